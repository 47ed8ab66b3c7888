// Agreement on categories: Cohen's (weighted) kappa for two raters, Fleiss' kappa for many.

export type KappaWeights = 'none' | 'linear' | 'quadratic';

export interface KappaResult {
  value: number;
  /** Observed and chance-expected (weighted) agreement. */
  observed: number;
  expected: number;
  n: number;
  /**
   * Large-sample standard error for confidence intervals (the non-null variance of Fleiss, Cohen &
   * Everitt 1969), so value ± 1.96·se is an approximate 95 % interval.
   */
  standardError: number;
  weights: KappaWeights;
  categories: (string | number)[];
}

/**
 * Cohen's kappa (Cohen 1960) and weighted kappa (Cohen 1968) from a square table of counts
 * (rows: rater A's category, columns: rater B's), with category scores for the weights.
 * Linear weights 1 − |xᵢ − xⱼ| / range, quadratic 1 − (xᵢ − xⱼ)² / range² (Fleiss–Cohen weights);
 * with numeric categories the distances are the actual values, so marks 0..10 weigh as marks.
 */
export function cohenKappaFromTable(
  table: readonly (readonly number[])[],
  weights: KappaWeights = 'none',
  scores?: readonly number[],
): Omit<KappaResult, 'categories'> {
  const r = table.length;
  if (r < 1 || table.some((row) => row.length !== r))
    throw new RangeError('The table must be square (categories × categories).');
  for (const row of table)
    for (const v of row)
      if (!(Number.isFinite(v) && v >= 0)) throw new RangeError('Counts must be numbers ≥ 0.');
  const n = table.reduce((s, row) => s + row.reduce((a, b) => a + b, 0), 0);
  if (n === 0) throw new RangeError('No ratings to compare.');
  const x = scores ?? Array.from({ length: r }, (_, i) => i);
  if (x.length !== r) throw new RangeError('Give one score per category.');
  const range = Math.max(...x) - Math.min(...x);
  const w = (i: number, j: number) => {
    if (weights === 'none' || range === 0) return i === j ? 1 : 0;
    const d = Math.abs((x[i] as number) - (x[j] as number)) / range;
    return weights === 'linear' ? 1 - d : 1 - d * d;
  };
  const p = table.map((row) => row.map((v) => v / n));
  const rowM = p.map((row) => row.reduce((a, b) => a + b, 0));
  const colM = Array.from({ length: r }, (_, j) => p.reduce((s, row) => s + (row[j] as number), 0));
  let po = 0;
  let pe = 0;
  for (let i = 0; i < r; i++)
    for (let j = 0; j < r; j++) {
      po += w(i, j) * (p[i]![j] as number);
      pe += w(i, j) * (rowM[i] as number) * (colM[j] as number);
    }
  if (pe >= 1 - 1e-12)
    throw new RangeError('Chance agreement is complete (one category only): kappa is undefined.');
  const value = (po - pe) / (1 - pe);
  // Fleiss, Cohen & Everitt (1969), non-null large-sample variance of weighted kappa.
  const wRow = Array.from({ length: r }, (_, i) => colM.reduce((s, c, j) => s + w(i, j) * c, 0));
  const wCol = Array.from({ length: r }, (_, j) => rowM.reduce((s, c, i) => s + w(i, j) * c, 0));
  let sum = 0;
  for (let i = 0; i < r; i++)
    for (let j = 0; j < r; j++) {
      sum +=
        (p[i]![j] as number) *
        (w(i, j) - ((wRow[i] as number) + (wCol[j] as number)) * (1 - value)) ** 2;
    }
  const variance = (sum - (value - pe * (1 - value)) ** 2) / (n * (1 - pe) ** 2);
  return {
    value,
    observed: po,
    expected: pe,
    n,
    standardError: Math.sqrt(Math.max(0, variance)),
    weights,
  };
}

/**
 * Cohen's kappa for two raters' categories of the same items (e.g. bands or marks of two
 * examiners). Numeric categories are ordered by value; text categories need `categories` in
 * order for weighted kappa. Items where either rating is null are left out (n says how many count).
 */
