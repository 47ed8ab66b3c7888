// Who may see and add recordings (issue 6 §6; design.md §8: a minor's data only to their teachers,
// their examiners while marking, and themselves). Pure rules over facts the service loads.
import { ADULT_AGE } from '@stavemark/shared';
import type { Caller } from '../common/request-context.js';
import { marksSlot, type SittingAccess } from '../sittings/sitting-access.js';
import type { Sitting } from '../sittings/entities/sitting.entity.js';
import type { Slot } from '../sittings/entities/slot.entity.js';
import type { Guardian } from '../students/entities/guardian.entity.js';
import type { Student } from '../students/entities/student.entity.js';

export interface StudentFacts {
  caller: Caller;
  teaches: ReadonlySet<string>;
  studentId: string | null;
}

const isAdmin = (c: Caller) => c.roles.includes('admin');

/** Teachers of the student and admins look after a student's recordings. */
export function looksAfter(f: StudentFacts, studentId: string): boolean {
  return isAdmin(f.caller) || f.teaches.has(studentId);
}

/** A slot's recordings: the candidate's teachers, admins, the candidate, and its examiners while the sitting runs. */
export function canViewSlotRecordings(a: SittingAccess, sitting: Sitting, slot: Slot): boolean {
  return looksAfter(a, slot.studentId) || slot.studentId === a.studentId || (sitting.status === 'in_progress' && marksSlot(a, slot));
}

/** A practice recording: the student's teachers, admins and the student. */
export function canViewStudentRecordings(f: StudentFacts, studentId: string): boolean {
  return looksAfter(f, studentId) || f.studentId === studentId;
}

export function canDeleteRecording(f: StudentFacts, rec: { studentId: string; uploadedByPersonId: string | null }): boolean {
  return looksAfter(f, rec.studentId) || rec.uploadedByPersonId === f.caller.personId;
}

/** Age in whole years on a calendar date (both YYYY-MM-DD). */
export function ageOn(dateOfBirth: string, onDate: string): number {
  const years = Number(onDate.slice(0, 4)) - Number(dateOfBirth.slice(0, 4));
  return onDate.slice(5) >= dateOfBirth.slice(5) ? years : years - 1;
}

/**
 * A minor may be recorded only with a guardian's yes on record, and not while any guardian has
 * said no (one carer's refusal is not overridden by another's consent). Returns the reason, or null.
 */
export function consentProblem(student: Pick<Student, 'givenName' | 'dateOfBirth'>, guardians: Pick<Guardian, 'consentRecordings'>[], today: string): string | null {
  if (ageOn(student.dateOfBirth, today) >= ADULT_AGE) return null;
  const name = student.givenName;
  if (guardians.some((g) => g.consentRecordings === false))
    return `${name} is under ${ADULT_AGE} and a guardian has declined recordings, so no recording of ${name} can be kept. Nothing was uploaded.`;
  if (!guardians.some((g) => g.consentRecordings === true))
    return `${name} is under ${ADULT_AGE} and no guardian’s consent to recordings is on record. A guardian can give it through the consent link the school e-mails them; until then nothing can be uploaded.`;
  return null;
}
