import fc from 'fast-check';
import { createRequire } from 'node:module';

import {
  holm,
  normalCdf,
  normalQuantile,
  pairedT,
  pairedTPower,
  pairsForPower,
  pooledFromSummary,
  tCdf,
  tCritical,
  tQuantile,
  tTwoSidedP,
  welchFromSummary,
  welchT,
  wilcoxonExactLowerTail,
  wilcoxonSignedRank,
  wilsonInterval,
} from '../../shared/stats';

// jstat ships no type declarations; this is the part the tests use.
interface JStat {
  studentt: { cdf(x: number, df: number): number; inv(p: number, df: number): number };
  normal: {
    cdf(x: number, mean: number, sd: number): number;
    inv(p: number, mean: number, sd: number): number;
  };
  noncentralt: { cdf(x: number, df: number, ncp: number): number };
}
const { jStat } = createRequire(__filename)('jstat') as { jStat: JStat };

/** |actual − expected| within half a unit of the last decimal the reference gives. */
function expectRounded(actual: number, expected: number, decimals: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(0.5 * 10 ** -decimals * (1 + 1e-9));
}

// Source: domain-facts §3, Student's sleep data (R datasets::sleep) [C]
const g1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const g2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];
const sleepDiff = g2.map((v, i) => v - (g1[i] as number));

describe('Student t critical values', () => {
  // Source: domain-facts §3, NIST e-Handbook 1.3.6.7.2 two-sided 95 % t table [C]
  const nist: [number, number][] = [
    [1, 12.706],
    [2, 4.303],
    [3, 3.182],
    [4, 2.776],
    [5, 2.571],
    [6, 2.447],
    [7, 2.365],
    [8, 2.306],
    [9, 2.262],
    [10, 2.228],
    [11, 2.201],
    [12, 2.179],
    [13, 2.16],
    [14, 2.145],
    [15, 2.131],
    [16, 2.12],
    [17, 2.11],
    [18, 2.101],
    [19, 2.093],
    [20, 2.086],
    [21, 2.08],
    [22, 2.074],
    [23, 2.069],
    [24, 2.064],
    [25, 2.06],
    [26, 2.056],
    [27, 2.052],
    [28, 2.048],
    [29, 2.045],
    [30, 2.042],
    [60, 2.0],
    [120, 1.98],
  ];
  it.each(nist)('matches the NIST table at df %d (%s)', (df, value) => {
    // Source: domain-facts §3, NIST e-Handbook 1.3.6.7.2 [C] (3 decimals)
    expectRounded(tCritical(0.95, df), value, 3);
    expectRounded(tQuantile(0.975, df), value, 3);
    expectRounded(tQuantile(0.025, df), -value, 3);
  });

  it('agrees with the closed forms for df 1 and 2', () => {
    // Source: closed forms, common practice: df = 1 is the Cauchy distribution,
    // F(t) = 1/2 + atan(t)/π; for df = 2, F(t) = 1/2 + t / (2√(2 + t²)).
    for (const t of [-30, -3, -0.7, 0, 0.2, 1, 4.5, 100]) {
      expect(tCdf(t, 1)).toBeCloseTo(0.5 + Math.atan(t) / Math.PI, 14);
      expect(tCdf(t, 2)).toBeCloseTo(0.5 + t / (2 * Math.sqrt(2 + t * t)), 14);
    }
    // Source: closed form, common practice: the df = 1 quantile is −cot(πp) = −1/(πp) for tiny p
    expect(tQuantile(1e-10, 1) / (-1 / (Math.PI * 1e-10))).toBeCloseTo(1, 12);
    expect(tQuantile(0.975, 1)).toBeCloseTo(Math.tan(Math.PI * 0.475), 10);
  });
});

