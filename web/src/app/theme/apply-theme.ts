import { cssVariables } from './tokens';

/** Writes the colour tokens as CSS variables on <html>, so theme.css and tokens.ts never drift. */
export function applyTheme(root: HTMLElement = document.documentElement): void {
  for (const [name, value] of Object.entries(cssVariables())) {
    root.style.setProperty(name, value);
  }
}
