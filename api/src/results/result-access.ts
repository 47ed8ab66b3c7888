import type { EntityManager } from 'typeorm';
import { RequestContext, type Caller } from '../common/request-context.js';

/** Who is asking, for results and moderation: the students they teach, their own student record. */
export interface ResultCaller {
  caller: Caller;
  admin: boolean;
  /** Student ids in classes the caller teaches (teachers only). */
  teaches: ReadonlySet<string>;
  /** The caller's own student record (students only). */
  studentId: string | null;
}

export async function resultCaller(em: EntityManager): Promise<ResultCaller> {
  const caller = RequestContext.requireCaller();
  let teaches = new Set<string>();
  if (caller.roles.includes('teacher')) {
    const rows = (await em.query(
      `SELECT DISTINCT cs.student_id AS id
         FROM class_teachers ct
         JOIN class_members cs ON cs.class_id = ct.class_id
         JOIN classes c ON c.id = ct.class_id
        WHERE ct.membership_id = $1 AND c.organisation_id = $2`,
      [caller.membershipId, caller.organisationId],
    )) as { id: string }[];
    teaches = new Set(rows.map((r) => r.id));
  }
  let studentId: string | null = null;
  if (caller.roles.includes('student')) {
    const [row] = (await em.query(
      `SELECT id FROM students WHERE membership_id = $1 AND organisation_id = $2`,
      [caller.membershipId, caller.organisationId],
    )) as { id: string }[];
    studentId = row?.id ?? null;
  }
  return { caller, admin: caller.roles.includes('admin'), teaches, studentId };
}
