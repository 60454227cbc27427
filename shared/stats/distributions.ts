/**
 * Student t and standard normal distribution functions.
 *
 * Written here rather than taken from simple-statistics: its `cumulativeStdNormalProbability` reads
 * a 4-decimal table, and its `probit(0.975)` is 1.95716 instead of 1.95996, neither good enough for
 * p-values and critical values. Every constant below is derivable (Bernoulli numbers, √π, ln 2π)
 * except the starting guess of `normalQuantile`, which Halley steps then polish to full precision.
 *
 * Accuracy (relative, against 40-digit arithmetic while writing this): normal CDF and quantile
 * ~1e-15; t CDF ~1e-13 for df ≤ 1000, ~1e-11 by df = 10⁵ (the continued fraction gathers rounding
 * over its many steps when df is large). jstat, the tests' independent reference, is itself only
 * good to ~1e-8 for the t distribution.
 */

const EPS = 1e-16;
const TINY = 1e-300;
const MAX_ITERATIONS = 10_000;
const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);
const SQRT_PI = Math.sqrt(Math.PI);
/** B₂ₖ / (2k(2k − 1)) for k = 1 … 7 (Bernoulli numbers B₂ … B₁₄): Stirling's series. */
const STIRLING = [1 / 12, -1 / 360, 1 / 1260, -1 / 1680, 1 / 1188, -691 / 360360, 1 / 156];

/** δ(z) = ln Γ(z) − [(z − ½) ln z − z + ½ ln 2π], Stirling's series; accurate for z ≥ 15. */
function stirlingCorrection(z: number): number {
  const inv = 1 / z;
  const inv2 = inv * inv;
  let series = 0;
  for (let k = STIRLING.length - 1; k >= 0; k--) series = series * inv2 + (STIRLING[k] ?? 0);
  return series * inv;
}

/**
 * ln Γ(x) for x > 0: Stirling's series after shifting x to at least 15 with Γ(x + 1) = xΓ(x);
 * at z ≥ 15 the first omitted term of the series is below 1e-19.
 */
export function lnGamma(x: number): number {
  if (!(x > 0)) throw new RangeError(`lnGamma needs x > 0, got ${x}`);
  if (x === Infinity) return Infinity;
  let shift = 0;
  let z = x;
  while (z < 15) {
    shift += Math.log(z);
    z += 1;
  }
  return (z - 0.5) * Math.log(z) - z + LN_SQRT_2PI + stirlingCorrection(z) - shift;
}

/**
 * ln B(a, b) = ln Γ(a) + ln Γ(b) − ln Γ(a + b). For a large argument the three ln Γ values are
 * large and nearly cancel (df = 10⁵ would lose five digits), so the difference ln Γ(big) −
 * ln Γ(big + small) is taken from Stirling's formula with log1p, where no large terms remain.
 */
export function lnBeta(a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new RangeError(`lnBeta needs a, b > 0, got ${a}, ${b}`);
  const small = Math.min(a, b);
  const big = Math.max(a, b);
  if (big < 15) return lnGamma(a) + lnGamma(b) - lnGamma(a + b);
  const sum = big + small;
  const lnRatio =
    -(big - 0.5) * Math.log1p(small / big) -
    small * Math.log(sum) +
    small +
    stirlingCorrection(big) -
    stirlingCorrection(sum);
  return lnGamma(small) + lnRatio;
}

/** Continued fraction of the incomplete beta function, modified Lentz (Numerical Recipes §6.4). */
function betaContinuedFraction(a: number, b: number, x: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= MAX_ITERATIONS; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPS) return h;
  }
  throw new Error(`incomplete beta did not converge (a = ${a}, b = ${b}, x = ${x})`);
}

/**
 * I_x(a, b) given both x and y = 1 − x: callers that know 1 − x more precisely than the subtraction
 * would give it (the t tails: x = df/(df + t²), y = t²/(df + t²)) keep that precision.
 */