describe('t and normal distributions against jstat', () => {
  const dfs = [1, 2, 3, 4.5, 7, 9, 17.77647, 30, 60, 120, 326, 1000];
  const ts = [-40, -6, -3, -2, -1.5, -1, -0.4, 0, 0.1, 0.8, 1.96, 2.5, 4, 12];
  const ps = [1e-6, 0.001, 0.01, 0.025, 0.05, 0.2, 0.5, 0.7, 0.9, 0.95, 0.975, 0.995, 0.9999];

  it('tCdf matches jstat.studentt.cdf', () => {
    for (const df of dfs) {
      for (const t of ts) {
        // Source: independent library: jstat (itself good to about 1e-8)
        expect(Math.abs(tCdf(t, df) - jStat.studentt.cdf(t, df))).toBeLessThan(1e-7);
      }
    }
  });

  it('tQuantile matches jstat.studentt.inv', () => {
    for (const df of dfs) {
      for (const p of ps) {
        const ours = tQuantile(p, df);
        // Source: independent library: jstat
        expect(Math.abs(ours - jStat.studentt.inv(p, df))).toBeLessThan(
          1e-6 * Math.max(1, Math.abs(ours)),
        );
      }
    }
  });

  it('normalCdf and normalQuantile match jstat.normal', () => {
    for (const z of [-8, -5, -3, -1.96, -1, -0.25, 0, 0.3, 1, 1.6449, 2.5, 4, 6]) {
      const ref = jStat.normal.cdf(z, 0, 1);
      // Source: independent library: jstat
      expect(Math.abs(normalCdf(z) - ref)).toBeLessThan(1e-14 + 1e-9 * ref);
    }
    for (const p of [1e-10, 1e-6, ...ps, 1 - 1e-6]) {
      // Source: independent library: jstat
      expect(normalQuantile(p)).toBeCloseTo(jStat.normal.inv(p, 0, 1), 8);
    }
  });

  it('inverts its own CDFs to 1e-12 (relative, smaller tail)', () => {
    // common practice, no source: quantile and CDF are inverses
    fc.assert(
      fc.property(
        fc.double({ min: 1e-12, max: 0.5, noNaN: true }),
        fc.double({ min: 0.5, max: 500, noNaN: true }),
        fc.boolean(),
        (q, df, upper) => {
          const p = upper ? 1 - q : q;
          const t = tQuantile(p, df);
          const back = upper ? 1 - tCdf(t, df) : tCdf(t, df);
          const z = normalQuantile(p);
          const backZ = upper ? 1 - normalCdf(z) : normalCdf(z);
          // upper tails go through 1 − q, which rounds q by up to 1e-16 absolute
          const tol = 1e-12 * q + (upper ? 4e-16 : 0);
          return Math.abs(back - q) <= tol && Math.abs(backZ - q) <= tol;
        },
      ),
    );
  });

  it('is symmetric, and the t tends to the normal', () => {
    // common practice, no source: symmetry of t and normal; t with df = ∞ is the normal
    for (const t of [0.3, 1.7, 5]) {
      expect(tCdf(-t, 6) + tCdf(t, 6)).toBeCloseTo(1, 15);
      expect(tTwoSidedP(t, 6)).toBeCloseTo(2 * tCdf(-t, 6), 15);
      expect(tCdf(t, Infinity)).toBe(normalCdf(t));
      expect(Math.abs(tCdf(t, 1e6) - normalCdf(t))).toBeLessThan(1e-5);
    }
    expect(tQuantile(0.975, Infinity)).toBe(normalQuantile(0.975));
  });
});

describe('pairedT', () => {
  it("reproduces R's paired t-test on the sleep data (d = g2 − g1)", () => {
    const r = pairedT(g2, g1);
    // Source: domain-facts §3, sleep data paired t [D, agrees with R's published output]
    expect(r.n).toBe(10);
    expect(r.df).toBe(9);
    expectRounded(r.meanDiff, 1.58, 12);
    expectRounded(r.sdDiff, 1.229995, 6);
    expectRounded(r.se, 0.3889587, 7);
    expectRounded(r.t, 4.062128, 6);
    expectRounded(r.p, 0.00283289, 9);
    expectRounded(r.ci95[0], 0.7001142, 7);
    expectRounded(r.ci95[1], 2.4598858, 7);
    // Source: derived from domain-facts §3 mean and sd: dz = 1.58 / 1.229995 (sd rounded)
    expect(Math.abs(r.cohenDz - 1.58 / 1.229995)).toBeLessThan(1e-6);
    // common practice, no source: dz = t / √n
    expect(r.cohenDz).toBeCloseTo(r.t / Math.sqrt(10), 12);
  });

  it('reverses sign with the order: pairedT(g1, g2) gives the CI of g1 − g2', () => {
    const r = pairedT(g1, g2);
    // Source: domain-facts §3, 95 % CI of g1 − g2 = (−2.4598858, −0.7001142) [D]
    expectRounded(r.t, -4.062128, 6);
    expectRounded(r.ci95[0], -2.4598858, 7);
    expectRounded(r.ci95[1], -0.7001142, 7);
    expectRounded(r.p, 0.00283289, 9);
  });

  it('refuses unequal lengths, a single pair and constant differences', () => {
    expect(() => pairedT([1, 2], [1])).toThrow(RangeError);
    expect(() => pairedT([1], [2])).toThrow(RangeError);
    expect(() => pairedT([3, 4, 5], [1, 2, 3])).toThrow(/all equal/);
  });
});

