// Request shapes and views of sittings (issue 5): planning a timed mock-exam day, its slots,
// access arrangements, double marking, outcomes, re-sits and band policies.
import { z } from 'zod';
import { SLOT_OUTCOMES, type SlotOutcome, type Substitution } from '../music/domain.js';
import { requestKindSchema } from '../music/schemas.js';
import type { BandPolicy } from '../marks/bands.js';

export const SITTING_STATUSES = [
  'draft',
  'scheduled',
  'in_progress',
  'marking_closed',
  'published',
] as const;
export type SittingStatus = (typeof SITTING_STATUSES)[number];
export const sittingStatusSchema = z.enum(SITTING_STATUSES);

/** The only forward steps; nothing goes back (a scheduled sitting has pinned its versions). */
export const NEXT_SITTING_STATUS: Record<SittingStatus, SittingStatus | null> = {
  draft: 'scheduled',
  scheduled: 'in_progress',
  in_progress: 'marking_closed',
  marking_closed: 'published',
  published: null,
};

export const slotOutcomeSchema = z.enum(SLOT_OUTCOMES);

/** A wall-clock time of the sitting's day, in the organisation's time zone. */
export const clockSchema = z
  .string()
  .trim()
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a 24-hour time such as 09:30.');

const minutesOf = (clock: string): number =>
  Number(clock.slice(0, 2)) * 60 + Number(clock.slice(3, 5));

export const sittingBreakSchema = z
  .strictObject({
    start: clockSchema,
    end: clockSchema,
    label: z.string().trim().max(60).optional(),
  })
  .refine((b) => minutesOf(b.end) > minutesOf(b.start), {
    path: ['end'],
    message: 'A break ends after it starts.',
  });
export type SittingBreak = z.infer<typeof sittingBreakSchema>;

/** One requirement-list version used in a sitting; `slotMinutes` fixes the length for its grade. */
export const sittingPaperSchema = z.strictObject({
  listVersionId: z.uuid('Choose a requirement list.'),
  /** Null or absent: the length suggested from the list (planSlotMinutes plus the write-up gap). */
  slotMinutes: z
    .number()
    .int('Whole minutes.')
    .min(2, 'A slot is at least 2 minutes.')
    .max(180, 'A slot is at most 180 minutes.')
    .nullable()
    .optional(),
});
export type SittingPaperInput = z.infer<typeof sittingPaperSchema>;

const sittingFields = {
  title: z.string().trim().min(1, 'Give the sitting a title.').max(120),
  date: z.iso.date('Use a date such as 2026-12-01.'),
  room: z.string().trim().min(1, 'Say which room.').max(80),
  dayStart: clockSchema,
  dayEnd: clockSchema,
  breaks: z.array(sittingBreakSchema).max(10),
  /** The examiner's write-up time after each candidate, included in every slot. */
  writeUpGapMinutes: z.number().int().min(0).max(30),
  /** Minutes between one candidate leaving and the next coming in. */
  changeoverMinutes: z.number().int().min(0).max(30),
  papers: z
    .array(sittingPaperSchema)
    .min(1, 'Choose at least one requirement list.')
    .max(12)
    .refine((p) => new Set(p.map((x) => x.listVersionId)).size === p.length, 'Each list once.'),
  /** Examiner memberships; the first leads and marks every candidate unless a slot says otherwise. */
  examinerIds: z
    .array(z.uuid())
    .max(12)
    .refine((e) => new Set(e).size === e.length, 'Each examiner once.'),
};