function incompleteBeta(x: number, y: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (y <= 0) return 1;
  const lnX = x < 0.5 ? Math.log(x) : Math.log1p(-y);
  const lnY = y < 0.5 ? Math.log(y) : Math.log1p(-x);
  const front = Math.exp(a * lnX + b * lnY - lnBeta(a, b));
  // The continued fraction converges fast only on this side of the mean; use the symmetry
  // I_x(a, b) = 1 − I_{1−x}(b, a) on the other.
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, y)) / b;
}

/** The regularized incomplete beta function I_x(a, b). */
export function regularizedIncompleteBeta(x: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new RangeError(`need a, b > 0, got a = ${a}, b = ${b}`);
  if (Number.isNaN(x) || x < 0 || x > 1) throw new RangeError(`need 0 ≤ x ≤ 1, got ${x}`);
  return incompleteBeta(x, 1 - x, a, b);
}

function checkDf(df: number): void {
  if (!(df > 0)) throw new RangeError(`degrees of freedom must be > 0, got ${df}`);
}

/**
 * P(T > t) for t ≥ 0, computed directly (not as 1 − CDF) so small tail probabilities keep their
 * relative precision: P(|T| > t) = I_{df/(df+t²)}(df/2, 1/2).
 */
function tUpperTail(t: number, df: number): number {
  if (t === Infinity) return 0;
  if (df === Infinity) return normalUpperTail(t);
  const t2 = t * t;
  return 0.5 * incompleteBeta(df / (df + t2), t2 / (df + t2), df / 2, 0.5);
}

/** Two-sided p-value P(|T| ≥ |t|) of Student's t with df degrees of freedom. */
export function tTwoSidedP(t: number, df: number): number {
  checkDf(df);
  if (Number.isNaN(t)) return NaN;
  return Math.min(1, 2 * tUpperTail(Math.abs(t), df));
}

/** Student t cumulative distribution function P(T ≤ t); df may be fractional (Welch) or Infinity. */
export function tCdf(t: number, df: number): number {
  checkDf(df);
  if (Number.isNaN(t)) return NaN;
  return t >= 0 ? 1 - tUpperTail(t, df) : tUpperTail(-t, df);
}

/** Student t density, for the Newton steps of the quantile. */
function tPdf(t: number, df: number): number {
  if (df === Infinity) return Math.exp(-0.5 * t * t - LN_SQRT_2PI);
  // f(t) = (1 + t²/df)^(−(df+1)/2) / (√df · B(df/2, 1/2))
  return Math.exp(
    -((df + 1) / 2) * Math.log1p((t * t) / df) - 0.5 * Math.log(df) - lnBeta(df / 2, 0.5),
  );
}

/**
 * Student t quantile: the t with P(T ≤ t) = p. The two-sided critical value at confidence c is
 * `tQuantile(1 − (1 − c)/2, df)`, see `tCritical`.
 *
 * Solves P(T > t) = q (q = the smaller tail) for t > 0 by Newton steps kept inside a bracket, with
 * bisection whenever a step leaves it; the starting point is the normal quantile with the first two
 * Cornish–Fisher terms (Abramowitz & Stegun 26.7.5), which only affects the speed.
 */
export function tQuantile(p: number, df: number): number {
  checkDf(df);
  if (Number.isNaN(p) || p < 0 || p > 1) throw new RangeError(`need 0 ≤ p ≤ 1, got ${p}`);
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  if (df === Infinity) return normalQuantile(p);
  const sign = p < 0.5 ? -1 : 1;
  const q = p < 0.5 ? p : 1 - p;

  const z = -normalQuantile(q);
  const z3 = z * z * z;
  let guess = z + (z3 + z) / (4 * df) + (5 * z3 * z * z + 16 * z3 + 3 * z) / (96 * df * df);
  if (!(guess > 0) || !Number.isFinite(guess)) guess = 1;

  let lo = 0;
  let hi = Math.max(guess, 1);
  while (tUpperTail(hi, df) > q) {
    lo = hi;
    hi *= 2;
    if (!Number.isFinite(hi)) return sign * Infinity;
  }
  let t = Math.min(Math.max(guess, lo), hi);
  for (let i = 0; i < 500; i++) {
    const f = tUpperTail(t, df) - q;
    if (f === 0) break;
    if (f > 0) lo = t;
    else hi = t;
    let next = t + f / tPdf(t, df);
    if (!(next > lo && next < hi))
      next = lo > 0 && hi / lo > 4 ? Math.sqrt(lo * hi) : (lo + hi) / 2;
    if (Math.abs(next - t) <= 1e-15 * t || hi - lo <= 1e-15 * hi) {
      t = next;
      break;
    }
    t = next;
  }
  return sign * t;
}

