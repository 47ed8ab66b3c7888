import { describe, expect, it } from 'vitest';
import { contrastRatio, relativeLuminance } from './contrast.js';

describe('WCAG 2.1 contrast', () => {
  it('black on white is 21:1 (WCAG 2.1, definition of contrast ratio: range 1 to 21)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 6);
  });
  it('equal colours are 1:1 (WCAG 2.1 definition)', () => {
    expect(contrastRatio('#777777', '#777')).toBeCloseTo(1, 6);
  });
  it('white has luminance 1 and black 0 (WCAG 2.1 relative luminance definition)', () => {
    expect(relativeLuminance('#fff')).toBeCloseTo(1, 9);
    expect(relativeLuminance('#000')).toBe(0);
  });
  it('#767676 on white is about 4.54:1, the commonly cited lightest AA grey (common practice)', () => {
    expect(contrastRatio('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
  });
  it('order does not matter', () => {
    expect(contrastRatio('#1f2a44', '#faf7f0')).toBeCloseTo(contrastRatio('#faf7f0', '#1f2a44'), 9);
  });
  it('rejects something that is not a colour', () => {
    expect(() => contrastRatio('blue', '#fff')).toThrow(/Not a hex colour/);
  });
});
