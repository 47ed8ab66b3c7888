// Krippendorff's alpha (Krippendorff 2011, "Computing Krippendorff's alpha-reliability"),
// tolerating missing marks, for nominal, ordinal, interval and ratio data.

export type AlphaLevel = 'nominal' | 'ordinal' | 'interval' | 'ratio';

export interface AlphaResult {
  value: number;
  level: AlphaLevel;
  /** Pairable values: values in units that have at least two of them. */
  pairable: number;
  /** Units with at least two values (the others cannot be paired and are left out). */
  units: number;
  observedDisagreement: number;
  expectedDisagreement: number;
}

/**
 * α = 1 − D_o / D_e via the coincidence matrix. `data` rows are observers (examiners), columns are
 * units (recordings, candidates), `null` where an observer gave no value. Nominal values may be
 * text; the other levels need numbers (ordinal uses their order only; ratio needs values ≥ 0).
 */
export function krippendorffAlpha(
  data: readonly (readonly (number | string | null)[])[],
  level: AlphaLevel,
): AlphaResult {
  if (!['nominal', 'ordinal', 'interval', 'ratio'].includes(level))
    throw new RangeError(`Unknown level "${String(level)}".`);
  if (data.length < 2) throw new RangeError('Alpha needs at least two observers (rows).');
  const unitsCount = data[0]?.length ?? 0;
  data.forEach((row, i) => {
    if (row.length !== unitsCount)
      throw new RangeError(`Observer ${i + 1} has ${row.length} units, expected ${unitsCount}.`);
    row.forEach((v, u) => {
      if (v === null) return;
      if (level !== 'nominal' && (typeof v !== 'number' || !Number.isFinite(v))) {
        throw new RangeError(`Observer ${i + 1}, unit ${u + 1}: ${level} data must be numbers.`);
      }
      if (level === 'ratio' && (v as number) < 0)
        throw new RangeError(`Observer ${i + 1}, unit ${u + 1}: ratio data cannot be negative.`);
    });
  });

  const values: (number | string)[] = [];
  for (const row of data)
    for (const v of row) if (v !== null && !values.includes(v)) values.push(v);
  values.sort((a, b) =>
    typeof a === 'number' && typeof b === 'number' ? a - b : String(a).localeCompare(String(b)),
  );
  const idx = new Map(values.map((v, i) => [v, i]));
  const V = values.length;
  const o = Array.from({ length: V }, () => new Array<number>(V).fill(0));
  let units = 0;
  for (let u = 0; u < unitsCount; u++) {
    const vs = data
      .map((row) => row[u])
      .filter((v): v is number | string => v !== null && v !== undefined);
    const m = vs.length;
    if (m < 2) continue;
    units++;
    for (let i = 0; i < m; i++)
      for (let j = 0; j < m; j++) {
        if (i === j) continue;
        o[idx.get(vs[i] as number | string) as number]![
          idx.get(vs[j] as number | string) as number
        ]! += 1 / (m - 1);
      }
  }
  const nc = o.map((row) => row.reduce((a, b) => a + b, 0));
  const n = nc.reduce((a, b) => a + b, 0);
  if (n < 2) throw new RangeError('Fewer than two pairable values: alpha is undefined.');

  const delta2 = (c: number, k: number): number => {
    if (c === k) return 0;
    const vc = values[c] as number;
    const vk = values[k] as number;
    switch (level) {
      case 'nominal':
        return 1;
      case 'interval':
        return (vc - vk) ** 2;
      case 'ratio':
        return vc + vk === 0 ? 0 : ((vc - vk) / (vc + vk)) ** 2;
      case 'ordinal': {
        const [lo, hi] = c < k ? [c, k] : [k, c];
        let s = 0;
        for (let g = lo; g <= hi; g++) s += nc[g] as number;
        return (s - ((nc[c] as number) + (nc[k] as number)) / 2) ** 2;
      }
    }
  };
  let Do = 0;
  let De = 0;
  for (let c = 0; c < V; c++)
    for (let k = 0; k < V; k++) {
      const d = delta2(c, k);
      Do += (o[c]![k] as number) * d;
      De += (nc[c] as number) * (nc[k] as number) * d;
    }
  Do /= n;
  De /= n * (n - 1);
  if (De === 0)
    throw new RangeError(
      'Every pairable value is the same: alpha is undefined (no variation to agree on).',
    );
  return {
    value: 1 - Do / De,
    level,
    pairable: n,
    units,
    observedDisagreement: Do,
    expectedDisagreement: De,
  };
}
