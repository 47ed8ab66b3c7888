import { randomUUID } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { startMailCatcher, type RunningMailCatcher } from '../mail-catcher/catcher.js';
import { UPLOAD_TEMP_PREFIX } from './import/csv-upload.interceptor.js';
import {
  clearCaughtMail,
  listCaughtMail,
  waitForCaughtMail,
  type CaughtMail,
} from '../mail-catcher/mailbox.js';

const SAMPLES = resolve(fileURLToPath(import.meta.url), '../../../../seed-data/class-lists');
const sample = (name: string): Buffer => readFileSync(join(SAMPLES, name));
const HEADER =
  'Pupil number,Given name,Family name,Student e-mail,Date of birth,Guardian name,Guardian e-mail,Grade,Class code';
const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
const linkIn = (mail: CaughtMail): string => {
  const m = /#token=([A-Za-z0-9_-]{43})/.exec(mail.text);
  if (!m) throw new Error(`no link in ${mail.subject}`);
  return m[1]!;
};

describe('class-list import, guardians and the e-mails they cause', () => {
  let t: TestApp;
  let catcher: RunningMailCatcher;
  let dir: string;
  let teacher: string;
  let admin: string;

  const upload = (token: string, csv: Buffer | string, dryRun: boolean, name = 'list.csv') =>
    t
      .http()
      .post(`/api/classes/import${dryRun ? '?dryRun=true' : ''}`)
      .set(auth(token))
      .attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), name);
  const count = async (table: string): Promise<number> =>
    Number(((await t.db.query(`SELECT count(*) AS n FROM ${table}`)) as { n: string }[])[0]!.n);
  const snapshot = async () => ({
    students: await count('students'),
    guardians: await count('guardians'),
    classes: await count('classes'),
    members: await count('class_members'),
    people: await count('people'),
    mail: await count('outbound_mail'),
    links: await count('account_tokens'),
  });

  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'stavemark-import-mail-'));
    catcher = await startMailCatcher({ dir, port: 0 });
    t = await createTestApp({
      env: {
        SMTP_PORT: String(catcher.port),
        MAIL_CATCHER_DIR: dir,
        MAIL_POLL_SECONDS: '0.5',
        STAVEMARK_NOW: '2026-12-01T12:00:00Z',
      },
    });
    teacher = await signIn(t, 'teacher@demo.example');
    admin = await signIn(t, 'admin@demo.example');
  });
  afterAll(async () => {
    await t?.close();
    await catcher?.close();
    await rm(dir, { recursive: true, force: true });
    delete process.env.STAVEMARK_NOW;
  });
  beforeEach(async () => {
    await clearCaughtMail(dir);
  });

  it('a dry run reports every row and writes nothing', async () => {
    const before = await snapshot();
    const res = await upload(
      teacher,
      sample('tuesday-beginners.csv'),
      true,
      'tuesday-beginners.csv',
    );
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      dryRun: true,
      applied: false,
      fileName: 'tuesday-beginners.csv',
      delimiter: ',',
      rowCount: 6,
      counts: { new: 5, updated: 1, unchanged: 0, error: 0 },
      newClassCodes: ['TUE-BEG'],
      invitations: 2,
      guardianNotices: 3,
      importDate: '2026-12-01',
    });
    expect(res.body.rows.map((r: { line: number; status: string }) => [r.line, r.status])).toEqual([
      [2, 'new'],
      [3, 'new'],
      [4, 'new'],
      [5, 'new'],
      [6, 'new'],
      [7, 'updated'],
    ]);
    expect(res.body.rows[5].changes).toEqual(['Joins class TUE-BEG']);
    expect(await snapshot()).toEqual(before);
  });

  it('a file with one bad row: the preview names the line; applying changes nothing and sends nothing', async () => {
    const before = await snapshot();
    const file = sample('tuesday-beginners-one-bad-row.csv');
    const preview = await upload(teacher, file, true);
    expect(preview.status).toBe(200);
    expect(preview.body.counts).toEqual({ new: 4, updated: 1, unchanged: 0, error: 1 });
    const bad = preview.body.rows.find((r: { status: string }) => r.status === 'error');
    expect(bad).toMatchObject({ line: 4, pupilNumber: 'KL2103', name: 'Juniper Calloway-Reyes' });
    expect(bad.errors).toEqual([
      'Date of birth “2017-02-30” is not a real date: check the day and the month.',
    ]);

    const applied = await upload(teacher, file, false);
    expect(applied.status).toBe(400);
    expect(applied.body.message).toBe(
      '1 row has an error, so nothing was imported. Correct the file and upload it again.',
    );
    expect(applied.body.details.report.rows[2].errors[0]).toMatch(/2017-02-30/);
    expect(await snapshot()).toEqual(before);
    // Give a worker time to send anything it might have: the catcher stays empty.
    await new Promise((r) => setTimeout(r, 1500));
    expect(await listCaughtMail(dir)).toEqual([]);
  });

  it('applies the good file in one go, with counts, and sends the invitations and guardian notices after commit', async () => {
    const before = await snapshot();
    const res = await upload(teacher, sample('tuesday-beginners.csv'), false);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      applied: true,
      counts: { new: 5, updated: 1, unchanged: 0, error: 0 },
      invitations: 2,
      guardianNotices: 3,
    });
    const after = await snapshot();
    expect(after.students - before.students).toBe(5);
    expect(after.guardians - before.guardians).toBe(4); // Saoirse is an adult with no guardian
    expect(after.classes - before.classes).toBe(1);
    expect(after.members - before.members).toBe(6);
    expect(after.people - before.people).toBe(2);
    expect(after.mail - before.mail).toBe(5);

    // The new class is taught by the teacher who imported it and lists its members.
    const list = await t.http().get('/api/classes').set(auth(teacher));
    const tue = list.body.find((c: { code: string }) => c.code === 'TUE-BEG');
    expect(tue).toMatchObject({
      name: 'TUE-BEG',
      memberCount: 6,
      teachers: [{ displayName: 'Idris Calloway' }],
    });

    const mails = await waitFor(dir, 5);
    const to = (addr: string) => mails.find((m) => m.envelope.to.includes(addr))!;
    const siblings = to('tess.ashcombe@family.example');
    expect(siblings.subject).toBe(
      'Maren and Otto at Kestrel Lane Music School: what we keep, and two questions for you',
    );
    expect(siblings.text).toContain('Hello Tess Ashcombe,');
    expect(siblings.html).toContain('Give my answers');
    expect(siblings.text).toMatch(
      /http:\/\/localhost:3000\/account\/consent#token=[A-Za-z0-9_-]{43}/,
    );
    const invite = to('saoirse.lambourne@mail.example');
    expect(invite.subject).toBe('Welcome to Stavemark at Kestrel Lane Music School');
    expect(invite.text).toContain(
      'The link works once, for 72 hours. If it has run out, ask for a fresh one here: http://localhost:3000/account/forgot-password',
    );
    expect(to('idris.penhale@pupils.example').subject).toMatch(/^Welcome/);
    expect(to('wyn.penhale@family.example').subject).toMatch(/^Idris at/);
    expect(to('dani.reyes@family.example').subject).toMatch(/^Juniper at/);
    // Every row is marked sent, and no link is stored in a usable form.
    const rows = (await t.db.query(`SELECT status, message_id FROM outbound_mail`)) as {
      status: string;
      message_id: string;
    }[];
    expect(rows.every((r) => r.status === 'sent' && r.message_id)).toBe(true);
    const stored =
      JSON.stringify(await t.db.query(`SELECT * FROM account_tokens`)) +
      JSON.stringify(await t.db.query(`SELECT * FROM outbound_mail`));
    expect(stored).not.toContain(linkIn(invite));

    // The invitation works once: set a password, sign in, and the link is spent.
    const token = linkIn(invite);
    const info = await t.http().post('/api/account/link').send({ token });
    expect(info.body).toMatchObject({
      purpose: 'invitation',
      displayName: 'Saoirse Lambourne',
      organisationName: 'Kestrel Lane Music School',
    });
    const set = await t
      .http()
      .post('/api/account/accept-invitation')
      .send({ token, password: 'a-fine-long-password' });
    expect(set.status).toBe(200);
    expect(await signIn(t, 'saoirse.lambourne@mail.example', 'a-fine-long-password')).toMatch(
      /^ey/,
    );
    const again = await t
      .http()
      .post('/api/account/accept-invitation')
      .send({ token, password: 'another-long-password' });
    expect(again.status).toBe(400);
    expect(again.body.message).toMatch(/expired or has already been used/);

    // The guardian answers the consent questions for both children.
    const consentToken = linkIn(siblings);
    const ask = await t.http().post('/api/account/consent/request').send({ token: consentToken });
    expect(ask.status).toBe(200);
    expect(ask.body.children.map((c: { givenName: string }) => c.givenName)).toEqual([
      'Otto',
      'Maren',
    ]);
    const answers = ask.body.children.map((c: { studentId: string }, i: number) => ({
      studentId: c.studentId,
      consentResultsEmail: true,
      consentRecordings: i === 0,
    }));
    const partial = await t
      .http()
      .post('/api/account/consent')
      .send({ token: consentToken, answers: answers.slice(0, 1) });
    expect(partial.status).toBe(400);
    const saved = await t
      .http()
      .post('/api/account/consent')
      .send({ token: consentToken, answers });
    expect(saved.status).toBe(200);
    const stored2 = (await t.db.query(
      `SELECT s.given_name, g.consent_results_email, g.consent_recordings FROM guardians g JOIN students s ON s.id = g.student_id
        WHERE g.email = 'tess.ashcombe@family.example' ORDER BY s.given_name`,
    )) as { given_name: string; consent_results_email: boolean; consent_recordings: boolean }[];
    expect(stored2).toEqual([
      { given_name: 'Maren', consent_results_email: true, consent_recordings: false },
      { given_name: 'Otto', consent_results_email: true, consent_recordings: true },
    ]);
    expect(
      (await t.http().post('/api/account/consent').send({ token: consentToken, answers })).status,
    ).toBe(400);

    // The Outbox shows what the catcher received, to an admin only.
    const outbox = await t.http().get('/api/dev/outbox').set(auth(admin));
    expect(outbox.status).toBe(200);
    expect(outbox.body.catcher).toBe(true);
    expect(outbox.body.items.length).toBeGreaterThanOrEqual(5);
    expect(outbox.body.items[0]).toMatchObject({
      status: 'sent',
      kind: expect.any(String),
      html: expect.stringContaining('<p'),
    });
    expect((await t.http().get('/api/dev/outbox').set(auth(teacher))).status).toBe(403);
  });

  it('an update writes what the report says; a blank optional cell keeps what is stored', async () => {
    const first = `${HEADER}\nKL9001,Rhea,Tamsin,rhea.tamsin@pupils.example,2012-04-02,Ola Tamsin,ola.tamsin@family.example,3,UPD-A\n`;
    expect((await upload(admin, first, false)).body.counts).toMatchObject({ new: 1 });
    const second = `${HEADER}\nKL9001,Rhiannon,Tamsin,,2012-04-03,Ola Tamsin-Reed,ola.tamsin@family.example,,UPD-B\n`;
    const preview = await upload(admin, second, true);
    expect(preview.body.rows[0]).toMatchObject({
      line: 2,
      status: 'updated',
      changes: [
        'Given name: Rhea → Rhiannon',
        'Date of birth: 2012-04-02 → 2012-04-03',
        'Guardian name: Ola Tamsin → Ola Tamsin-Reed',
        'Joins class UPD-B',
      ],
    });
    expect((await upload(admin, second, false)).body).toMatchObject({
      applied: true,
      counts: { new: 0, updated: 1, unchanged: 0, error: 0 },
    });
    const mailBefore = await count('outbound_mail');
    const third = `${HEADER}\nKL9001,Rhiannon,Tamsin,,2012-04-03,Kit Tamsin,kit.tamsin@family.example,4,UPD-B\n`;
    expect((await upload(admin, third, false)).body).toMatchObject({
      counts: { updated: 1 },
      guardianNotices: 1,
      invitations: 0,
    });
    // The notice to the new guardian of a minor (14 on the import date) is the only new mail.
    expect((await count('outbound_mail')) - mailBefore).toBe(1);

    const [student] = (await t.db.query(
      `SELECT id, given_name, family_name, email, date_of_birth::text AS dob, grade FROM students WHERE pupil_number = 'KL9001'`,
    )) as { id: string; given_name: string; email: string; dob: string; grade: number }[];
    expect(student).toMatchObject({
      given_name: 'Rhiannon',
      family_name: 'Tamsin',
      email: 'rhea.tamsin@pupils.example',
      dob: '2012-04-03',
      grade: 4,
    });
    const guardians = (await t.db.query(
      `SELECT name, email FROM guardians WHERE student_id = $1 ORDER BY email`,
      [student!.id],
    )) as { name: string; email: string }[];
    expect(guardians).toEqual([
      { name: 'Kit Tamsin', email: 'kit.tamsin@family.example' },
      { name: 'Ola Tamsin-Reed', email: 'ola.tamsin@family.example' },
    ]);
    const classes = (await t.db.query(
      `SELECT c.code FROM class_members m JOIN classes c ON c.id = m.class_id WHERE m.student_id = $1 ORDER BY c.code`,
      [student!.id],
    )) as { code: string }[];
    expect(classes.map((c) => c.code)).toEqual(['UPD-A', 'UPD-B']);
    // Importing the same file again changes nothing.
    expect((await upload(admin, third, true)).body.counts).toEqual({
      new: 0,
      updated: 0,
      unchanged: 1,
      error: 0,
    });
  });

  it('export, then import the export: nothing changes', async () => {
    const list = await t.http().get('/api/classes').set(auth(teacher));
    for (const code of ['MON-FND', 'TUE-BEG']) {
      const cls = list.body.find((c: { code: string }) => c.code === code);
      const exported = await t
        .http()
        .get(`/api/classes/${cls.id}/export`)
        .set(auth(teacher))
        .buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(exported.status).toBe(200);
      expect(exported.headers['content-type']).toMatch(/^text\/csv/);
      const csv = exported.body as Buffer;
      expect(csv.subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
      expect(csv.toString('utf8')).toContain('\r\n');
      const before = await snapshot();
      const preview = await upload(teacher, csv, true);
      expect(preview.body.counts).toEqual({
        new: 0,
        updated: 0,
        unchanged: cls.memberCount,
        error: 0,
      });
      const applied = await upload(teacher, csv, false);
      expect(applied.status).toBe(200);
      expect(applied.body.counts.unchanged).toBe(cls.memberCount);
      expect(await snapshot()).toEqual(before);
    }
  });

  it('neutralises formula-like cells in the export (design.md §8; OWASP CSV injection)', async () => {
    const [s] = (await t.db.query(`SELECT id FROM students WHERE pupil_number = 'KL1001'`)) as {
      id: string;
    }[];
    await t.db.query(
      `UPDATE guardians SET name = '=HYPERLINK("http://x.example","y")' WHERE student_id = $1`,
      [s!.id],
    );
    const list = await t.http().get('/api/classes').set(auth(teacher));
    const cls = list.body.find((c: { code: string }) => c.code === 'MON-FND');
    const res = await t.http().get(`/api/classes/${cls.id}/export`).set(auth(teacher));
    const rows = parse(res.text, { bom: true }) as string[][];
    const ada = rows.find((r) => r[0] === 'KL1001')!;
    expect(ada[5]).toBe(`'=HYPERLINK("http://x.example","y")`);
    await t.db.query(`UPDATE guardians SET name = 'Robin Pendry' WHERE student_id = $1`, [s!.id]);
  });

  it('row errors: duplicates, a minor without a guardian e-mail, bad e-mail, bad grade, a formula-like cell, a stray field', async () => {
    const csv = [
      HEADER,
      'KL3001,Pip,Marlow,,2016-01-01,Sam Marlow,sam.marlow@family.example,1,NEW-A',
      'KL3001,Pip,Marlow,,2016-01-01,Sam Marlow,sam.marlow@family.example,1,NEW-A',
      'KL3002,Tam,Yew,,2015-04-04,,,2,NEW-A',
      'KL3003,Ros,Quill,ros@,2000-04-04,,,2,NEW-A',
      'KL3004,Ned,Ash,,2000-04-04,,,13,NEW-A',
      'KL3005,=cmd|calc,Ash,,2000-04-04,,,3,NEW-A',
      'KL3006,Bea,Ash,,2000-04-04,,,3,NEW-A,extra',
      'KL3007,Cy,Ash,,2008-12-02,,,3,NEW-A',
      'KL3008,Di,Ash,twin@pupils.example,2000-04-04,,,3,NEW-A',
      'KL3009,Ed,Ash,TWIN@pupils.example,2000-04-04,,,3,NEW-A',
    ].join('\n');
    const res = await upload(teacher, csv, true);
    expect(res.status).toBe(200);
    const errs = (line: number) =>
      res.body.rows.find((r: { line: number }) => r.line === line).errors as string[];
    expect(errs(2)).toEqual(['Pupil number KL3001 is in the file more than once (also line 3).']);
    expect(errs(3)).toEqual(['Pupil number KL3001 is in the file more than once (also line 2).']);
    expect(errs(4)).toEqual([
      'Tam Yew is 11 on 2026-12-01: a student under 18 needs a guardian e-mail.',
    ]);
    expect(errs(5)).toEqual(['Student e-mail “ros@” is not an e-mail address.']);
    expect(errs(6)).toEqual(['Grade “13” should be a whole number from 0 to 12.']);
    expect(errs(7)).toEqual([
      'Given name starts with “=”, which spreadsheets run as a formula. Remove it.',
    ]);
    expect(errs(8)[0]).toMatch(/10 fields but the header has 9/);
    // 17 the day after the import date: still a minor (age counted on the organisation's date).
    expect(errs(9)).toEqual([
      'Cy Ash is 17 on 2026-12-01: a student under 18 needs a guardian e-mail.',
    ]);
    // The same student e-mail twice (compared without case).
    expect(errs(10)).toEqual([
      'Student e-mail twin@pupils.example is in the file more than once (also line 11).',
    ]);
    expect(errs(11)).toEqual([
      'Student e-mail twin@pupils.example is in the file more than once (also line 10).',
    ]);
    expect(res.body.counts.error).toBe(10);
  });

  it('ownership: a teacher cannot import into another teacher’s class or change a student outside their classes', async () => {
    const csv = [
      HEADER,
      // SAT-DIP is taught by Tomasz only; KL1031 is only in SAT-DIP.
      'KL3101,Ivo,Brent,,2000-01-01,,,5,SAT-DIP',
      'KL1031,Elodie,Merrow,elodie.merrow@mail.example,2002-02-08,,,7,MON-FND',
    ].join('\r\n');
    const res = await upload(teacher, csv, true);
    expect(res.body.rows[0].errors[0]).toMatch(/Class SAT-DIP is taught by other teachers/);
    expect(res.body.rows[1].errors[0]).toMatch(
      /Pupil number KL1031 belongs to a student who is not in your classes/,
    );
    // An admin may do both.
    const asAdmin = await upload(admin, csv, true);
    expect(asAdmin.body.counts.error).toBe(0);

    const classes = await t.http().get('/api/classes').set(auth(admin));
    const satDip = classes.body.find((c: { code: string }) => c.code === 'SAT-DIP');
    expect((await t.http().get(`/api/classes/${satDip.id}`).set(auth(teacher))).status).toBe(404);
    expect((await t.http().get(`/api/classes/${satDip.id}/export`).set(auth(teacher))).status).toBe(
      404,
    );
    const other = await signIn(t, 'admin@fernhill.example');
    expect((await t.http().get(`/api/classes/${satDip.id}`).set(auth(other))).status).toBe(404);
    expect(
      (await t.http().get('/api/classes').set(auth(other))).body.map(
        (c: { code: string }) => c.code,
      ),
    ).toEqual(['FH-TUE']);
  });

  it('reports its progress to the caller who sent the progress id, and to nobody else', async () => {
    const progressId = randomUUID();
    const csv = `${HEADER}\nKL9101,Ada,Progress,,2001-01-01,,,,PRG-1\nKL9102,Bram,Progress,,2001-02-01,,,,PRG-1\n`;
    const res = await t
      .http()
      .post('/api/classes/import')
      .set(auth(teacher))
      .field('progressId', progressId)
      .attach('file', Buffer.from(csv), 'progress.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const seen = await t
      .http()
      .get(`/api/classes/import/progress/${progressId}`)
      .set(auth(teacher));
    expect(seen.status).toBe(200);
    expect(seen.body).toEqual({ phase: 'done', done: 7, total: 7, step: 'Imported' });
    // Another person, even an administrator of the same school, does not see it.
    expect(
      (await t.http().get(`/api/classes/import/progress/${progressId}`).set(auth(admin))).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/classes/import/progress/${randomUUID()}`).set(auth(teacher)))
        .status,
    ).toBe(404);
  });

  it('bad files over HTTP: binary, Latin-1, too large, no file', async () => {
    // Uploads wait in temporary folders; none may be left behind, whatever the answer.
    const uploadDirs = () =>
      readdirSync(tmpdir()).filter((f) => join(tmpdir(), f).startsWith(UPLOAD_TEMP_PREFIX));
    const leftBefore = uploadDirs();
    const binary = await upload(
      teacher,
      Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 0]),
      true,
      'list.xlsx',
    );
    expect(binary.status).toBe(400);
    expect(binary.body.message).toMatch(/not a CSV text file/);
    const latin1 = Buffer.concat([
      Buffer.from(`${HEADER}\nKL1,Zo`),
      Buffer.from([0xeb]),
      Buffer.from(',Pendry,,2000-01-01,,,,A\n'),
    ]);
    const l = await upload(teacher, latin1, false);
    expect(l.status).toBe(400);
    expect(l.body.message).toMatch(/not UTF-8 text: line 2/);
    const big = await upload(teacher, Buffer.alloc(2 * 1024 * 1024 + 10, 0x41), true);
    expect(big.status).toBe(413);
    expect(big.body.message).toMatch(/larger than 2 MB/);
    const none = await t
      .http()
      .post('/api/classes/import?dryRun=true')
      .set(auth(teacher))
      .field('x', 'y');
    expect(none.status).toBe(400);
    expect(none.body.message).toMatch(/Choose a CSV file/);
    const badQuery = await t
      .http()
      .post('/api/classes/import?dryRun=maybe')
      .set(auth(teacher))
      .attach('file', Buffer.from(HEADER), 'a.csv');
    expect(badQuery.status).toBe(400);
    const good = await upload(
      teacher,
      `${HEADER}\nKL9001,Ada,Tmpfile,,2001-01-01,,,,TMP-1\n`,
      true,
    );
    expect(good.status, JSON.stringify(good.body)).toBe(200);
    expect(uploadDirs().filter((d) => !leftBefore.includes(d))).toEqual([]);
  });

  it('forgot password: the same answer for any address; a reset link only for a real one; a reset signs out old sessions', async () => {
    const before = await count('outbound_mail');
    const unknown = await t
      .http()
      .post('/api/account/forgot-password')
      .send({ email: 'nobody@demo.example' });
    const known = await t
      .http()
      .post('/api/account/forgot-password')
      .send({ email: 'examiner@demo.example' });
    expect(unknown.status).toBe(202);
    expect(known.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    expect((await count('outbound_mail')) - before).toBe(1);
    const mail = await waitForCaughtMail(dir, (m) =>
      m.envelope.to.includes('examiner@demo.example'),
    );
    expect(mail.subject).toBe('Choose a new Stavemark password');
    expect(mail.text).toContain('for 2 hours');

    const old = await signIn(t, 'examiner@demo.example');
    const token = linkIn(mail);
    const short = await t
      .http()
      .post('/api/account/reset-password')
      .send({ token, password: 'short' });
    expect(short.status).toBe(400);
    // An invitation route does not accept a reset link.
    expect(
      (
        await t
          .http()
          .post('/api/account/accept-invitation')
          .send({ token, password: 'a-new-long-password' })
      ).status,
    ).toBe(400);
    const reset = await t
      .http()
      .post('/api/account/reset-password')
      .send({ token, password: 'a-new-long-password' });
    expect(reset.status).toBe(200);
    expect((await t.http().get('/api/auth/me').set(auth(old))).status).toBe(401);
    expect(await signIn(t, 'examiner@demo.example', 'a-new-long-password')).toMatch(/^ey/);
    await expect(signIn(t, 'examiner@demo.example')).rejects.toThrow(/401/);
  });

  it('an expired link answers like a used one', async () => {
    await t
      .http()
      .post('/api/account/forgot-password')
      .send({ email: 'tomasz.whitcombe@demo.example' });
    const mail = await waitForCaughtMail(dir, (m) =>
      m.envelope.to.includes('tomasz.whitcombe@demo.example'),
    );
    await t.db.query(
      `UPDATE account_tokens SET expires_at = '2026-12-01T11:59:59Z' WHERE purpose = 'password_reset' AND used_at IS NULL`,
    );
    const res = await t
      .http()
      .post('/api/account/reset-password')
      .send({ token: linkIn(mail), password: 'a-new-long-password' });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/expired or has already been used/);
    const garbled = await t
      .http()
      .post('/api/account/link')
      .send({ token: 'x'.repeat(43) });
    expect(garbled.status).toBe(400);
    expect(garbled.body.message).toBe(res.body.message);
  });
});

async function waitFor(dir: string, n: number): Promise<CaughtMail[]> {
  const deadline = Date.now() + 15_000;
  for (;;) {
    const all = await listCaughtMail(dir);
    if (all.length >= n) return all;
    if (Date.now() > deadline) throw new Error(`only ${all.length} of ${n} mails arrived`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
