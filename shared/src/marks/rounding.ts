// Half-up rounding for marks (design.md §4.1).

/**
 * Rounds half up (towards +∞ on a tie): 0.5 → 1, 2.5 → 3, −2.5 → −2, the "round half up" rule
 * as usually defined (y = ⌊x + ½⌋). Ties are judged on the decimal the arithmetic meant, not on
 * its binary approximation: 1.005 is stored as 1.00499999999999989…, so a naive rounding to two
 * places gives 1.00; here the value is first brought to 15 significant digits (the precision a
 * double holds reliably), so 1.005 → 1.01 as a person working on paper would get.
 */
export function roundHalfUp(value: number, decimals = 0): number {
  if (!Number.isFinite(value)) throw new RangeError(`Cannot round ${String(value)}.`);
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 10) {
    throw new RangeError(`decimals must be a whole number from 0 to 10, got ${String(decimals)}.`);
  }
  const factor = 10 ** decimals;
  const scaled = Number((value * factor).toPrecision(15));
  const rounded = Math.floor(scaled + 0.5) / factor;
  // Avoid returning −0 for small negative values.
  return rounded === 0 ? 0 : rounded;
}