describe('Welch and pooled two-sample t', () => {
  it('reproduces Welch on the sleep groups (g1 − g2)', () => {
    const r = welchT(g1, g2);
    // Source: domain-facts §3, sleep data Welch [D]
    expectRounded(r.t, -1.860813, 6);
    expectRounded(r.df, 17.77647, 5);
    expectRounded(r.p, 0.07939414, 8);
  });

  // NIST AUTO83B: US cars (n 249) vs Japanese cars (n 79). The summaries are rounded, so the
  // checks allow one unit in the last published digit.
  const us = { mean: 20.14458, sd: 6.4147, n: 249 };
  const japan = { mean: 30.48101, sd: 6.10771, n: 79 };

  it('reproduces the NIST pooled T from summary statistics', () => {
    const r = pooledFromSummary(us, japan);
    // Source: domain-facts §3, NIST e-Handbook §1.3.5.3 AUTO83B [C]
    expect(r.df).toBe(326);
    expect(Math.abs(r.t - -12.62059)).toBeLessThan(1e-5);
    expect(r.p).toBeLessThan(1e-20);
  });

  it('reproduces the NIST Welch T from summary statistics', () => {
    const r = welchFromSummary(us, japan);
    // Source: domain-facts §3, NIST e-Handbook §1.3.5.3 AUTO83B [C]
    expect(Math.abs(r.t - -12.946)).toBeLessThan(1e-3);
    expect(Math.abs(r.df - 136.87)).toBeLessThan(1e-2);
  });

  it('welchT equals welchFromSummary on the same data', () => {
    // common practice, no source: same formula from raw data or summaries
    const sd = (xs: number[]) => {
      const m = xs.reduce((s, x) => s + x, 0) / xs.length;
      return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
    };
    const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
    const fromSummary = welchFromSummary(
      { mean: mean(g1), sd: sd(g1), n: 10 },
      { mean: mean(g2), sd: sd(g2), n: 10 },
    );
    const raw = welchT(g1, g2);
    expect(raw.t).toBeCloseTo(fromSummary.t, 12);
    expect(raw.df).toBeCloseTo(fromSummary.df, 10);
  });
});

