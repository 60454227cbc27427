export {
  lnBeta,
  lnGamma,
  normalCdf,
  normalQuantile,
  regularizedIncompleteBeta,
  tCdf,
  tCritical,
  tQuantile,
  tTwoSidedP,
} from './distributions';
export {
  WILCOXON_EXACT_MAX_N,
  holm,
  pairedT,
  pairedTPower,
  pairsForPower,
  pooledFromSummary,
  welchFromSummary,
  welchT,
  wilcoxonExactLowerTail,
  wilcoxonSignedRank,
  wilsonInterval,
} from './tests';
export type {
  GroupSummary,
  PairedTResult,
  PowerInput,
  TTestResult,
  WilcoxonOptions,
  WilcoxonResult,
  WilsonInterval,
} from './tests';
