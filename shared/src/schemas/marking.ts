// The marking desk (issue 6; design.md §7): a mark sheet is a set of cells, each saved on its
// own with a client change id and the version of that cell it was based on. The same change sent
// twice is applied once; a conflict arises only when that same cell changed since.
import { z } from 'zod';
import {
  ARTICULATIONS,
  HANDS,
  MODES,
  MOTIONS,
  SLOT_OUTCOMES,
  type Request,
  type RubricCriterion,
  type SlotOutcome,
} from '../music/domain.js';
import { isKeyName, normaliseKeyName } from '../music/keys.js';
import type { FingeringView } from './fingerings.js';
import type { NoteNameConvention } from './roles.js';

/** The quick flags an examiner raises while the candidate plays, one key each. */
export const QUICK_FLAGS = ['slip', 'restart', 'stopped', 'prompted'] as const;
export type QuickFlag = (typeof QUICK_FLAGS)[number];
export const QUICK_FLAG_LABELS: Record<QuickFlag, string> = {
  slip: 'Fingering slip',
  restart: 'Restart',
  stopped: 'Stopped',
  prompted: 'Prompted',
};

export const MARK_SHEET_STATUSES = ['draft', 'submitted'] as const;
export type MarkSheetStatus = (typeof MARK_SHEET_STATUSES)[number];

// ---------- Cell names ----------
// mark:<request>:<criterion>  an integer 0..max, or null (cleared)
// flag:<request>:<flag>        a count ≥ 0
// comment:<request>            text
// comment:overall              text
// asked:<request>              false when the request was not asked
// outcome                      the slot's outcome as this examiner records it

const CRITERION_KEY = '[a-z][a-z0-9_]{0,39}';
const CELL_PATTERN = new RegExp(
  `^(?:mark:\\d{1,2}:${CRITERION_KEY}|flag:\\d{1,2}:(?:${QUICK_FLAGS.join('|')})|comment:(?:\\d{1,2}|overall)|asked:\\d{1,2}|outcome)$`,
);

export type CellKind = 'mark' | 'flag' | 'comment' | 'asked' | 'outcome';
export interface ParsedCell {
  kind: CellKind;
  /** The request's index in the draw; null for the overall comment and the outcome. */
  request: number | null;
  /** The criterion key (marks) or the flag (flags). */
  part: string | null;
}

export function parseCell(cell: string): ParsedCell | null {
  if (!CELL_PATTERN.test(cell)) return null;
  const [kind, a, b] = cell.split(':') as [CellKind, string | undefined, string | undefined];
  const request = a === undefined || a === 'overall' ? null : Number(a);
  return { kind, request, part: b ?? null };
}

export const cellName = {
  mark: (request: number, criterion: string) => `mark:${request}:${criterion}`,
  flag: (request: number, flag: QuickFlag) => `flag:${request}:${flag}`,
  comment: (request: number | 'overall') => `comment:${request}`,
  asked: (request: number) => `asked:${request}`,
  outcome: () => 'outcome',
};

export type CellValue = number | string | boolean | null;

/** The value's shape for its cell kind; a mark's upper limit is the criterion's, checked by the API. */
export function checkCellValue(kind: CellKind, value: CellValue): string | null {
  switch (kind) {
    case 'mark':
      return value === null ||
        (typeof value === 'number' && Number.isInteger(value) && value >= 0 && value <= 10)
        ? null
        : 'A mark is a whole number from 0 to the criterion’s maximum, or empty.';
    case 'flag':
      return typeof value === 'number' && Number.isInteger(value) && value >= 0 && value <= 99
        ? null
        : 'A flag count is a whole number from 0 to 99.';
    case 'comment':
      return typeof value === 'string' && value.length <= 2000
        ? null
        : 'A comment is text of at most 2000 characters.';
    case 'asked':
      return typeof value === 'boolean' ? null : 'Asked is true or false.';
    case 'outcome':
      return value === null ||
        (typeof value === 'string' && (SLOT_OUTCOMES as readonly string[]).includes(value))
        ? null
        : `The outcome is one of ${SLOT_OUTCOMES.join(', ')}.`;
  }
}

const cellValueSchema = z.union([z.number(), z.string(), z.boolean(), z.null()]);

const cellField = z
  .string()
  .max(80)
  .refine(
    (c) => parseCell(c) !== null,
    'Not a cell of a mark sheet (e.g. "mark:0:accuracy", "flag:1:slip", "comment:overall").',
  );

