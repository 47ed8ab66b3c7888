// Standardisation of examiners (issue 7 §4; design.md §4.5, §5): a reference performance with
// reference marks, marked blind by each examiner; then their deviation from the reference and the
// agreement of all examiners on it.
import { z } from 'zod';
import type { RubricCriterion } from '../music/domain.js';
import type { InterpretationScale } from '../stats/interpretation.js';
import type { Interpretation } from './agreement.js';

export const EXERCISE_STATUSES = ['draft', 'published'] as const;
export type ExerciseStatus = (typeof EXERCISE_STATUSES)[number];
export const ATTEMPT_STATUSES = ['draft', 'submitted'] as const;
export type AttemptStatus = (typeof ATTEMPT_STATUSES)[number];

/** What the performer was asked to play, as an examiner would say it. */
export const exerciseRequestSchema = z.strictObject({
  title: z
    .string()
    .trim()
    .min(1, 'Say what was asked, e.g. “E major scale”.')
    .max(120, 'At most 120 characters.'),
  details: z.string().trim().max(300, 'At most 300 characters.').default(''),
});
export type ExerciseRequest = z.infer<typeof exerciseRequestSchema>;

/** One mark: request (0-based) × criterion key. */
export const exerciseMarkSchema = z.strictObject({
  request: z.number().int().min(0).max(5),
  criterion: z
    .string()
    .regex(/^[a-z][a-z0-9_]{0,39}$/, 'A criterion key such as note_accuracy.'),
  mark: z.number().int('A mark is a whole number.').min(0, 'A mark is 0 or more.').max(10),
});
export type ExerciseMark = z.infer<typeof exerciseMarkSchema>;

const marksSchema = z
  .array(exerciseMarkSchema)
  .max(120)
  .superRefine((marks, ctx) => {
    const seen = new Set<string>();
    marks.forEach((m, i) => {
      const k = `${m.request}:${m.criterion}`;
      if (seen.has(k))
        ctx.addIssue({
          code: 'custom',
          path: [i],
          message: `Request ${m.request + 1}, ${m.criterion} is marked twice.`,
        });
      seen.add(k);
    });
  });

const exerciseFields = {
  title: z.string().trim().min(1, 'Give the exercise a title.').max(120, 'At most 120 characters.'),
  instructions: z.string().trim().max(2000, 'At most 2000 characters.').default(''),
  rubricVersionId: z.uuid('Choose a published rubric version.'),
  requests: z
    .array(exerciseRequestSchema)
    .min(1, 'Name at least one request performed.')
    .max(6, 'At most six requests in one exercise.'),
  /** Examiners are asked to mark it by this date (before their sitting). */
  dueOn: z.iso.date('Use a date such as 2026-12-01.').nullable().default(null),
  referenceMarks: marksSchema.default([]),
};

export const createExerciseSchema = z.strictObject(exerciseFields);
export type CreateExerciseInput = z.input<typeof createExerciseSchema>;

export const updateExerciseSchema = z.strictObject({
  title: exerciseFields.title.optional(),
  instructions: z.string().trim().max(2000, 'At most 2000 characters.').optional(),
  rubricVersionId: exerciseFields.rubricVersionId.optional(),
  requests: exerciseFields.requests.optional(),
  dueOn: z.iso.date('Use a date such as 2026-12-01.').nullable().optional(),
  referenceMarks: marksSchema.optional(),
});
export type UpdateExerciseInput = z.infer<typeof updateExerciseSchema>;

/** An examiner's marks: saved as a draft (some may be missing), or submitted (all needed). */
export const attemptMarksSchema = z.strictObject({ marks: marksSchema });
export type AttemptMarksInput = z.infer<typeof attemptMarksSchema>;

// ---------- views ----------

export interface CriterionDeviation {
  criterion: string;
  label: string;
  maxMark: number;
  /** Cells (requests) compared. */
  n: number;
  /** Mean of (examiner − reference), in marks. */
  meanDifference: number;
  meanAbsoluteDifference: number;
}

export interface ExerciseDeviation {
  /** Per criterion, over the exercise's requests. */
  criteria: CriterionDeviation[];
  /** Over every cell, in percentage points of each criterion's maximum. */
  meanDifferencePercent: number;
  meanAbsoluteDifferencePercent: number;
  /** Cells marked exactly as the reference. */
  exactShare: number;
  cells: number;
}

export interface ExerciseAgreement {
  examiners: number;
  units: number;
  /** Krippendorff's alpha, ordinal, on marks as a share of each criterion's maximum. */
  alpha: number | null;
  level: 'ordinal';
  interpretation: Interpretation | null;
  note: string | null;
  method: string;
}

export interface ExerciseSummary {
  id: string;
  title: string;
  status: ExerciseStatus;
  dueOn: string | null;
  rubricName: string;
  requests: number;
  hasRecording: boolean;
  publishedAt: string | null;
  createdBy: string | null;
  canManage: boolean;
  /** The caller's own attempt, if any. */
  myAttempt: { status: AttemptStatus; submittedAt: string | null } | null;
  submittedAttempts: number;
}

export interface ExerciseView {
  id: string;
  title: string;
  instructions: string;
  status: ExerciseStatus;
  dueOn: string | null;
  publishedAt: string | null;
  createdBy: string | null;
  rubric: { versionId: string; name: string; version: number; criteria: RubricCriterion[] };
  requests: ExerciseRequest[];
  recording: { contentType: string; bytes: number; durationSeconds: number | null } | null;
  canManage: boolean;
  /** May the caller mark it (an examiner, the exercise published)? */
  canAttempt: boolean;
  /** Hidden (null) until the caller has submitted their own attempt, unless they manage it. */
  referenceMarks: ExerciseMark[] | null;
  myAttempt: {
    status: AttemptStatus;
    marks: ExerciseMark[];
    startedAt: string;
    submittedAt: string | null;
  } | null;
  myDeviation: ExerciseDeviation | null;
  /** Every submitted examiner's marks per cell, without names; hidden like the reference. */
  othersMarks: { request: number; criterion: string; marks: number[] }[] | null;
  agreement: ExerciseAgreement | null;
  /** Managers only: each examiner's submitted attempt and deviation. */
  attempts:
    | {
        examiner: { id: string; name: string };
        status: AttemptStatus;
        submittedAt: string | null;
        deviation: ExerciseDeviation | null;
      }[]
    | null;
  scales: InterpretationScale[];
}

/** An examiner's deviation from the reference over time, one point per submitted exercise. */
export interface DeviationHistory {
  examiner: { id: string; name: string };
  points: {
    exerciseId: string;
    title: string;
    submittedAt: string;
    meanDifferencePercent: number;
    meanAbsoluteDifferencePercent: number;
    exactShare: number;
    cells: number;
    criteria: CriterionDeviation[];
  }[];
  /** Per criterion key over every exercise (cells pooled). */
  criteria: CriterionDeviation[];
}
