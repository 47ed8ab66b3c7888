import { describe, expect, it } from 'vitest';
import { roundHalfUp } from './rounding.js';

// ECMA-402 (Intl.NumberFormat) defines roundingMode "halfCeil" — ties towards +∞ — on the
// number's decimal value; the JS engine's implementation is an independent check of ours.
const intlHalfCeil = (v: number, d: number) =>
  Number(
    new Intl.NumberFormat('en', {
      maximumFractionDigits: d,
      roundingMode: 'halfCeil',
      useGrouping: false,
    }).format(v),
  );

describe('roundHalfUp (worked table: round half up, y = ⌊x + ½⌋, ties towards +∞)', () => {
  const table: [value: number, decimals: number, expected: number][] = [
    [0.5, 0, 1],
    [1.5, 0, 2],
    [2.5, 0, 3],
    [3.5, 0, 4],
    [2.4999, 0, 2],
    [20.625, 0, 21],
    [22.25, 0, 22],
    [-2.5, 0, -2], // ties towards +∞, e.g. −23.5 → −23 in the usual definition of "half up"
    [-2.6, 0, -3],
    [1.005, 2, 1.01], // stored as 1.00499999999999989…; on paper it is a tie
    [2.675, 2, 2.68],
    [1.255, 2, 1.26],
    [0.615, 2, 0.62],
    [0.1 + 0.2, 1, 0.3],
    [4.35 * 10, 0, 44], // 43.49999999999999 in binary, 43.5 on paper
  ];
  it.each(table)('%d to %d places → %d', (value, decimals, expected) => {
    expect(roundHalfUp(value, decimals)).toBe(expected);
  });
  it('agrees with ECMA-402 Intl.NumberFormat roundingMode "halfCeil" on the table', () => {
    for (const [value, decimals] of table)
      expect(roundHalfUp(value, decimals)).toBe(intlHalfCeil(value, decimals));
  });
  it('naive rounding gets 1.005 wrong, which is why this exists (hand-worked)', () => {
    expect(Math.round(1.005 * 100) / 100).toBe(1);
    expect(roundHalfUp(1.005, 2)).toBe(1.01);
  });
  it('never returns −0', () => {
    expect(Object.is(roundHalfUp(-0.4), 0)).toBe(true);
  });
  it('rejects non-finite values and bad decimals', () => {
    expect(() => roundHalfUp(Number.NaN)).toThrow(/Cannot round/);
    expect(() => roundHalfUp(1, -1)).toThrow(/decimals/);
  });
});
