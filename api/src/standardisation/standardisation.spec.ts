import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DeviationHistory, ExerciseMark, ExerciseSummary, ExerciseView } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { binary, textFile, wavFile } from '../../test/support/media-fixtures.js';
import { DEMO_EXERCISE_TITLE } from '../seed/demo-standardisation.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

describe('standardisation', () => {
  let t: TestApp;
  const tok: Record<string, string> = {};
  let demo: ExerciseSummary;
  let criteria: { key: string; maxMark: number }[];

  beforeAll(async () => {
    t = await createTestApp({ today: '2026-12-01' });
    for (const [k, email] of Object.entries({
      admin: 'admin@demo.example',
      teacher: 'teacher@demo.example',
      priya: 'examiner@demo.example',
      beatrix: 'beatrix.oduya@demo.example',
      student: 'student@demo.example',
      otherOrg: 'admin@fernhill.example',
    }))
      tok[k] = await signIn(t, email);
    const list = await t.http().get('/api/standardisation/exercises').set(auth(tok.priya!));
    expect(list.status).toBe(200);
    demo = (list.body as ExerciseSummary[]).find((e) => e.title === DEMO_EXERCISE_TITLE)!;
    expect(demo).toMatchObject({ status: 'published', submittedAttempts: 2, myAttempt: null, canManage: false });
  });
  afterAll(() => t.close());

  const get = (id: string, who: string) => t.http().get(`/api/standardisation/exercises/${id}`).set(auth(tok[who]!));
  const put = (id: string, who: string, marks: ExerciseMark[]) => t.http().put(`/api/standardisation/exercises/${id}/attempt`).set(auth(tok[who]!)).send({ marks });
  const submit = (id: string, who: string, marks: ExerciseMark[]) => t.http().post(`/api/standardisation/exercises/${id}/attempt/submit`).set(auth(tok[who]!)).send({ marks });

  it('blind: before submitting, an examiner gets no reference marks, no other examiner’s marks and no agreement', async () => {
    const res = await get(demo.id, 'priya');
    expect(res.status).toBe(200);
    const v = res.body as ExerciseView;
    criteria = v.rubric.criteria;
    expect(criteria.length).toBe(7);
    expect(v).toMatchObject({ canAttempt: true, canManage: false, referenceMarks: null, othersMarks: null, agreement: null, attempts: null, myDeviation: null, myAttempt: null });
    // Nothing of the reference travels in the answer under another name either.
    expect(res.text).not.toMatch(/"mark":/);

    // A draft with a mark above the maximum is refused, naming the cell; a good draft is kept, still blind.
    const bad = await put(demo.id, 'priya', [{ request: 0, criterion: 'tempo_control', mark: 9 }]);
    expect(bad.status).toBe(400);
    expect(bad.body.details).toEqual([{ path: 'marks.0.mark', message: 'Request 1, Tempo control: 9 is above the maximum of 5.' }]);
    const draft = await put(demo.id, 'priya', [{ request: 0, criterion: 'note_accuracy', mark: 9 }]);
    expect(draft.status).toBe(200);
    expect(draft.body).toMatchObject({ referenceMarks: null, othersMarks: null, agreement: null, myAttempt: { status: 'draft' } });
    expect((draft.body as ExerciseView).myAttempt!.marks).toEqual([{ request: 0, criterion: 'note_accuracy', mark: 9 }]);

    // Submitting with marks missing: 400 listing each, and still nothing revealed.
    const incomplete = await submit(demo.id, 'priya', [{ request: 0, criterion: 'note_accuracy', mark: 9 }]);
    expect(incomplete.status).toBe(400);
    expect(incomplete.body.details).toHaveLength(6);
    expect(incomplete.body.message).toMatch(/6 mark\(s\) missing/);
    expect((await get(demo.id, 'priya')).body).toMatchObject({ referenceMarks: null, othersMarks: null });
  });

  it('the demo’s synthesised recording plays through a short-lived signed address, in ranges', async () => {
    const v = (await get(demo.id, 'priya')).body as ExerciseView;
    expect(v.recording?.contentType).toBe('audio/wav');
    expect(v.recording!.durationSeconds!).toBeGreaterThan(5);
    const signed = await t.http().get(`/api/standardisation/exercises/${demo.id}/recording-url`).set(auth(tok.priya!));
    expect(signed.status).toBe(200);
    expect(signed.body.url).toMatch(/^\/api\/media\//);
    const whole = await t.http().get(signed.body.url).buffer(true).parse(binary);
    expect(whole.status).toBe(200);
    expect(whole.headers['content-type']).toMatch(/audio\/wav/);
    expect((whole.body as Buffer).subarray(0, 4).toString('latin1')).toBe('RIFF');
    expect((whole.body as Buffer).length).toBe(v.recording!.bytes);
    const part = await t.http().get(signed.body.url).set('Range', 'bytes=8-11').buffer(true).parse(binary);
    expect(part.status).toBe(206);
    expect((part.body as Buffer).toString('latin1')).toBe('WAVE');
    // Another organisation cannot ask for an address at all.
    expect((await t.http().get(`/api/standardisation/exercises/${demo.id}/recording-url`).set(auth(tok.otherOrg!))).status).toBe(404);
  });

  it('after submitting: the reference, the deviation per criterion, everyone’s marks without names, and alpha across the three examiners', async () => {
    // Priya marks 1 below the reference on every criterion she can (0 stays 0).
    const reference: Record<string, number> = { note_accuracy: 10, fingering_consistency: 5, grouping: 3, motion_economy: 3, freedom_from_tension: 4, evenness: 6, tempo_control: 3 };
    const marks = criteria.map((c) => ({ request: 0, criterion: c.key, mark: reference[c.key]! - 1 }));
    const res = await submit(demo.id, 'priya', marks);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const v = res.body as ExerciseView;
    expect(v.referenceMarks).toHaveLength(7);
    expect(v.myDeviation!.criteria.every((c) => c.meanDifference === -1)).toBe(true);
    // −1 on a 10-mark criterion is −10 %, on a 5-mark one −20 %: (2·10 + 5·20)/7 = 17.14 points.
    expect(v.myDeviation!.meanDifferencePercent).toBeCloseTo(-120 / 7, 10);
    expect(v.myDeviation!.exactShare).toBe(0);
    expect(v.othersMarks!.find((c) => c.criterion === 'evenness')!.marks).toEqual([5, 7, 8]);
    expect(v.agreement).toMatchObject({ examiners: 3, units: 7, level: 'ordinal' });
    expect(typeof v.agreement!.alpha).toBe('number');
    expect(v.agreement!.interpretation!.source).toMatch(/Krippendorff, K. \(2004\)/);
    expect(v.attempts).toBeNull();
    // Fixed now.
    expect((await put(demo.id, 'priya', marks)).status).toBe(409);
    expect((await submit(demo.id, 'priya', marks)).status).toBe(409);

    const history = (await t.http().get('/api/standardisation/deviations').set(auth(tok.priya!))).body as DeviationHistory;
    expect(history.examiner.name).toBe('Priya Halvorsen');
    expect(history.points).toHaveLength(1);
    expect(history.points[0]!.meanAbsoluteDifferencePercent).toBeCloseTo(120 / 7, 10);
    expect(history.criteria).toHaveLength(7);
  });

  it('managers see every attempt; an exercise is written as a draft, published only with every reference mark, then fixed', async () => {
    const admin = (await get(demo.id, 'admin')).body as ExerciseView;
    expect(admin.canAttempt).toBe(false);
    expect(admin.attempts!.map((a) => a.examiner.name).sort()).toEqual(['Beatrix Oduya', 'Ottilie Brandt', 'Priya Halvorsen']);
    // Beatrix differs from the reference on evenness only (+1 of 10).
    const beatrix = admin.attempts!.find((a) => a.examiner.name === 'Beatrix Oduya')!;
    expect(beatrix.deviation!.exactShare).toBeCloseTo(6 / 7, 12);

    const [rubric] = (await t.db.query(
      `SELECT v.id FROM rubric_versions v JOIN rubrics r ON r.id = v.rubric_id WHERE r.starter_key = 'arpeggios' AND v.status = 'published' AND r.organisation_id = (SELECT organisation_id FROM memberships m JOIN people p ON p.id = m.person_id WHERE p.email = 'teacher@demo.example')`,
    )) as { id: string }[];
    const created = await t.http().post('/api/standardisation/exercises').set(auth(tok.teacher!)).send({
      title: 'G major arpeggio',
      rubricVersionId: rubric!.id,
      requests: [{ title: 'G major arpeggio', details: 'hands together, two octaves' }],
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const ex = created.body as ExerciseView;
    expect(ex.status).toBe('draft');
    // Unknown fields and a rubric of nowhere are refused with their paths.
    const unknown = await t.http().post('/api/standardisation/exercises').set(auth(tok.teacher!)).send({ title: 'x', rubricVersionId: randomUUID(), requests: [{ title: 'x' }] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.details).toEqual([{ path: 'rubricVersionId', message: 'not a published rubric version' }]);
    // Another teacher (who also examines) does not see the draft; another organisation never.
    expect((await get(ex.id, 'beatrix')).status).toBe(404);
    expect((await get(ex.id, 'otherOrg')).status).toBe(404);
    expect((await t.http().patch(`/api/standardisation/exercises/${ex.id}`).set(auth(tok.beatrix!)).send({ title: 'Mine' })).status).toBe(404);
    // Publishing without reference marks or a recording: every missing thing listed.
    const early = await t.http().post(`/api/standardisation/exercises/${ex.id}/publish`).set(auth(tok.teacher!));
    expect(early.status).toBe(400);
    expect(early.body.details.length).toBe(ex.rubric.criteria.length + 1);
    expect(early.body.details.at(-1)).toEqual({ path: 'recording', message: 'Attach the reference recording: examiners mark what they hear.' });
    const ref = ex.rubric.criteria.map((c) => ({ request: 0, criterion: c.key, mark: Math.min(3, c.maxMark) }));
    expect((await t.http().patch(`/api/standardisation/exercises/${ex.id}`).set(auth(tok.teacher!)).send({ referenceMarks: ref })).status).toBe(200);
    // The recording: a text file named .wav is refused by its content; a WAV is kept with its length.
    const upload = (file: Buffer, name: string, who = 'teacher') => t.http().post(`/api/standardisation/exercises/${ex.id}/recording`).set(auth(tok[who]!)).attach('file', file, { filename: name });
    expect((await upload(textFile(), 'take.wav')).status).toBe(415);
    expect((await upload(wavFile({ seconds: 1 }), 'take.wav', 'beatrix')).status).toBe(404);
    const first = await upload(wavFile({ seconds: 1 }), 'first.wav');
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    const attached = await upload(wavFile({ seconds: 2 }), 'second.wav');
    // RIFF header arithmetic: 2 s × 8000 samples × 2 bytes / 16000 bytes per second.
    expect(attached.body.recording).toEqual({ contentType: 'audio/wav', bytes: 44 + 32000, durationSeconds: 2 });
    const published = await t.http().post(`/api/standardisation/exercises/${ex.id}/publish`).set(auth(tok.teacher!));
    expect(published.status).toBe(200);
    expect((await t.http().patch(`/api/standardisation/exercises/${ex.id}`).set(auth(tok.teacher!)).send({ title: 'Later' })).status).toBe(409);
    expect((await upload(wavFile({ seconds: 1 }), 'late.wav')).status).toBe(409);
    // Now Beatrix sees it, blind, and may mark it.
    expect((await get(ex.id, 'beatrix')).body).toMatchObject({ canAttempt: true, referenceMarks: null });
    // Roles: a teacher without the examiner role cannot attempt (403); students see nothing (403).
    expect((await put(ex.id, 'teacher', [])).status).toBe(403);
    expect((await t.http().get('/api/standardisation/exercises').set(auth(tok.student!))).status).toBe(403);
    expect((await t.http().get('/api/standardisation/exercises').set(auth(tok.otherOrg!))).body.map((e: ExerciseSummary) => e.id)).not.toContain(ex.id);
  });
});
