/**
 * "Blue on paper" (design.md §9): the one place the theme's colours are defined.
 * apply-theme.ts turns them into CSS variables; theme.contrast.test.ts checks every text pair.
 */
export const colours = {
  /** Structural: navigation bar, headings, table rules, body text. */
  ink: '#1f2a44',
  /** A lighter ink for the active navigation item and hover on the bar. */
  inkRaised: '#33426a',
  /** Secondary text (captions, table headers' helper text). */
  inkMuted: '#525a6b',
  paper: '#faf7f0',
  /** Cards, tables and dialogs sit on a slightly lighter sheet. */
  sheet: '#ffffff',
  /** Alternate table rows and hovered rows: a shade of the paper. */
  paperShade: '#f1ece1',
  /** Light rules between table rows; structural rules use ink. */
  rule: '#d8d1c2',
  /** Form field borders: 3:1 against the sheet (WCAG 2.1 SC 1.4.11, non-text contrast). */
  fieldBorder: '#857d6c',
  /** Only for primary buttons. */
  copper: '#8c4a17',
  copperHover: '#723b10',
  onCopper: '#ffffff',
  onInk: '#ffffff',
  /** Text on the bar that is not the current page. */
  onInkMuted: '#d9deea',
  focus: '#2b5fb3',
  // Status only: muted green, amber and red, each a text colour on its own tint.
  successText: '#2d5e34',
  successTint: '#e4efe2',
  warningText: '#6e4b00',
  warningTint: '#f6ecd2',
  dangerText: '#9a2b22',
  dangerTint: '#f7e2de',
} as const;

export type ColourToken = keyof typeof colours;

export const fonts = {
  body: '"Public Sans", system-ui, sans-serif',
} as const;

/** Every text-on-background pair the theme uses (theme.css must not combine others). */
export const textPairs: ReadonlyArray<{ use: string; text: ColourToken; background: ColourToken }> =
  [
    { use: 'body text and headings on paper', text: 'ink', background: 'paper' },
    { use: 'body text in tables, cards and dialogs', text: 'ink', background: 'sheet' },
    { use: 'text on alternate and hovered rows', text: 'ink', background: 'paperShade' },
    { use: 'secondary text on paper', text: 'inkMuted', background: 'paper' },
    { use: 'secondary text on sheets', text: 'inkMuted', background: 'sheet' },
    { use: 'secondary text on shaded rows', text: 'inkMuted', background: 'paperShade' },
    { use: 'navigation bar text', text: 'onInk', background: 'ink' },
    { use: 'navigation bar, other pages', text: 'onInkMuted', background: 'ink' },
    { use: 'current navigation item', text: 'onInk', background: 'inkRaised' },
    { use: 'primary button', text: 'onCopper', background: 'copper' },
    { use: 'primary button, hovered', text: 'onCopper', background: 'copperHover' },
    { use: 'copper text (outlined primary button) on paper', text: 'copper', background: 'paper' },
    { use: 'copper text on sheets', text: 'copper', background: 'sheet' },
    { use: 'links and focus outline text on sheets', text: 'focus', background: 'sheet' },
    { use: 'success status', text: 'successText', background: 'successTint' },
    { use: 'warning status', text: 'warningText', background: 'warningTint' },
    { use: 'error status', text: 'dangerText', background: 'dangerTint' },
    { use: 'field error text on sheets', text: 'dangerText', background: 'sheet' },
    { use: 'field error text on paper', text: 'dangerText', background: 'paper' },
  ];

/** Non-text pairs that must reach 3:1 (WCAG 2.1 SC 1.4.11). */
export const uiPairs: ReadonlyArray<{ use: string; part: ColourToken; background: ColourToken }> = [
  { use: 'form field border on sheets', part: 'fieldBorder', background: 'sheet' },
  { use: 'focus ring on sheets', part: 'focus', background: 'sheet' },
  { use: 'focus ring on paper', part: 'focus', background: 'paper' },
  { use: 'table rules (ink) on sheets', part: 'ink', background: 'sheet' },
];

/** CSS custom properties, e.g. --sm-ink; set on :root at start-up. */
export function cssVariables(): Record<string, string> {
  const vars: Record<string, string> = {};
  for (const [name, value] of Object.entries(colours)) {
    vars[`--sm-${name.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`] = value;
  }
  vars['--sm-font'] = fonts.body;
  return vars;
}
