import { describe, expect, it } from 'vitest';
import { krippendorffAlpha } from './krippendorff.js';

// Krippendorff, K. (2011). Computing Krippendorff's alpha-reliability. Annenberg School for
// Communication, University of Pennsylvania. Example C: 4 observers × 12 units with missing values.
const K = [
  [1, 2, 3, 3, 2, 1, 4, 1, 2, null, null, null],
  [1, 2, 3, 3, 2, 2, 4, 1, 2, 5, null, 3],
  [null, 3, 3, 3, 2, 3, 4, 2, 2, 5, 1, null],
  [1, 2, 3, 3, 2, 4, 4, 1, 2, 5, 1, null],
];

describe("Krippendorff's alpha against Krippendorff (2011), example with missing values", () => {
  it.each([
    ['nominal', 0.743],
    ['ordinal', 0.815],
    ['interval', 0.849],
    ['ratio', 0.797],
  ] as const)('%s α = %d (three decimals as published)', (level, published) => {
    const r = krippendorffAlpha(K, level);
    expect(Math.round(r.value * 1000) / 1000).toBe(published);
  });
  it('40 pairable values in 11 units (unit 12 has a single value and is left out), as in the worked example', () => {
    const r = krippendorffAlpha(K, 'nominal');
    expect(r.pairable).toBeCloseTo(40, 12);
    expect(r.units).toBe(11);
  });
  it('nominal text values work the same as numbers', () => {
    const text = K.map((row) => row.map((v) => (v === null ? null : `c${v}`)));
    expect(krippendorffAlpha(text, 'nominal').value).toBeCloseTo(
      krippendorffAlpha(K, 'nominal').value,
      12,
    );
  });
  it('perfect agreement is 1', () => {
    expect(
      krippendorffAlpha(
        [
          [1, 2, 3],
          [1, 2, 3],
        ],
        'interval',
      ).value,
    ).toBeCloseTo(1, 12);
  });
  it('refuses text at interval level, negative ratio values and data without variation', () => {
    expect(() =>
      krippendorffAlpha(
        [
          ['a', 'b'],
          ['a', 'b'],
        ],
        'interval',
      ),
    ).toThrow(/must be numbers/);
    expect(() =>
      krippendorffAlpha(
        [
          [-1, 2],
          [1, 2],
        ],
        'ratio',
      ),
    ).toThrow(/negative/);
    expect(() =>
      krippendorffAlpha(
        [
          [2, 2],
          [2, 2],
        ],
        'nominal',
      ),
    ).toThrow(/undefined/);
    expect(() => krippendorffAlpha([[1, 2]], 'nominal')).toThrow(/two observers/);
  });
});
