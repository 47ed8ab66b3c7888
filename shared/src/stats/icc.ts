// Intraclass correlations (Shrout & Fleiss 1979) with 95 % confidence intervals
// (Shrout & Fleiss 1979; McGraw & Wong 1996, Table 7).
import { fCdf, fQuantile } from './distributions.js';

export const ICC_FORMS = [
  'ICC(1,1)',
  'ICC(2,1)',
  'ICC(3,1)',
  'ICC(1,k)',
  'ICC(2,k)',
  'ICC(3,k)',
] as const;
export type IccForm = (typeof ICC_FORMS)[number];

export interface IccResult {
  form: IccForm;
  value: number;
  /** Bounds of the confidence interval (default 95 %). */
  lower: number;
  upper: number;
  /** Targets (candidates) and judges (examiners). */
  n: number;
  k: number;
  /** The F test of the form against zero, with its degrees of freedom and p-value. */
  f: number;
  df1: number;
  df2: number;
  p: number;
  meanSquares: { between: number; within: number; judges: number; error: number };
}

/**
 * ICC for a complete table: rows are targets (candidates), columns are judges (examiners).
 * - ICC(1,·): one-way random; each target rated by a different set of judges (pairs vary).
 * - ICC(2,·): two-way random, absolute agreement; the same judges, seen as a sample of judges.
 * - ICC(3,·): two-way mixed, consistency; the same judges, the only ones of interest.
 * ·,1 is the reliability of one judge; ·,k of the mean of the k judges.
 * Missing marks are not allowed: the ANOVA needs a full table (drop incomplete rows first).
 */
export function icc(
  ratings: readonly (readonly number[])[],
  form: IccForm,
  options: { confidence?: number } = {},
): IccResult {
  if (!(ICC_FORMS as readonly string[]).includes(form))
    throw new RangeError(`Unknown ICC form "${String(form)}"; use one of ${ICC_FORMS.join(', ')}.`);
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1))
    throw new RangeError('confidence must be between 0 and 1.');
  const n = ratings.length;
  if (n < 2) throw new RangeError('ICC needs at least 2 targets (rows).');
  const k = ratings[0]?.length ?? 0;
  if (k < 2) throw new RangeError('ICC needs at least 2 judges (columns).');
  ratings.forEach((row, i) => {
    if (row.length !== k)
      throw new RangeError(`Row ${i + 1} has ${row.length} ratings, expected ${k}.`);
    row.forEach((v, j) => {
      if (typeof v !== 'number' || !Number.isFinite(v))
        throw new RangeError(
          `Row ${i + 1}, column ${j + 1} is not a number (missing marks are not allowed).`,
        );
    });
  });

  const grand = ratings.reduce((s, r) => s + r.reduce((a, b) => a + b, 0), 0) / (n * k);
  const rowMeans = ratings.map((r) => r.reduce((a, b) => a + b, 0) / k);
  const colMeans = Array.from(
    { length: k },
    (_, j) => ratings.reduce((s, r) => s + (r[j] as number), 0) / n,
  );
  let sst = 0;
  for (const r of ratings) for (const v of r) sst += (v - grand) ** 2;
  const ssr = k * rowMeans.reduce((s, m) => s + (m - grand) ** 2, 0);
  const ssc = n * colMeans.reduce((s, m) => s + (m - grand) ** 2, 0);
  const sse = sst - ssr - ssc;
  const BMS = ssr / (n - 1);
  const WMS = (sst - ssr) / (n * (k - 1));
  const JMS = ssc / (k - 1);
  const EMS = sse / ((n - 1) * (k - 1));
  if (!(BMS > 0)) throw new RangeError('All targets have the same mean: the ICC is undefined.');

  const q = 1 - (1 - confidence) / 2;
  const meanSquares = { between: BMS, within: WMS, judges: JMS, error: EMS };
  const single = form.endsWith(',1)');
  // Spearman–Brown: the mean of k judges from one judge's value (also maps the bounds; see
  // McGraw & Wong 1996, Table 7, where the ·,k bounds are this transform of the ·,1 bounds).
  const sb = (r: number) => (k * r) / (1 + (k - 1) * r);

  // No disagreement at all: the ratio of mean squares is infinite and the ICC is exactly 1.
  const denominator = form.startsWith('ICC(1') ? WMS : EMS;
  if (denominator <= 1e-12 * BMS && (!form.startsWith('ICC(2') || JMS <= 1e-12 * BMS)) {
    const df2 = form.startsWith('ICC(1') ? n * (k - 1) : (n - 1) * (k - 1);
    return {
      form,
      value: 1,
      lower: 1,
      upper: 1,
      n,
      k,
      f: Infinity,
      df1: n - 1,
      df2,
      p: 0,
      meanSquares,
    };
  }

  let value: number;
  let lower: number;
  let upper: number;
  let f: number;
  const df1 = n - 1;
  let df2: number;
  if (form.startsWith('ICC(1')) {
    f = BMS / WMS;
    df2 = n * (k - 1);
    const fl = f / fQuantile(q, df1, df2);
    const fu = f * fQuantile(q, df2, df1);
    value = (BMS - WMS) / (BMS + (k - 1) * WMS);
    lower = (fl - 1) / (fl + k - 1);
    upper = (fu - 1) / (fu + k - 1);
  } else if (form.startsWith('ICC(3')) {
    f = BMS / EMS;
    df2 = (n - 1) * (k - 1);
    const fl = f / fQuantile(q, df1, df2);
    const fu = f * fQuantile(q, df2, df1);
    value = (BMS - EMS) / (BMS + (k - 1) * EMS);
    lower = (fl - 1) / (fl + k - 1);
    upper = (fu - 1) / (fu + k - 1);
  } else {
    f = BMS / EMS;
    df2 = (n - 1) * (k - 1);
    value = (BMS - EMS) / (BMS + (k - 1) * EMS + (k * (JMS - EMS)) / n);
    // Satterthwaite's approximate degrees of freedom for the denominator (McGraw & Wong 1996).
    const a = (k * value) / (n * (1 - value));
    const b = 1 + (k * value * (n - 1)) / (n * (1 - value));
    const v =
      (a * JMS + b * EMS) ** 2 / ((a * JMS) ** 2 / (k - 1) + (b * EMS) ** 2 / ((n - 1) * (k - 1)));
    const fStar = fQuantile(q, n - 1, v);
    const fStar2 = fQuantile(q, v, n - 1);
    lower = (n * (BMS - fStar * EMS)) / (fStar * (k * JMS + (k * n - k - n) * EMS) + n * BMS);
    upper = (n * (fStar2 * BMS - EMS)) / (k * JMS + (k * n - k - n) * EMS + n * fStar2 * BMS);
  }
  if (!single) {
    value = sb(value);
    lower = sb(lower);
    upper = sb(upper);
  }
  return { form, value, lower, upper, n, k, f, df1, df2, p: 1 - fCdf(f, df1, df2), meanSquares };
}
