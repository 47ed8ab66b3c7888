// Small rules shared by the versioned teaching records (rubrics, requirement lists) and the
// fingerings module. Kept beside the rubrics because they were the first to need them.
import { QueryFailedError } from 'typeorm';
import type { Role } from '@stavemark/shared';
import { RequestContext } from '../common/request-context.js';

/** Teachers and admins write rubrics, lists and fingerings; examiners and students only read. */
export function isTeachingStaff(roles: readonly Role[]): boolean {
  return roles.includes('admin') || roles.includes('teacher');
}

/** Drafts are work in progress: only those who can edit them see them. */
export function callerSeesDrafts(): boolean {
  return isTeachingStaff(RequestContext.requireCaller().roles);
}

/** PostgreSQL's unique_violation (SQLSTATE 23505), optionally on one named constraint or index. */
export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  if (!(err instanceof QueryFailedError)) return false;
  const e = err.driverError as { code?: string; constraint?: string };
  return e.code === '23505' && (constraint === undefined || e.constraint === constraint);
}

/** A file name part from a title: "Scales — Grade 3" → "scales-grade-3". */
export function slug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'rubric'
  );
}
