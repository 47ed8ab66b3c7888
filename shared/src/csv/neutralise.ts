// CSV export safety (design.md §8).

/** Characters that make a spreadsheet read a cell as a formula (OWASP "CSV Injection"). */
const FORMULA_START = new Set(['=', '+', '-', '@', '\t', '\r']);

/**
 * Neutralises a text cell for CSV export: a cell starting with =, +, -, @, tab or carriage return
 * gets a leading apostrophe, so a spreadsheet shows it as text instead of running it as a formula
 * (OWASP guidance on CSV injection). Quoting and escaping of quotes stay with the CSV writer.
 * Numbers, booleans, null and undefined pass through unchanged: a negative number is data, not
 * a formula, and the writer prints it as such.
 */
export function neutraliseCsvCell(value: string): string;
export function neutraliseCsvCell<T extends number | boolean | null | undefined>(value: T): T;
export function neutraliseCsvCell(
  value: string | number | boolean | null | undefined,
): string | number | boolean | null | undefined;
export function neutraliseCsvCell(
  value: string | number | boolean | null | undefined,
): string | number | boolean | null | undefined {
  if (typeof value !== 'string' || value.length === 0) return value;
  return FORMULA_START.has(value[0] as string) ? `'${value}` : value;
}

/** Neutralises every cell of a row. */
export function neutraliseCsvRow<
  T extends readonly (string | number | boolean | null | undefined)[],
>(row: T): T {
  return row.map((c) => neutraliseCsvCell(c)) as unknown as T;
}