describe('wilcoxonSignedRank', () => {
  it('drops the zero difference of the sleep data and ranks the rest (V = 0 on one side)', () => {
    const r = wilcoxonSignedRank(sleepDiff);
    // Source: domain-facts §3, sleep Wilcoxon: one zero dropped (n = 9), V = 0 [D]
    expect(r.n).toBe(9);
    expect(r.zeros).toBe(1);
    expect(r.vMinus).toBe(0);
    expect(r.w).toBe(0);
    expect(r.vPlus).toBe(45);
    expect(r.method).toBe('exact');
  });

  it('gives the exact p 2/512 for the sleep data', () => {
    // Source: domain-facts §3, exact p ignoring ties = 2/512 = 0.00390625 [D]
    expect(2 * wilcoxonExactLowerTail(9, 0)).toBe(0.00390625);
    // With the tied ranks enumerated the answer is the same: only "all positive" reaches V− = 0.
    expect(wilcoxonSignedRank(sleepDiff).p).toBe(0.00390625);
  });

  it('gives the normal approximation with tie and continuity correction when forced', () => {
    const r = wilcoxonSignedRank(sleepDiff, { exact: false });
    expect(r.method).toBe('normal');
    // Source: domain-facts §3, normal approximation p ≈ 0.00909 [D]
    expectRounded(r.p, 0.00909, 5);
  });

  it('uses the normal approximation above 50 pairs, exact at 50', () => {
    const d = Array.from({ length: 51 }, (_, i) => (i % 3 === 0 ? -1 : 1) * (i + 1));
    expect(wilcoxonSignedRank(d).method).toBe('normal');
    expect(wilcoxonSignedRank(d.slice(0, 50)).method).toBe('exact');
  });

  it.each([
    [6, 0, 1 / 64, 20],
    [8, 3, 0.01953125, 20],
    [10, 8, 25 / 1024, 20],
    [20, 52, 0.0242205, 7],
  ])('exact lower tail n = %d: P(W ≤ %d) = %s', (n, w, expected, decimals) => {
    // Source: domain-facts §3, Wilcoxon exact lower-tail probabilities [D, computed exactly]
    expectRounded(wilcoxonExactLowerTail(n, w), expected, decimals);
  });

  it('without ties, the exact p is twice the lower tail of the smaller rank sum', () => {
    // common practice, no source: definition of the exact two-sided p
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 1, max: 500 }), { minLength: 1, maxLength: 25 }),
        fc.array(fc.boolean(), { minLength: 25, maxLength: 25 }),
        (magnitudes, signs) => {
          const d = magnitudes.map((m, i) => (signs[i] ? m : -m));
          const r = wilcoxonSignedRank(d);
          const expected = Math.min(1, 2 * wilcoxonExactLowerTail(r.n, r.w));
          return r.vPlus + r.vMinus === (r.n * (r.n + 1)) / 2 && Math.abs(r.p - expected) < 1e-15;
        },
      ),
    );
  });

  it('treats differences equal on paper as ties despite binary rounding', () => {
    // 1.1 − (−0.2) and 0.1 − (−1.2) differ in binary floating point but are both 1.3
    const r = wilcoxonSignedRank([1.1 - -0.2, 0.1 - -1.2, -0.5]);
    expect(r.vPlus).toBe(5); // ranks 2.5 + 2.5
    expect(r.vMinus).toBe(1);
  });
});

describe('wilsonInterval', () => {
  const zJstat = jStat.normal.inv(0.975, 0, 1);
  const wilsonJstat = (s: number, n: number) => {
    const p = s / n;
    const z2 = zJstat * zJstat;
    const centre = (p + z2 / (2 * n)) / (1 + z2 / n);
    const half = (zJstat / (1 + z2 / n)) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
    return [centre - half, centre + half] as const;
  };

  it('uses the 97.5 % normal quantile by default', () => {
    // Source: independent library: jstat
    expect(normalQuantile(0.975)).toBeCloseTo(zJstat, 12);
  });

  it.each([
    [0, 10],
    [1, 10],
    [7, 12],
    [5, 5],
    [12, 40],
    [99, 100],
    [250, 1000],
  ])('%d of %d matches the Wilson formula with jstat’s quantile', (s, n) => {
    const r = wilsonInterval(s, n);
    const [lo, hi] = wilsonJstat(s, n);
    // Source: independent library: jstat (normal quantile), Wilson score formula
    expect(r.estimate).toBe(s / n);
    expect(r.lo).toBeCloseTo(Math.max(0, lo), 12);
    expect(r.hi).toBeCloseTo(Math.min(1, hi), 12);
  });

  it('keeps 0 and n successes at the bounds and refuses impossible counts', () => {
    expect(wilsonInterval(0, 8).lo).toBe(0);
    expect(wilsonInterval(8, 8).hi).toBe(1);
    expect(() => wilsonInterval(9, 8)).toThrow(RangeError);
    expect(() => wilsonInterval(1.5, 8)).toThrow(RangeError);
    expect(() => wilsonInterval(0, 0)).toThrow(RangeError);
  });
});

