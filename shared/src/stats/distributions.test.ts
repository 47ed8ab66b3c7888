import { binomialDistribution, chiSquaredDistributionTable, gammaln } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { fCdf, fQuantile, incompleteBeta, logGamma, tQuantile } from './distributions.js';

describe('logGamma', () => {
  it('Γ(5) = 24, Γ(½) = √π, Γ(1) = 1 (closed forms)', () => {
    expect(logGamma(5)).toBeCloseTo(Math.log(24), 12);
    expect(logGamma(0.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI)), 12);
    expect(logGamma(1)).toBeCloseTo(0, 12);
  });
  it('agrees with simple-statistics gammaln', () => {
    for (const x of [0.3, 1.7, 3.5, 10, 42.25, 150]) expect(logGamma(x)).toBeCloseTo(gammaln(x), 8);
  });
});

describe('incompleteBeta', () => {
  it('closed forms: I_x(1,1) = x, I_x(a,1) = xᵃ, I_x(1,b) = 1 − (1−x)ᵇ, symmetry I_x(a,b) = 1 − I_{1−x}(b,a)', () => {
    expect(incompleteBeta(0.3, 1, 1)).toBeCloseTo(0.3, 14);
    expect(incompleteBeta(0.6, 3.5, 1)).toBeCloseTo(0.6 ** 3.5, 13);
    expect(incompleteBeta(0.2, 1, 4)).toBeCloseTo(1 - 0.8 ** 4, 13);
    expect(incompleteBeta(0.37, 2.5, 7)).toBeCloseTo(1 - incompleteBeta(0.63, 7, 2.5), 13);
  });
  it('binomial: P(X ≤ k−1) for Bin(n, p) = 1 − I_p(k, n−k+1), against simple-statistics binomialDistribution', () => {
    const n = 12;
    const p = 0.35;
    // simple-statistics stops its table once the cumulative probability passes 1 − 0.0001,
    // so only lower sums (which need no truncated terms) are compared.
    const pmf = binomialDistribution(n, p) ?? [];
    for (let k = 1; k <= pmf.length; k++) {
      const lower = pmf.slice(0, k).reduce((s, v) => s + v, 0);
      expect(1 - incompleteBeta(p, k, n - k + 1)).toBeCloseTo(lower, 9);
    }
    expect(pmf.length).toBeGreaterThan(8);
  });
});

describe('F distribution against published tables', () => {
  // Upper critical values F_{1−α}(d1, d2) from the NIST/SEMATECH e-Handbook of Statistical Methods,
  // §1.3.6.7.3 (printed to three decimals), and for α = 0.025 from standard printed F tables.
  const table: [p: number, d1: number, d2: number, value: number][] = [
    [0.95, 1, 1, 161.448],
    [0.95, 1, 10, 4.965],
    [0.95, 5, 10, 3.326],
    [0.95, 10, 10, 2.978],
    [0.95, 3, 15, 3.287],
    [0.95, 4, 20, 2.866],
    [0.99, 5, 10, 5.636],
    [0.99, 10, 10, 4.849],
    [0.9, 5, 10, 2.522],
    [0.975, 5, 15, 3.576],
    [0.975, 15, 5, 6.428],
  ];
  it.each(table)('F_%d(%d, %d) = %d', (p, d1, d2, value) => {
    expect(fQuantile(p, d1, d2)).toBeCloseTo(value, 3);
    expect(fCdf(value, d1, d2)).toBeCloseTo(p, 4);
  });
  it('F(2, 2) has the closed form P(F ≤ x) = x/(1+x), so F_0.95(2,2) = 19', () => {
    expect(fQuantile(0.95, 2, 2)).toBeCloseTo(19, 9);
    expect(fCdf(3, 2, 2)).toBeCloseTo(0.75, 12);
  });
  it('d1·F(d1, ∞) is χ²(d1): matches the simple-statistics χ² table (two decimals)', () => {
    for (const df of [1, 2, 5, 10]) {
      for (const level of ['0.05', '0.01'] as const) {
        const chi = chiSquaredDistributionTable[df as 1]![level];
        expect(df * fQuantile(1 - Number(level), df, 1e7)).toBeCloseTo(chi, 1);
      }
    }
  });
  it('non-integer degrees of freedom (as Satterthwaite gives) lie between their integer neighbours', () => {
    const f = fQuantile(0.975, 5, 7.4);
    expect(f).toBeLessThan(fQuantile(0.975, 5, 7));
    expect(f).toBeGreaterThan(fQuantile(0.975, 5, 8));
  });
});

describe('t quantiles against a printed t table (common two-sided 95 % values)', () => {
  it('t_0.975(10) = 2.228, t_0.975(9) = 2.262, t_0.975(30) = 2.042, t_0.95(5) = 2.015', () => {
    expect(tQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
    expect(tQuantile(0.975, 9)).toBeCloseTo(2.262, 3);
    expect(tQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
    expect(tQuantile(0.95, 5)).toBeCloseTo(2.015, 3);
    expect(tQuantile(0.025, 10)).toBeCloseTo(-2.228, 3);
  });
});