type DayShape = { dayStart?: string; dayEnd?: string; breaks?: SittingBreak[] };
function checkDay(v: DayShape, ctx: z.RefinementCtx): void {
  if (v.dayStart === undefined || v.dayEnd === undefined) return;
  const start = minutesOf(v.dayStart);
  const end = minutesOf(v.dayEnd);
  if (end <= start) {
    ctx.addIssue({ code: 'custom', path: ['dayEnd'], message: 'The day ends after it starts.' });
    return;
  }
  const breaks = [...(v.breaks ?? [])]
    .map((b, i) => ({ i, s: minutesOf(b.start), e: minutesOf(b.end) }))
    .sort((a, b) => a.s - b.s);
  breaks.forEach((b, k) => {
    if (b.s < start || b.e > end)
      ctx.addIssue({
        code: 'custom',
        path: ['breaks', b.i, 'start'],
        message: `A break lies inside the day (${v.dayStart}–${v.dayEnd}).`,
      });
    const prev = breaks[k - 1];
    if (prev && b.s < prev.e)
      ctx.addIssue({
        code: 'custom',
        path: ['breaks', b.i, 'start'],
        message: 'Breaks may not overlap.',
      });
  });
}

export const createSittingSchema = z
  .strictObject({
    ...sittingFields,
    breaks: sittingFields.breaks.default([]),
    writeUpGapMinutes: sittingFields.writeUpGapMinutes.default(3),
    changeoverMinutes: sittingFields.changeoverMinutes.default(0),
    examinerIds: sittingFields.examinerIds.default([]),
    acknowledgeOwnPupil: z.boolean().optional(),
  })
  .superRefine(checkDay);
export type CreateSittingInput = z.output<typeof createSittingSchema>;
export type CreateSittingBody = z.input<typeof createSittingSchema>;

/** Any subset; papers and the write-up gap are fixed once the sitting is scheduled. */
export const updateSittingSchema = z
  .strictObject({
    title: sittingFields.title.optional(),
    date: sittingFields.date.optional(),
    room: sittingFields.room.optional(),
    dayStart: sittingFields.dayStart.optional(),
    dayEnd: sittingFields.dayEnd.optional(),
    breaks: sittingFields.breaks.optional(),
    writeUpGapMinutes: sittingFields.writeUpGapMinutes.optional(),
    changeoverMinutes: sittingFields.changeoverMinutes.optional(),
    papers: sittingFields.papers.optional(),
    examinerIds: sittingFields.examinerIds.optional(),
    acknowledgeOwnPupil: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).some((k) => k !== 'acknowledgeOwnPupil'), 'Nothing to change.')
  .superRefine(checkDay);
export type UpdateSittingInput = z.output<typeof updateSittingSchema>;

export const listSittingsQuerySchema = z.strictObject({
  from: z.iso.date().optional(),
  to: z.iso.date().optional(),
  status: sittingStatusSchema.optional(),
});
export type ListSittingsQuery = z.infer<typeof listSittingsQuerySchema>;

export const addCandidatesSchema = z
  .strictObject({
    classId: z.uuid().optional(),
    studentIds: z.array(z.uuid()).max(200).optional(),
    /** Put everyone on this list; without it each candidate goes to the list of their grade. */
    listVersionId: z.uuid().optional(),
    acknowledgeOwnPupil: z.boolean().optional(),
  })
  .refine((v) => v.classId !== undefined || (v.studentIds?.length ?? 0) > 0, {
    message: 'Choose a class or some students.',
    path: ['classId'],
  });
export type AddCandidatesInput = z.infer<typeof addCandidatesSchema>;

export const updateSlotSchema = z
  .strictObject({
    examinerId: z.uuid().nullable().optional(),
    secondExaminerId: z.uuid().nullable().optional(),
    /** Start no earlier than this time (leaves a gap before the slot); null removes it. */
    notBefore: clockSchema.nullable().optional(),
    /** Which of the sitting's lists the candidate takes. */
    paperId: z.uuid().optional(),
    acknowledgeOwnPupil: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).some((k) => k !== 'acknowledgeOwnPupil'), 'Nothing to change.');
export type UpdateSlotInput = z.infer<typeof updateSlotSchema>;