describe('holm', () => {
  it('adjusts a small example step-down and keeps the input order', () => {
    // Worked by hand (common practice, no source): p = [0.01, 0.04, 0.03, 0.005], m = 4.
    // Sorted: 0.005·4 = 0.02, 0.01·3 = 0.03, 0.03·2 = 0.06, 0.04·1 = 0.04 → running max
    // 0.02, 0.03, 0.06, 0.06 → in input order [0.03, 0.06, 0.06, 0.02].
    const adjusted = holm([0.01, 0.04, 0.03, 0.005]);
    [0.03, 0.06, 0.06, 0.02].forEach((v, i) => expect(adjusted[i]).toBeCloseTo(v, 15));
  });

  it('caps at 1 and handles the empty list', () => {
    // By hand: [0.6, 0.7] → 0.6·2 = 1.2 → 1; max(1, 0.7) = 1.
    expect(holm([0.6, 0.7])).toEqual([1, 1]);
    expect(holm([])).toEqual([]);
    expect(() => holm([0.2, 1.5])).toThrow(RangeError);
  });

  it('never lowers a p-value and keeps the order of the raw p-values', () => {
    // common practice, no source: properties of Holm's adjustment
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 30 }), (ps) => {
        const adj = holm(ps);
        return ps.every(
          (p, i) =>
            (adj[i] as number) >= p &&
            (adj[i] as number) <= 1 &&
            ps.every((q, j) => !(p < q) || (adj[i] as number) <= (adj[j] as number)),
        );
      }),
    );
  });
});

describe('pairsForPower', () => {
  it('asks for 10 pairs when sd = delta (80 % power, two-sided α 0.05)', () => {
    // computed, approximation as documented (shifted central t); checked below against jstat
    expect(pairsForPower({ sdDiff: 1, delta: 1 })).toBe(10);
    expect(pairsForPower({ sdDiff: 2.5, delta: 2.5 })).toBe(10);
  });

  it('is the smallest n whose approximate power reaches the target, per jstat’s central t', () => {
    const approxPower = (n: number) => {
      const df = n - 1;
      const crit = jStat.studentt.inv(0.975, df);
      const ncp = Math.sqrt(n);
      return 1 - jStat.studentt.cdf(crit - ncp, df) + jStat.studentt.cdf(-crit - ncp, df);
    };
    // Source: independent library: jstat
    expect(approxPower(10)).toBeGreaterThanOrEqual(0.8);
    expect(approxPower(9)).toBeLessThan(0.8);
    expect(pairedTPower(10, { sdDiff: 1, delta: 1 })).toBeCloseTo(approxPower(10), 6);
  });

  it('gives the same 10 pairs as the exact noncentral t here', () => {
    const exactPower = (n: number) => {
      const df = n - 1;
      const crit = jStat.studentt.inv(0.975, df);
      const ncp = Math.sqrt(n);
      return 1 - jStat.noncentralt.cdf(crit, df, ncp) + jStat.noncentralt.cdf(-crit, df, ncp);
    };
    // Source: independent library: jstat (noncentral t)
    expect(exactPower(10)).toBeGreaterThanOrEqual(0.8);
    expect(exactPower(9)).toBeLessThan(0.8);
  });

  it('needs more pairs for smaller differences and never fewer than the normal formula', () => {
    // common practice, no source: power grows with delta/sd; the t needs more than the normal
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 5, noNaN: true }),
        fc.double({ min: 0.05, max: 5, noNaN: true }),
        (d1, d2) => {
          const [small, large] = d1 < d2 ? [d1, d2] : [d2, d1];
          const nSmall = pairsForPower({ sdDiff: 1, delta: small });
          const nLarge = pairsForPower({ sdDiff: 1, delta: large });
          const normalN = ((normalQuantile(0.975) + normalQuantile(0.8)) / small) ** 2;
          return nSmall >= nLarge && nLarge >= 2 && nSmall >= normalN;
        },
      ),
    );
  });

  it('needs more pairs for more power or a stricter alpha', () => {
    const base = pairsForPower({ sdDiff: 1, delta: 0.5 });
    expect(pairsForPower({ sdDiff: 1, delta: 0.5, power: 0.9 })).toBeGreaterThan(base);
    expect(pairsForPower({ sdDiff: 1, delta: 0.5, alpha: 0.01 })).toBeGreaterThan(base);
    expect(pairsForPower({ sdDiff: 1, delta: 100 })).toBe(2);
  });

  it('answers Infinity for no difference and refuses a negative one', () => {
    expect(pairsForPower({ sdDiff: 1, delta: 0 })).toBe(Infinity);
    expect(() => pairsForPower({ sdDiff: 1, delta: -1 })).toThrow(RangeError);
    expect(() => pairsForPower({ sdDiff: 0, delta: 1 })).toThrow(RangeError);
    expect(() => pairsForPower({ sdDiff: 1, delta: 1, power: 1 })).toThrow(RangeError);
  });
});
