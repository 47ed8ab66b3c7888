import type { EntityManager } from 'typeorm';

/**
 * Fills latest_results from results: per student, list lineage and grade, the result computed
 * last (ties by id, so the choice is stable). `where` filters the results read (alias r). Used by
 * refreshLatest, the LatestResults migration's backfill and the benchmark's seed, so they agree.
 */
export const fillLatestResultsSql = (where: string) => `
  INSERT INTO latest_results (student_id, list_id, grade, organisation_id, result_id, percentage, computed_at)
  SELECT DISTINCT ON (r.student_id, v.list_id, v.grade)
         r.student_id, v.list_id, v.grade, r.organisation_id, r.id, r.percentage, r.computed_at
    FROM results r JOIN requirement_list_versions v ON v.id = r.list_version_id
   WHERE ${where}
   ORDER BY r.student_id, v.list_id, v.grade, r.computed_at DESC, r.id DESC
  ON CONFLICT (student_id, list_id, grade) DO UPDATE
     SET organisation_id = EXCLUDED.organisation_id, result_id = EXCLUDED.result_id,
         percentage = EXCLUDED.percentage, computed_at = EXCLUDED.computed_at`;

/**
 * Rebuilds these students' latest_results rows from their results, in the caller's transaction:
 * call it after storing, recomputing or removing results (or changing computed_at). Rebuilt rather
 * than patched, so a removed latest result falls back to the one before and a new grade gets its
 * own row. The students' rows are locked first so two transactions rebuilding the same student
 * run one after the other, the second seeing the first's results.
 */
export async function refreshLatest(
  em: EntityManager,
  organisationId: string,
  studentIds: readonly string[],
): Promise<void> {
  const ids = [...new Set(studentIds)].sort();
  if (!ids.length) return;
  await em.query(
    `SELECT 1 FROM students WHERE organisation_id = $1 AND id = ANY($2::uuid[]) ORDER BY id FOR NO KEY UPDATE`,
    [organisationId, ids],
  );
  await em.query(
    `DELETE FROM latest_results WHERE organisation_id = $1 AND student_id = ANY($2::uuid[])`,
    [organisationId, ids],
  );
  await em.query(
    fillLatestResultsSql(`r.organisation_id = $1 AND r.student_id = ANY($2::uuid[])`),
    [organisationId, ids],
  );
}