export const moveSlotSchema = z.strictObject({ direction: z.enum(['earlier', 'later']) });
export type MoveSlotInput = z.infer<typeof moveSlotSchema>;

export const swapSlotsSchema = z.strictObject({ withSlotId: z.uuid() });
export type SwapSlotsInput = z.infer<typeof swapSlotsSchema>;

export const recordOutcomeSchema = z.strictObject({
  outcome: slotOutcomeSchema,
  note: z.string().trim().max(500).optional(),
});
export type RecordOutcomeInput = z.infer<typeof recordOutcomeSchema>;

export const createResitSchema = z.strictObject({
  /** The sitting the re-sit takes place in (may be the same one, later in the day). */
  sittingId: z.uuid(),
  acknowledgeOwnPupil: z.boolean().optional(),
});
export type CreateResitInput = z.infer<typeof createResitSchema>;

export const doubleMarkingSchema = z
  .strictObject({
    /** Percentage of the slots to double-mark, spread through the day. */
    share: z.number().min(0).max(100).optional(),
    /** Or exactly these slots. */
    slotIds: z.array(z.uuid()).max(500).optional(),
    acknowledgeOwnPupil: z.boolean().optional(),
  })
  .refine((v) => (v.share === undefined) !== (v.slotIds === undefined), {
    message: 'Give either a share of the slots or the slots themselves.',
    path: ['share'],
  });
export type DoubleMarkingInput = z.infer<typeof doubleMarkingSchema>;

export const changeSittingStatusSchema = z.strictObject({
  status: sittingStatusSchema.exclude(['draft']),
  acknowledgeOwnPupil: z.boolean().optional(),
});
export type ChangeSittingStatusInput = z.infer<typeof changeSittingStatusSchema>;

export const dayScheduleQuerySchema = z.strictObject({
  date: z.iso.date('Use a date such as 2026-12-01.'),
});
export type DayScheduleQuery = z.infer<typeof dayScheduleQuerySchema>;

// ---------- Access arrangements ----------

export const substitutionSchema = z.discriminatedUnion('type', [
  z.strictObject({
    type: z.literal('hands_separately'),
    appliesTo: z.array(requestKindSchema).min(1).optional(),
  }),
  z.strictObject({
    type: z.literal('single_hand'),
    hand: z.enum(['RH', 'LH']),
    appliesTo: z.array(requestKindSchema).min(1).optional(),
  }),
  z.strictObject({
    type: z.literal('max_octaves'),
    octaves: z.number().int().min(1).max(4),
    appliesTo: z.array(requestKindSchema).min(1).optional(),
  }),
  z.strictObject({
    type: z.literal('tempo_percent'),
    percent: z.number().int().min(50, 'At least 50 % of the set tempo.').max(99),
    appliesTo: z.array(requestKindSchema).min(1).optional(),
  }),
]) satisfies z.ZodType<Substitution>;

export const accessArrangementSchema = z
  .strictObject({
    extraTimePercent: z
      .number()
      .int('Whole percent.')
      .min(0)
      .max(100, 'Extra time is at most 100 %.'),
    restBreakMinutes: z.number().int('Whole minutes.').min(0).max(60),
    substitutions: z.array(substitutionSchema).max(8),
    notes: z.string().trim().max(1000).optional(),
  })
  .refine((a) => new Set(a.substitutions.map((s) => s.type)).size === a.substitutions.length, {
    path: ['substitutions'],
    message: 'Each kind of substitution once.',
  })
  .refine(
    (a) =>
      !(
        a.substitutions.some((s) => s.type === 'hands_separately') &&
        a.substitutions.some((s) => s.type === 'single_hand')
      ),
    { path: ['substitutions'], message: 'Choose hands separately or one hand, not both.' },
  );
export type AccessArrangementInput = z.infer<typeof accessArrangementSchema>;

