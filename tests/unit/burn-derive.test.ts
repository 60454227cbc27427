import { deriveLane, nextMarks, type LaneState } from '../../shared/burn/derive';
import {
  markKinds,
  markLabels,
  markSchema,
  type Mark,
  type MarkKind,
} from '../../shared/burn/marks';

const idOf = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;

/** A lane scripted as [kind, seconds]; ids follow the script so undos can name them. */
function lane(script: [Exclude<MarkKind, 'undo'>, number][]): Mark[] {
  return script.map(([kind, seconds], i) => ({ id: idOf(i + 1), kind, atMs: seconds * 1000 }));
}

const undo = (n: number, target: Mark, seconds: number): Mark => ({
  id: idOf(n),
  kind: 'undo',
  atMs: seconds * 1000,
  undoes: target.id,
});

function at<T>(list: T[], index: number): T {
  const item = list[index];
  if (item === undefined) throw new Error(`no item at ${index}`);
  return item;
}

// A specimen that burns on, goes out, glows, and stops glowing.
const simple = lane([
  ['flame_applied', 10],
  ['flame_removed', 22],
  ['flame_out', 25.5],
  ['glow_out', 31],
]);

describe('deriveLane', () => {
  it('derives exposure, afterflame, afterglow and total from a simple log', () => {
    const d = deriveLane(simple);
    expect(d.state).toBe('done');
    expect(d.exposureMs).toBe((22 - 10) * 1000);
    // A single flame application: this afterflame is UL 94's t1, the afterflame time after the
    // first flame application. Source: domain-facts.md §2, UL 94 V-0 row [C]
    expect(d.afterflameMs).toBe((25.5 - 22) * 1000);
    expect(d.afterflameComplete).toBe(true);
    // Afterglow measured from the end of flaming to the end of glowing, as ASTM D6413 records
    // afterflame and afterglow separately. Source: domain-facts.md §2, ASTM D6413 row [C]
    expect(d.afterglowMs).toBe((31 - 25.5) * 1000);
    expect(d.totalMs).toBe((31 - 22) * 1000);
    expect(d.reignitions).toBe(0);
    expect(d.flamingDrips).toBe(0);
    expect(d.burnedToClamp).toBe(false);
    expect(d.stopped).toBe(false);
    expect(d.problems).toEqual([]);
    expect(d.effective).toEqual(simple);
  });

  it('starts ready with no times when there are no marks', () => {
    expect(deriveLane([])).toEqual({
      effective: [],
      state: 'ready',
      exposureMs: null,
      afterflameMs: null,
      afterflameComplete: false,
      afterglowMs: null,
      totalMs: null,
      reignitions: 0,
      flamingDrips: 0,
      burnedToClamp: false,
      stopped: false,
      problems: [],
    });
  });

  it('follows the lane through each state as marks are added', () => {
    const states = [0, 1, 2, 3, 4].map((n) => deriveLane(simple.slice(0, n)).state);
    expect(states).toEqual(['ready', 'exposing', 'afterflame', 'afterglow', 'done']);
  });

  it('counts no afterflame time yet while the specimen is still flaming', () => {
    const d = deriveLane(simple.slice(0, 2));
    expect(d.afterflameMs).toBe(0);
    expect(d.afterflameComplete).toBe(false);
    expect(d.totalMs).toBeNull();
  });

  it('gives an afterflame of about zero when the specimen does not ignite', () => {
    const d = deriveLane(
      lane([
        ['flame_applied', 0],
        ['flame_removed', 12],
        ['flame_out', 12.2],
        ['glow_out', 12.4],
      ]),
    );
    expect(d.problems).toEqual([]);
    expect(d.afterflameMs).toBeCloseTo(200, 6);
    expect(d.afterflameComplete).toBe(true);
  });

  it('restores the previous state and times when the last mark is undone', () => {
    const marks = [...simple, undo(9, at(simple, 3), 32)];
    const d = deriveLane(marks);
    const before = deriveLane(simple.slice(0, 3));
    expect(d).toEqual(before);
    expect(d.state).toBe('afterglow');
    expect(d.afterglowMs).toBeNull();
    expect(d.totalMs).toBe((25.5 - 22) * 1000);
  });

  it('drops a mark undone in the middle and re-times from the marks that remain', () => {
    // The operator tapped "flame out" too early, undid it, and tapped it again later.
    const marks = lane([
      ['flame_applied', 0],
      ['flame_removed', 12],
      ['flame_out', 14],
      ['flame_out', 19],
      ['glow_out', 25],
    ]);
    const d = deriveLane([...marks, undo(9, at(marks, 2), 15)]);
    expect(d.effective.map((m) => m.id)).toEqual([1, 2, 4, 5].map(idOf));
    expect(d.afterflameMs).toBe((19 - 12) * 1000);
    expect(d.afterglowMs).toBe((25 - 19) * 1000);
    expect(d.problems).toEqual([]);
  });

  it('adds the second flaming period and counts one re-ignition', () => {
    const d = deriveLane(
      lane([
        ['flame_applied', 0],
        ['flame_removed', 10],
        ['flame_out', 13],
        ['reignited', 15],
        ['flaming_drip', 16],
        ['flame_out', 20],
        ['glow_out', 24],
      ]),
    );
    expect(d.reignitions).toBe(1);
    expect(d.afterflameMs).toBe((13 - 10 + (20 - 15)) * 1000);
    expect(d.afterflameComplete).toBe(true);
    // Afterglow runs from the last flame out, not the first.
    expect(d.afterglowMs).toBe((24 - 20) * 1000);
    expect(d.totalMs).toBe((24 - 10) * 1000);
    expect(d.flamingDrips).toBe(1);
  });

  it('reports a lower-bound afterflame when the operator stops a flaming specimen', () => {
    const d = deriveLane(
      lane([
        ['flame_applied', 0],
        ['flame_removed', 12],
        ['stopped', 72],
      ]),
    );
    expect(d.state).toBe('done');
    expect(d.stopped).toBe(true);
    expect(d.afterflameComplete).toBe(false);
    expect(d.afterflameMs).toBe((72 - 12) * 1000);
    expect(d.afterglowMs).toBeNull();
    expect(d.totalMs).toBe((72 - 12) * 1000);
  });

  it('keeps a complete afterflame when the operator stops a glowing specimen', () => {
    const d = deriveLane(
      lane([
        ['flame_applied', 0],
        ['flame_removed', 12],
        ['flame_out', 15],
        ['stopped', 60],
      ]),
    );
    expect(d.stopped).toBe(true);
    expect(d.afterflameComplete).toBe(true);
    expect(d.afterflameMs).toBe((15 - 12) * 1000);
    expect(d.afterglowMs).toBeNull();
    expect(d.totalMs).toBe((60 - 12) * 1000);
  });

  it('records a burn to the clamp and ends the lane with an open afterflame', () => {
    // burnedToClamp feeds UL 94 V-0's "no burn to clamp" rule.
    // Source: domain-facts.md §2, UL 94 V-0 row [C]
    const d = deriveLane(
      lane([
        ['flame_applied', 0],
        ['flame_removed', 10],
        ['flaming_drip', 14],
        ['flaming_drip', 18],
        ['burned_to_clamp', 41],
      ]),
    );
    expect(d.state).toBe('done');
    expect(d.burnedToClamp).toBe(true);
    expect(d.stopped).toBe(false);
    expect(d.afterflameComplete).toBe(false);
    expect(d.afterflameMs).toBe((41 - 10) * 1000);
    expect(d.totalMs).toBe((41 - 10) * 1000);
    expect(d.flamingDrips).toBe(2);
  });

  it('gives the same result whatever order the marks arrive in', () => {
    const marks = lane([
      ['flame_applied', 0],
      ['flaming_drip', 5],
      ['flame_removed', 10],
      ['flame_out', 13],
      ['reignited', 15],
      ['flame_out', 20],
      ['glow_out', 24],
    ]);
    const all = [...marks, undo(8, at(marks, 1), 6)];
    const expected = deriveLane(all);
    // Fixed permutations (as index lists) instead of random shuffles, so the test cannot flake.
    const permutations = [
      [7, 6, 5, 4, 3, 2, 1, 0],
      [3, 0, 7, 5, 1, 6, 2, 4],
      [6, 2, 4, 0, 7, 1, 5, 3],
      [1, 5, 0, 6, 3, 7, 4, 2],
    ];
    for (const order of permutations) {
      const shuffled = order.map((i) => at(all, i));
      expect(deriveLane(shuffled)).toEqual(expected);
    }
    expect(expected.flamingDrips).toBe(0);
    expect(expected.reignitions).toBe(1);
    expect(expected.problems).toEqual([]);
  });

  it('keeps the given order for marks with the same time', () => {
    const marks = lane([
      ['flame_applied', 0],
      ['flame_removed', 10],
      ['flame_out', 10],
      ['glow_out', 10],
    ]);
    const d = deriveLane(marks);
    expect(d.state).toBe('done');
    expect(d.afterflameMs).toBe(0);
    expect(d.problems).toEqual([]);
  });

  it('reports impossible marks and leaves them out of the times', () => {
    const d = deriveLane(
      lane([
        ['flame_applied', 0],
        ['flame_out', 4],
        ['flame_removed', 12],
        ['glow_out', 13],
        ['flame_out', 16],
        ['flaming_drip', 17],
        ['glow_out', 21],
        ['reignited', 25],
      ]),
    );
    expect(d.problems).toEqual([
      'Flame out before the flame was removed',
      'Glow out while the specimen was still flaming',
      'Flaming drip while the specimen was not flaming',
      'Re-ignition after the test had ended',
    ]);
    expect(d.afterflameMs).toBe((16 - 12) * 1000);
    expect(d.afterglowMs).toBe((21 - 16) * 1000);
    expect(d.totalMs).toBe((21 - 12) * 1000);
    expect(d.reignitions).toBe(0);
    expect(d.flamingDrips).toBe(0);
  });

  it('reports marks before the flame was applied', () => {
    const d = deriveLane(lane([['flame_removed', 3]]));
    expect(d.state).toBe('ready');
    expect(d.problems).toEqual(['Flame removed before the flame was applied']);
    expect(d.exposureMs).toBeNull();
  });

  it('ignores an undo of an undo and says so', () => {
    const first = undo(9, at(simple, 3), 32);
    const d = deriveLane([...simple, first, undo(10, first, 33)]);
    expect(d.problems).toEqual(['An undo cannot be undone; it was ignored']);
    expect(d.state).toBe('afterglow');
  });

  it('reports an undo of a mark that is not on the lane', () => {
    const stray: Mark = { id: idOf(99), kind: 'flame_out', atMs: 1 };
    const d = deriveLane([...simple, undo(9, stray, 40)]);
    expect(d.problems).toEqual(['Undo names a mark that is not on this lane']);
    expect(d.state).toBe('done');
  });

  it('counts a mark delivered twice by sync once', () => {
    const d = deriveLane([...simple, at(simple, 2)]);
    expect(d).toEqual(deriveLane(simple));
  });
});

