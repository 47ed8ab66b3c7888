// A student's year of progress and the teacher's attention list (issue 8 §1–2; design.md §4.6).
import type { SlotOutcome } from '../music/domain.js';

export interface ProgressCriterionPoint {
  key: string;
  label: string;
  /** Share of the maximum, 0..1. */
  fraction: number;
}

export interface ProgressExaminerComment {
  examiner: string;
  role: 'first' | 'second' | 'third';
  /** "overall" or the request's label. */
  about: string;
  text: string;
}

/** One sitting the student was entered for: completed with a result, or absent (never a zero). */
export interface ProgressSitting {
  sittingId: string;
  slotId: string;
  title: string;
  date: string;
  outcome: SlotOutcome;
  listName: string;
  /** Requirement-list lineage (the list) and grade: points compare only within one line. */
  lineageId: string;
  grade: string;
  /** Index into `lines` of the comparable line this sitting belongs to. */
  line: number;
  result: {
    percentage: number;
    total: number;
    outOf: number;
    band: { key: string; label: string };
    criteria: ProgressCriterionPoint[];
    slips: number;
    notesPlayed: number | null;
    /** Slips per 100 notes played; null when no counted notes. */
    slipRate: number | null;
    released: boolean;
  } | null;
  examiners: string[];
  comments: ProgressExaminerComment[];
}

export interface ProgressLine {
  lineageId: string;
  grade: string;
  listName: string;
  from: string;
  to: string;
  /** Completed sittings with a result in this line. */
  n: number;
  slopePer30Days: number | null;
  standardError: number | null;
  firstToLatest: { first: number; latest: number; change: number } | null;
}

export interface ProgressView {
  student: { id: string; name: string; pupilNumber: string; grade: number | null };
  from: string;
  to: string;
  sittings: ProgressSitting[];
  lines: ProgressLine[];
  /** Percentile of the latest result among the same grade's students (latest result each, same line); null when fewer than 10. */
  percentile: { value: number | null; students: number; grade: string; lineageId: string } | null;
  /** The health caution (design.md §10), present when a tension criterion appears. */
  tensionCaution: string | null;
}

export const ATTENTION_KINDS = ['entrenched', 'tension', 'rising_slips'] as const;
export type AttentionKind = (typeof ATTENTION_KINDS)[number];

export interface AttentionEvidence {
  sittingId: string;
  title: string;
  date: string;
  slotId: string;
  /** What was seen there: "Evenness 45 %", "5.2 slips per 100 notes". */
  value: string;
  examiners: string[];
}

export interface AttentionEntry {
  kind: AttentionKind;
  student: { id: string; name: string; pupilNumber: string; grade: number | null };
  /** The criterion concerned (entrenched, tension). */
  criterion: { key: string; label: string } | null;
  summary: string;
  since: string;
  evidence: AttentionEvidence[];
  /** design.md §10, on every tension entry. */
  caution: string | null;
}

export interface AttentionView {
  entries: AttentionEntry[];
  students: number;
  caution: string;
}
