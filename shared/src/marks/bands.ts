// Bands from the rounded total and a band policy (design.md §4.1).
import { z } from 'zod';

export interface BandThreshold {
  key: string;
  label: string;
  /** Lowest percentage of the total marks that reaches this band (inclusive). */
  minPercent: number;
}

export interface BandPolicy {
  version?: number;
  /** Bands from highest to lowest threshold. */
  bands: BandThreshold[];
  /** The band below every threshold. */
  below: { key: string; label: string };
}

export interface Band {
  key: string;
  label: string;
}

/** Default policy of design.md §4.1: Distinction ≥ 80 %, Merit ≥ 70 %, Pass ≥ 55 %, else Not yet passed. */
export const DEFAULT_BAND_POLICY: BandPolicy = {
  version: 1,
  bands: [
    { key: 'distinction', label: 'Distinction', minPercent: 80 },
    { key: 'merit', label: 'Merit', minPercent: 70 },
    { key: 'pass', label: 'Pass', minPercent: 55 },
  ],
  below: { key: 'not_yet_passed', label: 'Not yet passed' },
};

const bandKey = z
  .string()
  .trim()
  .regex(/^[a-z][a-z0-9_]{0,39}$/, 'Use lower-case letters, digits and _.');

/** Body of a new band policy version (an admin edits the policy as a new version). */
export const bandPolicyBodySchema = z
  .strictObject({
    bands: z
      .array(
        z.strictObject({
          key: bandKey,
          label: z.string().trim().min(1).max(60),
          minPercent: z
            .number()
            .gt(0, 'A threshold is above 0 %.')
            .max(100, 'A threshold is at most 100 %.'),
        }),
      )
      .min(1, 'Give at least one band.')
      .max(10),
    below: z.strictObject({ key: bandKey, label: z.string().trim().min(1).max(60) }),
  })
  .superRefine((p, ctx) => {
    p.bands.forEach((b, i) => {
      const prev = p.bands[i - 1];
      if (prev && b.minPercent >= prev.minPercent) {
        ctx.addIssue({
          code: 'custom',
          path: ['bands', i, 'minPercent'],
          message: 'List bands from the highest threshold down, each lower than the one before.',
        });
      }
    });
    const keys = [...p.bands.map((b) => b.key), p.below.key];
    if (new Set(keys).size !== keys.length)
      ctx.addIssue({ code: 'custom', path: ['bands'], message: 'Each band key once.' });
  });
export type BandPolicyBody = z.infer<typeof bandPolicyBodySchema>;

/**
 * The band of a rounded total out of `outOf` marks. Compared as total·100 ≥ threshold·outOf so
 * that 56/70 reaches exactly 80 % without a floating-point near miss.
 */
export function bandFor(total: number, policy: BandPolicy, outOf: number): Band {
  if (!Number.isFinite(outOf) || outOf <= 0)
    throw new RangeError(`outOf must be a positive number, got ${String(outOf)}.`);
  if (!Number.isFinite(total) || total < 0 || total > outOf) {
    throw new RangeError(`total must be between 0 and ${outOf}, got ${String(total)}.`);
  }
  const sorted = [...policy.bands].sort((a, b) => b.minPercent - a.minPercent);
  for (const b of sorted) {
    if (total * 100 >= b.minPercent * outOf - 1e-9) return { key: b.key, label: b.label };
  }
  return { key: policy.below.key, label: policy.below.label };
}

/** Band order from lowest to highest, for exact/adjacent agreement. */
export function bandOrder(policy: BandPolicy): string[] {
  return [
    policy.below.key,
    ...[...policy.bands].sort((a, b) => a.minPercent - b.minPercent).map((b) => b.key),
  ];
}
