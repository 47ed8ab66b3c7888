import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drawRequests, itemDurationSeconds } from '@stavemark/shared';
import { createTestApp, signIn, type TestApp } from '../../test/support/test-app.js';
import { rubricFileJsonSchema } from './rubric-file.js';
import { readStarterLibrary, seedStarterLibrary, STARTER_DIR } from './starter-library.js';

describe('starter library files', () => {
  const library = readStarterLibrary();

  it('has rubrics for scales, arpeggios, broken chords and passages, and lists for grades 1, 3 and 5', () => {
    expect(library.rubrics.map((r) => r.key)).toEqual([
      'arpeggios',
      'broken-chords',
      'passages',
      'scales',
    ]);
    expect(library.lists.map((l) => l.body.grade)).toEqual(['1', '3', '5']);
    const kinds = library.rubrics.flatMap((r) => r.file.rubric.kinds);
    for (const k of [
      'scale',
      'chromatic',
      'arpeggio',
      'dominant_seventh',
      'diminished_seventh',
      'broken_chord',
      'passage',
    ])
      expect(kinds).toContain(k);
  });

  it('gives every criterion 4 to 6 level descriptors covering each mark from 0 to the maximum exactly once', () => {
    for (const { key, file } of library.rubrics) {
      for (const c of file.rubric.criteria) {
        expect(c.descriptors.length, `${key}.${c.key}`).toBeGreaterThanOrEqual(4);
        expect(c.descriptors.length, `${key}.${c.key}`).toBeLessThanOrEqual(6);
        const covered = c.descriptors
          .flatMap((d) => Array.from({ length: d.max - d.min + 1 }, (_, i) => d.min + i))
          .sort((a, b) => a - b);
        expect(covered, `${key}.${c.key}`).toEqual(
          Array.from({ length: c.maxMark + 1 }, (_, i) => i),
        );
      }
    }
  });

  it('assesses technique the same way across the technical rubrics', () => {
    for (const key of ['scales', 'arpeggios', 'broken-chords']) {
      const keys = library.rubrics
        .find((r) => r.key === key)!
        .file.rubric.criteria.map((c) => c.key);
      expect(keys).toEqual([
        'note_accuracy',
        'fingering_consistency',
        'grouping',
        'motion_economy',
        'freedom_from_tension',
        'evenness',
        'tempo_control',
      ]);
    }
    const passages = library.rubrics
      .find((r) => r.key === 'passages')!
      .file.rubric.criteria.map((c) => c.key);
    expect(passages).toContain('tone_and_dynamics');
  });

  it('every list can be drawn from with its own rule, and every line has a playing time', () => {
    for (const { key, body } of library.lists) {
      const lines = body.lines.map((l, i) => ({ ...l, id: `l${i}` }));
      const draw = drawRequests({ lines }, body.selectionRule, key);
      expect(draw.requests).toHaveLength(body.selectionRule.count);
      for (const r of draw.requests) expect(itemDurationSeconds(r)).toBeGreaterThan(0);
    }
  });
});

describe('seeding the starter library', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('puts published rubrics and lists into the demo school, and seeding again adds nothing', async () => {
    const teacher = await signIn(t, 'teacher@demo.example');
    const rubrics = await t.http().get('/api/rubrics').set('Authorization', `Bearer ${teacher}`);
    const starter = rubrics.body.filter(
      (r: { starterKey: string | null }) => r.starterKey !== null,
    );
    expect(starter.map((r: { name: string }) => r.name).sort()).toEqual([
      'Arpeggios and seventh chords',
      'Broken chords',
      'Passages and studies',
      'Scales and chromatic scales',
    ]);
    expect(
      starter.every(
        (r: { latest: { status: string; version: number } }) =>
          r.latest.status === 'published' && r.latest.version === 1,
      ),
    ).toBe(true);
    const lists = await t
      .http()
      .get('/api/requirement-lists')
      .set('Authorization', `Bearer ${teacher}`);
    expect(
      lists.body
        .filter((l: { starterKey: string | null }) => l.starterKey)
        .map((l: { grade: string }) => l.grade),
    ).toEqual(['1', '3', '5']);

    const org = (await t.db.query(`SELECT id FROM organisations WHERE slug = 'kestrel-lane'`))[0]
      .id as string;
    const count = async () =>
      (
        await t.db.query(
          `SELECT (SELECT count(*) FROM rubric_versions)::int AS r, (SELECT count(*) FROM requirement_lines)::int AS l`,
        )
      )[0];
    const before = await count();
    expect(await t.db.transaction((em) => seedStarterLibrary(em, org))).toEqual({
      rubrics: 0,
      lists: 0,
    });
    expect(await count()).toEqual(before);

    // The other organisation is not given the demo school's library.
    const fernhill = await signIn(t, 'admin@fernhill.example');
    expect(
      (await t.http().get('/api/rubrics').set('Authorization', `Bearer ${fernhill}`)).body,
    ).toEqual([]);
  });
});

describe('the documented rubric file schema', () => {
  it('rubrics/rubric-file.schema.json is the schema the import checks against', () => {
    const path = join(STARTER_DIR, 'rubric-file.schema.json');
    const generated = `${JSON.stringify(rubricFileJsonSchema(), null, 2)}\n`;
    // Regenerate after changing the rubric shapes: UPDATE_RUBRIC_SCHEMA=1 npx vitest run src/rubrics/starter-library.spec.ts
    if (process.env.UPDATE_RUBRIC_SCHEMA === '1') writeFileSync(path, generated);
    expect(readFileSync(path, 'utf8')).toBe(generated);
  });
});
