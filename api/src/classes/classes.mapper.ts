import type { ClassRow, GuardianView, StudentRow } from '@stavemark/shared';
import type { Guardian } from '../students/entities/guardian.entity.js';
import type { Student } from '../students/entities/student.entity.js';
import type { ClassGroup } from './entities/class-group.entity.js';

export function toGuardianView(g: Guardian): GuardianView {
  return {
    name: g.name,
    email: g.email,
    consentResultsEmail: g.consentResultsEmail,
    consentRecordings: g.consentRecordings,
  };
}

/** What leaves the server about a student: never the entity itself. */
export function toStudentRow(s: Student, classCodes: string[]): StudentRow {
  return {
    id: s.id,
    pupilNumber: s.pupilNumber,
    givenName: s.givenName,
    familyName: s.familyName,
    email: s.email,
    dateOfBirth: s.dateOfBirth,
    grade: s.grade,
    active: s.active,
    hasSignIn: s.membershipId !== null,
    guardians: [...(s.guardians ?? [])]
      .sort((a, b) => a.email.localeCompare(b.email))
      .map(toGuardianView),
    classCodes: [...classCodes].sort(),
  };
}

export function toClassRow(c: ClassGroup, memberCount: number): ClassRow {
  return {
    id: c.id,
    name: c.name,
    code: c.code,
    grade: c.grade,
    active: c.active,
    teachers: (c.teachers ?? [])
      .filter((m) => m.person)
      .map((m) => ({ id: m.person!.id, displayName: m.person!.displayName }))
      .sort((a, b) => a.displayName.localeCompare(b.displayName)),
    memberCount,
  };
}
