// One monotonic clock per page: performance.now() anchored once to the wall clock, so marks
// are evenly spaced even if the system clock is adjusted during a burn.
const anchor = Date.now() - performance.now();

export function nowMs(): number {
  return Math.round((anchor + performance.now()) * 10) / 10;
}

export function formatSeconds(ms: number | null | undefined): string {
  if (ms === null || ms === undefined) return '–';
  return `${(ms / 1000).toFixed(1)} s`;
}
