import { mean, sampleStandardDeviation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { interpret, KOO_LI_2016, KRIPPENDORFF_2004, LANDIS_KOCH_1977 } from './interpretation.js';
import { MIN_SHEETS_FOR_SEVERITY, severity } from './severity.js';

describe('severity', () => {
  const examiner = [14, 16, 12, 18, 15, 13, 17, 14, 16, 15];
  const other = [15, 17, 14, 18, 16, 15, 17, 16, 16, 17];
  it('mean difference and SD agree with simple-statistics; SE = sd/√n; 95 % interval with t_.975(9) = 2.262 (printed t table)', () => {
    const d = examiner.map((v, i) => v - (other[i] as number));
    const r = severity(examiner.map((e, i) => ({ examiner: e, other: other[i] as number })));
    expect(r.meanDifference).toBeCloseTo(mean(d), 12);
    expect(r.standardDeviation).toBeCloseTo(sampleStandardDeviation(d), 12);
    expect(r.standardError).toBeCloseTo(sampleStandardDeviation(d) / Math.sqrt(10), 12);
    expect(r.lower).toBeCloseTo(mean(d) - 2.262 * (r.standardError as number), 3);
    expect(r.n).toBe(10);
    expect(r.enough).toBe(false);
  });
  it('hand-worked: differences −1, −1, −2, 0, −1, −2, 0, −2, 0, −2 → mean −1.1, sd 0.8756, se 0.2769', () => {
    const r = severity(examiner.map((e, i) => ({ examiner: e, other: other[i] as number })));
    expect(r.meanDifference).toBeCloseTo(-1.1, 12);
    expect(r.standardDeviation).toBeCloseTo(Math.sqrt(6.9 / 9), 12);
    expect(r.standardError).toBeCloseTo(Math.sqrt(6.9 / 9) / Math.sqrt(10), 12);
  });
  it(`is "enough" from ${MIN_SHEETS_FOR_SEVERITY} pairs (design.md §4.5), leaves out incomplete pairs`, () => {
    const pairs = Array.from({ length: 21 }, (_, i) => ({
      examiner: i % 3,
      other: i === 0 ? null : 1,
    }));
    const r = severity(pairs);
    expect(r.n).toBe(20);
    expect(r.enough).toBe(true);
    expect(severity([{ examiner: 3, other: 1 }])).toMatchObject({
      meanDifference: 2,
      standardError: null,
      n: 1,
    });
    expect(() => severity([{ examiner: null, other: 1 }])).toThrow(/No complete pair/);
  });
});

describe('interpretation bands as published', () => {
  it('Koo & Li (2016): < .5 poor, .5–.75 moderate, .75–.9 good, > .9 excellent', () => {
    expect([0.49, 0.5, 0.74, 0.75, 0.9, 0.91].map((v) => interpret(v, KOO_LI_2016).label)).toEqual([
      'poor',
      'moderate',
      'moderate',
      'good',
      'good',
      'excellent',
    ]);
    expect(interpret(0.6, KOO_LI_2016).source).toMatch(/Koo.*2016/);
  });
  it('Landis & Koch (1977): < 0 poor, 0–.20 slight, .21–.40 fair, .41–.60 moderate, .61–.80 substantial, .81–1 almost perfect', () => {
    expect(
      [-0.1, 0, 0.2, 0.21, 0.4, 0.41, 0.6, 0.61, 0.8, 0.81, 1].map(
        (v) => interpret(v, LANDIS_KOCH_1977).label,
      ),
    ).toEqual([
      'poor',
      'slight',
      'slight',
      'fair',
      'fair',
      'moderate',
      'moderate',
      'substantial',
      'substantial',
      'almost perfect',
      'almost perfect',
    ]);
  });
  it('Krippendorff (2004): α ≥ .800 reliable, ≥ .667 tentative', () => {
    expect([0.85, 0.743, 0.6].map((v) => interpret(v, KRIPPENDORFF_2004).label)).toEqual([
      'reliable',
      'tentative conclusions only',
      'unreliable',
    ]);
  });
});
