import type { PairRow } from '../../shared/ranking/rank';
import type { RankingQuery } from '../../shared/schemas/ranking';
import type { TreatmentDetailOutput, TreatmentPairOutput } from '../../shared/schemas/treatment';
import { AppError } from '../errors';
import { fetchPairRows, rankings, toPairRow } from './rankings';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const finite = (v: number | null) => (v !== null && Number.isFinite(v) ? v : null);

function outcome(s: PairRow['treated']): TreatmentPairOutput['treated'] {
  return {
    code: s.code,
    charLengthMm: finite(s.charLengthMm),
    afterflameS: finite(s.afterflameS),
    afterflameComplete: s.afterflameComplete,
    afterglowS: finite(s.afterglowS),
    massLossPct: finite(s.massLossPct),
    flamingDrips: s.flamingDrips,
    burnedToClamp: s.burnedToClamp,
  };
}

const oldestFirst = (a: PairRow, b: PairRow) =>
  a.heldAt.localeCompare(b.heldAt) || a.pairId.localeCompare(b.pairId);

/**
 * One treatment of the ranking, under the same filters, with the pairs behind it. The figures
 * are the ranking's own (rank included), so the detail screen never disagrees with the list.
 */
export async function treatmentDetail(
  labId: string,
  key: string,
  q: RankingQuery,
): Promise<TreatmentDetailOutput> {
  const notFound = () =>
    AppError.notFound('No such treatment in this lab, or no pairs of it match the filters.');
  // A key is "<revision id>|<substrate>": fetch only that revision's pairs.
  const revisionId = key.split('|')[0] ?? '';
  if (!UUID.test(revisionId)) throw notFound();
  const [ranking, rows] = await Promise.all([
    rankings(labId, q),
    fetchPairRows(labId, { ...q, revisionId }),
  ]);
  const treatment = [...ranking.ranked, ...ranking.notEnoughPairs].find((t) => t.key === key);
  if (!treatment) throw notFound();
  const pairs = rows
    .map(toPairRow)
    .filter((p) => p.treatmentKey === key)
    .sort(oldestFirst)
    .map((p) => ({
      pairId: p.pairId,
      heldAt: p.heldAt,
      batchCode: p.batchCode,
      addOnPct: finite(p.addOnPct),
      control: outcome(p.control),
      treated: outcome(p.treated),
    }));
  return { treatment, profile: ranking.profile, onlySignedOff: ranking.onlySignedOff, pairs };
}
