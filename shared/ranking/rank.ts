import { median, mean, sampleStandardDeviation } from 'simple-statistics';
import { judgeSpecimens, type SpecimenResult } from '../criteria/judge';
import type { CriteriaProfileInput } from '../criteria/types';
import { holm, pairedT, pairsForPower, welchT, wilcoxonSignedRank, wilsonInterval } from '../stats';

/** One burned pair, as the ranking needs it (the server fetches these rows in one query). */
export type PairRow = {
  pairId: string;
  heldAt: string;
  treatmentKey: string;
  recipeId: string;
  recipeName: string;
  revisionId: string;
  revisionNumber: number;
  substrate: string;
  batchCode: string;
  addOnPct: number | null;
  treated: SpecimenResult & { code: string };
  control: SpecimenResult & { code: string };
};

export const MIN_PAIRS = 3;

export type TreatmentStats = {
  key: string;
  recipeId: string;
  recipeName: string;
  revisionId: string;
  revisionNumber: number;
  substrate: string;
  pairs: number;
  treatedChar: { mean: number; median: number; sd: number | null };
  controlChar: { mean: number; median: number; sd: number | null };
  /** control − treated char length, per pair */
  difference: {
    mean: number;
    ci95: [number, number] | null;
    reductionPct: number | null;
    pairedP: number | null;
    wilcoxonP: number | null;
    wilcoxonMethod: 'exact' | 'normal' | null;
    cohenDz: number | null;
    sd: number | null;
  };
  selfExtinguish: { rate: number; lo: number; hi: number; count: number };
  afterflameMedianS: number | null;
  afterglowMedianS: number | null;
  massLossMeanPct: number | null;
  addOnMeanPct: number | null;
  pairsNeeded: number | null;
  verdict: { pass: boolean; failed: string[]; notEnough?: string } | null;
  rank: number | null;
};

export type RankingOptions = {
  sort?: 'treated_char' | 'reduction';
  profile?: CriteriaProfileInput;
  /** The reduction in char length (mm) the sample-size helper should be able to detect. */
  detectMm?: number;
};

export type Ranking = {
  ranked: TreatmentStats[];
  notEnoughPairs: TreatmentStats[];
  /** The leader against the runner-up, in words (Welch tests with Holm correction, α = 0.05). */
  leaderStatement: string | null;
  comparisons: { a: string; b: string; p: number; adjustedP: number }[];
};

/** A test that cannot be computed (too few values, no spread) gives no answer, not an error. */
function attempt<T>(run: () => T): T | null {
  try {
    return run();
  } catch {
    return null;
  }
}

const sdOf = (xs: number[]) => (xs.length >= 2 ? sampleStandardDeviation(xs) : null);
const valid = (xs: (number | null)[]) =>
  xs.filter((x): x is number => x !== null && Number.isFinite(x));

function statsFor(rows: PairRow[], options: RankingOptions): TreatmentStats {
  const first = rows[0]!;
  // Only pairs with both char lengths count toward the char statistics.
  const both = rows.filter(
    (r) => r.treated.charLengthMm !== null && r.control.charLengthMm !== null,
  );
  const treated = both.map((r) => r.treated.charLengthMm!);
  const control = both.map((r) => r.control.charLengthMm!);
  const diffs = both.map((r) => r.control.charLengthMm! - r.treated.charLengthMm!);
  const t = both.length >= 2 ? attempt(() => pairedT(control, treated)) : null;
  const w = diffs.some((d) => d !== 0) ? attempt(() => wilcoxonSignedRank(diffs)) : null;
  const selfOut = rows.filter(
    (r) => r.treated.afterflameComplete && !r.treated.burnedToClamp,
  ).length;
  const wilson = wilsonInterval(selfOut, rows.length);
  const controlMean = control.length ? mean(control) : NaN;
  const sdDiff = sdOf(diffs);
  const detect = options.detectMm ?? (diffs.length ? Math.abs(mean(diffs)) : undefined);
  let pairsNeeded: number | null = null;
  if (sdDiff !== null && sdDiff > 0 && detect !== undefined && detect > 0) {
    const n = attempt(() => pairsForPower({ sdDiff, delta: detect }));
    pairsNeeded = n !== null && Number.isFinite(n) ? n : null;
  }
  const verdict = options.profile
    ? judgeSpecimens(
        options.profile,
        rows.map((r) => r.treated),
      )
    : null;
  return {
    key: first.treatmentKey,
    recipeId: first.recipeId,
    recipeName: first.recipeName,
    revisionId: first.revisionId,
    revisionNumber: first.revisionNumber,
    substrate: first.substrate,
    pairs: both.length,
    treatedChar: {
      mean: treated.length ? mean(treated) : NaN,
      median: treated.length ? median(treated) : NaN,
      sd: sdOf(treated),
    },
    controlChar: {
      mean: controlMean,
      median: control.length ? median(control) : NaN,
      sd: sdOf(control),
    },
    difference: {
      mean: diffs.length ? mean(diffs) : NaN,
      ci95: t ? t.ci95 : null,
      reductionPct: diffs.length && controlMean > 0 ? (mean(diffs) / controlMean) * 100 : null,
      pairedP: t && Number.isFinite(t.p) ? t.p : null,
      wilcoxonP: w ? w.p : null,
      wilcoxonMethod: w ? w.method : null,
      cohenDz: t && Number.isFinite(t.cohenDz) ? t.cohenDz : null,
      sd: sdDiff,
    },
    selfExtinguish: { rate: wilson.estimate, lo: wilson.lo, hi: wilson.hi, count: selfOut },
    afterflameMedianS: valid(rows.map((r) => r.treated.afterflameS)).length
      ? median(valid(rows.map((r) => r.treated.afterflameS)))
      : null,
    afterglowMedianS: valid(rows.map((r) => r.treated.afterglowS)).length
      ? median(valid(rows.map((r) => r.treated.afterglowS)))
      : null,
    massLossMeanPct: valid(rows.map((r) => r.treated.massLossPct)).length
      ? mean(valid(rows.map((r) => r.treated.massLossPct)))
      : null,
    addOnMeanPct: valid(rows.map((r) => r.addOnPct)).length
      ? mean(valid(rows.map((r) => r.addOnPct)))
      : null,
    pairsNeeded,
    verdict: verdict
      ? {
          pass: verdict.pass,
          failed: verdict.failed,
          ...(verdict.notEnough ? { notEnough: verdict.notEnough } : {}),
        }
      : null,
    rank: null,
  };
}

