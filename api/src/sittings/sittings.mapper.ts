import type {
  AccessArrangementView,
  RequirementLine,
  SelectionRule,
  SittingStatus,
  SittingSummary,
  SittingView,
  SlotView,
} from '@stavemark/shared';
import { formatClock } from '@stavemark/shared';
import type { Membership } from '../users/entities/membership.entity.js';
import type { AccessArrangement } from './entities/access-arrangement.entity.js';
import type { SittingExaminer } from './entities/sitting-examiner.entity.js';
import type { SittingPaper } from './entities/sitting-paper.entity.js';
import type { Sitting } from './entities/sitting.entity.js';
import type { Slot } from './entities/slot.entity.js';
import { canSeeSlot, type SittingAccess } from './sitting-access.js';
import { clockOf } from './zoned-time.js';

/** A sitting's paper with the list it times from. */
export interface PaperFacts {
  paper: SittingPaper;
  list: { lines: RequirementLine[]; selectionRule: SelectionRule };
  name: string;
  grade: string;
  version: number;
  listId: string;
}

interface PlanLike {
  sitting: Sitting;
  papers: PaperFacts[];
  panel: SittingExaminer[];
  slots: Slot[];
  arrangements: Map<string, AccessArrangement>;
}

const ref = (e: SittingExaminer) => ({ id: e.membershipId, displayName: e.membership?.person?.displayName ?? 'An examiner' });

export function toArrangementView(studentId: string, a: AccessArrangement | undefined | null): AccessArrangementView {
  return {
    studentId,
    extraTimePercent: a?.extraTimePercent ?? 0,
    restBreakMinutes: a?.restBreakMinutes ?? 0,
    substitutions: a?.substitutions ?? [],
    notes: a?.notes ?? null,
    updatedAt: a?.updatedAt?.toISOString() ?? null,
    updatedBy: a?.updatedBy ? { id: a.updatedBy.id, displayName: a.updatedBy.displayName } : null,
  };
}

function times(slot: Slot, tz: string) {
  return {
    startsAt: slot.startsAt.toISOString(),
    endsAt: slot.endsAt.toISOString(),
    startTime: clockOf(slot.startsAt, tz),
    endTime: clockOf(slot.endsAt, tz),
    minutes: slot.minutes,
  };
}

function base(s: Sitting, panel: SittingExaminer[], candidateCount: number, planner: Membership | null, studentOnly: boolean): SittingSummary {
  return {
    id: s.id,
    title: s.title,
    date: s.date,
    room: s.room,
    status: s.status,
    timeZone: s.timeZone,
    dayStart: clockOf(s.startsAt, s.timeZone),
    dayEnd: clockOf(s.endsAt, s.timeZone),
    candidateCount,
    examiners: studentOnly ? [] : panel.map(ref),
    plannedBy: studentOnly || !planner ? null : { id: planner.id, displayName: planner.person?.displayName ?? '' },
  };
}

export function toSittingSummary(s: Sitting, panel: SittingExaminer[], slots: Slot[], access: SittingAccess, planner: Membership | null): SittingSummary {
  const visible = slots.filter((x) => canSeeSlot(access, x));
  const studentOnly = !access.editor && !access.examiner && !slots.some((x) => access.teaches.has(x.studentId));
  const summary = base(s, panel, visible.length, planner, studentOnly);
  const mine = access.studentId ? slots.find((x) => x.studentId === access.studentId) : undefined;
  if (mine && studentOnly) summary.mySlot = { id: mine.id, ...times(mine, s.timeZone) };
  return summary;
}

export interface ViewOptions {
  canSeeSlot: (s: Slot) => boolean;
  canSeeArrangement: (s: Slot) => boolean;
  studentOnly: boolean;
  nextStatuses: Exclude<SittingStatus, 'draft'>[];
  recordOutcomes: boolean;
  ownPupils?: Map<string, Map<string, string>> | undefined;
}

export function toSittingView(plan: PlanLike, access: SittingAccess, o: ViewOptions): SittingView {
  const s = plan.sitting;
  const tz = s.timeZone;
  const paperById = new Map(plan.papers.map((p) => [p.paper.id, p]));
  const panel = new Map(plan.panel.map((e) => [e.membershipId, ref(e)]));
  const visible = plan.slots.filter(o.canSeeSlot);
  const planner = plan.sitting.plannedBy ?? null;
  const summary = base(s, plan.panel, visible.length, planner, o.studentOnly);
  const slots: SlotView[] = visible.map((slot) => {
    const paper = paperById.get(slot.paperId)!;
    const effective = paper.paper.slotMinutes ?? paper.paper.suggestedMinutes;
    const view: SlotView = {
      id: slot.id,
      sittingId: s.id,
      position: slot.position,
      studentId: slot.studentId,
      candidate: { name: `${slot.student!.givenName} ${slot.student!.familyName}`, pupilNumber: slot.student!.pupilNumber, grade: slot.student!.grade },
      paperId: slot.paperId,
      ...times(slot, tz),
      notBefore: slot.notBefore === null ? null : formatClock(slot.notBefore),
      examiner: o.studentOnly || !slot.examinerMembershipId ? null : (panel.get(slot.examinerMembershipId) ?? null),
      secondExaminer: o.studentOnly || !slot.secondExaminerMembershipId ? null : (panel.get(slot.secondExaminerMembershipId) ?? null),
      outcome: slot.outcome,
      outcomeNote: o.studentOnly ? null : slot.outcomeNote,
      outcomeRecordedAt: slot.outcomeRecordedAt?.toISOString() ?? null,
      resitOfSlotId: slot.resitOfSlotId,
      ownPupilAcknowledged: !o.studentOnly && slot.ownPupilAckAt ? { by: slot.ownPupilAckBy?.displayName ?? slot.ownPupilAckByPersonId ?? '', at: slot.ownPupilAckAt.toISOString() } : null,
      // The length itself shows extra time to whoever sees it; the flag is for those who plan.
      lengthened: (access.editor || access.teaches.has(slot.studentId)) && slot.minutes > effective,
    };
    if (o.canSeeArrangement(slot)) view.arrangement = plan.arrangements.has(slot.studentId) ? toArrangementView(slot.studentId, plan.arrangements.get(slot.studentId)) : null;
    return view;
  });
  return {
    ...summary,
    breaks: s.breaks,
    writeUpGapMinutes: s.writeUpGapMinutes,
    changeoverMinutes: s.changeoverMinutes,
    papers: o.studentOnly
      ? []
      : plan.papers.map((p) => ({
          id: p.paper.id,
          listVersionId: p.paper.listVersionId,
          listId: p.listId,
          name: p.name,
          grade: p.grade,
          version: p.version,
          suggestedMinutes: p.paper.suggestedMinutes,
          slotMinutes: p.paper.slotMinutes,
          effectiveMinutes: p.paper.slotMinutes ?? p.paper.suggestedMinutes,
        })),
    slots,
    pinned:
      o.studentOnly || !s.scheduledAt || !s.bandPolicyId
        ? null
        : {
            listVersionIds: plan.papers.map((p) => p.paper.listVersionId),
            rubricVersionIds: s.pinnedRubricVersionIds ?? [],
            bandPolicy: { id: s.bandPolicyId, version: s.bandPolicy?.version ?? 0 },
            at: s.scheduledAt.toISOString(),
          },
    permissions: {
      edit: access.editor && (s.status === 'draft' || s.status === 'scheduled'),
      recordOutcomes: o.recordOutcomes,
      changeStatus: o.nextStatuses,
    },
    recordedExam: s.recordedExam,
  };
}
