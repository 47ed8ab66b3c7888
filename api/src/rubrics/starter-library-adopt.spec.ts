import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { readStarterLibrary } from './starter-library.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });
interface Item {
  key: string;
  name: string;
  adopted: { id: string; name: string } | null;
}

describe('adding from the starter library', () => {
  let t: TestApp;
  let fernhill: string; // another school: nothing of the library yet
  let teacher: string; // the demo school: the seed gave it everything
  let examiner: string;
  let student: string;
  const library = readStarterLibrary();

  beforeAll(async () => {
    t = await createTestApp();
    fernhill = await signIn(t, 'admin@fernhill.example');
    teacher = await signIn(t, 'teacher@demo.example');
    examiner = await signIn(t, 'examiner@demo.example');
    student = await signIn(t, 'student@demo.example');
  });
  afterAll(() => t.close());

  const catalogue = async (token: string) => {
    const res = await t.http().get('/api/starter-library').set(auth(token));
    expect(res.status).toBe(200);
    return res.body as { rubrics: Item[]; requirementLists: (Item & { rubricKeys: string[] })[] };
  };

  it('lists every starter entry, with what each school already has', async () => {
    const other = await catalogue(fernhill);
    expect(other.rubrics.map((r) => r.key)).toEqual(library.rubrics.map((r) => r.key));
    expect(other.requirementLists.map((l) => l.key)).toEqual(['grade-1', 'grade-3', 'grade-5']);
    expect([...other.rubrics, ...other.requirementLists].every((i) => i.adopted === null)).toBe(
      true,
    );
    expect(other.requirementLists[0]).toMatchObject({
      name: 'Grade 1 technique',
      grade: '1',
      rubricKeys: ['scales', 'arpeggios'],
    });

    const demo = await catalogue(teacher);
    const scales = demo.rubrics.find((r) => r.key === 'scales')!;
    expect(scales.adopted?.name).toBe('Scales and chromatic scales');
    const mine = await t.http().get('/api/rubrics').set(auth(teacher));
    expect(mine.body.find((r: { starterKey: string }) => r.starterKey === 'scales').id).toBe(
      scales.adopted?.id,
    );
  });

  it('adds a list as published version 1, with the starter rubrics it is marked with', async () => {
    const res = await t
      .http()
      .post('/api/starter-library/requirement-lists')
      .set(auth(fernhill))
      .send({ key: 'grade-1' });
    expect(res.status).toBe(201);
    expect(res.body.version).toMatchObject({
      name: 'Grade 1 technique',
      grade: '1',
      version: 1,
      status: 'published',
      publishedBy: { displayName: expect.any(String) },
    });
    const file = library.lists.find((l) => l.key === 'grade-1')!;
    expect(res.body.version.lines).toHaveLength(file.body.lines.length);
    expect(res.body.rubricsAdded.map((r: { name: string }) => r.name)).toEqual([
      'Scales and chromatic scales',
      'Arpeggios and seventh chords',
    ]);
    // Every line is marked with this school's own, published copy of the rubric.
    const rubrics = await t.http().get('/api/rubrics').set(auth(fernhill));
    const publishedIds = rubrics.body.map((r: { published: { id: string } }) => r.published.id);
    for (const line of res.body.version.lines) {
      expect(publishedIds).toContain(line.rubricVersionId);
      expect(line.rubric.status).toBe('published');
    }
    // The list can be drawn from and used: the API's own list route shows it.
    const lists = await t.http().get('/api/requirement-lists').set(auth(fernhill));
    expect(lists.body.map((l: { starterKey: string }) => l.starterKey)).toEqual(['grade-1']);
  });

  it('refuses the same entry twice, saying where it already is', async () => {
    const again = await t
      .http()
      .post('/api/starter-library/requirement-lists')
      .set(auth(fernhill))
      .send({ key: 'grade-1' });
    expect(again.status).toBe(409);
    expect(again.body.message).toBe(
      '"Grade 1 technique" from the starter library is already in your school; open it on the Requirement lists page (edit it there to make a new version).',
    );
    expect(again.body.details[0].path).toBe('key');

    // Added with the list, so not again on its own.
    const scales = await t
      .http()
      .post('/api/starter-library/rubrics')
      .set(auth(fernhill))
      .send({ key: 'scales' });
    expect(scales.status).toBe(409);
    expect(scales.body.message).toMatch(/already in your school; open it on the Rubrics page/);

    // The demo school was given everything by the seed.
    const demo = await t
      .http()
      .post('/api/starter-library/rubrics')
      .set(auth(teacher))
      .send({ key: 'passages' });
    expect(demo.status).toBe(409);
  });

  it('adds a single rubric, and a later list reuses it rather than adding another', async () => {
    const res = await t
      .http()
      .post('/api/starter-library/rubrics')
      .set(auth(fernhill))
      .send({ key: 'broken-chords' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Broken chords', version: 1, status: 'published' });
    const file = library.rubrics.find((r) => r.key === 'broken-chords')!;
    expect(res.body.criteria.map((c: { key: string }) => c.key)).toEqual(
      file.file.rubric.criteria.map((c) => c.key),
    );

    const grade3 = await t
      .http()
      .post('/api/starter-library/requirement-lists')
      .set(auth(fernhill))
      .send({ key: 'grade-3' });
    expect(grade3.status).toBe(201);
    expect(grade3.body.rubricsAdded).toEqual([]);
    const brokenLine = grade3.body.version.lines.find(
      (l: { kind: string }) => l.kind === 'broken_chord',
    );
    expect(brokenLine.rubricVersionId).toBe(res.body.id);

    const after = await catalogue(fernhill);
    expect(
      after.rubrics
        .filter((r) => r.adopted)
        .map((r) => r.key)
        .sort(),
    ).toEqual(['arpeggios', 'broken-chords', 'scales']);
  });

  it('refuses a list whose rubric the school has changed so that it no longer fits', async () => {
    // Fernhill's arpeggio rubric, edited to cover arpeggios only and published as version 2.
    const rubrics = await t.http().get('/api/rubrics').set(auth(fernhill));
    const arpeggios = rubrics.body.find(
      (r: { starterKey: string }) => r.starterKey === 'arpeggios',
    );
    const v1 = await t
      .http()
      .get(`/api/rubric-versions/${arpeggios.published.id}`)
      .set(auth(fernhill));
    const v2 = await t
      .http()
      .post(`/api/rubrics/${arpeggios.id}/versions`)
      .set(auth(fernhill))
      .send({ name: v1.body.name, kinds: ['arpeggio'], criteria: v1.body.criteria });
    expect(v2.status).toBe(201);
    expect(
      (await t.http().post(`/api/rubric-versions/${v2.body.id}/publish`).set(auth(fernhill)))
        .status,
    ).toBe(200);

    const grade5 = await t
      .http()
      .post('/api/starter-library/requirement-lists')
      .set(auth(fernhill))
      .send({ key: 'grade-5' });
    expect(grade5.status).toBe(409);
    expect(grade5.body.message).toBe(
      'Your school\'s "Arpeggios and seventh chords" (version 2) is no longer for dominant seventh, diminished seventh requests, which "Grade 5 technique" marks with it.',
    );
    // Nothing of it was kept: not the list, not the passages rubric it would have added.
    const after = await catalogue(fernhill);
    expect(after.requirementLists.find((l) => l.key === 'grade-5')!.adopted).toBeNull();
    expect(after.rubrics.find((r) => r.key === 'passages')!.adopted).toBeNull();
  });

  it('says which keys exist when the key is unknown, and refuses unknown fields', async () => {
    const unknown = await t
      .http()
      .post('/api/starter-library/rubrics')
      .set(auth(fernhill))
      .send({ key: 'sight-reading' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toBe(
      'key: the starter library has no rubric "sight-reading"; it has "arpeggios", "broken-chords", "passages", "scales".',
    );
    const empty = await t
      .http()
      .post('/api/starter-library/requirement-lists')
      .set(auth(fernhill))
      .send({ key: '  ' });
    expect(empty.status).toBe(400);
    expect(empty.body.details[0]).toEqual({
      path: 'key',
      message: 'Name the starter entry to add by its key, e.g. "scales".',
    });
    const extra = await t
      .http()
      .post('/api/starter-library/rubrics')
      .set(auth(fernhill))
      .send({ key: 'passages', publish: false });
    expect(extra.status).toBe(400);
    expect(extra.body.message).toMatch(/Unknown field\(s\): publish/);
  });

  it('is for teachers and admins only', async () => {
    for (const token of [examiner, student]) {
      expect((await t.http().get('/api/starter-library').set(auth(token))).status).toBe(403);
      expect(
        (
          await t
            .http()
            .post('/api/starter-library/rubrics')
            .set(auth(token))
            .send({ key: 'passages' })
        ).status,
      ).toBe(403);
    }
  });

  it('records each addition in the audit log', async () => {
    const rows = (await t.db.query(
      `SELECT action, after->>'starterKey' AS key FROM audit_events WHERE action LIKE '%adopted_from_starter' ORDER BY at, action`,
    )) as { action: string; key: string }[];
    expect(rows.map((r) => `${r.action}:${r.key}`).sort()).toEqual(
      [
        'requirement_list.adopted_from_starter:grade-1',
        'requirement_list.adopted_from_starter:grade-3',
        'rubric.adopted_from_starter:arpeggios',
        'rubric.adopted_from_starter:broken-chords',
        'rubric.adopted_from_starter:scales',
      ].sort(),
    );
  });
});
