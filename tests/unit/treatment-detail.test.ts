import { createRequire } from 'node:module';
import { rankingFiltersFrom, rankingQueryString } from '../../components/api/rankings';
import { meanCi95 } from '../../components/rankings/intervals';
import { sampleSize } from '../../components/rankings/sample-size';
import {
  differenceDots,
  differenceSummary,
  pairLines,
  pairLinesSummary,
} from '../../components/rankings/treatment-chart-data';
import { treatmentHref } from '../../components/rankings/treatment-link';
import type { TreatmentPairOutput } from '../../shared/schemas/treatment';

// jstat ships no type declarations; this is the part the test uses.
const { jStat } = createRequire(__filename)('jstat') as {
  jStat: {
    studentt: { inv(p: number, df: number): number };
    noncentralt: { cdf(x: number, df: number, ncp: number): number };
  };
};

const outcome = (charLengthMm: number | null) => ({
  code: 'S',
  charLengthMm,
  afterflameS: 1,
  afterflameComplete: true,
  afterglowS: null,
  massLossPct: null,
  flamingDrips: false,
  burnedToClamp: false,
});
const pair = (control: number | null, treated: number | null, i: number): TreatmentPairOutput => ({
  pairId: `00000000-0000-4000-8000-00000000000${i}`,
  heldAt: '2026-03-01T10:00:00.000Z',
  batchCode: 'B-1',
  addOnPct: null,
  control: outcome(control),
  treated: outcome(treated),
});
const pairs = [pair(300, 52, 1), pair(300, 61, 2), pair(285, null, 3), pair(290, 310, 4)];
const mm = (v: number) => `${v} mm`;

describe('pairLines', () => {
  it('makes one two-point series per measured pair, control at x 0 and treated at x 1', () => {
    const lines = pairLines(pairs);
    expect(lines.keys).toEqual(['p0', 'p1', 'p2']);
    expect(lines.rows).toEqual([
      { x: 0, p0: 300, p1: 300, p2: 290 },
      { x: 1, p0: 52, p1: 61, p2: 310 },
    ]);
    expect(lines.top).toBeCloseTo(310 * 1.1, 9);
  });

  it('summarises the lines in words', () => {
    expect(pairLinesSummary(pairs, mm)).toBe(
      'Char length of 3 pairs, each a line from the control to the treated specimen. ' +
        'Controls 290 mm to 300 mm; treated 52 mm to 310 mm. ' +
        'The treated specimen charred less in 2 of 3.',
    );
    expect(pairLinesSummary([pair(null, 40, 1)], mm)).toMatch(/No pair/);
  });
});

describe('differenceDots', () => {
  it('plots control − treated per measured pair, numbered as listed, with zero and the interval in view', () => {
    const plot = differenceDots(pairs, { mean: 155.67, ci95: [-100, 400] });
    // The third pair has no treated char length: no dot, but the numbers follow the list.
    expect(plot.dots).toEqual([
      { x: 1, diff: 248 },
      { x: 2, diff: 239 },
      { x: 4, diff: -20 },
    ]);
    expect(plot.count).toBe(4);
    expect(plot.lo).toBeLessThan(-100);
    expect(plot.hi).toBeGreaterThan(400);
    const allAbove = differenceDots([pair(300, 50, 1), pair(300, 60, 2)], {
      mean: 245,
      ci95: [181.47, 308.53],
    });
    expect(allAbove.lo).toBeLessThan(0);
  });

  it('says whether the interval includes zero', () => {
    const excludes = differenceDots(pairs.slice(0, 2), { mean: 243.5, ci95: [186.3, 300.7] });
    expect(differenceSummary(excludes, mm)).toBe(
      'Paired differences (control − treated) of 2 pairs, from 239 mm to 248 mm. ' +
        'Mean 243.5 mm, 95 % CI 186.3 mm to 300.7 mm; the interval does not include zero.',
    );
    const includes = differenceDots(pairs, { mean: 155.67, ci95: [-100, 400] });
    expect(differenceSummary(includes, mm)).toMatch(/includes zero/);
  });
});

describe('meanCi95', () => {
  it('is the mean ± t(0.975, n − 1) · SD / √n', () => {
    // Source: domain-facts §3, NIST e-Handbook 1.3.6.7.2: t(0.975, 3) = 3.182; SD/√n = 2/2 = 1
    const [lo, hi] = meanCi95(10, 2, 4)!;
    expect(lo).toBeCloseTo(10 - 3.182, 3);
    expect(hi).toBeCloseTo(10 + 3.182, 3);
    expect(meanCi95(10, null, 4)).toBeNull();
    expect(meanCi95(10, 2, 1)).toBeNull();
  });
});

describe('sampleSize', () => {
  it('asks for the smallest n whose paired t-test reaches 80 % power', () => {
    // Source: independent library: jstat's noncentral t, two-sided α = 0.05, dz = 0.5
    const power = (n: number) => {
      const df = n - 1;
      const crit = jStat.studentt.inv(0.975, df);
      const ncp = 0.5 * Math.sqrt(n);
      return 1 - jStat.noncentralt.cdf(crit, df, ncp) + jStat.noncentralt.cdf(-crit, df, ncp);
    };
    let n = 2;
    while (power(n) < 0.8) n++;
    expect(sampleSize(5, 10, 12)).toEqual({ ok: true, needed: n, more: n - 12 });
    expect(sampleSize(5, 10, 50)).toEqual({ ok: true, needed: n, more: 0 });
  });

  it('refuses an empty, zero, negative or non-number reduction with a message', () => {
    expect(sampleSize(undefined, 10, 4)).toEqual({ ok: false, message: expect.any(String) });
    expect(sampleSize(Number.NaN, 10, 4)).toEqual({ ok: false, message: expect.any(String) });
    expect(sampleSize(0, 10, 4)).toEqual({
      ok: false,
      message: 'Enter a reduction larger than zero.',
    });
    expect(sampleSize(-3, 10, 4).ok).toBe(false);
    expect(sampleSize(5, null, 1)).toEqual({ ok: false, message: expect.stringMatching(/two/) });
    expect(sampleSize(5, 0, 3).ok).toBe(false);
  });
});

describe('treatmentHref', () => {
  it('encodes the key as one path segment and carries the filters back intact', () => {
    const key = '0b1c|linen / jute 50% #2?';
    const href = treatmentHref('lab-1', key, {
      sort: 'reduction',
      profile: 'preset:nfpa-705-field',
      unreviewed: true,
    });
    const url = new URL(href, 'http://x');
    const segments = url.pathname.split('/');
    expect(segments).toHaveLength(5);
    expect(decodeURIComponent(segments[4]!)).toBe(key);
    const back = rankingFiltersFrom(Object.fromEntries(url.searchParams));
    expect(back).toEqual({ sort: 'reduction', profile: 'preset:nfpa-705-field', unreviewed: true });
    expect(rankingQueryString(back)).toBe(url.search.slice(1));
  });
});