/** One save: a cell, its new value, the client's change id and the version it was based on. */
export const saveCellSchema = z
  .strictObject({
    changeId: z.uuid('changeId must be a UUID made by the client.'),
    cell: cellField,
    value: cellValueSchema,
    /** The cell's version the client last saw; 0 for a cell never saved. */
    baseVersion: z.number().int().min(0),
  })
  .superRefine((v, ctx) => {
    const parsed = parseCell(v.cell);
    const problem = parsed ? checkCellValue(parsed.kind, v.value) : null;
    if (problem) ctx.addIssue({ code: 'custom', path: ['value'], message: problem });
  });
export type SaveCellInput = z.infer<typeof saveCellSchema>;

/** A change to a submitted sheet: one cell, with the reason kept in the audit trail. */
export const correctCellSchema = z
  .strictObject({
    changeId: z.uuid(),
    cell: cellField,
    value: cellValueSchema,
    reason: z.string().trim().min(3, 'Say why the submitted sheet is corrected.').max(500),
  })
  .superRefine((v, ctx) => {
    const parsed = parseCell(v.cell);
    const problem = parsed ? checkCellValue(parsed.kind, v.value) : null;
    if (problem) ctx.addIssue({ code: 'custom', path: ['value'], message: problem });
  });
export type CorrectCellInput = z.infer<typeof correctCellSchema>;

export const submitSheetSchema = z.strictObject({
  /** The client's last change id, so the API can refuse a submit that overtakes its own saves. */
  lastChangeId: z.uuid().nullable(),
  confirm: z.literal(true, 'Confirm the submission.'),
});
export type SubmitSheetInput = z.infer<typeof submitSheetSchema>;

/** The examiner changes a drawn request; the change and its reason are recorded. */
export const changeRequestSchema = z.strictObject({
  index: z.number().int().min(0).max(99),
  key: z
    .string()
    .trim()
    .refine(isKeyName, 'Not a key or note name (e.g. "F#", "Bb").')
    .transform((k) => normaliseKeyName(k))
    .optional(),
  mode: z.enum(MODES).optional(),
  hands: z.enum(HANDS).optional(),
  motion: z.enum(MOTIONS).nullable().optional(),
  octaves: z.number().int().min(1).max(4).optional(),
  articulation: z.enum(ARTICULATIONS).nullable().optional(),
  reason: z.string().trim().min(3, 'Say why the request is changed.').max(500),
});
export type ChangeRequestInput = z.infer<typeof changeRequestSchema>;

// ---------- Views ----------

export interface CellView {
  cell: string;
  value: CellValue;
  version: number;
}

export type SaveResult =
  | {
      status: 'applied' | 'duplicate';
      cell: string;
      value: CellValue;
      version: number;
      changeId: string;
    }
  | {
      status: 'conflict';
      cell: string;
      changeId: string;
      yours: CellValue;
      theirs: CellValue;
      version: number;
    };

export interface MarkSheetView {
  id: string;
  slotId: string;
  examiner: { id: string; displayName: string };
  /** third: a moderator's sheet for a pair outside tolerance. */
  role: 'first' | 'second' | 'third';
  status: MarkSheetStatus;
  startedAt: string;
  submittedAt: string | null;
  cells: CellView[];
}

export interface DeskCriterion extends RubricCriterion {
  /** The tension criterion carries the health caution (design.md §10). */
  tension: boolean;
}

export interface DeskRequest extends Request {
  criteria: DeskCriterion[];
  rubricName: string;
  /** The student's approved fingering per hand for this request, when one is on record. */
  fingerings: FingeringView[];
  /** Changed by the examiner after the draw, with the reason. */
  change: { reason: string; by: string; at: string; before: Partial<Request> } | null;
}

export interface DeskView {
  slot: {
    id: string;
    sittingId: string;
    sittingTitle: string;
    sittingStatus: string;
    room: string;
    startsAt: string;
    endsAt: string;
    minutes: number;
    writeUpGapMinutes: number;
    outcome: SlotOutcome | null;
    candidate: { name: string; pupilNumber: string; grade: number | null };
    listName: string;
    extraTimePercent: number;
  };
  role: 'first' | 'second';
  noteNames: NoteNameConvention;
  draw: { seed: string; algorithm: string; drawnAt: string; repeatsOfPrevious: number } | null;
  requests: DeskRequest[];
  sheet: MarkSheetView | null;
  /** The other examiner's sheet: only once both are submitted (blind second marking). */
  otherSheet: MarkSheetView | null;
}

export interface MarkingSlotSummary {
  id: string;
  position: number;
  startTime: string;
  endTime: string;
  candidate: string;
  listName: string;
  role: 'first' | 'second';
  outcome: SlotOutcome | null;
  sheetStatus: MarkSheetStatus | null;
}

export interface MarkingSittingSummary {
  id: string;
  title: string;
  date: string;
  room: string;
  status: string;
  slots: MarkingSlotSummary[];
}
