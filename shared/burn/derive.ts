import type { Mark, MarkKind } from './marks';

export type LaneState = 'ready' | 'exposing' | 'afterflame' | 'afterglow' | 'done';

export type DerivedLane = {
  /** Marks in time order, without undone marks and without the undo marks themselves. */
  effective: Mark[];
  /** What the lane is doing now, for the timer. */
  state: LaneState;
  /** flame_removed − flame_applied. */
  exposureMs: number | null;
  /**
   * Flaming time after the flame was removed: (first flame_out − flame_removed) plus, for each
   * re-ignition, (next flame_out − reignited). A period still open (the lane is flaming now) is not
   * counted. Null before the flame was removed.
   */
  afterflameMs: number | null;
  /** False when the last flaming period never ended in a flame out: afterflameMs is a lower bound. */
  afterflameComplete: boolean;
  /** glow_out − the last flame_out (or − flame_removed when there is none); null without glow_out. */
  afterglowMs: number | null;
  /** From flame_removed to the last flame_out, glow_out, stopped or burned_to_clamp. */
  totalMs: number | null;
  reignitions: number;
  flamingDrips: number;
  burnedToClamp: boolean;
  /** The operator stopped the test before the specimen went out on its own. */
  stopped: boolean;
  /** Marks that were out of order or impossible, in plain words; they are ignored for the times. */
  problems: string[];
};

type TimedKind = Exclude<MarkKind, 'undo'>;

// Short nouns for problem sentences; the button labels read badly inside a sentence.
const nouns: Record<TimedKind, string> = {
  flame_applied: 'Flame applied',
  flame_removed: 'Flame removed',
  flame_out: 'Flame out',
  glow_out: 'Glow out',
  reignited: 'Re-ignition',
  flaming_drip: 'Flaming drip',
  burned_to_clamp: 'Burn to the clamp',
  stopped: 'Stop by the operator',
};

const buttons: Record<LaneState, readonly MarkKind[]> = {
  ready: ['flame_applied'],
  exposing: ['flame_removed'],
  afterflame: ['flame_out', 'flaming_drip', 'burned_to_clamp', 'stopped'],
  afterglow: ['glow_out', 'reignited', 'stopped'],
  done: [],
};

/** The marks that make sense in a state, for the big buttons. Undo is offered separately. */
export function nextMarks(state: LaneState): MarkKind[] {
  return [...buttons[state]];
}

/** Why a mark cannot be taken in a state. */
function impossible(state: LaneState, kind: TimedKind): string {
  switch (state) {
    case 'ready':
      return `${nouns[kind]} before the flame was applied`;
    case 'exposing':
      if (kind === 'flame_applied') return 'Flame applied twice';
      return `${nouns[kind]} before the flame was removed`;
    case 'afterflame':
    case 'afterglow':
      if (kind === 'flame_applied') return 'Flame applied again after it was removed';
      if (kind === 'flame_removed') return 'Flame removed twice';
      return state === 'afterflame'
        ? `${nouns[kind]} while the specimen was still flaming`
        : `${nouns[kind]} while the specimen was not flaming`;
    case 'done':
      return `${nouns[kind]} after the test had ended`;
  }
}

/** Marks with usable times, one per id, with the undo marks resolved. */
function resolveUndos(marks: Mark[], problems: string[]): Mark[] {
  const byId = new Map<string, Mark>();
  const ordered: Mark[] = [];
  for (const mark of marks) {
    if (!Number.isFinite(mark.atMs) || mark.atMs < 0) {
      problems.push(`${mark.kind === 'undo' ? 'Undo' : nouns[mark.kind]} has no valid time`);
      continue;
    }
    const seen = byId.get(mark.id);
    if (seen) {
      // Sync may deliver the same mark twice; only a different mark under the same id is wrong.
      if (seen.kind !== mark.kind || seen.atMs !== mark.atMs || seen.undoes !== mark.undoes) {
        problems.push('Two different marks share one id; the later one was ignored');
      }
      continue;
    }
    byId.set(mark.id, mark);
    ordered.push(mark);
  }

  const cancelled = new Set<string>();
  for (const mark of ordered) {
    if (mark.kind !== 'undo') continue;
    const target = mark.undoes === undefined ? undefined : byId.get(mark.undoes);
    if (mark.undoes === undefined) problems.push('Undo does not name a mark');
    else if (!target) problems.push('Undo names a mark that is not on this lane');
    // Undoing an undo would make "redo" depend on the order undos are read; tap the mark again.
    else if (target.kind === 'undo') problems.push('An undo cannot be undone; it was ignored');
    else cancelled.add(target.id);
  }
  return ordered.filter((m) => m.kind !== 'undo' && !cancelled.has(m.id));
}

