import { linearRegression, linearRegressionLine, quantileRank, sampleVariance } from 'simple-statistics';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TENSION_CAUTION, type AttentionView, type ProgressSitting, type ProgressView } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

// The demo is seeded for 2026-12-01 with its year of marks (api/src/seed/demo-year.ts).
const SEED_DAY = '2026-12-01';
const DAY = 86_400_000;

describe('progress and attention', () => {
  let t: TestApp;
  const tok: Record<string, string> = {};
  const id: Record<string, string> = {};
  beforeAll(async () => {
    t = await createTestApp({ today: SEED_DAY, env: { STAVEMARK_NOW: `${SEED_DAY}T12:00:00Z` } });
    for (const [k, email] of Object.entries({
      teacher: 'teacher@demo.example',
      tomasz: 'tomasz.whitcombe@demo.example',
      admin: 'admin@demo.example',
      examiner: 'examiner@demo.example',
      student: 'student@demo.example',
      fernhill: 'admin@fernhill.example',
    }))
      tok[k] = await signIn(t, email);
    const rows = (await t.db.query(`SELECT pupil_number, id FROM students`)) as { pupil_number: string; id: string }[];
    for (const r of rows) id[r.pupil_number] = r.id;
  });
  afterAll(() => t.close());

  const get = (path: string, who: string) => t.http().get(path).set('Authorization', `Bearer ${tok[who]}`);
  const progress = async (pupil: string, who = 'teacher') => {
    const res = await get(`/api/students/${id[pupil]}/progress`, who);
    expect(res.status).toBe(200);
    return res.body as ProgressView;
  };

  it('the student sees their year: released results, the absent sitting as absent (not zero), comments by examiner', async () => {
    const v = await progress('KL1021', 'student');
    expect(v.student.name).toBe('Ellis Northcott');
    expect(v.sittings).toHaveLength(8); // eight published Grade 5 sittings; the closed one is not released yet
    const absent = v.sittings.filter((s) => s.outcome === 'absent');
    expect(absent).toHaveLength(1);
    expect(absent[0]!.result).toBeNull();
    for (const s of v.sittings.filter((x) => x.outcome === 'completed')) {
      expect(s.result!.released).toBe(true);
      expect(s.result!.criteria.map((c) => c.key)).toContain('freedom_from_tension');
      expect(s.comments.some((c) => c.about === 'overall' && c.text.length > 20)).toBe(true);
      expect(s.examiners.length).toBeGreaterThanOrEqual(1);
    }
    expect(v.tensionCaution).toBe(TENSION_CAUTION);
    // The teacher also sees the sitting whose marking has closed.
    expect((await progress('KL1021')).sittings).toHaveLength(9);
  });

  it('trend per 30 days and its standard error agree with simple-statistics; Ellis is improving', async () => {
    const v = await progress('KL1021');
    expect(v.lines).toHaveLength(1);
    const pts = v.sittings.filter((s) => s.result).map((s) => [Date.parse(s.date), s.result!.percentage] as [number, number]);
    const xy = pts.map(([d, p]) => [(d - pts[0]![0]) / DAY / 30, p] as [number, number]);
    const fit = linearRegression(xy);
    const line = linearRegressionLine(fit);
    const sse = xy.reduce((a, [x, y]) => a + (y - line(x)) ** 2, 0);
    // SE of the slope = √(SSE / (n − 2)) / √Sxx, with Sxx = (n − 1) × sample variance of x (textbook OLS).
    const se = Math.sqrt(sse / (xy.length - 2)) / Math.sqrt((xy.length - 1) * sampleVariance(xy.map(([x]) => x)));
    expect(v.lines[0]!.n).toBe(8);
    expect(v.lines[0]!.slopePer30Days!).toBeCloseTo(fit.m, 9);
    expect(v.lines[0]!.standardError!).toBeCloseTo(se, 9);
    expect(v.lines[0]!.slopePer30Days!).toBeGreaterThan(0);
    expect(v.lines[0]!.firstToLatest!.change).toBeCloseTo(pts.at(-1)![1] - pts[0]![1], 9);
  });

  it('a change of grade starts a new line: Cosima’s Grade 3 spring and Grade 5 autumn trend apart', async () => {
    const v = await progress('KL1029');
    expect(v.lines.map((l) => [l.grade, l.n])).toEqual([
      ['3', 3],
      ['5', 4],
    ]);
    const g5 = v.sittings.filter((s) => s.grade === '5' && s.result);
    expect(new Set(g5.map((s) => s.line))).toEqual(new Set([1]));
    const x0 = Date.parse(g5[0]!.date);
    const fit = linearRegression(g5.map((s) => [(Date.parse(s.date) - x0) / DAY / 30, s.result!.percentage]));
    expect(v.lines[1]!.slopePer30Days!).toBeCloseTo(fit.m, 9);
    expect(v.lines[1]!.firstToLatest!.first).toBe(g5[0]!.result!.percentage);
  });

  it('percentile among the grade’s students agrees with simple-statistics quantileRank; hidden under 10', async () => {
    const v = await progress('KL1021');
    const latest = [...v.sittings].reverse().find((s) => s.result)!;
    const peers = (await t.db.query(
      `SELECT DISTINCT ON (r.student_id) r.percentage FROM results r JOIN requirement_list_versions v ON v.id = r.list_version_id
        WHERE v.list_id = $1 AND v.grade = '5' ORDER BY r.student_id, r.computed_at DESC`,
      [latest.lineageId],
    )) as { percentage: number }[];
    expect(peers).toHaveLength(11);
    expect(v.percentile).toMatchObject({ students: 11, grade: '5' });
    expect(v.percentile!.value!).toBeCloseTo(100 * quantileRank(peers.map((p) => p.percentage), latest.result!.percentage), 9);
    // Grade 3 has 6 students with results: no percentile, but the count is said.
    const g3 = await progress('KL1011');
    expect(g3.percentile).toMatchObject({ value: null, students: 6 });
  });

  it('who may see a student’s progress: the student, their teachers, admins; anyone else 404', async () => {
    expect((await get(`/api/students/${id['KL1021']}/progress`, 'admin')).status).toBe(200);
    expect((await get(`/api/students/${id['KL1021']}/progress`, 'tomasz')).status).toBe(404); // not his class
    expect((await get(`/api/students/${id['KL1023']}/progress`, 'student')).status).toBe(404); // a classmate
    expect((await get(`/api/students/${id['KL1021']}/progress`, 'fernhill')).status).toBe(404); // another school
    expect((await get(`/api/students/${id['KL1021']}/progress`, 'examiner')).status).toBe(403); // role
    expect((await get(`/api/students/not-an-id/progress`, 'teacher')).status).toBe(400);
  });

  it('attention: Wren’s entrenched evenness, Yara’s tension with the caution, Anouk’s rising slips — each with evidence', async () => {
    const res = await get('/api/attention', 'teacher');
    expect(res.status).toBe(200);
    const v = res.body as AttentionView;
    expect(v.caution).toBe(TENSION_CAUTION);
    const of = (name: string) => v.entries.filter((e) => e.student.name === name);
    const wren = of('Wren Ashdown').find((e) => e.kind === 'entrenched')!;
    expect(wren.criterion!.key).toBe('evenness');
    expect(wren.evidence.length).toBeGreaterThanOrEqual(3);
    expect(new Set(wren.evidence.flatMap((e) => e.examiners)).size).toBeGreaterThanOrEqual(2);
    const yara = of('Yara Ambrose').find((e) => e.kind === 'tension')!;
    expect(yara.criterion!.key).toBe('freedom_from_tension');
    expect(yara.caution).toBe(TENSION_CAUTION);
    const anouk = of('Anouk Wetherby').find((e) => e.kind === 'rising_slips')!;
    expect(anouk.evidence.length).toBeGreaterThanOrEqual(3);
    expect(of('Ellis Northcott')).toEqual([]);
    // Every piece of evidence names a sitting the student's progress page shows.
    const wrenYear = await progress('KL1023');
    for (const e of wren.evidence) expect(wrenYear.sittings.map((s: ProgressSitting) => s.sittingId)).toContain(e.sittingId);
    // Tomasz teaches only the diploma class (no marks this year); examiners and students are refused.
    expect(((await get('/api/attention', 'tomasz')).body as AttentionView).entries).toEqual([]);
    expect((await get('/api/attention', 'examiner')).status).toBe(403);
    expect((await get('/api/attention', 'student')).status).toBe(403);
    expect(((await get('/api/attention', 'admin')).body as AttentionView).entries.length).toBe(v.entries.length);
  });

  it('the entrenched rule needs two examiners: Wren’s low evenness marked by one examiner only is not listed', async () => {
    // Leave only one examiner's sheets on Wren's slots (Priya's), as if she had marked them all.
    const priya = (await t.db.query(
      `SELECT m.id FROM memberships m JOIN people p ON p.id = m.person_id WHERE p.email = 'examiner@demo.example'`,
    )) as { id: string }[];
    await t.db.query(
      `DELETE FROM mark_sheets ms USING slots sl WHERE sl.id = ms.slot_id AND sl.student_id = $1 AND ms.role = 'second'`,
      [id['KL1023']],
    );
    await t.db.query(
      `UPDATE mark_sheets ms SET examiner_membership_id = $2 FROM slots sl WHERE sl.id = ms.slot_id AND sl.student_id = $1`,
      [id['KL1023'], priya[0]!.id],
    );
    const v = (await get('/api/attention', 'teacher')).body as AttentionView;
    expect(v.entries.filter((e) => e.student.name === 'Wren Ashdown' && e.kind === 'entrenched')).toEqual([]);
  });
});
