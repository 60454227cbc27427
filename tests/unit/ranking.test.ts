import fc from 'fast-check';
import { rankTreatments, type PairRow } from '../../shared/ranking/rank';

const outcome = (charLengthMm: number, afterflameS: number) => ({
  code: 'x',
  charLengthMm,
  afterflameS,
  afterflameComplete: true,
  afterglowS: 1,
  flamingDrips: false,
  massLossPct: 5,
  burnedToClamp: false,
  burnTimeS: afterflameS + 1,
});

const pairArb = (treatments: string[]) =>
  fc.record({
    pairId: fc.uuid(),
    treatment: fc.constantFrom(...treatments),
    treated: fc.integer({ min: 20, max: 300 }),
    control: fc.integer({ min: 150, max: 300 }),
    afterflame: fc.double({ min: 0, max: 30, noNaN: true }),
  });

function toRow(p: {
  pairId: string;
  treatment: string;
  treated: number;
  control: number;
  afterflame: number;
}): PairRow {
  return {
    pairId: p.pairId,
    heldAt: '2026-11-30T10:00:00.000Z',
    treatmentKey: p.treatment,
    recipeId: '00000000-0000-4000-8000-000000000001',
    recipeName: `Recipe ${p.treatment}`,
    revisionId: '00000000-0000-4000-8000-000000000002',
    revisionNumber: 1,
    substrate: 'muslin',
    batchCode: 'B-1',
    addOnPct: 8,
    treated: outcome(p.treated, p.afterflame),
    control: outcome(p.control, 20),
  };
}

const withoutRank = <T extends { rank: number | null }>(t: T) => ({ ...t, rank: null });

describe('rankTreatments', () => {
  it('does not depend on the order of the pairs', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(pairArb(['A', 'B', 'C']), {
          minLength: 1,
          maxLength: 30,
          selector: (p) => p.pairId,
        }),
        fc.context(),
        (pairs, ctx) => {
          const rows = pairs.map(toRow);
          const reversed = [...rows].reverse();
          const rotated = [...rows.slice(1), ...rows.slice(0, 1)];
          ctx.log(`${rows.length} pairs`);
          const a = rankTreatments(rows);
          expect(rankTreatments(reversed)).toEqual(a);
          expect(rankTreatments(rotated)).toEqual(a);
        },
      ),
      { numRuns: 60 },
    );
  });

  it("changes no other treatment's statistics when a pair is added to one treatment", () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(pairArb(['A', 'B', 'C']), {
          minLength: 3,
          maxLength: 25,
          selector: (p) => p.pairId,
        }),
        pairArb(['A']),
        (pairs, extra) => {
          fc.pre(!pairs.some((p) => p.pairId === extra.pairId));
          const before = rankTreatments(pairs.map(toRow));
          const after = rankTreatments([...pairs, extra].map(toRow));
          const others = (r: ReturnType<typeof rankTreatments>) =>
            [...r.ranked, ...r.notEnoughPairs]
              .filter((t) => t.key !== 'A')
              .map(withoutRank)
              .sort((x, y) => x.key.localeCompare(y.key));
          expect(others(after)).toEqual(others(before));
        },
      ),
      { numRuns: 60 },
    );
  });

  it('ranks by mean treated char length and keeps treatments with fewer than 3 pairs apart', () => {
    const rows = [
      ...[40, 50, 60].map((c, i) =>
        toRow({ pairId: `a${i}`, treatment: 'A', treated: c, control: 300, afterflame: 1 }),
      ),
      ...[100, 110, 120].map((c, i) =>
        toRow({ pairId: `b${i}`, treatment: 'B', treated: c, control: 300, afterflame: 1 }),
      ),
      ...[30, 35].map((c, i) =>
        toRow({ pairId: `c${i}`, treatment: 'C', treated: c, control: 300, afterflame: 1 }),
      ),
    ];
    const r = rankTreatments(rows);
    expect(r.ranked.map((t) => [t.key, t.rank])).toEqual([
      ['A', 1],
      ['B', 2],
    ]);
    expect(r.notEnoughPairs.map((t) => t.key)).toEqual(['C']);
    // Means by arithmetic: A 50, control 300 → reduction 250 mm (83.3 %)
    expect(r.ranked[0]!.treatedChar.mean).toBe(50);
    expect(r.ranked[0]!.difference.mean).toBe(250);
    expect(r.leaderStatement).toMatch(/leads|cannot be told apart/);
  });

  it('says when the leader cannot be told apart from the next', () => {
    const rows = [
      ...[50, 90, 60].map((c, i) =>
        toRow({ pairId: `a${i}`, treatment: 'A', treated: c, control: 300, afterflame: 1 }),
      ),
      ...[55, 95, 65].map((c, i) =>
        toRow({ pairId: `b${i}`, treatment: 'B', treated: c, control: 300, afterflame: 1 }),
      ),
    ];
    expect(rankTreatments(rows).leaderStatement).toMatch(/cannot be told apart/);
  });
});
