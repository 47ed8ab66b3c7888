import { mean, sampleCovariance, variance } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { bandAgreement, cohenKappa, cohenKappaFromTable, fleissKappa } from './kappa.js';

describe('Cohen\'s kappa — worked examples reproduced in the Wikipedia article "Cohen\'s kappa"', () => {
  it('50 applications, Yes/Yes 20, Yes/No 5, No/Yes 10, No/No 15: pₒ = 0.7, pₑ = 0.5, κ = 0.4', () => {
    const r = cohenKappaFromTable([
      [20, 5],
      [10, 15],
    ]);
    expect(r.observed).toBeCloseTo(0.7, 12);
    expect(r.expected).toBeCloseTo(0.5, 12);
    expect(r.value).toBeCloseTo(0.4, 12);
    expect(r.n).toBe(50);
  });
  it('same agreement, different marginals: 45/15/25/15 → κ = 0.1304; 25/35/5/35 → κ = 0.2593', () => {
    expect(
      cohenKappaFromTable([
        [45, 15],
        [25, 15],
      ]).value,
    ).toBeCloseTo(0.1304, 4);
    expect(
      cohenKappaFromTable([
        [25, 35],
        [5, 35],
      ]).value,
    ).toBeCloseTo(0.2593, 4);
  });
  it('from raw ratings gives the same as from the table', () => {
    const a = [
      ...Array(20).fill('yes'),
      ...Array(5).fill('yes'),
      ...Array(10).fill('no'),
      ...Array(15).fill('no'),
    ];
    const b = [
      ...Array(20).fill('yes'),
      ...Array(5).fill('no'),
      ...Array(10).fill('yes'),
      ...Array(15).fill('no'),
    ];
    expect(cohenKappa(a, b).value).toBeCloseTo(0.4, 12);
  });
  it('standard error, hand-worked from Fleiss, Cohen & Everitt (1969) for the 20/5/10/15 table: √(0.2016 / 12.5) = 0.1270', () => {
    // Σ pᵢⱼ [wᵢⱼ − (w̄ᵢ. + w̄.ⱼ)(1−κ)]² = 0.04624 + 0.04356 + 0.05832 + 0.06348 = 0.2116;
    // minus (κ − pₑ(1−κ))² = 0.01 → 0.2016; divided by n(1−pₑ)² = 12.5.
    expect(
      cohenKappaFromTable([
        [20, 5],
        [10, 15],
      ]).standardError,
    ).toBeCloseTo(Math.sqrt(0.2016 / 12.5), 10);
  });
});

describe('weighted kappa', () => {
  const a = [0, 1, 2, 3, 4, 2, 3, 1, 4, 0, 2, 3, 3, 1, 2];
  const b = [0, 2, 2, 3, 3, 1, 4, 1, 4, 1, 2, 2, 3, 0, 3];
  it('quadratic weights equal Lin’s concordance 2·s_ab / (s_a² + s_b² + (ā − b̄)²) (Fleiss & Cohen 1973 equivalence), computed with simple-statistics', () => {
    // population (1/n) moments, as in the identity
    const n = a.length;
    const cov = (sampleCovariance(a, b) * (n - 1)) / n;
    const ccc = (2 * cov) / (variance(a) + variance(b) + (mean(a) - mean(b)) ** 2);
    expect(cohenKappa(a, b, 'quadratic').value).toBeCloseTo(ccc, 12);
  });
  it('linear weights, hand-worked on a 3×3 table [[10,4,1],[3,12,5],[0,2,13]] (ours): κ_w = 0.6262', () => {
    // n = 50; rows 15, 20, 15; columns 13, 18, 19. Disagreement weights |i−j|/2.
    // observed disagreement = (4·½ + 1·1 + 3·½ + 5·½ + 0·1 + 2·½)/50 = 8/50 = 0.16
    // expected disagreement = Σ rᵢcⱼ|i−j|/2 / 2500 = (135 + 285 + 130 + 190 + 195 + 135)/2500 = 1070/2500 = 0.428
    // → κ_w = 1 − 0.16/0.428 = 0.6262
    const r = cohenKappaFromTable(
      [
        [10, 4, 1],
        [3, 12, 5],
        [0, 2, 13],
      ],
      'linear',
    );
    expect(r.value).toBeCloseTo(1 - 0.16 / 0.428, 10);
    expect(r.value).toBeCloseTo(0.6262, 4);
  });
  it('weights do not change kappa for two categories (common property)', () => {
    const t = [
      [20, 5],
      [10, 15],
    ];
    expect(cohenKappaFromTable(t, 'linear').value).toBeCloseTo(0.4, 12);
    expect(cohenKappaFromTable(t, 'quadratic').value).toBeCloseTo(0.4, 12);
  });
  it('text categories need their order for weights; nulls are left out', () => {
    expect(() => cohenKappa(['pass', 'merit'], ['merit', 'pass'], 'linear')).toThrow(/categories/);
    const r = cohenKappa(
      ['pass', 'merit', null, 'pass'],
      ['pass', 'merit', 'pass', 'merit'],
      'linear',
      { categories: ['pass', 'merit', 'distinction'] },
    );
    expect(r.n).toBe(3);
  });
  it('refuses unequal lengths and a single category', () => {
    expect(() => cohenKappa([1, 2], [1])).toThrow(/different numbers/);
    expect(() => cohenKappa([1, 1], [1, 1])).toThrow(/undefined/);
  });
});

describe('Fleiss\' kappa — Fleiss (1971) style example reproduced in the Wikipedia article "Fleiss\' kappa"', () => {
  // 10 subjects, 14 raters, 5 categories
  const table = [
    [0, 0, 0, 0, 14],
    [0, 2, 6, 4, 2],
    [0, 0, 3, 5, 6],
    [0, 3, 9, 2, 0],
    [2, 2, 8, 1, 1],
    [7, 7, 0, 0, 0],
    [3, 2, 6, 3, 0],
    [2, 5, 3, 2, 2],
    [6, 5, 2, 1, 0],
    [0, 2, 2, 3, 7],
  ];
  it('P̄ = 0.378, P̄ₑ = 0.213, κ = 0.210; pⱼ = 0.143, 0.200, 0.279, 0.150, 0.229', () => {
    const r = fleissKappa(table);
    expect(r.observed).toBeCloseTo(0.378, 3);
    expect(r.expected).toBeCloseTo(0.213, 3);
    expect(r.value).toBeCloseTo(0.21, 3);
    [0.143, 0.2, 0.279, 0.15, 0.229].forEach((p, j) =>
      expect(r.categoryShares[j]).toBeCloseTo(p, 3),
    );
    expect(r).toMatchObject({ subjects: 10, raters: 14 });
  });
  it('refuses subjects with different numbers of raters', () => {
    expect(() =>
      fleissKappa([
        [1, 2],
        [2, 2],
      ]),
    ).toThrow(/Subject 2 has 4 ratings/);
  });
});

describe('bandAgreement (hand-worked)', () => {
  it('exact 2 of 4, within one band 3 of 4', () => {
    const order = ['not_yet_passed', 'pass', 'merit', 'distinction'];
    expect(
      bandAgreement(
        ['pass', 'merit', 'distinction', 'pass'],
        ['pass', 'distinction', 'distinction', 'distinction'],
        order,
      ),
    ).toEqual({
      n: 4,
      exact: 0.5,
      withinOne: 0.75,
    });
  });
});
