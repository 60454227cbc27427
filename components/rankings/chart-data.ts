import { tQuantile } from '../../shared/stats';
import type { TreatmentStatsOutput } from '../../shared/schemas/ranking';

export type ChartBar = { x: number; label: string; mean: number; lo: number; hi: number };

/** Mean treated char length per ranked treatment, with its 95 % t interval. */
export function chartBars(treatments: TreatmentStatsOutput[]): ChartBar[] {
  return treatments.flatMap((t, i) => {
    const mean = t.treatedChar.mean;
    if (mean === null) return [];
    const sd = t.treatedChar.sd ?? 0;
    const half = t.pairs >= 2 ? tQuantile(0.975, t.pairs - 1) * (sd / Math.sqrt(t.pairs)) : 0;
    return [
      { x: i + 1, label: `${t.rank ?? '–'}`, mean, lo: Math.max(0, mean - half), hi: mean + half },
    ];
  });
}
