import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
// One-octave C major scale, right hand, up: 1-2-3-1-2-3-4-5 (common practice, from memory); up
// and down repeats the descent without the top note: 15 notes.
const cMajorRhUp = [1, 2, 3, 1, 2, 3, 4, 5];
const cMajorRhUpDown = [1, 2, 3, 1, 2, 3, 4, 5, 4, 3, 2, 1, 3, 2, 1];
const body = (digits = cMajorRhUp) => ({
  kind: 'scale',
  key: 'C',
  mode: 'major',
  hand: 'RH',
  octaves: 1,
  direction: 'up',
  digits,
});

describe('students’ approved fingerings', () => {
  let t: TestApp;
  let teacher: string;
  let otherTeacher: string;
  let admin: string;
  let examiner: string;
  let student: string;
  let otherAdmin: string;
  let ellis: string; // the demo student, in a class Idris teaches
  let diploma: string; // a student only Tomasz teaches

  beforeAll(async () => {
    t = await createTestApp();
    teacher = await signIn(t, 'teacher@demo.example');
    otherTeacher = await signIn(t, 'tomasz.whitcombe@demo.example');
    admin = await signIn(t, 'admin@demo.example');
    examiner = await signIn(t, 'examiner@demo.example');
    student = await signIn(t, 'student@demo.example');
    otherAdmin = await signIn(t, 'admin@fernhill.example');
    const ids = (await t.db.query(
      `SELECT pupil_number, id FROM students WHERE pupil_number IN ('KL1021', 'KL1031')`,
    )) as { pupil_number: string; id: string }[];
    ellis = ids.find((r) => r.pupil_number === 'KL1021')!.id;
    diploma = ids.find((r) => r.pupil_number === 'KL1031')!.id;
  });
  afterAll(() => t.close());

  it('a teacher records a fingering; a change is a new revision and the old one stays as history', async () => {
    const first = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send(body());
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({
      kind: 'scale',
      key: 'C',
      mode: 'major',
      hand: 'RH',
      inversion: null,
      digits: cMajorRhUp,
      revision: 1,
      history: [],
      setBy: { displayName: 'Idris Calloway' },
    });

    const changed = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send({ ...body(cMajorRhUpDown), direction: 'up_down', note: 'Thumb under on F both ways.' });
    expect(changed.status).toBe(201);
    expect(changed.body).toMatchObject({
      revision: 2,
      direction: 'up_down',
      digits: cMajorRhUpDown,
      note: 'Thumb under on F both ways.',
    });
    expect(changed.body.history).toHaveLength(1);
    expect(changed.body.history[0]).toMatchObject({ revision: 1, digits: cMajorRhUp });

    // The same fingering again is not a change: no new revision.
    const same = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(admin))
      .send({ ...body(cMajorRhUpDown), direction: 'up_down', note: 'Thumb under on F both ways.' });
    expect(same.body.revision).toBe(2);

    // Left hand, one octave up: 5-4-3-2-1-3-2-1 (common practice, from memory).
    await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send({ ...body([5, 4, 3, 2, 1, 3, 2, 1]), hand: 'LH' });

    const list = await t.http().get(`/api/students/${ellis}/fingerings`).set(auth(student));
    expect(list.status).toBe(200);
    expect(
      list.body.map((f: { hand: string; revision: number }) => `${f.hand}:${f.revision}`),
    ).toEqual(['LH:1', 'RH:2']);
  });

  it('refuses a fingering of the wrong length or with a non-finger, naming the field and position', async () => {
    const short = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send(body([1, 2, 3, 1, 2, 3, 4]));
    expect(short.status).toBe(400);
    expect(short.body.details).toEqual([
      { path: 'digits', message: 'Too few fingers: 7 given, 8 notes (missing from position 8).' },
    ]);
    expect(short.body.message).toBe(
      'digits: Too few fingers: 7 given, 8 notes (missing from position 8).',
    );

    const six = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send(body([1, 2, 3, 1, 2, 6, 4, 5]));
    expect(six.status).toBe(400);
    expect(six.body.details[0]).toEqual({
      path: 'digits.5',
      message: 'Position 6: "6" is not a finger; use 1 (thumb) to 5.',
    });

    const noMode = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send({ ...body(), mode: null });
    expect(noMode.body.details[0].path).toBe('mode');
    const passage = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send({ ...body(), kind: 'passage' });
    expect(passage.body.details[0].path).toBe('kind');
    const extra = await t
      .http()
      .post(`/api/students/${ellis}/fingerings`)
      .set(auth(teacher))
      .send({ ...body(), colour: 'red' });
    expect(extra.status).toBe(400);
    expect(extra.body.message).toMatch(/Unknown field\(s\): colour/);
  });

  it('only the student’s teachers and admins set it; the student reads their own; everyone else gets 404', async () => {
    // Tomasz does not teach Ellis; Idris does not teach the diploma student.
    expect(
      (
        await t
          .http()
          .post(`/api/students/${ellis}/fingerings`)
          .set(auth(otherTeacher))
          .send(body())
      ).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/students/${ellis}/fingerings`).set(auth(otherTeacher))).status,
    ).toBe(404);
    expect(
      (await t.http().post(`/api/students/${diploma}/fingerings`).set(auth(teacher)).send(body()))
        .status,
    ).toBe(404);
    expect(
      (
        await t
          .http()
          .post(`/api/students/${diploma}/fingerings`)
          .set(auth(otherTeacher))
          .send(body())
      ).status,
    ).toBe(201);
    expect(
      (
        await t
          .http()
          .post(`/api/students/${diploma}/fingerings`)
          .set(auth(admin))
          .send({ ...body(), key: 'G' })
      ).status,
    ).toBe(201);

    // Students and examiners never set fingerings; a student reads only their own.
    expect(
      (await t.http().post(`/api/students/${ellis}/fingerings`).set(auth(student)).send(body()))
        .status,
    ).toBe(403);
    expect(
      (await t.http().post(`/api/students/${ellis}/fingerings`).set(auth(examiner)).send(body()))
        .status,
    ).toBe(403);
    expect(
      (await t.http().get(`/api/students/${diploma}/fingerings`).set(auth(student))).status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/students/${ellis}/fingerings`).set(auth(examiner))).status,
    ).toBe(404);

    // Another organisation's admin: the student is not there.
    expect(
      (await t.http().get(`/api/students/${ellis}/fingerings`).set(auth(otherAdmin))).status,
    ).toBe(404);
    expect(
      (await t.http().post(`/api/students/${ellis}/fingerings`).set(auth(otherAdmin)).send(body()))
        .status,
    ).toBe(404);
    expect(
      (await t.http().get(`/api/students/not-a-uuid/fingerings`).set(auth(admin))).status,
    ).toBe(400);
  });
});
