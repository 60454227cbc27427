import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { deriveLane } from '../../shared/burn/derive';
import { marksForLane, msFromSeconds, type LaneTimes } from '../../shared/burn/synthesize';

function times(over: Partial<LaneTimes>): LaneTimes {
  return {
    exposureMs: 12_000,
    afterflameMs: null,
    afterflameComplete: true,
    afterglowMs: null,
    totalMs: null,
    burnedToClamp: false,
    ...over,
  };
}

/** What the pairs export reads back from a lane's marks. */
function readBack(t: LaneTimes) {
  const d = deriveLane(marksForLane(t, randomUUID));
  return {
    exposureMs: d.exposureMs,
    afterflameMs: d.afterflameMs,
    afterflameComplete: d.afterflameComplete,
    afterglowMs: d.afterglowMs,
    totalMs: d.totalMs,
    burnedToClamp: d.burnedToClamp,
    problems: d.problems,
  };
}

describe('msFromSeconds', () => {
  it('gives whole milliseconds for two-decimal seconds', () => {
    // 1.1 × 1000 is 1100.0000000000002 in binary floating point (IEEE 754 double).
    expect(msFromSeconds(1.1)).toBe(1100);
    expect(msFromSeconds(0.29)).toBe(290);
  });
});

describe('marksForLane', () => {
  it('gives back a lane that went out by itself and then stopped glowing', () => {
    expect(readBack(times({ afterflameMs: 800, afterglowMs: 4000 }))).toEqual({
      exposureMs: 12_000,
      afterflameMs: 800,
      afterflameComplete: true,
      afterglowMs: 4000,
      totalMs: 4800,
      burnedToClamp: false,
      problems: [],
    });
  });

  it('gives back a lane still flaming when it burned to the clamp', () => {
    expect(
      readBack(times({ afterflameMs: 21_000, afterflameComplete: false, burnedToClamp: true })),
    ).toMatchObject({
      afterflameMs: 21_000,
      afterflameComplete: false,
      afterglowMs: null,
      burnedToClamp: true,
      problems: [],
    });
  });

  it('gives back a burn time longer than afterflame + afterglow', () => {
    expect(readBack(times({ afterflameMs: 5000, afterglowMs: 2000, totalMs: 9500 }))).toMatchObject(
      { afterflameMs: 5000, afterglowMs: 2000, totalMs: 9500, problems: [] },
    );
  });

  it('makes no marks for an untimed lane', () => {
    expect(marksForLane(times({}), randomUUID)).toEqual([]);
  });

  it('round-trips every consistent set of times through deriveLane', () => {
    const lane = fc
      .record({
        exposureMs: fc.integer({ min: 1, max: 600_000 }),
        afterflameMs: fc.integer({ min: 0, max: 3_600_000 }),
        afterflameComplete: fc.boolean(),
        afterglowMs: fc.option(fc.integer({ min: 0, max: 3_600_000 })),
        gapMs: fc.option(fc.integer({ min: 0, max: 600_000 })),
        burnedToClamp: fc.boolean(),
      })
      .map(({ gapMs, ...t }) => {
        // The row schema refuses an afterglow when the flame never went out or the glow reached
        // the clamp; the generator keeps to the same rules.
        const afterglowMs = t.afterflameComplete && !t.burnedToClamp ? t.afterglowMs : null;
        const totalMs = gapMs === null ? null : t.afterflameMs + (afterglowMs ?? 0) + gapMs;
        return { ...t, afterglowMs, totalMs };
      });
    fc.assert(
      fc.property(lane, (t) => {
        const back = readBack(t);
        expect(back).toEqual({
          exposureMs: t.exposureMs,
          afterflameMs: t.afterflameMs,
          afterflameComplete: t.afterflameComplete,
          afterglowMs: t.afterglowMs,
          totalMs: t.totalMs ?? t.afterflameMs + (t.afterglowMs ?? 0),
          burnedToClamp: t.burnedToClamp,
          problems: [],
        });
      }),
      { numRuns: 500 },
    );
  });
});
