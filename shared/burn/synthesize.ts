import type { Mark } from './marks';

/** A lane's times as a file states them, in whole milliseconds. */
export type LaneTimes = {
  exposureMs: number;
  /** Null: the lane was not timed, and gets no marks. */
  afterflameMs: number | null;
  /** False when the flame was still burning when timing ended. */
  afterflameComplete: boolean;
  afterglowMs: number | null;
  /** From flame removed to the end of the lane; null means afterflame + afterglow. */
  totalMs: number | null;
  burnedToClamp: boolean;
};

/** Seconds as a file gives them (two decimals at most) to whole milliseconds, without float dust. */
export function msFromSeconds(s: number): number {
  return Math.round(s * 1000);
}

/**
 * The marks a timer would have stamped for these times, so that `deriveLane` gives them back:
 * flame applied at 0, removed after the exposure, one flaming period, then the glow. Where the
 * total is longer than afterflame + afterglow, the flame goes out after the afterflame and
 * re-ignites for an instant at the end of the gap: the only way the event log holds time that is
 * neither flaming nor glowing. A gap below zero (rounding in the file) counts as none.
 */
export function marksForLane(t: LaneTimes, newId: () => string): Mark[] {
  if (t.afterflameMs === null) return [];
  const mark = (kind: Mark['kind'], atMs: number): Mark => ({ id: newId(), kind, atMs });
  const glow = t.afterflameComplete ? (t.afterglowMs ?? 0) : 0;
  const gap = Math.max(0, (t.totalMs ?? t.afterflameMs + glow) - t.afterflameMs - glow);
  const marks = [mark('flame_applied', 0), mark('flame_removed', t.exposureMs)];
  let at = t.exposureMs + t.afterflameMs;
  if (gap > 0) {
    marks.push(mark('flame_out', at), mark('reignited', at + gap));
    at += gap;
  }
  if (!t.afterflameComplete) {
    marks.push(mark(t.burnedToClamp ? 'burned_to_clamp' : 'stopped', at));
    return marks;
  }
  marks.push(mark('flame_out', at));
  if (t.afterglowMs !== null) marks.push(mark('glow_out', at + t.afterglowMs));
  else if (t.burnedToClamp) marks.push(mark('burned_to_clamp', at));
  return marks;
}
