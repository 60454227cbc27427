import { pairsForPower } from '../../shared/stats';

export type SampleSize =
  { ok: true; needed: number; more: number } | { ok: false; message: string };

/**
 * Pairs needed for a two-sided paired t-test at α = 0.05 to show a reduction of `reductionMm`
 * with 80 % power, given the SD of the paired differences seen so far. `reductionMm` comes from
 * the typed text: undefined when empty, NaN when not a number.
 */
export function sampleSize(
  reductionMm: number | undefined,
  sdDiff: number | null,
  have: number,
): SampleSize {
  if (sdDiff === null || !(sdDiff > 0)) {
    return {
      ok: false,
      message: 'Not known yet: it needs at least two pairs whose differences are not all the same.',
    };
  }
  if (reductionMm === undefined) return { ok: false, message: 'Enter the reduction to detect.' };
  if (Number.isNaN(reductionMm)) return { ok: false, message: 'Enter a number, such as 20.' };
  if (reductionMm <= 0) return { ok: false, message: 'Enter a reduction larger than zero.' };
  const needed = pairsForPower({ sdDiff, delta: reductionMm });
  return { ok: true, needed, more: Math.max(0, needed - have) };
}
