// Special functions and the F and t distributions needed for confidence intervals of ICCs and
// severity. Written here (small, pure) rather than pulling a large statistics package into the
// web bundle; each function is tested against published tables and a general-purpose library.

/** ln Γ(x) for x > 0 — Lanczos approximation (g = 7, 9 coefficients), with reflection below ½. */
export function logGamma(x: number): number {
  if (!(x > 0)) throw new RangeError(`logGamma needs x > 0, got ${String(x)}.`);
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const c = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
    -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
    1.5056327351493116e-7,
  ];
  const z = x - 1;
  let a = c[0] as number;
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += (c[i] as number) / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

/** Continued fraction for the incomplete beta (modified Lentz's method). */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const TINY = 1e-300;
  const EPS = 1e-15;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 10000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < EPS) return h;
  }
  throw new RangeError('Incomplete beta did not converge.');
}

/** Regularised incomplete beta I_x(a, b), for 0 ≤ x ≤ 1 and a, b > 0. */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0))
    throw new RangeError(`incompleteBeta needs a, b > 0, got ${String(a)}, ${String(b)}.`);
  if (!(x >= 0 && x <= 1))
    throw new RangeError(`incompleteBeta needs 0 ≤ x ≤ 1, got ${String(x)}.`);
  if (x === 0) return 0;
  if (x === 1) return 1;
  const front = Math.exp(
    logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x),
  );
  // The continued fraction converges fast for x < (a+1)/(a+b+2); use symmetry otherwise.
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(x, a, b)) / a;
  return 1 - (front * betaContinuedFraction(1 - x, b, a)) / b;
}

function checkDf(name: string, df: number): void {
  if (!(df > 0) || !Number.isFinite(df))
    throw new RangeError(`${name} must be a positive number, got ${String(df)}.`);
}

/** P(F ≤ x) for the F distribution with (d1, d2) degrees of freedom (non-integer df allowed). */
export function fCdf(x: number, d1: number, d2: number): number {
  checkDf('d1', d1);
  checkDf('d2', d2);
  if (x <= 0) return 0;
  if (x === Infinity) return 1;
  return incompleteBeta((d1 * x) / (d1 * x + d2), d1 / 2, d2 / 2);
}

/**
 * The p-quantile of F(d1, d2): the x with P(F ≤ x) = p. Found by bisection on the beta variable
 * y = d1·x / (d1·x + d2) ∈ (0, 1), which is monotone and bounded, so it always converges.
 */
export function fQuantile(p: number, d1: number, d2: number): number {
  checkDf('d1', d1);
  checkDf('d2', d2);
  if (!(p > 0 && p < 1))
    throw new RangeError(`p must be strictly between 0 and 1, got ${String(p)}.`);
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < 200 && hi - lo > 1e-16; i++) {
    const mid = (lo + hi) / 2;
    if (incompleteBeta(mid, d1 / 2, d2 / 2) < p) lo = mid;
    else hi = mid;
  }
  const y = (lo + hi) / 2;
  return (d2 * y) / (d1 * (1 - y));
}

/** Student's t quantile, from F(1, df) = t²: for p > ½, t_p = √F_{2p−1}(1, df). */
export function tQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1))
    throw new RangeError(`p must be strictly between 0 and 1, got ${String(p)}.`);
  if (p === 0.5) return 0;
  const t = Math.sqrt(fQuantile(Math.abs(2 * p - 1), 1, df));
  return p > 0.5 ? t : -t;
}
