// Results of a sitting (issue 7; design.md §3, §4.1): derived from submitted mark sheets when
// marking closes, stored with the rule that computed them so they can be recomputed.
import type { Band } from '../marks/bands.js';

/**
 * Names the scoring rule a stored result was computed with (design.md §4.1: weighted criterion
 * mean per request, requests weighted by difficulty and scaled to the list's total marks, rounded
 * half up, band on the rounded total). Change it whenever that rule changes.
 */
export const RESULT_RULE_VERSION = 'marks-v1 difficulty-weighted, half-up';

/** Which marks a result came from: one examiner; the first of a pair; agreed marks; a third marker. */
export const RESULT_BASES = ['single', 'first', 'agreed', 'third'] as const;
export type ResultBasis = (typeof RESULT_BASES)[number];

export interface ResultRequestProfile {
  /** The request's index in the slot's draw. */
  index: number;
  /** "D harmonic minor scale, hands together". */
  label: string;
  asked: boolean;
  /** Weighted mean of its criteria as a fraction of the maximum (0..1); null when not asked. */
  score: number | null;
  /** Fingering slips flagged on it (0 when not asked). */
  slips: number;
  /** Notes played (both hands together count twice); null for passages, pieces and requests not asked. */
  notesPlayed: number | null;
}

export interface ResultCriterionProfile {
  key: string;
  label: string;
  /** marks ÷ maximum over the asked requests (0..1). */
  fraction: number;
  marks: number;
  maximum: number;
}

export interface ResultProfile {
  requests: ResultRequestProfile[];
  criteria: ResultCriterionProfile[];
}

export interface ResultView {
  id: string;
  sittingId: string;
  sittingTitle: string;
  sittingDate: string;
  slotId: string;
  student: { id: string; name: string; pupilNumber: string };
  listVersionId: string;
  listName: string;
  bandPolicyVersionId: string;
  ruleVersion: string;
  basis: ResultBasis;
  total: number;
  outOf: number;
  percentage: number;
  band: Band;
  profile: ResultProfile;
  slips: number;
  notesPlayed: number | null;
  computedAt: string;
  releasedAt: string | null;
}
