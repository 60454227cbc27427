import { tQuantile } from '../../shared/stats';

/** 95 % t interval of a mean from its SD and count; null when it cannot be worked out. */
export function meanCi95(
  mean: number | null,
  sd: number | null,
  n: number,
): [number, number] | null {
  if (mean === null || sd === null || n < 2) return null;
  const half = tQuantile(0.975, n - 1) * (sd / Math.sqrt(n));
  return [mean - half, mean + half];
}