export function cohenKappa<T extends string | number>(
  a: readonly (T | null)[],
  b: readonly (T | null)[],
  weights: KappaWeights = 'none',
  options: { categories?: readonly T[] } = {},
): KappaResult {
  if (a.length !== b.length)
    throw new RangeError(
      `The raters rated different numbers of items (${a.length} and ${b.length}).`,
    );
  const pairs: [T, T][] = [];
  a.forEach((v, i) => {
    const w = b[i];
    if (v !== null && w !== null && w !== undefined) pairs.push([v, w]);
  });
  if (pairs.length === 0) throw new RangeError('No item was rated by both raters.');
  let categories: T[];
  if (options.categories) {
    categories = [...options.categories];
    for (const [u, v] of pairs) {
      if (!categories.includes(u))
        throw new RangeError(`Category "${String(u)}" is not in the list of categories.`);
      if (!categories.includes(v))
        throw new RangeError(`Category "${String(v)}" is not in the list of categories.`);
    }
  } else {
    const seen = [...new Set(pairs.flat())];
    if (weights !== 'none' && seen.some((c) => typeof c !== 'number')) {
      throw new RangeError(
        'Weighted kappa on text categories needs their order: pass options.categories.',
      );
    }
    categories = seen.sort((u, v) =>
      typeof u === 'number' && typeof v === 'number' ? u - v : String(u).localeCompare(String(v)),
    );
  }
  const index = new Map(categories.map((c, i) => [c, i]));
  const table = categories.map(() => categories.map(() => 0));
  for (const [u, v] of pairs) table[index.get(u) as number]![index.get(v) as number]! += 1;
  const numeric = categories.every((c) => typeof c === 'number');
  const scores = numeric ? (categories as number[]) : categories.map((_, i) => i);
  return { ...cohenKappaFromTable(table, weights, scores), categories };
}

export interface FleissKappaResult {
  value: number;
  /** Mean observed agreement P̄ and chance agreement P̄e. */
  observed: number;
  expected: number;
  subjects: number;
  raters: number;
  /** Share of all ratings in each category (pⱼ). */
  categoryShares: number[];
}

/**
 * Fleiss' kappa (Fleiss 1971) for many raters: rows are subjects, columns categories, cells the
 * number of raters who chose that category; every subject needs the same number of raters.
 */
export function fleissKappa(counts: readonly (readonly number[])[]): FleissKappaResult {
  const N = counts.length;
  if (N < 1) throw new RangeError('No subjects.');
  const q = counts[0]?.length ?? 0;
  if (q < 2) throw new RangeError('At least two categories are needed.');
  const m = (counts[0] as readonly number[]).reduce((a, b) => a + b, 0);
  counts.forEach((row, i) => {
    if (row.length !== q)
      throw new RangeError(`Subject ${i + 1} has ${row.length} categories, expected ${q}.`);
    if (row.some((v) => !Number.isInteger(v) || v < 0))
      throw new RangeError(`Subject ${i + 1}: counts must be whole numbers ≥ 0.`);
    const s = row.reduce((a, b) => a + b, 0);
    if (s !== m)
      throw new RangeError(
        `Subject ${i + 1} has ${s} ratings, the first has ${m}: every subject needs the same number of raters.`,
      );
  });
  if (m < 2) throw new RangeError('At least two raters per subject are needed.');
  const shares = Array.from(
    { length: q },
    (_, j) => counts.reduce((s, row) => s + (row[j] as number), 0) / (N * m),
  );
  const Pi = counts.map((row) => (row.reduce((s, v) => s + v * v, 0) - m) / (m * (m - 1)));
  const Pbar = Pi.reduce((a, b) => a + b, 0) / N;
  const Pe = shares.reduce((s, p) => s + p * p, 0);
  if (Pe >= 1 - 1e-12) throw new RangeError('Every rating is in one category: kappa is undefined.');
  return {
    value: (Pbar - Pe) / (1 - Pe),
    observed: Pbar,
    expected: Pe,
    subjects: N,
    raters: m,
    categoryShares: shares,
  };
}

export interface BandAgreement {
  n: number;
  /** Share of items given the same band. */
  exact: number;
  /** Share given the same or a neighbouring band (exact included). */
  withinOne: number;
}

/** Exact and adjacent agreement of two examiners' bands, with `order` from lowest to highest band. */
export function bandAgreement(
  a: readonly (string | null)[],
  b: readonly (string | null)[],
  order: readonly string[],
): BandAgreement {
  if (a.length !== b.length) throw new RangeError('The two lists of bands differ in length.');
  let n = 0;
  let exact = 0;
  let within = 0;
  a.forEach((u, i) => {
    const v = b[i];
    if (u === null || v === null || v === undefined) return;
    const iu = order.indexOf(u);
    const iv = order.indexOf(v);
    if (iu < 0 || iv < 0) throw new RangeError(`Unknown band "${iu < 0 ? u : v}".`);
    n++;
    if (iu === iv) exact++;
    if (Math.abs(iu - iv) <= 1) within++;
  });
  if (n === 0) throw new RangeError('No item has a band from both examiners.');
  return { n, exact: exact / n, withinOne: within / n };
}
