import { describe, expect, it } from 'vitest';
import { contrastRatio } from '@stavemark/shared';
import { colours, cssVariables, textPairs, uiPairs } from './tokens';
import themeCss from './theme.css?raw';
import appCss from '../app.css?raw';

const sheets = [themeCss, appCss];

// Source: WCAG 2.1, SC 1.4.3 Contrast (Minimum), level AA: text needs at least 4.5:1;
// SC 1.4.11 Non-text Contrast: UI component boundaries and focus indicators need 3:1.
// Contrast ratio and relative luminance as defined in WCAG 2.1's glossary.
const AA_TEXT = 4.5;
const AA_NON_TEXT = 3;

describe('theme colours (blue on paper)', () => {
  it('uses the contrast definition whose reference value is black on white = 21:1 (WCAG 2.1)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10);
    expect(contrastRatio('#777777', '#777777')).toBeCloseTo(1, 10);
  });

  it('keeps the design colours of design.md §9', () => {
    expect(colours.ink).toBe('#1f2a44');
    expect(colours.paper).toBe('#faf7f0');
    expect(colours.copper).toBe('#8c4a17');
  });

  it('measures the pairs design.md §9 quotes (13.3, 6.3, 6.8 to one decimal)', () => {
    expect(contrastRatio(colours.ink, colours.paper)).toBeCloseTo(13.3, 1);
    expect(contrastRatio(colours.copper, colours.paper)).toBeCloseTo(6.3, 1);
    expect(contrastRatio(colours.onCopper, colours.copper)).toBeCloseTo(6.8, 1);
  });

  it.each(textPairs)(
    'text pair "$use" ($text on $background) reaches 4.5:1',
    ({ text, background }) => {
      expect(contrastRatio(colours[text], colours[background])).toBeGreaterThanOrEqual(AA_TEXT);
    },
  );

  it.each(uiPairs)('UI pair "$use" reaches 3:1', ({ part, background }) => {
    expect(contrastRatio(colours[part], colours[background])).toBeGreaterThanOrEqual(AA_NON_TEXT);
  });

  it('every CSS variable the stylesheets use is defined from the tokens', () => {
    const defined = new Set(Object.keys(cssVariables()));
    const used = new Set(
      sheets.flatMap((css) =>
        [...css.matchAll(/var\((--sm-[a-z-]+)\)/g)].map((m) => m[1] as string),
      ),
    );
    expect(used.size).toBeGreaterThan(10);
    for (const name of used) expect(defined, `${name} is used but not a token`).toContain(name);
  });

  it('the stylesheets name no colour of their own outside the tokens (so the pairs above are all there is)', () => {
    // rgba() overlays and shadows are allowed (they carry no text); hex colours are not.
    for (const css of sheets) expect(css.match(/#[0-9a-f]{3,8}\b/gi) ?? []).toEqual([]);
  });
});
