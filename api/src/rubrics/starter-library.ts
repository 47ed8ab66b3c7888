// The starter library (rubrics/ at the top of the repository): rubric files and requirement
// lists written for Stavemark, loaded into an organisation as published versions.
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import {
  drawRequests,
  requirementListVersionBodySchema,
  rubricFileSchema,
  type RequirementListVersionBody,
  type RubricFile,
} from '@stavemark/shared';
import { now } from '../common/clock.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { issuesToDetails } from '../common/validation.js';
import { RequirementLineRow } from '../requirement-lists/entities/requirement-line.entity.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { RequirementList } from '../requirement-lists/entities/requirement-list.entity.js';
import { toLineRows } from '../requirement-lists/requirement-lists.mapper.js';
import { RubricCriterionRow } from './entities/rubric-criterion.entity.js';
import { toCriterionRows } from './rubrics.mapper.js';
import { RubricVersion } from './entities/rubric-version.entity.js';
import { Rubric } from './entities/rubric.entity.js';

const here = dirname(fileURLToPath(import.meta.url));
/** Same depth from src/ and dist/: api/{src,dist}/rubrics → the repository root. */
export const STARTER_DIR = resolve(here, '../../../rubrics');

export const REQUIREMENT_LIST_FILE_FORMAT = 'stavemark.requirement-list';

/**
 * A starter requirement list: the list body, but each line names its rubric by the starter
 * file's key (`"rubric": "scales"`) instead of a rubric version id, which only exists once seeded.
 */
const starterListFileSchema = z.strictObject({
  format: z.literal(REQUIREMENT_LIST_FILE_FORMAT),
  formatVersion: z.literal(1),
  list: z.strictObject({
    name: z.string(),
    grade: z.string(),
    totalMarks: z.number(),
    selectionRule: z.unknown(),
    lines: z.array(z.looseObject({ rubric: z.string() })),
  }),
});

export interface StarterRubric {
  key: string;
  file: RubricFile;
}
export interface StarterList {
  key: string;
  /** Lines name rubrics by starter key, in `rubricVersionId`, until resolved. */
  body: RequirementListVersionBody;
}

function fail(file: string, error: z.ZodError): never {
  const d = issuesToDetails(error)
    .map((i) => `${i.path}: ${i.message}`)
    .join('; ');
  throw new Error(`Starter library: ${file} is not valid: ${d}`);
}

/** Reads and validates every starter file; a broken file stops the seed with its name and path. */
export function readStarterLibrary(dir = STARTER_DIR): {
  rubrics: StarterRubric[];
  lists: StarterList[];
} {
  const rubrics = readdirSync(dir)
    .filter((f) => f.endsWith('.rubric.json'))
    .sort()
    .map((f) => {
      const r = rubricFileSchema.safeParse(JSON.parse(readFileSync(join(dir, f), 'utf8')));
      if (!r.success) fail(f, r.error);
      return { key: f.replace(/\.rubric\.json$/, ''), file: r.data };
    });
  const listDir = join(dir, 'requirement-lists');
  const lists = readdirSync(listDir)
    .filter((f) => f.endsWith('.list.json'))
    .sort()
    .map((f) => {
      const raw = starterListFileSchema.safeParse(
        JSON.parse(readFileSync(join(listDir, f), 'utf8')),
      );
      if (!raw.success) fail(f, raw.error);
      const lines = raw.data.list.lines.map(({ rubric, ...line }) => {
        if (!rubrics.some((r) => r.key === rubric))
          throw new Error(
            `Starter library: ${f} names rubric "${rubric}", which has no ${rubric}.rubric.json`,
          );
        return { ...line, rubricVersionId: rubric };
      });
      const body = requirementListVersionBodySchema.safeParse({ ...raw.data.list, lines });
      if (!body.success) fail(f, body.error);
      return { key: f.replace(/\.list\.json$/, ''), body: body.data };
    });
  return { rubrics, lists };
}

/**
 * Loads the starter library into one organisation as published version 1 of each rubric and
 * list. Idempotent: an entry already there (by starter key) is left alone, edits included.
 */
export async function seedStarterLibrary(
  em: EntityManager,
  organisationId: string,
  dir = STARTER_DIR,
): Promise<{ rubrics: number; lists: number }> {
  const scoped = <T extends { id: string; organisationId: string }>(
    target: new () => T,
    what: string,
  ) => new ScopedRepository<T>(em.getRepository<T>(target), what, () => organisationId);
  const rubrics = scoped(Rubric, 'rubric');
  const versions = scoped(RubricVersion, 'rubric version');
  const lists = scoped(RequirementList, 'requirement list');
  const listVersions = scoped(RequirementListVersion, 'requirement list version');
  const library = readStarterLibrary(dir);
  const publishedAt = now();
  const added = { rubrics: 0, lists: 0 };

  const versionIdByKey = new Map<string, string>();
  for (const { key, file } of library.rubrics) {
    const existing = await rubrics.findOne({ where: { starterKey: key } });
    if (existing) {
      const published = await versions.findOne({
        where: { rubricId: existing.id, status: 'published' },
        order: { version: 'DESC' },
      });
      if (published) versionIdByKey.set(key, published.id);
      continue;
    }
    const rubric = await rubrics.save(rubrics.create({ starterKey: key }));
    const v = await versions.save(
      versions.create({
        rubricId: rubric.id,
        version: 1,
        status: 'published',
        name: file.rubric.name,
        kinds: file.rubric.kinds,
        publishedAt,
        createdByPersonId: null,
        publishedByPersonId: null,
      }),
    );
    await em.save(RubricCriterionRow, toCriterionRows(v.id, file.rubric));
    versionIdByKey.set(key, v.id);
    added.rubrics++;
  }

  for (const { key, body } of library.lists) {
    if (await lists.findOne({ where: { starterKey: key } })) continue;
    // A teacher may have replaced a starter rubric's published version; then the list is not added.
    if (body.lines.some((l) => !versionIdByKey.has(l.rubricVersionId))) continue;
    const resolved = {
      ...body,
      lines: body.lines.map((l, i) => ({
        ...l,
        id: `line-${i}`,
        rubricVersionId: versionIdByKey.get(l.rubricVersionId)!,
      })),
    };
    drawRequests(resolved, resolved.selectionRule, `starter-${key}`); // throws if the rule cannot be honoured
    const list = await lists.save(lists.create({ starterKey: key }));
    const v = await listVersions.save(
      listVersions.create({
        listId: list.id,
        version: 1,
        status: 'published',
        name: body.name,
        grade: body.grade,
        totalMarks: body.totalMarks,
        selectionRule: body.selectionRule,
        publishedAt,
        createdByPersonId: null,
        publishedByPersonId: null,
      }),
    );
    await em.save(RequirementLineRow, toLineRows(v.id, resolved));
    added.lists++;
  }
  return added;
}