export interface AccessArrangementView {
  studentId: string;
  extraTimePercent: number;
  restBreakMinutes: number;
  substitutions: Substitution[];
  notes: string | null;
  updatedAt: string | null;
  updatedBy: { id: string; displayName: string } | null;
}

// ---------- Views ----------

export interface SittingPersonRef {
  /** Membership id (the person's place in this organisation). */
  id: string;
  displayName: string;
}

export interface SittingPaperView {
  id: string;
  listVersionId: string;
  listId: string;
  name: string;
  grade: string;
  version: number;
  /** planSlotMinutes for the list plus the write-up gap, before any access arrangement. */
  suggestedMinutes: number;
  /** The teacher's fixed length for this grade, or null. */
  slotMinutes: number | null;
  effectiveMinutes: number;
}

export interface SlotTimes {
  /** Instants (ISO 8601, UTC). */
  startsAt: string;
  endsAt: string;
  /** Wall-clock times in the sitting's time zone. */
  startTime: string;
  endTime: string;
  minutes: number;
}

export interface SlotView extends SlotTimes {
  id: string;
  sittingId: string;
  position: number;
  studentId: string;
  candidate: { name: string; pupilNumber: string; grade: number | null };
  paperId: string;
  notBefore: string | null;
  examiner: SittingPersonRef | null;
  secondExaminer: SittingPersonRef | null;
  outcome: SlotOutcome | null;
  outcomeNote: string | null;
  outcomeRecordedAt: string | null;
  resitOfSlotId: string | null;
  /** Set when someone went ahead although the examiner teaches this candidate. */
  ownPupilAcknowledged: { by: string; at: string } | null;
  /** Only for the candidate's teachers, admins and the slot's examiners while marking. */
  arrangement?: AccessArrangementView | null;
  /** Whether the slot's length includes extra time or rest (shown to those who plan). */
  lengthened: boolean;
}

export interface SittingPermissions {
  edit: boolean;
  recordOutcomes: boolean;
  /** The steps the caller may take next (never back to draft). */
  changeStatus: Exclude<SittingStatus, 'draft'>[];
}

export interface SittingSummary {
  id: string;
  title: string;
  date: string;
  room: string;
  status: SittingStatus;
  timeZone: string;
  dayStart: string;
  dayEnd: string;
  candidateCount: number;
  examiners: SittingPersonRef[];
  plannedBy: SittingPersonRef | null;
  /** A student's own slot (students see nothing else of the sitting's candidates). */
  mySlot?: SlotTimes & { id: string };
}

export interface SittingPinned {
  listVersionIds: string[];
  rubricVersionIds: string[];
  bandPolicy: { id: string; version: number };
  at: string;
}

export interface SittingView extends SittingSummary {
  breaks: SittingBreak[];
  writeUpGapMinutes: number;
  changeoverMinutes: number;
  papers: SittingPaperView[];
  slots: SlotView[];
  pinned: SittingPinned | null;
  permissions: SittingPermissions;
  /** Candidates may upload their own recording (issue 6 §6). */
  recordedExam: boolean;
}

export interface ScheduleEntry {
  slotId: string;
  sittingId: string;
  sittingTitle: string;
  room: string;
  startTime: string;
  endTime: string;
  startsAt: string;
  endsAt: string;
  candidate: string;
  listName: string;
  examiner: string | null;
  secondExaminer: string | null;
  outcome: SlotOutcome | null;
}

export interface DaySchedule {
  date: string;
  timeZone: string;
  rooms: { room: string; entries: ScheduleEntry[] }[];
  examiners: { examiner: SittingPersonRef; entries: ScheduleEntry[] }[];
}

export interface ExaminerOption extends SittingPersonRef {
  email: string;
}

export interface BandPolicyVersionView extends BandPolicy {
  id: string;
  version: number;
  createdAt: string;
  createdBy: { id: string; displayName: string } | null;
}

export interface BandPolicyView {
  current: BandPolicyVersionView;
  versions: BandPolicyVersionView[];
}
