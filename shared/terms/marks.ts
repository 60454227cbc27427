/** What the operator can tap on a specimen's timer lane. Times are derived from these, never typed. */
export const markKinds = [
  'flame_applied',
  'flame_removed',
  'flame_out',
  'glow_out',
  'reignited',
  'flaming_drip',
  'burned_to_clamp',
  'stopped',
  'undo',
] as const;
export type MarkKind = (typeof markKinds)[number];

/**
 * One tap on a lane. `atMs` is read from one monotonic clock per test session, so marks from the
 * same session compare directly even when they sync out of order. An 'undo' names the mark it
 * cancels in `undoes`; marks are never edited or deleted.
 */
export type Mark = { id: string; kind: MarkKind; atMs: number; undoes?: string };

export const markLabels: Record<MarkKind, string> = {
  flame_applied: 'Flame applied',
  flame_removed: 'Flame removed',
  flame_out: 'Flame out (self-extinguished)',
  glow_out: 'Glow out',
  reignited: 'Re-ignited',
  flaming_drip: 'Flaming drip',
  burned_to_clamp: 'Burned to the clamp',
  stopped: 'Stopped by operator',
  undo: 'Undo',
};
