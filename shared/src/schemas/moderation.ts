// Moderation and release (issue 7 §2, §5; design.md §4.5): double-marked pairs side by side,
// pairs outside tolerance flagged, flags resolved by agreed marks or a third marker, and results
// released to students (and guardians' e-mail) only when no flag is open.
import { z } from 'zod';
import type { CellValue } from './marking.js';
import type { ResultBasis } from './results.js';

export const MODERATION_STATUSES = ['open', 'third_marking', 'agreed', 'third'] as const;
/** open: flagged, unresolved; third_marking: waiting for the third sheet; agreed / third: resolved. */
export type ModerationStatus = (typeof MODERATION_STATUSES)[number];
/** A flag is open until marks are agreed or the third marker submits. */
export const OPEN_MODERATION: readonly ModerationStatus[] = ['open', 'third_marking'];

const markCell = z
  .string()
  .regex(/^mark:\d{1,2}:[a-z][a-z0-9_]{0,39}$/, 'A mark cell is "mark:<request>:<criterion>".');

/** Agreed marks for a flagged pair: a mark for every criterion of every request asked, and why. */
export const agreeMarksSchema = z.strictObject({
  marks: z.record(markCell, z.number().int('A mark is a whole number.').min(0).max(10)),
  /** Requests the agreed sheet treats as not asked (both examiners must have left them out). */
  notAsked: z.array(z.number().int().min(0).max(99)).max(100).default([]),
  reason: z
    .string()
    .trim()
    .min(10, 'Say in a sentence why these marks are agreed (at least 10 characters).')
    .max(1000),
});
export type AgreeMarksInput = z.infer<typeof agreeMarksSchema>;

export const thirdMarkerSchema = z.strictObject({
  examinerId: z.uuid('Choose an examiner.'),
  note: z.string().trim().max(500).optional(),
});
export type ThirdMarkerInput = z.infer<typeof thirdMarkerSchema>;

export const releaseResultsSchema = z.strictObject({
  /** A teacher's note per student, shown in the take-home report; optional. */
  notes: z
    .array(
      z.strictObject({
        studentId: z.uuid(),
        note: z.string().trim().max(1500, 'A note is at most 1500 characters.'),
      }),
    )
    .max(500)
    .default([]),
});
export type ReleaseResultsInput = z.infer<typeof releaseResultsSchema>;

// ---------- Views ----------

export interface ModerationSheetView {
  id: string;
  role: 'first' | 'second' | 'third';
  examiner: { id: string; displayName: string };
  submittedAt: string | null;
  total: number | null;
  bandLabel: string | null;
  /** Request score (0..1) by request index; null when not asked. */
  requestScores: (number | null)[];
  cells: { cell: string; value: CellValue }[];
}

export interface ModerationCriterionView {
  key: string;
  label: string;
  maxMark: number;
  /** The tension criterion carries the health caution (design.md §10). */
  tension: boolean;
}

export interface ModerationRequestView {
  index: number;
  label: string;
  criteria: ModerationCriterionView[];
  /** |first − second| as a share of the request's maximum; null when one side did not ask it. */
  difference: number | null;
  flagged: boolean;
}

export interface ModerationPairView {
  slotId: string;
  candidate: { studentId: string; name: string; pupilNumber: string };
  status: ModerationStatus | 'within' | 'waiting';
  /** Why it is flagged, in words; empty when within tolerance. */
  reasons: string[];
  total: { first: number | null; second: number | null; difference: number | null; limit: number };
  requests: ModerationRequestView[];
  first: ModerationSheetView | null;
  second: ModerationSheetView | null;
  third: ModerationSheetView | null;
  thirdExaminer: { id: string; displayName: string } | null;
  agreed: {
    by: string;
    at: string;
    reason: string;
    marks: Record<string, number>;
    notAsked: number[];
  } | null;
  result: {
    total: number;
    outOf: number;
    bandLabel: string;
    basis: ResultBasis;
    released: boolean;
  } | null;
}

export interface ModerationView {
  sitting: { id: string; title: string; date: string; status: string };
  tolerance: { requestShare: number; totalShare: number };
  pairs: ModerationPairView[];
  openFlags: number;
  /** Examiners who may be asked to third-mark (not the pair's own examiners; checked per slot). */
  examiners: { id: string; displayName: string }[];
  /** Results of the sitting the caller may release, and how many are released. */
  release: { results: number; released: number; canRelease: boolean; blockedBy: string | null };
}

export interface ReleaseSummary {
  released: number;
  alreadyReleased: number;
  mailed: number;
  sittingStatus: string;
}

export interface ResultSummary {
  id: string;
  sittingId: string;
  sittingTitle: string;
  sittingDate: string;
  listName: string;
  total: number;
  outOf: number;
  percentage: number;
  band: { key: string; label: string };
  basis: ResultBasis;
  releasedAt: string | null;
}

export interface ResultDetail extends ResultSummary {
  student: { id: string; name: string; pupilNumber: string };
  requests: {
    index: number;
    label: string;
    asked: boolean;
    score: number | null;
    marks: { key: string; label: string; mark: number | null; maxMark: number }[];
    comment: string | null;
  }[];
  criteria: { key: string; label: string; fraction: number; marks: number; maximum: number }[];
  overallComments: string[];
  teacherNote: string | null;
  /** Shown with the tension criterion (design.md §10). */
  caution: string;
}

/** The plain-words report a student and their guardians take home: no raw figures. */
export interface TakeHomeReport {
  resultId: string;
  studentName: string;
  sittingTitle: string;
  date: string;
  /** "Merit", in words. */
  outcome: string;
  summary: string;
  strengths: string[];
  nextSteps: string[];
  teacherNote: string | null;
  /** The health caution when tension is among the next steps (design.md §10); else null. */
  caution: string | null;
}

/** What a teacher may release in a sitting: their students' results (an admin's: all). */
export interface ReleaseListView {
  sitting: { id: string; title: string; date: string; status: string };
  /** Why release is refused now (open flags, marking not closed), or null. */
  blockedBy: string | null;
  results: {
    resultId: string;
    studentId: string;
    name: string;
    pupilNumber: string;
    total: number;
    outOf: number;
    bandLabel: string;
    releasedAt: string | null;
    teacherNote: string | null;
  }[];
}
