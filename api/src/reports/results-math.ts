// Small summaries of a list of results: band counts, mean and median, criterion means.
import type { BandCount, CriterionMean, ResultsSummary } from '@stavemark/shared';

export interface BandPolicyRow {
  bands: { key: string; label: string; minPercent: number }[];
  below: { key: string; label: string };
}

/**
 * Band keys in order, highest threshold first, across every policy version the results used (an
 * admin may have edited the policy between sittings); each policy's "below" band comes last.
 */
export function bandOrder(policies: readonly BandPolicyRow[]): { key: string; label: string }[] {
  const best = new Map<string, { label: string; min: number }>();
  for (const p of policies) {
    for (const b of p.bands) {
      const seen = best.get(b.key);
      if (!seen || b.minPercent > seen.min) best.set(b.key, { label: b.label, min: b.minPercent });
    }
    if (!best.has(p.below.key)) best.set(p.below.key, { label: p.below.label, min: -1 });
  }
  return [...best.entries()].sort((a, b) => b[1].min - a[1].min).map(([key, v]) => ({ key, label: v.label }));
}

/** Median of the values (mean of the middle two for an even count); null when empty. */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

export function mean(values: readonly number[]): number | null {
  return values.length === 0 ? null : values.reduce((a, b) => a + b, 0) / values.length;
}

export function summarise(
  results: readonly { percentage: number; band: { key: string; label: string } }[],
  order: readonly { key: string; label: string }[],
): ResultsSummary {
  const counts = new Map<string, number>();
  for (const r of results) counts.set(r.band.key, (counts.get(r.band.key) ?? 0) + 1);
  const keys = [...order];
  // A band no listed policy names (should not happen) still shows rather than vanishing.
  for (const r of results) if (!keys.some((k) => k.key === r.band.key)) keys.push(r.band);
  const bands: BandCount[] = keys.map((k) => {
    const count = counts.get(k.key) ?? 0;
    return { key: k.key, label: k.label, count, percent: results.length ? (count / results.length) * 100 : 0 };
  });
  const pcts = results.map((r) => r.percentage);
  return { results: results.length, meanPercent: mean(pcts), medianPercent: median(pcts), bands };
}

/** The tension criterion carries the health caution (design.md §10). */
export const isTension = (c: { key: string; label: string }): boolean => /tension/i.test(c.key) || /tension/i.test(c.label);

export function criterionMeans(profiles: readonly { criteria: readonly { key: string; label: string; fraction: number }[] }[]): CriterionMean[] {
  const by = new Map<string, { label: string; sum: number; n: number }>();
  for (const p of profiles) {
    for (const c of p.criteria) {
      const e = by.get(c.key) ?? { label: c.label, sum: 0, n: 0 };
      e.sum += c.fraction;
      e.n += 1;
      by.set(c.key, e);
    }
  }
  return [...by.entries()].map(([key, e]) => ({ key, label: e.label, meanFraction: e.sum / e.n, results: e.n, tension: isTension({ key, label: e.label }) }));
}

export const HEALTH_CAUTION =
  'Health note. Persistent tension can contribute to playing-related pain. If a student reports pain, stop and seek advice ' +
  'from a qualified health professional. Stavemark records teaching observations; it does not diagnose.';
