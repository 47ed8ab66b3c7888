import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

describe('classes, members and students', () => {
  let t: TestApp;
  let teacher: string;
  let admin: string;
  const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
  const classId = async (code: string, token = admin): Promise<string> =>
    (
      (await t.http().get('/api/classes').set(auth(token))).body as { id: string; code: string }[]
    ).find((c) => c.code === code)!.id;

  beforeAll(async () => {
    t = await createTestApp({ env: { LINK_LIMIT_PER_EMAIL: '3' } });
    teacher = await signIn(t, 'teacher@demo.example');
    admin = await signIn(t, 'admin@demo.example');
  });
  afterAll(() => t.close());

  it('a teacher lists only the classes they teach, with teachers and member counts', async () => {
    const res = await t.http().get('/api/classes').set(auth(teacher));
    expect(res.status).toBe(200);
    expect(res.body.map((c: { code: string }) => c.code).sort()).toEqual([
      'MON-FND',
      'THU-SNR',
      'WED-INT',
    ]);
    const wed = res.body.find((c: { code: string }) => c.code === 'WED-INT');
    expect(wed.teachers.map((x: { displayName: string }) => x.displayName)).toEqual([
      'Beatrix Oduya',
      'Idris Calloway',
    ]);
    expect(wed.memberCount).toBe(10);
    expect((await t.http().get('/api/classes').set(auth(admin))).body).toHaveLength(4);
    expect(
      (
        await t
          .http()
          .get('/api/classes')
          .set(auth(await signIn(t, 'student@demo.example')))
      ).status,
    ).toBe(403);
  });

  it('the class detail lists members with guardians and the classes the caller can see', async () => {
    const res = await t
      .http()
      .get(`/api/classes/${await classId('WED-INT')}`)
      .set(auth(teacher));
    expect(res.status).toBe(200);
    const mira = res.body.members.find((m: { pupilNumber: string }) => m.pupilNumber === 'KL1013');
    // Mira is also in SAT-DIP, which this teacher does not teach: not shown to them.
    expect(mira.classCodes).toEqual(['WED-INT']);
    expect(mira.guardians).toEqual([
      {
        name: 'Jamie Gadsby',
        email: 'jamie.gadsby@family.example',
        consentResultsEmail: true,
        consentRecordings: true,
      },
    ]);
    const asAdmin = await t
      .http()
      .get(`/api/classes/${await classId('WED-INT')}`)
      .set(auth(admin));
    expect(
      asAdmin.body.members.find((m: { pupilNumber: string }) => m.pupilNumber === 'KL1013')
        .classCodes,
    ).toEqual(['SAT-DIP', 'WED-INT']);
  });

  it('create: a teacher teaches the class they create; a code is used once', async () => {
    const res = await t
      .http()
      .post('/api/classes')
      .set(auth(teacher))
      .send({ name: 'Friday Duets', code: 'FRI-DUO' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      code: 'FRI-DUO',
      teachers: [{ displayName: 'Idris Calloway' }],
      memberCount: 0,
    });
    const again = await t
      .http()
      .post('/api/classes')
      .set(auth(admin))
      .send({ name: 'Other', code: 'FRI-DUO' });
    expect(again.status).toBe(409);
    const bad = await t
      .http()
      .post('/api/classes')
      .set(auth(admin))
      .send({ name: 'X', code: '=1+1' });
    expect(bad.status).toBe(400);
  });

  it('update: teachers rename and deactivate; only admins choose teachers, who must have the teacher role', async () => {
    const id = await classId('FRI-DUO');
    expect(
      (
        await t
          .http()
          .patch(`/api/classes/${id}`)
          .set(auth(teacher))
          .send({ name: 'Friday Duets and Trios' })
      ).body.name,
    ).toBe('Friday Duets and Trios');
    const users = await t.http().get('/api/users?search=oduya').set(auth(admin));
    const beatrix = users.body.items[0].id as string;
    expect(
      (
        await t
          .http()
          .patch(`/api/classes/${id}`)
          .set(auth(teacher))
          .send({ teacherIds: [beatrix] })
      ).status,
    ).toBe(403);
    const set = await t
      .http()
      .patch(`/api/classes/${id}`)
      .set(auth(admin))
      .send({ teacherIds: [beatrix] });
    expect(set.body.teachers.map((x: { displayName: string }) => x.displayName)).toEqual([
      'Beatrix Oduya',
    ]);
    // No longer this teacher's class: it is not there for them.
    expect((await t.http().get(`/api/classes/${id}`).set(auth(teacher))).status).toBe(404);
    const examiner = (await t.http().get('/api/users?search=halvorsen').set(auth(admin))).body
      .items[0].id as string;
    expect(
      (
        await t
          .http()
          .patch(`/api/classes/${id}`)
          .set(auth(admin))
          .send({ teacherIds: [examiner] })
      ).status,
    ).toBe(400);
    const off = await t.http().patch(`/api/classes/${id}`).set(auth(admin)).send({ active: false });
    expect(off.body.active).toBe(false);
  });

  it('add, move and remove members; a student in several classes', async () => {
    const mon = await classId('MON-FND');
    const wed = await classId('WED-INT');
    const found = await t.http().get('/api/students?search=pendry').set(auth(teacher));
    const ada = found.body[0];
    expect(ada).toMatchObject({ pupilNumber: 'KL1001', classCodes: ['MON-FND'], hasSignIn: false });
    const added = await t
      .http()
      .post(`/api/classes/${wed}/members`)
      .set(auth(teacher))
      .send({ studentId: ada.id });
    expect(added.status).toBe(200);
    expect(added.body.members.find((m: { id: string }) => m.id === ada.id).classCodes).toEqual([
      'MON-FND',
      'WED-INT',
    ]);
    const moved = await t
      .http()
      .post(`/api/classes/${mon}/members`)
      .set(auth(teacher))
      .send({ studentId: ada.id, fromClassId: wed });
    expect(moved.body.members.find((m: { id: string }) => m.id === ada.id).classCodes).toEqual([
      'MON-FND',
    ]);
    expect(
      (await t.http().delete(`/api/classes/${wed}/members/${ada.id}`).set(auth(teacher))).status,
    ).toBe(404);
    expect(
      (await t.http().delete(`/api/classes/${mon}/members/${ada.id}`).set(auth(teacher))).status,
    ).toBe(204);
    // Out of all the teacher's classes, Ada is no longer theirs to see; an admin puts her back.
    expect(
      (
        await t
          .http()
          .post(`/api/classes/${mon}/members`)
          .set(auth(teacher))
          .send({ studentId: ada.id })
      ).status,
    ).toBe(404);
    expect(
      (
        await t
          .http()
          .post(`/api/classes/${mon}/members`)
          .set(auth(admin))
          .send({ studentId: ada.id })
      ).status,
    ).toBe(200);
  });

  it('students: a teacher finds only their own; deactivation keeps the record', async () => {
    expect((await t.http().get('/api/students?search=merrow').set(auth(teacher))).body).toEqual([]);
    expect((await t.http().get('/api/students?search=merrow').set(auth(admin))).body).toHaveLength(
      1,
    );
    const dev = (await t.http().get('/api/students?search=KL1004').set(auth(teacher))).body[0];
    const off = await t
      .http()
      .patch(`/api/students/${dev.id}`)
      .set(auth(teacher))
      .send({ active: false });
    expect(off.body).toMatchObject({ pupilNumber: 'KL1004', active: false });
    const elodie = (await t.http().get('/api/students?search=merrow').set(auth(admin))).body[0];
    expect(
      (
        await t
          .http()
          .patch(`/api/students/${elodie.id}`)
          .set(auth(teacher))
          .send({ active: false })
      ).status,
    ).toBe(404);
  });

  it('the template is the header line of the documented columns', async () => {
    const res = await t.http().get('/api/classes/import/template').set(auth(teacher));
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toMatch(/class-list-template\.csv/);
    expect(res.text.replace(/^\uFEFF/, '')).toBe(
      'Pupil number,Given name,Family name,Student e-mail,Date of birth,Guardian name,Guardian e-mail,Grade,Class code\r\n',
    );
  });

  it('forgot password is rate-limited per address, with Retry-After', async () => {
    const statuses: number[] = [];
    let retryAfter: string | undefined;
    for (let i = 0; i < 5; i++) {
      const res = await t
        .http()
        .post('/api/account/forgot-password')
        .send({ email: 'limit.test@demo.example' });
      statuses.push(res.status);
      if (res.status === 429) retryAfter = res.headers['retry-after'];
    }
    expect(statuses).toEqual([202, 202, 202, 429, 429]);
    expect(Number(retryAfter)).toBeGreaterThan(0);
    // Another address from the same client is not blocked by the first.
    expect(
      (
        await t
          .http()
          .post('/api/account/forgot-password')
          .send({ email: 'other.test@demo.example' })
      ).status,
    ).toBe(202);
  });
});