const label = (t: TreatmentStats) => `${t.recipeName} (rev. ${t.revisionNumber}) on ${t.substrate}`;

/**
 * Ranks treatments by mean treated char length (lower is better) or by mean paired reduction
 * (higher is better). Treatments with fewer than MIN_PAIRS pairs are kept apart, unranked.
 * The result does not depend on the order of the rows.
 */
export function rankTreatments(rows: PairRow[], options: RankingOptions = {}): Ranking {
  const groups = new Map<string, PairRow[]>();
  for (const row of [...rows].sort((a, b) => a.pairId.localeCompare(b.pairId))) {
    const list = groups.get(row.treatmentKey) ?? [];
    list.push(row);
    groups.set(row.treatmentKey, list);
  }
  const all = [...groups.values()].map((g) => statsFor(g, options));
  const byKey = (a: TreatmentStats, b: TreatmentStats) => a.key.localeCompare(b.key);
  const enough = all.filter((t) => t.pairs >= MIN_PAIRS);
  const notEnoughPairs = all.filter((t) => t.pairs < MIN_PAIRS).sort(byKey);
  const score = (t: TreatmentStats) =>
    options.sort === 'reduction' ? -t.difference.mean : t.treatedChar.mean;
  const ranked = enough
    .sort((a, b) => score(a) - score(b) || byKey(a, b))
    .map((t, i) => ({ ...t, rank: i + 1 }));

  const treatedOf = (t: TreatmentStats) =>
    (groups.get(t.key) ?? []).flatMap((r) =>
      r.treated.charLengthMm === null ? [] : [r.treated.charLengthMm],
    );
  // Each treatment against the next in rank (the question a ranking raises), Holm-corrected over
  // those n − 1 tests; all n(n − 1)/2 pairs would cost quadratic time for hundreds of treatments.
  const raw: { a: string; b: string; p: number }[] = [];
  for (let i = 0; i + 1 < ranked.length; i++) {
    const p = attempt(() => welchT(treatedOf(ranked[i]!), treatedOf(ranked[i + 1]!)).p);
    raw.push({
      a: ranked[i]!.key,
      b: ranked[i + 1]!.key,
      p: p !== null && Number.isFinite(p) ? p : 1,
    });
  }
  const adjusted = holm(raw.map((r) => r.p));
  const comparisons = raw.map((r, i) => ({ ...r, adjustedP: adjusted[i]! }));
  let leaderStatement: string | null = null;
  if (ranked.length === 1) {
    leaderStatement = `Only one treatment has ${MIN_PAIRS} or more pairs: ${label(ranked[0]!)}.`;
  } else if (ranked.length >= 2) {
    const [leader, next] = ranked;
    const c = comparisons.find(
      (x) =>
        (x.a === leader!.key && x.b === next!.key) || (x.a === next!.key && x.b === leader!.key),
    )!;
    leaderStatement =
      c.adjustedP < 0.05
        ? `${label(leader!)} leads: its treated char length differs from ${label(next!)} (Welch test, Holm-adjusted p = ${c.adjustedP.toPrecision(2)}).`
        : `${label(leader!)} and ${label(next!)} cannot be told apart yet (Welch test on treated char length, Holm-adjusted p = ${c.adjustedP.toPrecision(2)} ≥ 0.05). More pairs would settle it.`;
  }
  return { ranked, notEnoughPairs, leaderStatement, comparisons };
}
