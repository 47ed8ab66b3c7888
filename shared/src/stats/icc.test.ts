import { describe, expect, it } from 'vitest';
import { fQuantile } from './distributions.js';
import { icc } from './icc.js';

// Shrout, P. E., & Fleiss, J. L. (1979). Intraclass correlations: uses in assessing rater
// reliability. Psychological Bulletin, 86(2), 420–428. Table 2: 6 targets × 4 judges.
const SF = [
  [9, 2, 5, 8],
  [6, 1, 3, 2],
  [8, 4, 6, 8],
  [7, 1, 2, 6],
  [10, 5, 6, 9],
  [6, 2, 4, 7],
];

describe('icc against the Shrout & Fleiss (1979) worked example', () => {
  it('mean squares as published (Table 3: BMS 11.24, WMS 6.26, JMS 32.49, EMS 1.02)', () => {
    const { meanSquares: ms } = icc(SF, 'ICC(1,1)');
    expect(ms.between).toBeCloseTo(11.24, 2);
    expect(ms.within).toBeCloseTo(6.26, 2);
    expect(ms.judges).toBeCloseTo(32.49, 2);
    expect(ms.error).toBeCloseTo(1.02, 2);
  });
  it.each([
    ['ICC(1,1)', 0.17],
    ['ICC(2,1)', 0.29],
    ['ICC(3,1)', 0.71],
    ['ICC(1,k)', 0.44],
    ['ICC(2,k)', 0.62],
    ['ICC(3,k)', 0.91],
  ] as const)('%s = %d (Table 4, two decimals as published)', (form, published) => {
    const r = icc(SF, form);
    expect(Math.round(r.value * 100) / 100).toBe(published);
    expect(r.n).toBe(6);
    expect(r.k).toBe(4);
    expect(r.lower).toBeLessThan(r.value);
    expect(r.upper).toBeGreaterThan(r.value);
  });
  it('ICC(3,1) interval hand-worked with printed F-table values F_.975(5,15) = 3.576 and F_.975(15,5) = 6.428', () => {
    // F0 = BMS/EMS; FL = F0/3.576, FU = F0·6.428; bounds (F−1)/(F+k−1) (Shrout & Fleiss 1979, eq. for Case 3)
    const r = icc(SF, 'ICC(3,1)');
    const f0 = r.meanSquares.between / r.meanSquares.error;
    const fl = f0 / 3.576;
    const fu = f0 * 6.428;
    expect(r.lower).toBeCloseTo((fl - 1) / (fl + 3), 3);
    expect(r.upper).toBeCloseTo((fu - 1) / (fu + 3), 3);
    expect(r.lower).toBeCloseTo(0.34, 2);
    expect(r.upper).toBeCloseTo(0.95, 2);
  });
  it('ICC(2,1) interval follows McGraw & Wong (1996) Table 7 with Satterthwaite df (hand-worked with our F quantile)', () => {
    const r = icc(SF, 'ICC(2,1)');
    const { between: B, judges: J, error: E } = r.meanSquares;
    const n = 6;
    const k = 4;
    const rho = (B - E) / (B + (k - 1) * E + (k * (J - E)) / n);
    const a = (k * rho) / (n * (1 - rho));
    const b = 1 + (k * rho * (n - 1)) / (n * (1 - rho));
    const v = (a * J + b * E) ** 2 / ((a * J) ** 2 / (k - 1) + (b * E) ** 2 / ((n - 1) * (k - 1)));
    const fs = fQuantile(0.975, n - 1, v);
    expect(r.lower).toBeCloseTo(
      (n * (B - fs * E)) / (fs * (k * J + (k * n - k - n) * E) + n * B),
      10,
    );
  });
  it('intervals agree with R psych::ICC on this data to two decimals (values as commonly reproduced; from memory)', () => {
    const expected: [string, number, number][] = [
      ['ICC(1,1)', -0.13, 0.72],
      ['ICC(2,1)', 0.02, 0.76],
      ['ICC(3,1)', 0.34, 0.95],
      ['ICC(1,k)', -0.88, 0.91],
      ['ICC(2,k)', 0.07, 0.93],
      ['ICC(3,k)', 0.68, 0.99],
    ];
    for (const [form, lo, hi] of expected) {
      const r = icc(SF, form as 'ICC(1,1)');
      expect(Math.abs(r.lower - lo)).toBeLessThan(0.006);
      expect(Math.abs(r.upper - hi)).toBeLessThan(0.006);
    }
  });
  it('F tests: F = 1.80 on (5, 18) for ICC(1,·) and 11.03 on (5, 15) for ICC(2/3,·) (BMS/WMS, BMS/EMS from Table 3)', () => {
    expect(icc(SF, 'ICC(1,1)')).toMatchObject({ df1: 5, df2: 18 });
    expect(icc(SF, 'ICC(1,1)').f).toBeCloseTo(1.795, 2);
    expect(icc(SF, 'ICC(3,k)').f).toBeCloseTo(11.03, 1);
    expect(icc(SF, 'ICC(3,k)').p).toBeLessThan(0.001);
  });
  it('perfect agreement gives 1 for every form', () => {
    const same = [
      [1, 1],
      [4, 4],
      [7, 7],
      [3, 3],
    ];
    for (const form of ['ICC(1,1)', 'ICC(2,1)', 'ICC(3,1)'] as const)
      expect(icc(same, form).value).toBeCloseTo(1, 12);
  });
  it('a judge one mark higher throughout: consistency ICC(3,1) = 1, absolute agreement ICC(2,1) < 1 (Shrout & Fleiss Case 2 vs 3)', () => {
    const offset = [
      [1, 2],
      [4, 5],
      [7, 8],
      [3, 4],
    ];
    expect(icc(offset, 'ICC(3,1)').value).toBeCloseTo(1, 12);
    const two = icc(offset, 'ICC(2,1)');
    expect(two.value).toBeLessThan(1);
    expect(two.lower).toBeLessThan(two.value);
  });
  it('refuses missing marks, ragged rows and too little data', () => {
    expect(() =>
      icc(
        [
          [1, 2],
          [3, Number.NaN],
        ],
        'ICC(1,1)',
      ),
    ).toThrow(/Row 2, column 2/);
    expect(() => icc([[1, 2], [3]], 'ICC(1,1)')).toThrow(/Row 2 has 1/);
    expect(() => icc([[1, 2]], 'ICC(1,1)')).toThrow(/at least 2 targets/);
    expect(() => icc(SF, 'ICC(4,1)' as never)).toThrow(/Unknown ICC form/);
  });
});
