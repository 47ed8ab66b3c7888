import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RequirementListsService } from './requirement-lists.service.js';
import { RequestContext } from '../common/request-context.js';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
const criteria = [
  {
    key: 'note_accuracy',
    label: 'Note accuracy',
    weight: 1,
    maxMark: 5,
    descriptors: [{ min: 0, max: 5, text: 'As heard.' }],
  },
];

describe('requirement lists', () => {
  let t: TestApp;
  let teacher: string;
  let examiner: string;
  let student: string;
  let otherAdmin: string;
  let scalesV: string;
  let arpsV: string;
  let draftRubricV: string;

  const scaleLine = () => ({
    kind: 'scale',
    keys: ['D', 'Bb', 'eb'],
    modes: ['major', 'harmonic_minor'],
    hands: ['HT'],
    motions: ['similar'],
    octaves: [2],
    articulations: ['legato'],
    dynamics: [],
    inversions: [],
    tempo: { bpm: 80, beatUnit: 'quarter', notesPerBeat: 4 },
    rubricVersionId: scalesV,
    difficultyWeight: 1,
  });
  const arpLine = () => ({
    kind: 'arpeggio',
    keys: ['C', 'G'],
    modes: ['major'],
    hands: ['RH', 'LH'],
    motions: [],
    octaves: [2],
    articulations: ['legato'],
    dynamics: [],
    inversions: ['root'],
    tempo: { bpm: 60, beatUnit: 'quarter', notesPerBeat: 2 },
    rubricVersionId: arpsV,
    difficultyWeight: 2,
  });
  const list = (name = 'Grade 3 technique') => ({
    name,
    grade: '3',
    totalMarks: 21,
    selectionRule: { count: 3, minPerKind: { scale: 1, arpeggio: 1 } },
    lines: [scaleLine(), arpLine()],
  });

  beforeAll(async () => {
    t = await createTestApp();
    teacher = await signIn(t, 'teacher@demo.example');
    examiner = await signIn(t, 'examiner@demo.example');
    student = await signIn(t, 'student@demo.example');
    otherAdmin = await signIn(t, 'admin@fernhill.example');
    const rubric = async (kinds: string[], publish: boolean) => {
      const r = await t
        .http()
        .post('/api/rubrics')
        .set(auth(teacher))
        .send({ name: `For ${kinds.join(' and ')}`, kinds, criteria });
      if (publish)
        await t.http().post(`/api/rubric-versions/${r.body.id}/publish`).set(auth(teacher));
      return r.body.id as string;
    };
    scalesV = await rubric(['scale'], true);
    arpsV = await rubric(['arpeggio'], true);
    draftRubricV = await rubric(['scale'], false);
  });
  afterAll(() => t.close());

  it('creates a draft list with template lines, publishes it, and an edit makes version 2 leaving version 1 as it was', async () => {
    const created = await t.http().post('/api/requirement-lists').set(auth(teacher)).send(list());
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      version: 1,
      status: 'draft',
      grade: '3',
      totalMarks: 21,
      usedAt: null,
    });
    const [scale, arp] = created.body.lines;
    // Key names are normalised by the music-theory library: "eb" → "Eb".
    expect(scale).toMatchObject({
      kind: 'scale',
      keys: ['D', 'Bb', 'Eb'],
      tempo: { bpm: 80, beatUnit: 'quarter', notesPerBeat: 4 },
      rubric: { id: scalesV, version: 1, status: 'published' },
    });
    expect(arp).toMatchObject({
      kind: 'arpeggio',
      hands: ['RH', 'LH'],
      inversions: ['root'],
      difficultyWeight: 2,
    });
    const v1 = created.body.id as string;

    const published = await t
      .http()
      .post(`/api/requirement-list-versions/${v1}/publish`)
      .set(auth(teacher));
    expect(published.status).toBe(200);
    expect(published.body.status).toBe('published');

    const refused = await t
      .http()
      .put(`/api/requirement-list-versions/${v1}`)
      .set(auth(teacher))
      .send(list('Changed'));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/published and cannot change/);

    const v2 = await t
      .http()
      .post(`/api/requirement-lists/${created.body.listId}/versions`)
      .set(auth(teacher))
      .send({ ...list(), totalMarks: 30 });
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ version: 2, status: 'draft', totalMarks: 30 });
    const old = await t.http().get(`/api/requirement-list-versions/${v1}`).set(auth(teacher));
    expect(old.body).toMatchObject({ version: 1, totalMarks: 21, status: 'published' });

    const detail = await t
      .http()
      .get(`/api/requirement-lists/${created.body.listId}`)
      .set(auth(examiner));
    expect(detail.body.versions.map((v: { version: number }) => v.version)).toEqual([1]);
    expect(
      (await t.http().get(`/api/requirement-list-versions/${v2.body.id}`).set(auth(student)))
        .status,
    ).toBe(404);
  });

  it('refuses bad lines with 400 naming the field', async () => {
    const cases: [object, string][] = [
      [
        {
          ...list(),
          lines: [
            {
              ...scaleLine(),
              tempo: { bpm: 80, beatUnit: 'quarter', notesPerBeat: 4, swing: true },
            },
          ],
        },
        'lines.0.tempo',
      ],
      [
        { ...list(), lines: [{ ...scaleLine(), difficultyWeight: 0 }, arpLine()] },
        'lines.0.difficultyWeight',
      ],
      [{ ...list(), lines: [{ ...scaleLine(), keys: ['H'] }, arpLine()] }, 'lines.0.keys.0'],
      [{ ...list(), lines: [{ ...scaleLine(), modes: [] }, arpLine()] }, 'lines.0.modes'],
      [
        { ...list(), selectionRule: { count: 1, minPerKind: { scale: 1, arpeggio: 1 } } },
        'selectionRule.minPerKind',
      ],
      [
        { ...list(), lines: [scaleLine(), { ...arpLine(), rubricVersionId: scalesV }] },
        'lines.1.rubricVersionId',
      ],
      [
        {
          ...list(),
          lines: [
            { ...scaleLine(), rubricVersionId: '8d1f4f39-4f5f-4a8e-9a55-2b9f7c0e0e01' },
            arpLine(),
          ],
        },
        'lines.0.rubricVersionId',
      ],
      [
        { ...list(), lines: [{ ...scaleLine(), rubricVersionId: 'not-a-uuid' }, arpLine()] },
        'lines.0.rubricVersionId',
      ],
    ];
    for (const [bad, path] of cases) {
      const res = await t.http().post('/api/requirement-lists').set(auth(teacher)).send(bad);
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.details.map((d: { path: string }) => d.path)).toContain(path);
    }
  });

  it('publishing needs published rubric versions and a rule the lines can honour (409, naming the field)', async () => {
    const withDraftRubric = await t
      .http()
      .post('/api/requirement-lists')
      .set(auth(teacher))
      .send({ ...list(), lines: [{ ...scaleLine(), rubricVersionId: draftRubricV }, arpLine()] });
    expect(withDraftRubric.status).toBe(201);
    const r1 = await t
      .http()
      .post(`/api/requirement-list-versions/${withDraftRubric.body.id}/publish`)
      .set(auth(teacher));
    expect(r1.status).toBe(409);
    expect(r1.body.details).toEqual([
      { path: 'lines.0.rubricVersionId', message: expect.stringMatching(/still a draft/) },
    ]);

    // The arpeggio line gives 4 different requests (C or G major × RH or LH, root position): 5 cannot be drawn.
    const tooMany = await t
      .http()
      .post('/api/requirement-lists')
      .set(auth(teacher))
      .send({ ...list(), selectionRule: { count: 6, minPerKind: { arpeggio: 5 } } });
    const r2 = await t
      .http()
      .post(`/api/requirement-list-versions/${tooMany.body.id}/publish`)
      .set(auth(teacher));
    expect(r2.status).toBe(409);
    expect(r2.body.details[0].path).toBe('selectionRule');
    expect(r2.body.message).toMatch(/at least 5 arpeggio request\(s\), but the list offers only 4/);
  });

  it('examiners and students cannot edit (403); another organisation gets 404', async () => {
    const created = await t
      .http()
      .post('/api/requirement-lists')
      .set(auth(teacher))
      .send(list('Grade 3, term 2'));
    for (const token of [examiner, student]) {
      expect(
        (await t.http().post('/api/requirement-lists').set(auth(token)).send(list())).status,
      ).toBe(403);
      expect(
        (
          await t
            .http()
            .put(`/api/requirement-list-versions/${created.body.id}`)
            .set(auth(token))
            .send(list())
        ).status,
      ).toBe(403);
    }
    expect(
      (
        await t
          .http()
          .get(`/api/requirement-list-versions/${created.body.id}`)
          .set(auth(otherAdmin))
      ).status,
    ).toBe(404);
    expect(
      (
        await t
          .http()
          .put(`/api/requirement-list-versions/${created.body.id}`)
          .set(auth(otherAdmin))
          .send(list())
      ).status,
    ).toBe(404);
    // Their own list cannot use our rubric version either: it is not there for them.
    const theirs = await t.http().post('/api/requirement-lists').set(auth(otherAdmin)).send(list());
    expect(theirs.status).toBe(400);
    expect(theirs.body.details[0]).toEqual({
      path: 'lines.0.rubricVersionId',
      message: 'No such rubric version.',
    });
  });

  it('lists by grade; a version used by a sitting can never change', async () => {
    const created = await t
      .http()
      .post('/api/requirement-lists')
      .set(auth(teacher))
      .send({ ...list('Grade 7 technique'), grade: '7' });
    const id = created.body.id as string;
    await t.http().post(`/api/requirement-list-versions/${id}/publish`).set(auth(teacher));
    const byGrade = await t.http().get('/api/requirement-lists?grade=7').set(auth(teacher));
    expect(byGrade.body.map((l: { name: string }) => l.name)).toContain('Grade 7 technique');
    expect(byGrade.body.every((l: { grade: string }) => l.grade === '7')).toBe(true);

    // The hook sittings will call when they pin a version.
    const service = t.app.get(RequirementListsService);
    const org = (
      await t.db.query(`SELECT organisation_id FROM requirement_list_versions WHERE id = $1`, [id])
    )[0].organisation_id as string;
    await RequestContext.runAs(
      {
        personId: '',
        membershipId: '',
        organisationId: org,
        roles: ['admin'],
        timeZone: 'Europe/London',
      },
      () => t.db.transaction((em) => service.markUsed(id, em)),
    );
    const used = await t.http().get(`/api/requirement-list-versions/${id}`).set(auth(teacher));
    expect(used.body.usedAt).not.toBeNull();
    const refused = await t
      .http()
      .put(`/api/requirement-list-versions/${id}`)
      .set(auth(teacher))
      .send(list());
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/used by a sitting/);
  });
});
