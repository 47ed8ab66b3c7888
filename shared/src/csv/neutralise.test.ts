import { describe, expect, it } from 'vitest';
import { neutraliseCsvCell, neutraliseCsvRow } from './neutralise.js';

// OWASP, "CSV Injection" (owasp.org community page): prepend a single quote to cells that begin
// with = + - @, tab (0x09) or carriage return (0x0D), so spreadsheets treat them as text.
describe('neutraliseCsvCell (OWASP CSV Injection guidance)', () => {
  it.each([
    ['=1+1', "'=1+1"],
    ['+SUM(A1:A2)', "'+SUM(A1:A2)"],
    ['-2+3', "'-2+3"],
    ['@SUM(1)', "'@SUM(1)"],
    ['\tTAB', "'\tTAB"],
    ['\rCR', "'\rCR"],
    ['=HYPERLINK("http://example.invalid","x")', '\'=HYPERLINK("http://example.invalid","x")'],
  ])('%j → %j', (input, expected) => {
    expect(neutraliseCsvCell(input)).toBe(expected);
  });
  it('leaves safe text, the empty string and formula characters later in the cell alone', () => {
    expect(neutraliseCsvCell('Ada Example')).toBe('Ada Example');
    expect(neutraliseCsvCell('')).toBe('');
    expect(neutraliseCsvCell('a=b')).toBe('a=b');
  });
  it('passes numbers, booleans and null through (a negative number is data, not a formula)', () => {
    expect(neutraliseCsvCell(-5)).toBe(-5);
    expect(neutraliseCsvCell(true)).toBe(true);
    expect(neutraliseCsvCell(null)).toBeNull();
    expect(neutraliseCsvRow(['=x', 3, null, 'ok'] as const)).toEqual(["'=x", 3, null, 'ok']);
  });
});
