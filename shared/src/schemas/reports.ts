// Results pages, CSV exports and printable reports (issue 8 §3–5; design.md §5). Query shapes are
// shared by the API's validation and the web client; the views are what the API answers.
import { z } from 'zod';
import type { SlotOutcome } from '../music/domain.js';

const flag = (name: string) =>
  z
    .enum(['true', 'false'], { message: `${name} is true or false.` })
    .transform((v) => v === 'true')
    .default(false);

const period = {
  from: z.iso.date('Use a date such as 2026-09-01.').optional(),
  to: z.iso.date('Use a date such as 2027-08-31.').optional(),
};

const checkPeriod = (q: { from?: string | undefined; to?: string | undefined }, ctx: z.RefinementCtx) => {
  if (q.from && q.to && q.from > q.to) ctx.addIssue({ code: 'custom', path: ['to'], message: '"to" is before "from".' });
};

/** A CSV export: `bom=true` starts the file with a UTF-8 byte-order mark (for spreadsheets). */
export const csvExportQuerySchema = z.strictObject({ bom: flag('bom') });
export type CsvExportQuery = z.infer<typeof csvExportQuerySchema>;

/** A period of results; without dates, the class's academic year (or the last twelve months). */
export const resultsPeriodQuerySchema = z.strictObject(period).superRefine(checkPeriod);
export type ResultsPeriodQuery = z.infer<typeof resultsPeriodQuerySchema>;

export const periodCsvExportQuerySchema = z.strictObject({ ...period, bom: flag('bom') }).superRefine(checkPeriod);
export type PeriodCsvExportQuery = z.infer<typeof periodCsvExportQuerySchema>;

export interface BandCount {
  key: string;
  label: string;
  count: number;
  /** count ÷ results × 100; 0 when there are no results. */
  percent: number;
}

export interface ResultsSummary {
  results: number;
  /** Mean and median percentage of the results; null without results. */
  meanPercent: number | null;
  medianPercent: number | null;
  bands: BandCount[];
}

export interface ResultRow {
  resultId: string;
  slotId: string;
  sittingId: string;
  sittingTitle: string;
  sittingDate: string;
  student: { id: string; name: string; pupilNumber: string; grade: number | null };
  listName: string;
  total: number;
  outOf: number;
  percentage: number;
  band: { key: string; label: string };
  basis: string;
  examiner: string | null;
  releasedAt: string | null;
}

export interface CriterionMean {
  key: string;
  label: string;
  /** Mean over the results of marks ÷ maximum, 0..1. */
  meanFraction: number;
  results: number;
  tension: boolean;
}

export interface SittingResultsView {
  sitting: { id: string; title: string; date: string; room: string; status: string };
  /** Whose rows the caller sees: every candidate, their own pupils', or the slots they marked. */
  scope: 'all' | 'own_pupils' | 'marked';
  results: ResultRow[];
  /** Candidates without a result (absent, withdrawn, incomplete, or not yet computed). */
  withoutResult: { slotId: string; student: { id: string; name: string; pupilNumber: string }; outcome: SlotOutcome | null }[];
  summary: ResultsSummary;
  criteria: CriterionMean[];
}

export interface ClassSittingSummary extends ResultsSummary {
  sittingId: string;
  title: string;
  date: string;
}

export interface ClassResultsView {
  class: { id: string; name: string; code: string; grade: number | null; students: number };
  period: { from: string; to: string };
  results: ResultRow[];
  sittings: ClassSittingSummary[];
  summary: ResultsSummary;
  criteria: CriterionMean[];
}

export interface ClassComparisonRow extends ResultsSummary {
  classId: string;
  name: string;
  code: string;
  grade: number | null;
  students: number;
  /** Students of the class with at least one result in the period. */
  studentsWithResults: number;
}

export interface ClassComparisonView {
  period: { from: string; to: string };
  /** The band keys in order, highest first, so every row's bands line up. */
  bands: { key: string; label: string }[];
  classes: ClassComparisonRow[];
}

/** Columns of the year export, one row per student × sitting × request × criterion (RFC 4180). */
export const YEAR_EXPORT_COLUMNS = [
  'Pupil number',
  'Given name',
  'Family name',
  'Grade',
  'Sitting date',
  'Sitting',
  'Requirement list',
  'Request number',
  'Request',
  'Criterion key',
  'Criterion',
  'Mark',
  'Out of',
  'Result total',
  'Result out of',
  'Band',
  'Basis',
] as const;

/** Columns of a sitting's results export, before one column per criterion. */
export const SITTING_EXPORT_COLUMNS = [
  'Pupil number',
  'Given name',
  'Family name',
  'Grade',
  'Requirement list',
  'Total',
  'Out of',
  'Percentage',
  'Band',
  'Basis',
  'Examiner',
  'Released',
  'Outcome',
] as const;
