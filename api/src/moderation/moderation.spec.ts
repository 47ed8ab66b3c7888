import { randomUUID } from 'node:crypto';
import { parse } from 'csv-parse/sync';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  DeskView,
  MarkingSittingSummary,
  ModerationView,
  ReleaseSummary,
  Request,
  ResultDetail,
  ResultSummary,
  TakeHomeReport,
} from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { renderMail, type ResultsReportData } from '../mail/templates.js';
import { writeSubmittedSheet, type SeedCriterion } from '../marking/seed-sheets.js';
import { Result } from '../results/entities/result.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
/** Reads a binary response body (PDF) as a Buffer with supertest. */
const binary = (res: NodeJS.ReadableStream, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};
const full = (_r: Request, c: SeedCriterion) => c.maxMark;
const eightTenths = (_r: Request, c: SeedCriterion) => (c.maxMark * 8) / 10;
// 7/10, 3/5, 4/5, 5/5, 2/5, 6/10, 4/5 on the seven starter criteria: 8.7/13 per request → 20 of 30.
const MIXED: Record<string, number> = {
  note_accuracy: 7,
  fingering_consistency: 3,
  grouping: 4,
  motion_economy: 5,
  freedom_from_tension: 2,
  evenness: 6,
  tempo_control: 4,
};
const mixed = (_r: Request, c: SeedCriterion) => MIXED[c.key]!;

