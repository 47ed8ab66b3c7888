import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AgreementReport, AgreementScopes } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

/**
 * The report over HTTP on the demo school's Grade 3 mock (two weeks before the seed day), with
 * double-marked sheets written straight into the tables the marking desk fills: every slot gets
 * Ottilie as second marker; Priya (first on the panel) marks first.
 */
describe('agreement report', () => {
  let t: TestApp;
  const tokens: Record<string, string> = {};
  let sittingId: string;
  let termId: string;

  const membership = async (email: string) =>
    ((await t.db.query(`SELECT m.id FROM memberships m JOIN people p ON p.id = m.person_id WHERE p.email = $1`, [email])) as { id: string }[])[0]!.id;

  /** A sheet whose every criterion sits at `fraction` of its maximum (so the total is that share). */
  async function sheet(slot: { id: string; organisation_id: string }, examinerId: string, role: 'first' | 'second', fraction: number, status: 'draft' | 'submitted', outcome = 'completed') {
    const [row] = (await t.db.query(
      `INSERT INTO mark_sheets (organisation_id, slot_id, examiner_membership_id, role, status, submitted_at) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
      [slot.organisation_id, slot.id, examinerId, role, status, status === 'submitted' ? new Date() : null],
    )) as { id: string }[];
    const [draw] = (await t.db.query(`SELECT requests FROM slot_draws WHERE slot_id = $1`, [slot.id])) as { requests: { index: number; rubricVersionId: string }[] }[];
    const cells: [string, unknown][] = [['outcome', outcome]];
    for (const r of draw!.requests) {
      const criteria = (await t.db.query(`SELECT key, max_mark FROM rubric_criteria WHERE rubric_version_id = $1`, [r.rubricVersionId])) as { key: string; max_mark: number }[];
      for (const c of criteria) cells.push([`mark:${r.index}:${c.key}`, Math.round(fraction * c.max_mark)]);
    }
    for (const [cell, value] of cells)
      await t.db.query(`INSERT INTO mark_cells (organisation_id, sheet_id, cell, value, version, last_change_id) VALUES ($1, $2, $3, $4, 1, $5)`, [
        slot.organisation_id,
        row!.id,
        cell,
        JSON.stringify(value),
        randomUUID(),
      ]);
  }

  beforeAll(async () => {
    t = await createTestApp({ today: '2026-12-01' });
    for (const e of ['admin', 'teacher', 'examiner', 'student', 'ottilie.brandt', 'beatrix.oduya'])
      tokens[e] = await signIn(t, `${e}@demo.example`);
    tokens.otherOrg = await signIn(t, 'admin@fernhill.example');
    const [s] = (await t.db.query(`SELECT id FROM sittings WHERE title = 'Grade 3 mock — Wednesday Intermediates'`)) as { id: string }[];
    sittingId = s!.id;
    const [term] = (await t.db.query(`SELECT t.id FROM terms t JOIN sittings s ON s.organisation_id = t.organisation_id AND s.date BETWEEN t.starts_on AND t.ends_on WHERE s.id = $1`, [sittingId])) as { id: string }[];
    termId = term!.id;
    const priya = await membership('examiner@demo.example');
    const ottilie = await membership('ottilie.brandt@demo.example');
    await t.db.query(`UPDATE slots SET second_examiner_membership_id = $1 WHERE sitting_id = $2`, [ottilie, sittingId]);
    const slots = (await t.db.query(
      `SELECT s.id, s.organisation_id, s.student_id, st.pupil_number, s.paper_id FROM slots s JOIN students st ON st.id = s.student_id WHERE s.sitting_id = $1 ORDER BY s.position`,
      [sittingId],
    )) as { id: string; organisation_id: string; student_id: string; pupil_number: string; paper_id: string }[];
    // Each slot's draw: the first five lines of the pinned list, one request each.
    const lines = (await t.db.query(
      `SELECT l.id, l.kind, l.rubric_version_id, l.difficulty_weight FROM requirement_lines l JOIN sitting_papers p ON p.list_version_id = l.list_version_id WHERE p.id = $1 ORDER BY l.position LIMIT 5`,
      [slots[0]!.paper_id],
    )) as { id: string; kind: string; rubric_version_id: string; difficulty_weight: number }[];
    const requests = lines.map((l, index) => ({ index, lineId: l.id, kind: l.kind, rubricVersionId: l.rubric_version_id, difficultyWeight: l.difficulty_weight }));
    for (const s of slots)
      await t.db.query(`INSERT INTO slot_draws (organisation_id, slot_id, student_id, seed, algorithm, drawn, requests) VALUES ($1, $2, $3, 'test', 'test', $4, $4)`, [
        s.organisation_id,
        s.id,
        s.student_id,
        JSON.stringify(requests),
      ]);
    const by = new Map(slots.map((s) => [s.pupil_number, s]));
    // Grade 3 totals 30 marks: 0.8 → 24 (80 %, Distinction), 0.6 → 18 (60 %, Pass), 1.0 → 30.
    await sheet(by.get('KL1011')!, priya, 'first', 0.8, 'submitted');
    await sheet(by.get('KL1011')!, ottilie, 'second', 0.6, 'submitted');
    await sheet(by.get('KL1013')!, priya, 'first', 0.6, 'submitted');
    await sheet(by.get('KL1013')!, ottilie, 'second', 0.6, 'submitted');
    await sheet(by.get('KL1015')!, priya, 'first', 1, 'submitted');
    await sheet(by.get('KL1015')!, ottilie, 'second', 0.8, 'submitted');
    // Still a draft on one side: left out as not submitted.
    await sheet(by.get('KL1017')!, priya, 'first', 0.6, 'submitted');
    await sheet(by.get('KL1017')!, ottilie, 'second', 0.6, 'draft');
    // KL1019 was absent (the slot's outcome): left out even with sheets.
    await sheet(by.get('KL1019')!, priya, 'first', 0.4, 'submitted', 'absent');
    await sheet(by.get('KL1019')!, ottilie, 'second', 0.4, 'submitted', 'absent');
  });
  afterAll(() => t.close());

  const get = (path: string, who: string) => t.http().get(path).set(auth(tokens[who]!));

  it('a sitting: three candidates in, absent and unsubmitted ones left out, ICC(2,1) for the fixed pair, too few to judge', async () => {
    const res = await get(`/api/sittings/${sittingId}/agreement`, 'teacher');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const r = res.body as AgreementReport;
    expect(r.counts).toEqual({ doubleMarkedSlots: 5, included: 3, notCompleted: 1, notSubmitted: 1 });
    expect(r.icc.form).toBe('ICC(2,1)');
    expect(r.icc.formReason).toMatch(/Ottilie Brandt and Priya Halvorsen/);
    // Totals 80/60, 60/60, 100/80 (÷ 20: 4/3, 3/3, 5/4). Hand-worked: grand mean 11/3; row means
    // 3.5, 3, 4.5 → SSR = 2·(1 + 16 + 25)/36 = 7/3, BMS = 7/6; column means 4, 10/3 → SSC = 2/3 = JMS;
    // SST = 10/3 → SSE = 1/3, EMS = 1/6. ICC(2,1) = (7/6 − 1/6)/(7/6 + 1/6 + 2·(2/3 − 1/6)/3) = 1/(5/3) = 0.6.
    expect(r.icc.value).toBeCloseTo(0.6, 10);
    expect(r.icc.enough).toBe(false);
    expect(r.icc.interpretation).toBeNull();
    expect(r.icc.note).toMatch(/Too few to judge: 3/);
    // Bands: Distinction/Pass, Pass/Pass, Distinction/Distinction → exact 2/3; Distinction and Pass are two apart.
    expect(r.bands.exact).toBeCloseTo(2 / 3, 12);
    expect(r.bands.adjacent).toBeCloseTo(2 / 3, 12);
    expect(r.pairs).toHaveLength(1);
    expect(r.pairs[0]!.n).toBe(3);
    expect(r.pairs[0]!.examiners.map((e) => e.name).sort()).toEqual(['Ottilie Brandt', 'Priya Halvorsen']);
    // Fewer than 20 sheets each: severity hidden.
    expect(r.severity.map((s) => [s.examiner.name, s.n, s.shown])).toEqual([
      ['Ottilie Brandt', 3, false],
      ['Priya Halvorsen', 3, false],
    ]);
    expect(r.scales.map((s) => s.source).join(' ')).toMatch(/Koo, T. K., & Li, M. Y. \(2016\).*Landis, J. R., & Koch, G. G. \(1977\)/);
  });

  it('who may read it: admins, the planner and the lead examiner; the second examiner, another teacher and another organisation 404; students 403', async () => {
    const status = async (who: string) => (await get(`/api/sittings/${sittingId}/agreement`, who)).status;
    expect(await status('admin')).toBe(200);
    expect(await status('teacher')).toBe(200);
    expect(await status('examiner')).toBe(200);
    expect(await status('ottilie.brandt')).toBe(404);
    expect(await status('beatrix.oduya')).toBe(404);
    expect(await status('otherOrg')).toBe(404);
    expect(await status('student')).toBe(403);
    expect((await get(`/api/sittings/${randomUUID()}/agreement`, 'admin')).status).toBe(404);
    expect((await get(`/api/sittings/not-an-id/agreement`, 'admin')).body).toMatchObject({ statusCode: 400, message: 'id must be an id (UUID).' });
  });

  it('a term pools its sittings; lead examiners report per sitting only', async () => {
    const res = await get(`/api/terms/${termId}/agreement`, 'admin');
    expect(res.status).toBe(200);
    const r = res.body as AgreementReport;
    expect(r.scope.kind).toBe('term');
    expect(r.sittings.map((s) => s.id)).toContain(sittingId);
    // The term pools every sitting in it: this file's three candidates and the demo year's.
    let pooled = 0;
    for (const s of r.sittings) pooled += ((await get(`/api/sittings/${s.id}/agreement`, 'admin')).body as AgreementReport).counts.included;
    expect(r.counts.included).toBe(pooled);
    expect(r.counts.included).toBeGreaterThanOrEqual(3 + 30);
    expect((await get(`/api/terms/${termId}/agreement`, 'examiner')).status).toBe(403);
    expect((await get(`/api/terms/${termId}/agreement`, 'otherOrg')).status).toBe(404);
    // Another teacher planned none of them: an empty report, not someone else's figures.
    const other = (await get(`/api/terms/${termId}/agreement`, 'beatrix.oduya')).body as AgreementReport;
    expect(other.sittings).toEqual([]);
    expect(other.icc.n).toBe(0);

    const scopes = (await get('/api/agreement/scopes', 'examiner')).body as AgreementScopes;
    expect(scopes.terms).toEqual([]);
    expect(scopes.sittings.find((s) => s.id === sittingId)?.doubleMarkedSlots).toBe(5);
    const adminScopes = (await get('/api/agreement/scopes', 'admin')).body as AgreementScopes;
    expect(adminScopes.terms.map((x) => x.id)).toContain(termId);
  });
});