describe('nextMarks', () => {
  it.each<[LaneState, MarkKind[]]>([
    ['ready', ['flame_applied']],
    ['exposing', ['flame_removed']],
    ['afterflame', ['flame_out', 'flaming_drip', 'burned_to_clamp', 'stopped']],
    ['afterglow', ['glow_out', 'reignited', 'stopped']],
    ['done', []],
  ])('offers the marks that make sense while %s', (state, expected) => {
    expect(nextMarks(state)).toEqual(expected);
  });

  it('returns a copy the caller may change', () => {
    nextMarks('ready').push('undo');
    expect(nextMarks('ready')).toEqual(['flame_applied']);
  });

  it('offers only marks the lane then accepts without a problem', () => {
    const reach: Record<LaneState, Mark[]> = {
      ready: [],
      exposing: simple.slice(0, 1),
      afterflame: simple.slice(0, 2),
      afterglow: simple.slice(0, 3),
      done: simple,
    };
    for (const [state, marks] of Object.entries(reach) as [LaneState, Mark[]][]) {
      for (const kind of nextMarks(state)) {
        const d = deriveLane([...marks, { id: idOf(50), kind, atMs: 40_000 }]);
        expect({ state, kind, problems: d.problems }).toEqual({ state, kind, problems: [] });
      }
    }
  });
});

describe('markSchema', () => {
  const base = { id: idOf(1), kind: 'flame_out', atMs: 1500 };

  it('accepts a mark and an undo that names its mark', () => {
    const parsed: Mark = markSchema.parse(base);
    expect(parsed).toEqual(base);
    expect(
      markSchema.safeParse({ ...base, id: idOf(2), kind: 'undo', undoes: idOf(1) }).success,
    ).toBe(true);
  });

  it.each([
    ['an undo without the mark it cancels', { ...base, kind: 'undo' }],
    ['a mark other than undo naming a mark', { ...base, undoes: idOf(2) }],
    ['a negative time', { ...base, atMs: -1 }],
    ['an infinite time', { ...base, atMs: Infinity }],
    ['an id that is not a uuid', { ...base, id: 'm1' }],
    ['an unknown kind', { ...base, kind: 'smoke' }],
  ])('rejects %s', (_name, input) => {
    expect(markSchema.safeParse(input).success).toBe(false);
  });

  it('has a plain label for every kind', () => {
    for (const kind of markKinds) expect(markLabels[kind]).toMatch(/^[A-Z][a-z]/);
  });
});