/** Derive a lane's state and times from its marks, in whatever order they arrived. */
export function deriveLane(marks: Mark[]): DerivedLane {
  const problems: string[] = [];
  const effective = resolveUndos(marks, problems)
    .map((mark, index) => ({ mark, index }))
    .sort((a, b) => a.mark.atMs - b.mark.atMs || a.index - b.index)
    .map(({ mark }) => mark);

  let state: LaneState = 'ready';
  let appliedAt: number | null = null;
  let removedAt: number | null = null;
  let flamingSince: number | null = null;
  let lastFlameOutAt: number | null = null;
  let glowOutAt: number | null = null;
  let endAt: number | null = null;
  let afterflameMs: number | null = null;
  let flamingAtEnd = false;
  let reignitions = 0;
  let flamingDrips = 0;
  let burnedToClamp = false;
  let stopped = false;

  const closeFlaming = (at: number) => {
    if (flamingSince !== null) afterflameMs = (afterflameMs ?? 0) + (at - flamingSince);
    flamingSince = null;
  };

  for (const { kind, atMs: at } of effective) {
    if (kind === 'undo') continue;
    const lit = state === 'exposing' || state === 'afterflame' || state === 'afterglow';
    if (state === 'ready' && kind === 'flame_applied') {
      appliedAt = at;
      state = 'exposing';
    } else if (state === 'exposing' && kind === 'flame_removed') {
      removedAt = at;
      flamingSince = at;
      afterflameMs = 0;
      state = 'afterflame';
    } else if ((state === 'exposing' || state === 'afterflame') && kind === 'flaming_drip') {
      flamingDrips += 1;
    } else if (state === 'afterflame' && kind === 'flame_out') {
      closeFlaming(at);
      lastFlameOutAt = at;
      endAt = at;
      state = 'afterglow';
    } else if (state === 'afterglow' && kind === 'reignited') {
      reignitions += 1;
      flamingSince = at;
      state = 'afterflame';
    } else if (state === 'afterglow' && kind === 'glow_out') {
      glowOutAt = at;
      endAt = at;
      state = 'done';
    } else if (lit && (kind === 'stopped' || kind === 'burned_to_clamp')) {
      // Ending while flaming leaves the afterflame open: what was timed is a lower bound.
      flamingAtEnd = state !== 'afterglow';
      closeFlaming(at);
      if (removedAt !== null) endAt = at;
      if (kind === 'stopped') stopped = true;
      else burnedToClamp = true;
      state = 'done';
    } else {
      problems.push(impossible(state, kind));
    }
  }

  const afterglowFrom = lastFlameOutAt ?? removedAt;
  return {
    effective,
    state,
    exposureMs: appliedAt !== null && removedAt !== null ? removedAt - appliedAt : null,
    afterflameMs,
    afterflameComplete: afterflameMs !== null && !flamingAtEnd && state !== 'afterflame',
    afterglowMs: glowOutAt !== null && afterglowFrom !== null ? glowOutAt - afterglowFrom : null,
    totalMs: removedAt !== null && endAt !== null ? endAt - removedAt : null,
    reignitions,
    flamingDrips,
    burnedToClamp,
    stopped,
    problems,
  };
}