/** Two-sided critical value of Student's t: e.g. `tCritical(0.95, 9)` = 2.262. */
export function tCritical(confidence: number, df: number): number {
  if (!(confidence > 0 && confidence < 1)) {
    throw new RangeError(`confidence must be between 0 and 1, got ${confidence}`);
  }
  return tQuantile(1 - (1 - confidence) / 2, df);
}

/**
 * erfc(y) for y ≥ 0 through the incomplete gamma function, erfc(y) = Q(1/2, y²): its power series
 * for y² < 1.5, its continued fraction (modified Lentz) beyond (Numerical Recipes §6.2).
 */
function erfcNonNegative(y: number): number {
  const x = y * y;
  if (x === 0) return 1;
  if (x > 750) return 0;
  if (x < 1.5) {
    // P(1/2, x) = e^{−x} x^{1/2} / Γ(1/2) · Σ xⁿ / ((1/2)(3/2)…(1/2 + n)), Γ(1/2) = √π
    let ap = 0.5;
    let term = 1 / 0.5;
    let sum = term;
    for (let n = 0; n < MAX_ITERATIONS; n++) {
      ap += 1;
      term *= x / ap;
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * EPS) break;
    }
    return 1 - (sum * Math.exp(-x) * y) / SQRT_PI;
  }
  let b = x + 0.5;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i <= MAX_ITERATIONS; i++) {
    const an = -i * (i - 0.5);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPS) break;
  }
  return (Math.exp(-x) * y * h) / SQRT_PI;
}

/** P(Z > z) for z ≥ 0 without cancellation. */
function normalUpperTail(z: number): number {
  return 0.5 * erfcNonNegative(z / Math.SQRT2);
}

/** Standard normal cumulative distribution function Φ(z). */
export function normalCdf(z: number): number {
  if (Number.isNaN(z)) return NaN;
  if (z === Infinity) return 1;
  if (z === -Infinity) return 0;
  return z >= 0 ? 1 - normalUpperTail(z) : normalUpperTail(-z);
}

/**
 * Standard normal quantile Φ⁻¹(p). Start: Abramowitz & Stegun 26.2.23 (error < 4.5e-4); then
 * Halley steps on the smaller tail (cubic convergence) to full double precision.
 */
export function normalQuantile(p: number): number {
  if (Number.isNaN(p) || p < 0 || p > 1) throw new RangeError(`need 0 ≤ p ≤ 1, got ${p}`);
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  const q = p < 0.5 ? p : 1 - p;
  // Work with x > 0 and P(Z > x) = q.
  const s = Math.sqrt(-2 * Math.log(q));
  let x =
    s -
    (2.515517 + 0.802853 * s + 0.010328 * s * s) /
      (1 + 1.432788 * s + 0.189269 * s * s + 0.001308 * s * s * s);
  for (let i = 0; i < 20; i++) {
    const upper = x >= 0 ? normalUpperTail(x) : 1 - normalUpperTail(-x);
    // f(x) = P(Z > x) − q has f′ = −φ, f″ = xφ, so Halley's step is u / (1 − x·u/2), u = f/φ.
    const u = (upper - q) * Math.exp(0.5 * x * x + LN_SQRT_2PI);
    const step = u / (1 - (x * u) / 2);
    x += step;
    if (Math.abs(step) <= 1e-15 * Math.max(1, Math.abs(x))) break;
  }
  return p < 0.5 ? -x : x;
}
