// Who may see and change what in a sitting (issue 5 §3, §7; design.md §2, §8). Pure rules over
// facts the service loads once per request.
import type { SittingStatus } from '@stavemark/shared';
import type { Caller } from '../common/request-context.js';
import type { Sitting } from './entities/sitting.entity.js';
import type { Slot } from './entities/slot.entity.js';

export interface CallerFacts {
  caller: Caller;
  /** Students in classes the caller teaches (empty unless they hold the teacher role). */
  teaches: ReadonlySet<string>;
  /** The caller's own student record in this organisation, if they are a student. */
  studentId: string | null;
}

export interface SittingAccess extends CallerFacts {
  admin: boolean;
  /** Planned this sitting (a teacher), or an admin: may change it. */
  editor: boolean;
  /** On the sitting's panel and holding the examiner role. */
  examiner: boolean;
}

const has = (c: Caller, role: Caller['roles'][number]) => c.roles.includes(role);

export function accessTo(facts: CallerFacts, sitting: Sitting, panel: readonly string[]): SittingAccess {
  const admin = has(facts.caller, 'admin');
  const planner = has(facts.caller, 'teacher') && sitting.plannedByMembershipId === facts.caller.membershipId;
  return {
    ...facts,
    admin,
    editor: admin || planner,
    examiner: has(facts.caller, 'examiner') && panel.includes(facts.caller.membershipId),
  };
}

/** Examiners and students see a sitting only once it is scheduled: a draft is still being planned. */
export function canSeeSitting(a: SittingAccess, sitting: Sitting, slots: readonly Pick<Slot, 'studentId'>[]): boolean {
  if (a.editor) return true;
  if (slots.some((s) => a.teaches.has(s.studentId))) return true;
  if (sitting.status === 'draft') return false;
  if (a.examiner) return true;
  return a.studentId !== null && slots.some((s) => s.studentId === a.studentId);
}

export function marksSlot(a: SittingAccess, slot: Pick<Slot, 'examinerMembershipId' | 'secondExaminerMembershipId'>): boolean {
  const me = a.caller.membershipId;
  return a.examiner && (slot.examinerMembershipId === me || slot.secondExaminerMembershipId === me);
}

/** Planners see every slot; a teacher their own pupils'; an examiner the slots they mark; a student their own. */
export function canSeeSlot(a: SittingAccess, slot: Slot): boolean {
  return a.editor || a.teaches.has(slot.studentId) || marksSlot(a, slot) || slot.studentId === a.studentId;
}

/** Confidential (issue 5 §3): the candidate's teachers, admins and, while marking, the slot's examiners. */
export function canSeeArrangement(a: SittingAccess, sitting: Sitting, slot: Slot): boolean {
  return a.admin || a.teaches.has(slot.studentId) || (sitting.status === 'in_progress' && marksSlot(a, slot));
}

/** Students see their own times only: no examiners, no other candidates, nothing of marks. */
export function seesAsStudentOnly(a: SittingAccess, slots: readonly Slot[]): boolean {
  return !a.editor && !a.examiner && !slots.some((s) => a.teaches.has(s.studentId));
}

export function canRecordOutcome(a: SittingAccess, slot: Slot): boolean {
  return a.editor || a.teaches.has(slot.studentId) || marksSlot(a, slot);
}

/** The next status this caller may move the sitting to, if any. */
export function nextStatusFor(a: SittingAccess, status: SittingStatus): Exclude<SittingStatus, 'draft'>[] {
  switch (status) {
    case 'draft':
      return a.editor ? ['scheduled'] : [];
    case 'scheduled':
      // The examiner on the day may open the sitting too.
      return a.editor || a.examiner ? ['in_progress'] : [];
    case 'in_progress':
      return a.editor ? ['marking_closed'] : [];
    case 'marking_closed':
      return a.editor ? ['published'] : [];
    case 'published':
      return [];
  }
}
