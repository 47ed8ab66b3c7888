import { quantileRank } from 'simple-statistics';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ProgressView } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { ResultsService } from '../results/results.service.js';

// The demo year (api/src/seed/demo-year.ts), seeded for 2026-12-01.
const SEED_DAY = '2026-12-01';

interface Latest {
  student_id: string;
  list_id: string;
  grade: string;
  result_id: string;
  percentage: number;
}

describe('latest_results: the percentile’s table of each student’s latest result per lineage and grade', () => {
  let t: TestApp;
  let teacher: string;
  const id: Record<string, string> = {};
  beforeAll(async () => {
    t = await createTestApp({ today: SEED_DAY, env: { STAVEMARK_NOW: `${SEED_DAY}T12:00:00Z` } });
    teacher = await signIn(t, 'teacher@demo.example');
    for (const r of (await t.db.query(`SELECT pupil_number, id FROM students`)) as {
      pupil_number: string;
      id: string;
    }[])
      id[r.pupil_number] = r.id;
  });
  afterAll(() => t.close());

  const table = async () =>
    (await t.db.query(
      `SELECT student_id, list_id, grade, result_id, percentage FROM latest_results ORDER BY student_id, list_id, grade`,
    )) as Latest[];
  // The same thing derived from results directly (the definition the table must keep to).
  const derived = async () =>
    (await t.db.query(
      `SELECT DISTINCT ON (r.student_id, v.list_id, v.grade) r.student_id, v.list_id, v.grade, r.id AS result_id, r.percentage
         FROM results r JOIN requirement_list_versions v ON v.id = r.list_version_id
        ORDER BY r.student_id, v.list_id, v.grade, r.computed_at DESC, r.id DESC`,
    )) as Latest[];
  const rowsOf = async (pupil: string) => (await table()).filter((r) => r.student_id === id[pupil]);
  const progress = async (pupil: string) => {
    const res = await t
      .http()
      .get(`/api/students/${id[pupil]}/progress`)
      .set('Authorization', `Bearer ${teacher}`);
    expect(res.status).toBe(200);
    return res.body as ProgressView;
  };
  // quantileRank (simple-statistics) over each grade-5 peer's latest result, straight from results.
  const expectedPercentile = async (lineageId: string, value: number) => {
    const peers = (await derived())
      .filter((r) => r.list_id === lineageId && r.grade === '5')
      .map((r) => r.percentage);
    return 100 * quantileRank(peers, value);
  };

  it('the seed fills it: one row per student, lineage and grade, each the latest result', async () => {
    const rows = await table();
    expect(rows.length).toBeGreaterThan(10);
    expect(rows).toEqual(await derived());
  });

  it('a result from a different grade has its own row: Cosima’s Grade 3 and Grade 5', async () => {
    const rows = await rowsOf('KL1029');
    expect(rows.map((r) => r.grade).sort()).toEqual(['3', '5']);
  });

  it('a recomputed result becomes the latest: the student’s row moves and a peer’s percentile with it', async () => {
    const ellis = id.KL1021!;
    const [before] = (await rowsOf('KL1021')).filter((r) => r.grade === '5');
    // Ellis's earliest Grade 5 result, its marks corrected to zero and recomputed: now the latest.
    const [first] = (await t.db.query(
      `SELECT r.id, r.slot_id, r.sitting_id FROM results r JOIN sittings s ON s.id = r.sitting_id
        WHERE r.student_id = $1 ORDER BY s.date LIMIT 1`,
      [ellis],
    )) as { id: string; slot_id: string; sitting_id: string }[];
    expect(first!.id).not.toBe(before!.result_id);
    // A peer below Ellis's old latest, whose percentile must rise once Ellis drops to 0 %.
    const peers = (await derived()).filter(
      (r) => r.list_id === before!.list_id && r.grade === '5' && r.student_id !== ellis,
    );
    const low = peers
      .filter((r) => r.percentage < before!.percentage)
      .sort((a, b) => a.percentage - b.percentage)[0]!;
    const lowPupil = Object.keys(id).find((p) => id[p] === low.student_id)!;
    const peerBefore = await progress(lowPupil);
    expect(peerBefore.percentile!.value!).toBeCloseTo(
      await expectedPercentile(before!.list_id, low.percentage),
      9,
    );

    await t.db.query(
      `UPDATE mark_cells c SET value = to_jsonb(0) FROM mark_sheets ms
        WHERE ms.id = c.sheet_id AND ms.slot_id = $1 AND c.cell LIKE 'mark:%'`,
      [first!.slot_id],
    );
    const summary = await t.app.get(ResultsService).computeForSitting(first!.sitting_id);
    expect(summary.computed).toBeGreaterThanOrEqual(1);

    const [after] = (await rowsOf('KL1021')).filter((r) => r.grade === '5');
    expect(after!.result_id).toBe(first!.id);
    expect(after!.percentage).toBe(0);
    expect(await table()).toEqual(await derived());
    const peerAfter = await progress(lowPupil);
    expect(peerAfter.percentile!.value!).toBeGreaterThan(peerBefore.percentile!.value!);
    expect(peerAfter.percentile!.value!).toBeCloseTo(
      await expectedPercentile(before!.list_id, low.percentage),
      9,
    );
    expect(peerAfter.percentile!.students).toBe(peerBefore.percentile!.students);
  });

  it('a removed latest result gives the row back to the one before (slot withdrawn after closing)', async () => {
    // A student whose latest result is in a sitting still open to outcome changes (marking closed,
    // not published), with an earlier result in the same lineage and grade to fall back to.
    const [row] = (await t.db.query(
      `SELECT l.student_id, l.list_id, l.grade, l.result_id, r.slot_id FROM latest_results l
         JOIN results r ON r.id = l.result_id JOIN sittings s ON s.id = r.sitting_id
        WHERE s.status = 'marking_closed'
          AND EXISTS (SELECT 1 FROM results r2 JOIN requirement_list_versions v ON v.id = r2.list_version_id
                       WHERE r2.student_id = l.student_id AND v.list_id = l.list_id AND v.grade = l.grade AND r2.id <> l.result_id)
        ORDER BY l.student_id LIMIT 1`,
    )) as (Latest & { slot_id: string })[];
    expect(row).toBeDefined();
    const res = await t
      .http()
      .post(`/api/slots/${row!.slot_id}/outcome`)
      .set('Authorization', `Bearer ${teacher}`)
      .send({ outcome: 'withdrawn', note: 'Withdrew on the day; entered in error.' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const now = (await table()).find(
      (r) =>
        r.student_id === row!.student_id && r.list_id === row!.list_id && r.grade === row!.grade,
    );
    expect(now).toBeDefined();
    expect(now!.result_id).not.toBe(row!.result_id);
    expect(await table()).toEqual(await derived());
  });
});
