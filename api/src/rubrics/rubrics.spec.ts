import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';

const auth = (token: string) => ({ Authorization: `Bearer ${token}` });

const descriptors = (max: number) => [
  { min: 0, max: Math.floor(max / 2), text: 'Not yet secure.' },
  { min: Math.floor(max / 2) + 1, max, text: 'Secure.' },
];
const criterion = (key: string, weight = 1, maxMark = 5) => ({
  key,
  label: key.replace('_', ' '),
  weight,
  maxMark,
  descriptors: descriptors(maxMark),
});
const body = (name = 'Scales check') => ({
  name,
  kinds: ['scale'],
  criteria: [
    criterion('note_accuracy', 3, 10),
    criterion('evenness', 2),
    criterion('freedom_from_tension', 1),
  ],
});

describe('rubrics', () => {
  let t: TestApp;
  let teacher: string;
  let admin: string;
  let examiner: string;
  let student: string;
  let otherAdmin: string;

  beforeAll(async () => {
    t = await createTestApp();
    teacher = await signIn(t, 'teacher@demo.example');
    admin = await signIn(t, 'admin@demo.example');
    examiner = await signIn(t, 'examiner@demo.example');
    student = await signIn(t, 'student@demo.example');
    otherAdmin = await signIn(t, 'admin@fernhill.example');
  });
  afterAll(() => t.close());

  it('creates a draft, publishes it, and an edit makes a new draft version while the old one stays', async () => {
    const created = await t.http().post('/api/rubrics').set(auth(teacher)).send(body());
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      version: 1,
      status: 'draft',
      name: 'Scales check',
      kinds: ['scale'],
      createdBy: { displayName: 'Idris Calloway' },
    });
    expect(created.body.criteria.map((c: { key: string }) => c.key)).toEqual([
      'note_accuracy',
      'evenness',
      'freedom_from_tension',
    ]);
    const v1 = created.body.id as string;
    const rubricId = created.body.rubricId as string;

    // A draft can be replaced in place.
    const edited = await t
      .http()
      .put(`/api/rubric-versions/${v1}`)
      .set(auth(teacher))
      .send({ ...body('Scales check (draft 2)'), criteria: body().criteria.slice(0, 2) });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ id: v1, version: 1, name: 'Scales check (draft 2)' });
    expect(edited.body.criteria).toHaveLength(2);

    const published = await t.http().post(`/api/rubric-versions/${v1}/publish`).set(auth(admin));
    expect(published.status).toBe(200);
    expect(published.body).toMatchObject({
      status: 'published',
      publishedBy: { displayName: 'Morwenna Tilley' },
    });

    // Published: immutable.
    const refused = await t
      .http()
      .put(`/api/rubric-versions/${v1}`)
      .set(auth(teacher))
      .send(body('Changed'));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/published and cannot change/);
    expect(
      (await t.http().post(`/api/rubric-versions/${v1}/publish`).set(auth(teacher))).status,
    ).toBe(409);

    // The edit becomes version 2, a draft; version 1 is unchanged.
    const v2 = await t
      .http()
      .post(`/api/rubrics/${rubricId}/versions`)
      .set(auth(teacher))
      .send(body('Scales check'));
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ rubricId, version: 2, status: 'draft' });
    expect(v2.body.criteria).toHaveLength(3);
    const again = await t.http().get(`/api/rubric-versions/${v1}`).set(auth(teacher));
    expect(again.body).toMatchObject({
      version: 1,
      status: 'published',
      name: 'Scales check (draft 2)',
    });
    expect(again.body.criteria).toHaveLength(2);

    // Only one draft at a time.
    const second = await t
      .http()
      .post(`/api/rubrics/${rubricId}/versions`)
      .set(auth(teacher))
      .send(body());
    expect(second.status).toBe(409);
    expect(second.body.message).toMatch(/still a draft/);

    const detail = await t.http().get(`/api/rubrics/${rubricId}`).set(auth(teacher));
    expect(detail.status).toBe(200);
    expect(
      detail.body.versions.map(
        (v: { version: number; status: string }) => `${v.version}:${v.status}`,
      ),
    ).toEqual(['2:draft', '1:published']);
    expect(detail.body).toMatchObject({
      latest: { version: 2 },
      published: { version: 1 },
      versionCount: 2,
    });

    // Examiners and students see the published version only; the draft is not there for them.
    const forExaminer = await t.http().get(`/api/rubrics/${rubricId}`).set(auth(examiner));
    expect(forExaminer.body.versions.map((v: { version: number }) => v.version)).toEqual([1]);
    expect(
      (await t.http().get(`/api/rubric-versions/${v2.body.id}`).set(auth(student))).status,
    ).toBe(404);
    expect((await t.http().get(`/api/rubric-versions/${v1}`).set(auth(student))).status).toBe(200);
  });

  it('refuses bad rubrics with 400 and a message naming the field', async () => {
    const cases: [object, string][] = [
      [{ ...body(), colour: 'red' }, '(body)'],
      [{ ...body(), criteria: [criterion('note_accuracy', 0)] }, 'criteria.0.weight'],
      [{ ...body(), criteria: [criterion('note_accuracy', -1)] }, 'criteria.0.weight'],
      [
        {
          ...body(),
          criteria: [
            {
              ...criterion('note_accuracy'),
              maxMark: 11,
              descriptors: [{ min: 0, max: 11, text: 'x' }],
            },
          ],
        },
        'criteria.0.maxMark',
      ],
      [{ ...body(), criteria: [criterion('a'), criterion('a')] }, 'criteria.1.key'],
      [{ ...body(), kinds: ['juggling'] }, 'kinds.0'],
    ];
    for (const [bad, path] of cases) {
      const res = await t.http().post('/api/rubrics').set(auth(teacher)).send(bad);
      expect(res.status, JSON.stringify(bad)).toBe(400);
      expect(res.body.details.map((d: { path: string }) => d.path)).toContain(path);
      expect(res.body.message).toContain(path === '(body)' ? 'Unknown field(s): colour' : path);
    }
  });

  it('examiners and students cannot edit (403); another organisation cannot see the rubric (404)', async () => {
    const created = await t.http().post('/api/rubrics').set(auth(admin)).send(body('Private'));
    const id = created.body.id as string;
    for (const token of [examiner, student]) {
      expect((await t.http().post('/api/rubrics').set(auth(token)).send(body())).status).toBe(403);
      expect(
        (await t.http().put(`/api/rubric-versions/${id}`).set(auth(token)).send(body())).status,
      ).toBe(403);
      expect(
        (await t.http().post(`/api/rubric-versions/${id}/publish`).set(auth(token))).status,
      ).toBe(403);
    }
    expect((await t.http().get(`/api/rubric-versions/${id}`).set(auth(otherAdmin))).status).toBe(
      404,
    );
    expect(
      (await t.http().get(`/api/rubrics/${created.body.rubricId}`).set(auth(otherAdmin))).status,
    ).toBe(404);
    expect(
      (await t.http().put(`/api/rubric-versions/${id}`).set(auth(otherAdmin)).send(body())).status,
    ).toBe(404);
    expect(
      (await t.http().post(`/api/rubric-versions/${id}/publish`).set(auth(otherAdmin))).status,
    ).toBe(404);
    const theirs = await t.http().get('/api/rubrics').set(auth(otherAdmin));
    expect(theirs.body.map((r: { name: string }) => r.name)).not.toContain('Private');
  });

  it('lists rubrics with filters; examiners see only rubrics with a published version', async () => {
    await t
      .http()
      .post('/api/rubrics')
      .set(auth(teacher))
      .send({ ...body('Arpeggio draft only'), kinds: ['arpeggio'] });
    const mine = await t.http().get('/api/rubrics?kind=arpeggio').set(auth(teacher));
    expect(mine.status).toBe(200);
    expect(mine.body.every((r: { kinds: string[] }) => r.kinds.includes('arpeggio'))).toBe(true);
    expect(mine.body.map((r: { name: string }) => r.name)).toContain('Arpeggio draft only');
    const drafts = await t.http().get('/api/rubrics?status=draft').set(auth(teacher));
    expect(
      drafts.body.every((r: { latest: { status: string } }) => r.latest.status === 'draft'),
    ).toBe(true);
    const forExaminer = await t.http().get('/api/rubrics').set(auth(examiner));
    expect(forExaminer.body.map((r: { name: string }) => r.name)).not.toContain(
      'Arpeggio draft only',
    );
    expect(
      forExaminer.body.every(
        (r: { published: unknown; latest: { status: string } }) =>
          r.published !== null && r.latest.status === 'published',
      ),
    ).toBe(true);
    expect((await t.http().get('/api/rubrics?kind=juggling').set(auth(teacher))).status).toBe(400);
  });

  it('exports a version as a file that imports back as a new draft rubric with the same content', async () => {
    const created = await t.http().post('/api/rubrics').set(auth(teacher)).send(body('Round trip'));
    const exported = await t
      .http()
      .get(`/api/rubric-versions/${created.body.id}/export`)
      .set(auth(teacher));
    expect(exported.status).toBe(200);
    expect(exported.headers['content-disposition']).toBe(
      'attachment; filename="round-trip-v1.rubric.json"',
    );
    expect(exported.body).toMatchObject({
      format: 'stavemark.rubric',
      formatVersion: 1,
      source: { version: 1, status: 'draft' },
      rubric: body('Round trip'),
    });

    const imported = await t
      .http()
      .post('/api/rubrics/import')
      .set(auth(teacher))
      .attach('file', Buffer.from(JSON.stringify(exported.body)), {
        filename: 'round-trip-v1.rubric.json',
        contentType: 'application/json',
      });
    expect(imported.status).toBe(201);
    expect(imported.body).toMatchObject({
      version: 1,
      status: 'draft',
      name: 'Round trip',
      kinds: ['scale'],
    });
    expect(imported.body.rubricId).not.toBe(created.body.rubricId);
    expect(imported.body.criteria).toEqual(created.body.criteria);
  });

  it('refuses import files that are not JSON, not a rubric, too large or missing, saying where and why', async () => {
    const upload = (content: Buffer | string, filename = 'r.json') =>
      t
        .http()
        .post('/api/rubrics/import')
        .set(auth(teacher))
        .attach('file', Buffer.from(content), { filename, contentType: 'application/json' });

    const notJson = await upload('{ "format": "stavemark.rubric",\n  "rubric": { name: 1 } }');
    expect(notJson.status).toBe(400);
    // Counted by hand: line 2 is `  "rubric": { name: 1 } }`; the unquoted name starts at column 15.
    expect(notJson.body.message).toMatch(/^The file is not valid JSON \(line 2, column 15\)/);

    const binary = await upload(Buffer.from([0xff, 0xfe, 0x00, 0xc3, 0x28]));
    expect(binary.status).toBe(400);
    expect(binary.body.message).toMatch(/not text \(UTF-8\)/);

    const file = {
      format: 'stavemark.rubric',
      formatVersion: 1,
      rubric: {
        ...body(),
        criteria: [criterion('note_accuracy'), { ...criterion('evenness'), weight: 0 }],
      },
    };
    const badWeight = await upload(JSON.stringify(file));
    expect(badWeight.status).toBe(400);
    expect(badWeight.body.message).toBe(
      'The file is not a valid rubric: rubric.criteria.1.weight: Weight must be greater than 0.',
    );
    expect(badWeight.body.details).toEqual([
      { path: 'rubric.criteria.1.weight', message: 'Weight must be greater than 0.' },
    ]);

    const wrongFormat = await upload(JSON.stringify({ ...file, format: 'something.else' }));
    expect(wrongFormat.status).toBe(400);
    expect(wrongFormat.body.details.map((d: { path: string }) => d.path)).toContain('format');

    const tooBig = await upload(Buffer.alloc(256 * 1024 + 1, 0x20));
    expect(tooBig.status).toBe(413);
    expect(tooBig.body).toMatchObject({ statusCode: 413, error: 'Payload Too Large' });

    const none = await t.http().post('/api/rubrics/import').set(auth(teacher)).send({});
    expect(none.status).toBe(400);
    expect(none.body.details).toEqual([{ path: 'file', message: 'missing' }]);

    expect((await upload(JSON.stringify(file)).set(auth(examiner))).status).toBe(403);
  });

  it('records each change in the audit log', async () => {
    const created = await t.http().post('/api/rubrics').set(auth(teacher)).send(body('Audited'));
    await t.http().post(`/api/rubric-versions/${created.body.id}/publish`).set(auth(teacher));
    const rows = (await t.db.query(
      `SELECT action FROM audit_events WHERE entity_id = $1 ORDER BY at, action`,
      [created.body.id],
    )) as { action: string }[];
    expect(rows.map((r) => r.action).sort()).toEqual(['rubric.created', 'rubric.published']);
  });
});