describe('moderation and release (issue 7 §2, §5)', () => {
  let t: TestApp;
  const tok: Record<string, string> = {};
  let sittingId: string;
  let slots: Slot[];
  const pupil = (p: string) => slots.find((s) => s.student!.pupilNumber === p)!;
  let ottilieId: string;
  let beatrixId: string;
  let firstSheetOfB: string;

  const moderation = async (token = tok.teacher!) => {
    const res = await t.http().get(`/api/sittings/${sittingId}/moderation`).set(auth(token));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as ModerationView;
  };
  const count = async (sql: string, params: unknown[]) =>
    ((await t.db.query(sql, params)) as { n: number }[])[0]!.n;

  beforeAll(async () => {
    t = await createTestApp({
      today: '2026-12-01',
      env: { STAVEMARK_NOW: '2026-12-01T13:00:00Z' },
    });
    for (const [k, email] of Object.entries({
      teacher: 'teacher@demo.example',
      admin: 'admin@demo.example',
      examiner: 'examiner@demo.example',
      ottilie: 'ottilie.brandt@demo.example',
      beatrix: 'beatrix.oduya@demo.example',
      tomasz: 'tomasz.whitcombe@demo.example',
      student: 'student@demo.example',
      otherOrg: 'admin@fernhill.example',
    }))
      tok[k] = await signIn(t, email);
    const member = async (email: string) =>
      (
        (await t.db.query(
          `SELECT m.id FROM memberships m JOIN people p ON p.id = m.person_id JOIN organisations o ON o.id = m.organisation_id WHERE p.email = $1 AND o.name NOT ILIKE '%fernhill%'`,
          [email],
        )) as { id: string }[]
      )[0]!.id;
    ottilieId = await member('ottilie.brandt@demo.example');
    beatrixId = await member('beatrix.oduya@demo.example');
    sittingId = (
      (await t.db.query(
        `SELECT id FROM sittings WHERE title = 'Grade 3 mock — Wednesday Intermediates'`,
      )) as { id: string }[]
    )[0]!.id;
    // Fixture: KL1011, KL1013 and KL1015 double-marked by Priya and Ottilie; KL1017 single; KL1019 absent.
    await t.db.query(
      `UPDATE slots SET second_examiner_membership_id = CASE WHEN s.pupil_number IN ('KL1011','KL1013','KL1015') THEN $2::uuid ELSE NULL END FROM students s WHERE s.id = slots.student_id AND slots.sitting_id = $1`,
      [sittingId, ottilieId],
    );
    slots = await t.db
      .getRepository(Slot)
      .find({ where: { sittingId }, relations: { student: true }, order: { position: 'ASC' } });
    const at = new Date('2026-11-17T17:00:00Z');
    await t.db.transaction(async (em) => {
      const both = async (p: string, a: typeof full, b: typeof full) => {
        const s = pupil(p);
        const first = await writeSubmittedSheet(em, {
          slot: s,
          examinerMembershipId: s.examinerMembershipId!,
          role: 'first',
          marks: a,
          comments: { overall: `First examiner on ${p}.`, '0': 'Even tone.' },
          submittedAt: at,
        });
        await writeSubmittedSheet(em, {
          slot: s,
          examinerMembershipId: ottilieId,
          role: 'second',
          marks: b,
          comments: { overall: `Second examiner on ${p}.` },
          submittedAt: at,
        });
        return first.sheet.id;
      };
      // A: 24 and 30 of 30 (6 marks apart; the limit is 6 % of 30 = 1.8) → flagged on the total.
      await both('KL1011', eightTenths, full);
      // B: 24 and 20 → flagged on the total; each request 0.8 against 0.669, within 20 %.
      firstSheetOfB = await both('KL1013', eightTenths, mixed);
      // C: equal sheets → within tolerance.
      await both('KL1015', eightTenths, eightTenths);
      const d = pupil('KL1017');
      await writeSubmittedSheet(em, {
        slot: d,
        examinerMembershipId: d.examinerMembershipId!,
        role: 'first',
        marks: full,
        submittedAt: at,
      });
    });
    const closed = await t
      .http()
      .post(`/api/sittings/${sittingId}/status`)
      .set(auth(tok.teacher!))
      .send({ status: 'marking_closed' });
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);
  });
  afterAll(() => t.close());

  it('shows the pairs side by side and flags those outside tolerance (design.md §4.5)', async () => {
    const v = await moderation();
    expect(v.pairs.map((p) => [p.candidate.pupilNumber, p.status])).toEqual([
      ['KL1011', 'open'],
      ['KL1013', 'open'],
      ['KL1015', 'within'],
    ]);
    expect(v.openFlags).toBe(2);
    const a = v.pairs[0]!;
    expect(a.total).toEqual({ first: 24, second: 30, difference: 6, limit: 30 * 0.06 });
    expect(a.reasons.join(' ')).toMatch(/Totals 24 and 30 differ by 6 marks/);
    // Every request 0.8 against 1.0: exactly 20 % of its maximum, which is within (strictly more is flagged).
    expect(a.requests.every((r) => !r.flagged && Math.abs(r.difference! - 0.2) < 1e-9)).toBe(true);
    expect(a.requests[0]!.criteria.find((c) => c.key === 'freedom_from_tension')?.tension).toBe(
      true,
    );
    expect(a.first?.examiner.displayName).toBe('Priya Halvorsen');
    expect(a.second?.cells.find((c) => c.cell === 'comment:overall')?.value).toBe(
      'Second examiner on KL1011.',
    );
    expect(v.release).toMatchObject({ results: 4, released: 0, canRelease: false });
    expect(v.release.blockedBy).toMatch(/2 double-marked pairs are outside tolerance/);
    // Results use the first examiner's marks until the flag is resolved.
    expect(a.result).toMatchObject({ total: 24, basis: 'first', released: false });
  });

  it('refuses release and publishing while a flag is open, releasing nothing', async () => {
    const res = await t
      .http()
      .post(`/api/sittings/${sittingId}/release`)
      .set(auth(tok.teacher!))
      .send({});
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(
      /outside tolerance and not resolved yet \(first: Kaia Gorsedd\)/,
    );
    const pub = await t
      .http()
      .post(`/api/sittings/${sittingId}/status`)
      .set(auth(tok.admin!))
      .send({ status: 'published' });
    expect(pub.status).toBe(409);
    expect(
      await count(
        `SELECT count(*)::int AS n FROM results WHERE sitting_id = $1 AND released_at IS NOT NULL`,
        [sittingId],
      ),
    ).toBe(0);
    expect(
      await count(`SELECT count(*)::int AS n FROM outbound_mail WHERE kind = 'results_report'`, []),
    ).toBe(0);
  });

  it('moderators see their pairs: a teacher only their students’, another organisation 404, an examiner or student 403', async () => {
    // Tomasz teaches only Mira (KL1013) here: he sees her pair alone; another organisation nothing.
    expect((await moderation(tok.tomasz!)).pairs.map((p) => p.candidate.pupilNumber)).toEqual([
      'KL1013',
    ]);
    expect(
      (await t.http().get(`/api/sittings/${sittingId}/moderation`).set(auth(tok.otherOrg!))).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/sittings/${sittingId}/moderation`).set(auth(tok.examiner!))).status,
    ).toBe(403);
    expect(
      (await t.http().get(`/api/sittings/${sittingId}/moderation`).set(auth(tok.student!))).status,
    ).toBe(403);
    expect((await moderation(tok.admin!)).pairs).toHaveLength(3);
  });

  it('agreed marks resolve a flag, are audited with who and why, and the result is recomputed', async () => {
    const a = pupil('KL1011');
    const v = await moderation();
    const requests = v.pairs[0]!.requests;
    const agreed: Record<string, number> = {};
    const AGREED: Record<string, number> = { note_accuracy: 9, evenness: 9 };
    for (const r of requests)
      for (const c of r.criteria) agreed[`mark:${r.index}:${c.key}`] = AGREED[c.key] ?? 4;
    const url = `/api/moderation/slots/${a.id}/agree`;
    // Bad input: a missing mark and a mark over the maximum, listed; a reason too short.
    const { [`mark:0:tempo_control`]: _gone, ...missing } = agreed;
    const bad = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({
        marks: { ...missing, 'mark:1:grouping': 6 },
        reason: 'Agreed after listening again together.',
      });
    expect(bad.status).toBe(400);
    expect(bad.body.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'marks.mark:0:tempo_control',
      'marks.mark:1:grouping',
    ]);
    const short = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({ marks: agreed, reason: 'ok' });
    expect(short.status).toBe(400);
    expect(short.body.message).toMatch(/why these marks are agreed/);
    const ok = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({
        marks: agreed,
        reason: 'Listened to the recording together; the second mark on evenness was generous.',
      });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    const pair = (ok.body as ModerationView).pairs.find((p) => p.slotId === a.id)!;
    expect(pair.status).toBe('agreed');
    expect(pair.agreed?.by).toBe('Idris Calloway');
    // Hand-worked: (3·0.9 + 2·0.8 + 2·0.8 + 1·0.8 + 2·0.8 + 2·0.9 + 1·0.8)/13 = 10.9/13 = 0.83846 per
    // request; × 30 = 25.15 → 25 of 30 = 83.3 % → Distinction (design.md §4.1 default policy).
    const r = await t.db.getRepository(Result).findOneByOrFail({ slotId: a.id });
    expect([r.basis, r.total, r.bandKey]).toEqual(['agreed', 25, 'distinction']);
    const [audit] = (await t.db.query(
      `SELECT a.after, p.display_name AS who FROM audit_events a JOIN people p ON p.id = a.actor_person_id WHERE a.action = 'moderation.agreed' AND a.entity_id = $1`,
      [a.id],
    )) as { after: { reason: string; total: number }; who: string }[];
    expect(audit).toMatchObject({
      who: 'Idris Calloway',
      after: { total: 25, reason: expect.stringMatching(/Listened/) },
    });
    // Agreeing a pair that is not flagged is refused.
    const c = pupil('KL1015');
    expect(
      (
        await t
          .http()
          .post(`/api/moderation/slots/${c.id}/agree`)
          .set(auth(tok.teacher!))
          .send({ marks: agreed, reason: 'Nothing to agree here at all.' })
      ).status,
    ).toBe(409);
  });

  it('the year export and the mark sheet show the agreed marks of an agreed result, not the first examiner’s', async () => {
    // KL1011: first examiner 8/10 on note accuracy and evenness (4/5 elsewhere); agreed 9/10 on
    // those two and 4/5 elsewhere (the test above). The export must carry the agreed 9s.
    const a = pupil('KL1011');
    const r = await t.db.getRepository(Result).findOneByOrFail({ slotId: a.id });
    expect(r.basis).toBe('agreed');
    const [{ id: classId }] = (await t.db.query(`SELECT id FROM classes WHERE code = 'WED-INT'`)) as [{ id: string }];
    const res = await t.http().get(`/api/classes/${classId}/results/export?from=2026-09-01&to=2027-08-31`).set(auth(tok.teacher!));
    expect(res.status).toBe(200);
    const [header, ...rows] = parse(res.text, { bom: true }) as string[][];
    const col = (name: string) => header!.indexOf(name);
    const mine = rows.filter((row) => row[col('Pupil number')] === 'KL1011');
    expect(mine.length).toBe(r.profile.requests.filter((q) => q.asked).length * 7);
    for (const row of mine) {
      const key = row[col('Criterion key')]!;
      expect(Number(row[col('Mark')]), `${key} of request ${row[col('Request')]}`).toBe(key === 'note_accuracy' || key === 'evenness' ? 9 : 4);
      expect(row[col('Basis')]).toBe('agreed');
    }
    // The marks add up to the stored (agreed) profile, criterion by criterion.
    for (const c of r.profile.criteria)
      expect(mine.filter((row) => row[col('Criterion key')] === c.key).reduce((n, row) => n + Number(row[col('Mark')]), 0)).toBe(c.marks);

    const pdf = await t.http().get(`/api/results/${r.id}/mark-sheet`).set(auth(tok.teacher!)).buffer(true).parse(binary as never);
    expect(pdf.status).toBe(200);
    const parser = new PDFParse({ data: new Uint8Array(pdf.body as Buffer) });
    const text = (await parser.getText()).text;
    await parser.destroy();
    // Each request's table row reads "<criterion> <mark> <out of>": the agreed 9 of 10, never the first examiner's 8.
    expect(text).toMatch(/Note accuracy\s+9\s+10/);
    expect(text).not.toMatch(/Note accuracy\s+8\s+10/);
    expect(text).toContain('First examiner on KL1011.'); // comments stay the first examiner's
  }, 120_000);

  it('a third marker marks blind on the desk; their sheet settles the pair', async () => {
    const b = pupil('KL1013');
    const url = `/api/moderation/slots/${b.id}/third-marker`;
    const own = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({ examinerId: b.examinerMembershipId });
    expect(own.status).toBe(400);
    expect(own.body.message).toMatch(/someone other than the two/);
    const sent = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({ examinerId: beatrixId, note: 'Please listen for evenness.' });
    expect(sent.status, JSON.stringify(sent.body)).toBe(200);
    expect((sent.body as ModerationView).pairs.find((p) => p.slotId === b.id)?.status).toBe(
      'third_marking',
    );
    expect(
      await count(
        `SELECT count(*)::int AS n FROM outbound_mail WHERE kind = 'third_marking' AND to_address = 'beatrix.oduya@demo.example'`,
        [],
      ),
    ).toBe(1);
    // Still open while waiting: release names it.
    const blocked = await t
      .http()
      .post(`/api/sittings/${sittingId}/release`)
      .set(auth(tok.teacher!))
      .send({});
    expect(blocked.status).toBe(409);
    expect(blocked.body.message).toMatch(
      /1 double-marked pair is outside tolerance.*1 waiting for a third marker/,
    );

    const today = await t.http().get('/api/marking/today').set(auth(tok.beatrix!));
    expect(today.status).toBe(200);
    const listed = (today.body as MarkingSittingSummary[])
      .flatMap((s) => s.slots)
      .find((x) => x.id === b.id);
    expect(listed?.role).toBe('third');
    const started = await t.http().post(`/api/slots/${b.id}/start`).set(auth(tok.beatrix!));
    expect(started.status, JSON.stringify(started.body)).toBe(200);
    const desk = started.body as DeskView;
    expect(desk.role).toBe('third');
    // Blind: neither the desk nor the sheet route shows the pair's marks before submitting.
    expect(desk.otherSheet).toBeNull();
    expect(
      (await t.http().get(`/api/mark-sheets/${firstSheetOfB}`).set(auth(tok.beatrix!))).status,
    ).toBe(404);
    // …and the pair does not see the third marker's draft.
    expect(
      (await t.http().get(`/api/mark-sheets/${desk.sheet!.id}`).set(auth(tok.ottilie!))).status,
    ).toBe(404);
    // The first examiner still sees the second examiner's sheet beside theirs, not the third draft.
    const priya = (await t.http().get(`/api/slots/${b.id}/desk`).set(auth(tok.examiner!)))
      .body as DeskView;
    expect(priya.otherSheet?.role).toBe('second');

    let last = '';
    for (const r of desk.requests)
      for (const c of r.criteria) {
        last = randomUUID();
        const res = await t
          .http()
          .post(`/api/mark-sheets/${desk.sheet!.id}/cells`)
          .set(auth(tok.beatrix!))
          .send({
            changeId: last,
            cell: `mark:${r.index}:${c.key}`,
            value: c.maxMark,
            baseVersion: 0,
          });
        expect(res.status, JSON.stringify(res.body)).toBe(200);
      }
    last = randomUUID();
    expect(
      (
        await t
          .http()
          .post(`/api/mark-sheets/${desk.sheet!.id}/cells`)
          .set(auth(tok.beatrix!))
          .send({ changeId: last, cell: 'outcome', value: 'completed', baseVersion: 0 })
      ).status,
    ).toBe(200);
    const submitted = await t
      .http()
      .post(`/api/mark-sheets/${desk.sheet!.id}/submit`)
      .set(auth(tok.beatrix!))
      .send({ lastChangeId: last, confirm: true });
    expect(submitted.status, JSON.stringify(submitted.body)).toBe(200);
    expect((submitted.body as DeskView).otherSheet).toBeNull();

    // Full marks on every criterion → 30 of 30 (hand-worked: every request scores 1).
    const r = await t.db.getRepository(Result).findOneByOrFail({ slotId: b.id });
    expect([r.basis, r.total, r.bandKey]).toEqual(['third', 30, 'distinction']);
    const v = await moderation();
    expect(v.pairs.find((p) => p.slotId === b.id)).toMatchObject({
      status: 'third',
      third: { total: 30 },
    });
    expect(v.openFlags).toBe(0);
    expect(v.release.canRelease).toBe(true);
  });

  it('releases to the teacher’s students with notes; e-mails go only to consenting guardians of minors', async () => {
    // Fixture consents: KL1013's guardian said no, KL1015's has not answered, KL1011 has a second
    // guardian who said no; KL1011's first guardian and KL1017's said yes.
    await t.db.query(`UPDATE guardians SET consent_results_email = false WHERE student_id = $1`, [
      pupil('KL1013').studentId,
    ]);
    await t.db.query(`UPDATE guardians SET consent_results_email = NULL WHERE student_id = $1`, [
      pupil('KL1015').studentId,
    ]);
    await t.db.query(
      `INSERT INTO guardians (organisation_id, student_id, name, email, consent_results_email) SELECT organisation_id, id, 'Robin Gorsedd', 'robin.gorsedd@family.example', false FROM students WHERE id = $1`,
      [pupil('KL1011').studentId],
    );

    const url = `/api/sittings/${sittingId}/release`;
    expect((await t.http().post(url).set(auth(tok.otherOrg!)).send({})).status).toBe(404);
    expect((await t.http().post(url).set(auth(tok.examiner!)).send({})).status).toBe(403);
    expect((await t.http().post(url).set(auth(tok.student!)).send({})).status).toBe(403);
    const ellis = (
      (await t.db.query(`SELECT id FROM students WHERE pupil_number = 'KL1021'`)) as {
        id: string;
      }[]
    )[0]!.id;
    const stranger = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({ notes: [{ studentId: ellis, note: 'Not in this sitting.' }] });
    expect(stranger.status).toBe(400);
    expect(stranger.body.details[0].path).toBe('notes.0.studentId');
    const unknown = await t.http().post(url).set(auth(tok.teacher!)).send({ notes: [], extra: 1 });
    expect(unknown.status).toBe(400);

    // Tomasz teaches Mira only: he releases hers (her guardian said no: no e-mail), not Kaia's.
    const kaiaNote = { studentId: pupil('KL1011').studentId, note: 'Not his pupil.' };
    expect(
      (
        await t
          .http()
          .post(url)
          .set(auth(tok.tomasz!))
          .send({ notes: [kaiaNote] })
      ).status,
    ).toBe(400);
    const his = await t.http().post(url).set(auth(tok.tomasz!)).send({});
    expect(his.status, JSON.stringify(his.body)).toBe(200);
    expect(his.body as ReleaseSummary).toEqual({
      released: 1,
      alreadyReleased: 0,
      mailed: 0,
      sittingStatus: 'marking_closed',
    });

    const note = 'Kaia, lovely even tone this term: keep the wrist loose in the arpeggios.';
    const res = await t
      .http()
      .post(url)
      .set(auth(tok.teacher!))
      .send({ notes: [{ studentId: pupil('KL1011').studentId, note }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // The last results released: the sitting is published.
    expect(res.body as ReleaseSummary).toEqual({
      released: 3,
      alreadyReleased: 1,
      mailed: 2,
      sittingStatus: 'published',
    });
    const mails = (await t.db.query(
      `SELECT to_address, data FROM outbound_mail WHERE kind = 'results_report' ORDER BY to_address`,
    )) as { to_address: string; data: ResultsReportData }[];
    expect(mails.map((m) => m.to_address)).toEqual([
      'charlie.gorsedd@family.example',
      'kim.fairweather@family.example',
    ]);
    const kaia = mails[0]!.data;
    expect(kaia.forGuardian).toBe(true);
    expect(kaia.report.teacherNote).toBe(note);
    const text = renderMail('results_report', kaia, null).text;
    expect(text).toContain(note);
    expect(text).toMatch(/What went well:\n• /);
    expect(text).toMatch(/What to work on next:\n• /);
    // Plain words: no totals, percentages or "x out of y" in the take-home report.
    expect(text).not.toMatch(/\d+\s*(%|\/\s*\d|out of|of 30)/);
    // Released once: a second release releases nothing more and sends nothing.
    const again = await t.http().post(url).set(auth(tok.teacher!)).send({});
    expect(again.body as ReleaseSummary).toEqual({
      released: 0,
      alreadyReleased: 4,
      mailed: 0,
      sittingStatus: 'published',
    });
    expect(
      await count(`SELECT count(*)::int AS n FROM outbound_mail WHERE kind = 'results_report'`, []),
    ).toBe(2);
  });

  it('students see only their own released results; teachers theirs; others 404', async () => {
    const kaia = pupil('KL1011').studentId;
    const list = await t.http().get(`/api/students/${kaia}/results`).set(auth(tok.teacher!));
    expect(list.status).toBe(200);
    const [r] = list.body as ResultSummary[];
    expect(r).toMatchObject({ total: 25, band: { label: 'Distinction' }, basis: 'agreed' });
    // Tomasz does not teach Kaia; the demo student is someone else.
    expect(
      (await t.http().get(`/api/students/${kaia}/results`).set(auth(tok.tomasz!))).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/students/${kaia}/results`).set(auth(tok.student!))).status,
    ).toBe(404);
    expect((await t.http().get(`/api/results/${r!.id}`).set(auth(tok.student!))).status).toBe(404);
    expect((await t.http().get(`/api/results/${r!.id}/report`).set(auth(tok.tomasz!))).status).toBe(
      404,
    );
    const detail = (await t.http().get(`/api/results/${r!.id}`).set(auth(tok.teacher!)))
      .body as ResultDetail;
    // Agreed marks, with both examiners' overall comments.
    expect(detail.requests[0]!.marks.find((m) => m.key === 'note_accuracy')).toMatchObject({
      mark: 9,
      maxMark: 10,
    });
    expect(detail.overallComments).toEqual([
      'First examiner on KL1011.',
      'Second examiner on KL1011.',
    ]);
    expect(detail.requests[0]!.comment).toBe('Even tone.');
    expect(detail.caution).toMatch(/qualified health professional/);
  });

  it('the demo student sees a result once released, with marks, comments and the report', async () => {
    // Today's Grade 5 sitting, marked and closed: Ellis Northcott (student@demo.example) sits in it.
    const g5 = (
      (await t.db.query(
        `SELECT id FROM sittings WHERE title = 'Grade 5 mock — Thursday Seniors'`,
      )) as { id: string }[]
    )[0]!.id;
    expect(
      (
        await t
          .http()
          .post(`/api/sittings/${g5}/status`)
          .set(auth(tok.teacher!))
          .send({ status: 'in_progress' })
      ).status,
    ).toBe(200);
    const g5slots = await t.db
      .getRepository(Slot)
      .find({ where: { sittingId: g5 }, relations: { student: true } });
    await t.db.transaction(async (em) => {
      for (const s of g5slots)
        await writeSubmittedSheet(em, {
          slot: s,
          examinerMembershipId: s.examinerMembershipId!,
          role: 'first',
          marks: s.student!.pupilNumber === 'KL1021' ? mixed : full,
          notAsked: (q) => q.kind === 'passage',
          comments: { overall: 'Good control of the pulse.' },
          submittedAt: new Date('2026-12-01T11:00:00Z'),
        });
    });
    expect(
      (
        await t
          .http()
          .post(`/api/sittings/${g5}/status`)
          .set(auth(tok.teacher!))
          .send({ status: 'marking_closed' })
      ).status,
    ).toBe(200);
    const ellis = g5slots.find((s) => s.student!.pupilNumber === 'KL1021')!.studentId;
    const before = await t.http().get(`/api/students/${ellis}/results`).set(auth(tok.student!));
    // The demo year may hold earlier released results of Ellis's; not this sitting's.
    expect(before.status).toBe(200);
    const earlier = (before.body as ResultSummary[]).length;
    expect((before.body as ResultSummary[]).some((x) => x.sittingId === g5)).toBe(false);
    const rel = await t
      .http()
      .post(`/api/sittings/${g5}/release`)
      .set(auth(tok.teacher!))
      .send({ notes: [{ studentId: ellis, note: 'Well done, Ellis.' }] });
    expect(rel.status, JSON.stringify(rel.body)).toBe(200);
    // Ellis has an own address and a consenting guardian (15, a minor): both receive the report.
    expect(
      await count(
        `SELECT count(*)::int AS n FROM outbound_mail WHERE kind = 'results_report' AND to_address IN ('student@demo.example', 'kim.northcott@family.example')`,
        [],
      ),
    ).toBe(2);
    const after = (await t.http().get(`/api/students/${ellis}/results`).set(auth(tok.student!)))
      .body as ResultSummary[];
    expect(after).toHaveLength(earlier + 1);
    const mine = after.find((x) => x.sittingId === g5)!;
    expect(mine).toMatchObject({ total: 20, band: { label: 'Pass' } });
    const detail = (await t.http().get(`/api/results/${mine.id}`).set(auth(tok.student!)))
      .body as ResultDetail;
    expect(detail.overallComments).toEqual(['Good control of the pulse.']);
    expect(detail.teacherNote).toBe('Well done, Ellis.');
    const report = (
      await t.http().get(`/api/results/${mine.id}/report`).set(auth(tok.student!))
    ).body as TakeHomeReport;
    expect(report.outcome).toBe('Pass');
    // 8.7/13 per request: motion economy (5/5) is the top strength; tension (2/5) the first next step.
    expect(report.strengths[0]).toMatch(/^Economy of motion: /);
    expect(report.nextSteps[0]).toMatch(/tension/i);
    expect(report.caution).toMatch(/does not diagnose/);
  });
});
