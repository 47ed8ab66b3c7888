import { parse } from 'csv-parse/sync';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SITTING_EXPORT_COLUMNS, YEAR_EXPORT_COLUMNS, type ClassResultsView, type Request, type SittingResultsView } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { writeSubmittedSheet, type SeedCriterion } from '../marking/seed-sheets.js';
import { Result } from '../results/entities/result.entity.js';
import { Slot } from '../sittings/entities/slot.entity.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
const BOM = '\uFEFF';

/** Reads a binary response body (PDF) as a Buffer with supertest. */
const binary = (res: NodeJS.ReadableStream & { setEncoding: (e: string) => void }, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

async function pdfText(pdf: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

/** RFC 4180 parsing by a general-purpose parser (csv-parse), with the BOM handled as a spreadsheet would. */
const parseCsv = (text: string) => parse(text, { bom: true, relax_column_count: false }) as string[][];

describe('results pages, CSV exports and PDFs (issue 8 §3–5)', () => {
  let t: TestApp;
  let teacher: string;
  let admin: string;
  let examiner: string;
  let otherTeacher: string;
  let sittingId: string;
  let classId: string;
  let slots: Slot[];
  const marks = (r: Request, c: SeedCriterion) => Math.max(0, c.maxMark - ((r.index + c.key.length) % 3));

  beforeAll(async () => {
    t = await createTestApp({ today: '2026-12-01', env: { STAVEMARK_NOW: '2026-12-01T13:00:00Z' } });
    [teacher, admin, examiner, otherTeacher] = await Promise.all([
      signIn(t, 'teacher@demo.example'),
      signIn(t, 'admin@demo.example'),
      signIn(t, 'examiner@demo.example'),
      signIn(t, 'tomasz.whitcombe@demo.example'),
    ]);
    const [row] = (await t.db.query(`SELECT id FROM sittings WHERE title = 'Grade 3 mock — Wednesday Intermediates'`)) as { id: string }[];
    sittingId = row!.id;
    classId = ((await t.db.query(`SELECT id FROM classes WHERE code = 'WED-INT'`)) as { id: string }[])[0]!.id;
    // A name a spreadsheet would run as a formula, and one that needs quoting (RFC 4180 §2.6).
    await t.db.query(`UPDATE students SET given_name = '=HYPERLINK("http://x.example")', family_name = 'Gorsedd, "KG"' WHERE pupil_number = 'KL1011'`);
    slots = await t.db.getRepository(Slot).find({ where: { sittingId }, relations: { student: true }, order: { position: 'ASC' } });
    await t.db.transaction(async (em) => {
      for (const slot of slots.filter((s) => s.outcome === 'completed')) {
        await writeSubmittedSheet(em, {
          slot,
          examinerMembershipId: slot.examinerMembershipId!,
          role: 'first',
          marks,
          flags: { 'flag:0:slip': 1 },
          comments: { overall: 'Even tone; keep the wrist loose.', '0': '+1 for the fingering' },
          submittedAt: new Date('2026-11-17T17:00:00Z'),
        });
      }
    });
    const closed = await t.http().post(`/api/sittings/${sittingId}/status`).set(auth(teacher)).send({ status: 'marking_closed' });
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);
    // The demo school with its year of marks takes a while to seed on a busy machine.
  }, 240_000);
  afterAll(() => t?.close());

  it('a sitting’s results: the planner sees every candidate, bands counted, the absent one without a result', async () => {
    const res = await t.http().get(`/api/sittings/${sittingId}/results`).set(auth(teacher));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const v = res.body as SittingResultsView;
    expect(v.scope).toBe('all');
    expect(v.results).toHaveLength(4);
    expect(v.withoutResult.map((w) => w.outcome)).toEqual(['absent']);
    const stored = await t.db.getRepository(Result).find({ where: { sittingId } });
    expect(v.results.map((r) => r.total).sort()).toEqual(stored.map((r) => r.total).sort());
    expect(v.summary.bands.reduce((s, b) => s + b.count, 0)).toBe(4);
    // Mean and median by their textbook definitions (common practice), over the stored percentages.
    const p = stored.map((r) => r.percentage).sort((a, b) => a - b);
    expect(v.summary.meanPercent).toBeCloseTo(p.reduce((a, b) => a + b, 0) / 4, 9);
    expect(v.summary.medianPercent).toBeCloseTo((p[1]! + p[2]!) / 2, 9);
    expect(v.criteria.map((c) => c.key)).toContain('freedom_from_tension');
  });

  it('another teacher sees only their own pupil; an examiner only the slots they marked; a student is refused', async () => {
    const other = await t.http().get(`/api/sittings/${sittingId}/results`).set(auth(otherTeacher));
    expect(other.status).toBe(200);
    expect(other.body.scope).toBe('own_pupils');
    expect(other.body.results.map((r: { student: { pupilNumber: string } }) => r.student.pupilNumber)).toEqual(['KL1013']);
    const ex = await t.http().get(`/api/sittings/${sittingId}/results`).set(auth(examiner));
    expect(ex.status).toBe(200);
    const [exMember] = (await t.db.query(`SELECT m.id FROM memberships m JOIN people p ON p.id = m.person_id WHERE p.email = 'examiner@demo.example'`)) as { id: string }[];
    const marked = slots.filter((s) => s.outcome === 'completed' && (s.examinerMembershipId === exMember!.id || s.secondExaminerMembershipId === exMember!.id));
    expect(ex.body.results.map((r: { slotId: string }) => r.slotId).sort()).toEqual(marked.map((s) => s.id).sort());
    const st = await t.http().get(`/api/sittings/${sittingId}/results`).set(auth(await signIn(t, 'student@demo.example')));
    expect(st.status).toBe(403);
    // Tomasz teaches none of the Wednesday class: its results are not there for him.
    expect((await t.http().get(`/api/classes/${classId}/results`).set(auth(otherTeacher))).status).toBe(404);
  });

  it('the sitting CSV round-trips through csv-parse (RFC 4180), cells neutralised, BOM only when asked', async () => {
    const plain = await t.http().get(`/api/sittings/${sittingId}/results/export`).set(auth(teacher));
    expect(plain.status).toBe(200);
    expect(plain.headers['content-type']).toMatch(/^text\/csv/);
    expect(plain.text.startsWith(BOM)).toBe(false);
    expect(plain.text).toMatch(/\r\n$/); // RFC 4180 §2.1: records end in CRLF
    const rows = parseCsv(plain.text);
    expect(rows[0]!.slice(0, SITTING_EXPORT_COLUMNS.length)).toEqual([...SITTING_EXPORT_COLUMNS]);
    expect(rows).toHaveLength(1 + 5);
    expect(plain.headers['x-expected-rows']).toBe('5');
    const kaia = rows.find((r) => r[0] === 'KL1011')!;
    // OWASP CSV injection guidance: a leading apostrophe, so a spreadsheet shows text, not a formula.
    expect(kaia[1]).toBe(`'=HYPERLINK("http://x.example")`);
    expect(kaia[2]).toBe('Gorsedd, "KG"'); // quoted and doubled quotes survive the round trip
    expect(rows.find((r) => r[0] === 'KL1019')![12]).toBe('absent');
    const withBom = await t.http().get(`/api/sittings/${sittingId}/results/export?bom=true`).set(auth(teacher));
    expect(withBom.text.startsWith(BOM)).toBe(true);
    expect(parseCsv(withBom.text)).toEqual(rows);
  });

  it('bad query input is refused with a clear message', async () => {
    const bad = await t.http().get(`/api/sittings/${sittingId}/results/export?bom=yes`).set(auth(teacher));
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/bom is true or false/);
    const backwards = await t.http().get(`/api/classes/${classId}/results?from=2026-12-01&to=2026-09-01`).set(auth(teacher));
    expect(backwards.status).toBe(400);
    expect(backwards.body.message).toMatch(/before "from"/);
    expect((await t.http().get(`/api/classes/${classId}/results?term=1`).set(auth(teacher))).status).toBe(400);
  });

  it('the class year exports one row per student × sitting × request × criterion, matching the stored results', async () => {
    const res = await t.http().get(`/api/classes/${classId}/results/export?from=2026-09-01&to=2027-08-31`).set(auth(teacher));
    expect(res.status).toBe(200);
    const [header, ...rows] = parseCsv(res.text);
    expect(header).toEqual([...YEAR_EXPORT_COLUMNS]);
    expect(String(rows.length)).toBe(res.headers['x-expected-rows']);
    const stored = await t.db.getRepository(Result).find({ where: { sittingId }, relations: { student: true } });
    // 4 results × requests asked × 7 criteria of the starter rubrics.
    const asked = stored.reduce((s, r) => s + r.profile.requests.filter((q) => q.asked).length, 0);
    expect(rows).toHaveLength(asked * 7);
    const col = (name: (typeof YEAR_EXPORT_COLUMNS)[number]) => YEAR_EXPORT_COLUMNS.indexOf(name);
    for (const r of stored) {
      const mine = rows.filter((row) => row[col('Pupil number')] === r.student!.pupilNumber);
      // The per-criterion marks add up to the stored profile (marks of maximum), criterion by criterion.
      for (const c of r.profile.criteria) {
        const cells = mine.filter((row) => row[col('Criterion key')] === c.key);
        expect(cells.reduce((s, row) => s + Number(row[col('Mark')]), 0)).toBe(c.marks);
        expect(cells.reduce((s, row) => s + Number(row[col('Out of')]), 0)).toBe(c.maximum);
      }
      expect(new Set(mine.map((row) => row[col('Result total')]))).toEqual(new Set([String(r.total)]));
    }
    expect(rows.find((row) => row[col('Pupil number')] === 'KL1011')![col('Given name')]).toBe(`'=HYPERLINK("http://x.example")`);
  });

  it('class results and the comparison of classes count the same results', async () => {
    const res = await t.http().get(`/api/classes/${classId}/results?from=2026-09-01&to=2027-08-31`).set(auth(teacher));
    expect(res.status).toBe(200);
    const v = res.body as ClassResultsView;
    expect(v.results).toHaveLength(4);
    expect(v.sittings).toHaveLength(1);
    const cmp = await t.http().get(`/api/results/classes?from=2026-09-01&to=2027-08-31`).set(auth(admin));
    expect(cmp.status).toBe(200);
    const wed = cmp.body.classes.find((c: { code: string }) => c.code === 'WED-INT');
    expect(wed.results).toBe(4);
    expect(wed.meanPercent).toBeCloseTo(v.summary.meanPercent!, 9);
    // PostgreSQL's percentile_cont(0.5) and our median agree.
    expect(wed.medianPercent).toBeCloseTo(v.summary.medianPercent!, 9);
    const mine = await t.http().get(`/api/results/classes`).set(auth(otherTeacher));
    expect(mine.body.classes.map((c: { code: string }) => c.code)).toEqual(['SAT-DIP']);
  });

  it('a mark sheet PDF parses and holds the candidate, the total and the band; take-home and class summary print', async () => {
    const [r] = (await t.db.query(
      `SELECT r.id, r.total, r.out_of, r.band_label, s.given_name || ' ' || s.family_name AS name, s.id AS student_id
         FROM results r JOIN students s ON s.id = r.student_id WHERE r.sitting_id = $1 AND s.pupil_number = 'KL1015'`,
      [sittingId],
    )) as { id: string; total: number; out_of: number; band_label: string; name: string; student_id: string }[];
    const pdf = await t.http().get(`/api/results/${r!.id}/mark-sheet`).set(auth(teacher)).buffer(true).parse(binary as never);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = await pdfText(pdf.body as Buffer);
    expect(text).toContain(r!.name);
    expect(text).toContain(`${r!.total} of ${r!.out_of}`);
    expect(text).toContain(r!.band_label);
    expect(text).toContain('Even tone; keep the wrist loose.');
    expect(text).toContain('Fingering slip ×1');
    expect(text).toContain('Health note'); // the tension criterion is assessed (design.md §10)

    const home = await t.http().get(`/api/results/${r!.id}/take-home`).set(auth(teacher)).buffer(true).parse(binary as never);
    expect(home.status).toBe(200);
    expect(await pdfText(home.body as Buffer)).toContain('What went well');

    // The demo student (KL1021) is not this candidate: someone else's result is not there for them.
    const st = await signIn(t, 'student@demo.example');
    expect((await t.http().get(`/api/results/${r!.id}/take-home`).set(auth(st))).status).toBe(404);
    expect((await t.http().get(`/api/results/${r!.id}/mark-sheet`).set(auth(st))).status).toBe(403);

    const summary = await t.http().get(`/api/classes/${classId}/results/summary?from=2026-09-01&to=2027-08-31`).set(auth(teacher)).buffer(true).parse(binary as never);
    expect(summary.status).toBe(200);
    const st2 = await pdfText(summary.body as Buffer);
    expect(st2).toContain('Class summary: Wednesday Intermediates');
    expect(st2).toContain(r!.name);
  }, 120_000); // five PDFs rendered and parsed

  it('a student reads their own take-home report only once it is released', async () => {
    // Make this candidate the demo student's own record for the check (one student record per sign-in).
    const [r] = (await t.db.query(`SELECT r.id FROM results r JOIN students s ON s.id = r.student_id WHERE r.sitting_id = $1 AND s.pupil_number = 'KL1017'`, [sittingId])) as { id: string }[];
    const [{ m }] = (await t.db.query(`SELECT membership_id AS m FROM students WHERE pupil_number = 'KL1021'`)) as [{ m: string }];
    await t.db.query(`UPDATE students SET membership_id = NULL WHERE pupil_number = 'KL1021'`);
    await t.db.query(`UPDATE students SET membership_id = $1 WHERE pupil_number = 'KL1017'`, [m]);
    const st = await signIn(t, 'student@demo.example');
    expect((await t.http().get(`/api/results/${r!.id}/take-home`).set(auth(st))).status).toBe(404);
    await t.db.query(`UPDATE results SET released_at = now(), released_by_person_id = (SELECT id FROM people WHERE email = 'teacher@demo.example') WHERE id = $1`, [r!.id]);
    const home = await t.http().get(`/api/results/${r!.id}/take-home`).set(auth(st)).buffer(true).parse(binary as never);
    expect(home.status).toBe(200);
    expect(await pdfText(home.body as Buffer)).toContain('Quinn Fairweather');
    // Released or not, the examiner's full mark sheet stays with staff.
    expect((await t.http().get(`/api/results/${r!.id}/mark-sheet`).set(auth(st))).status).toBe(403);
  });
});
