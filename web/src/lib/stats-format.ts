// Formatting of statistics for the agreement and standardisation pages.
/** "+1.5" / "−2.0": a sign always, and a real minus sign. */
export function signed(v: number, digits: number): string {
  const s = Math.abs(v).toFixed(digits);
  if (Number(s) === 0) return s;
  return `${v < 0 ? '−' : '+'}${s}`;
}

export const coefficient = (v: number | null) => (v === null ? '—' : v.toFixed(3).replace('-', '−'));
export const percent = (v: number | null) => (v === null ? '—' : `${Math.round(v * 100)} %`);

/** The short name of a published scale from its full reference ("Koo & Li (2016)"). */
export function shortSource(source: string): string {
  const m = /^([^(]+)\((\d{4})\)/.exec(source);
  if (!m) return source;
  const names = m[1]!.split(/,\s*(?:&\s*)?/).filter((p) => /^[A-Z][a-z]/.test(p.trim()) && !/^[A-Z]\.$/.test(p.trim()));
  const authors = names.map((n) => n.trim());
  return `${authors.length > 1 ? `${authors.slice(0, -1).join(', ')} & ${authors.at(-1)}` : authors[0]} (${m[2]})`;
}
