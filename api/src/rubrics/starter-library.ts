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

/** The repositories a starter entry is written through, all scoped to one organisation. */
export interface StarterRepos {
  em: EntityManager;
  rubrics: ScopedRepository<Rubric>;
  versions: ScopedRepository<RubricVersion>;
  lists: ScopedRepository<RequirementList>;
  listVersions: ScopedRepository<RequirementListVersion>;
}

export function starterRepos(em: EntityManager, organisationId: () => string): StarterRepos {
  const scoped = <T extends { id: string; organisationId: string }>(
    target: new () => T,
    what: string,
  ) => new ScopedRepository<T>(em.getRepository<T>(target), what, organisationId);
  return {
    em,
    rubrics: scoped(Rubric, 'rubric'),
    versions: scoped(RubricVersion, 'rubric version'),
    lists: scoped(RequirementList, 'requirement list'),
    listVersions: scoped(RequirementListVersion, 'requirement list version'),
  };
}

/** The newest published version of the organisation's copy of a starter rubric, if any. */
export async function publishedStarterRubric(
  r: StarterRepos,
  key: string,
): Promise<{ rubric: Rubric | null; version: RubricVersion | null }> {
  const rubric = await r.rubrics.findOne({ where: { starterKey: key } });
  if (!rubric) return { rubric: null, version: null };
  const version = await r.versions.findOne({
    where: { rubricId: rubric.id, status: 'published' },
    order: { version: 'DESC' },
  });
  return { rubric, version };
}

/** A starter rubric as a new rubric whose version 1 is published (by `by`, or by nobody: the seed). */
export async function insertStarterRubric(
  r: StarterRepos,
  { key, file }: StarterRubric,
  by: string | null,
): Promise<RubricVersion> {
  const rubric = await r.rubrics.save(r.rubrics.create({ starterKey: key }));
  const v = await r.versions.save(
    r.versions.create({
      rubricId: rubric.id,
      version: 1,
      status: 'published',
      name: file.rubric.name,
      kinds: file.rubric.kinds,
      publishedAt: now(),
      createdByPersonId: by,
      publishedByPersonId: by,
    }),
  );
  await r.em.save(RubricCriterionRow, toCriterionRows(v.id, file.rubric));
  return v;
}

/**
 * A starter list as a new list whose version 1 is published; `rubricVersionIds` maps each
 * starter rubric key its lines name to the organisation's rubric version.
 */
export async function insertStarterList(
  r: StarterRepos,
  { key, body }: StarterList,
  rubricVersionIds: ReadonlyMap<string, string>,
  by: string | null,
): Promise<RequirementListVersion> {
  const resolved = {
    ...body,
    lines: body.lines.map((l, i) => {
      const id = rubricVersionIds.get(l.rubricVersionId);
      if (!id) throw new Error(`starter list ${key}: no rubric version for "${l.rubricVersionId}"`);
      return { ...l, id: `line-${i}`, rubricVersionId: id };
    }),
  };
  drawRequests(resolved, resolved.selectionRule, `starter-${key}`); // throws if the rule cannot be honoured
  const list = await r.lists.save(r.lists.create({ starterKey: key }));
  const v = await r.listVersions.save(
    r.listVersions.create({
      listId: list.id,
      version: 1,
      status: 'published',
      name: body.name,
      grade: body.grade,
      totalMarks: body.totalMarks,
      selectionRule: body.selectionRule,
      publishedAt: now(),
      createdByPersonId: by,
      publishedByPersonId: by,
    }),
  );
  await r.em.save(RequirementLineRow, toLineRows(v.id, resolved));
  return v;
}

/** Starter rubric keys a starter list's lines are marked with, in order of first use. */
export function rubricKeysOf(list: StarterList): string[] {
  return [...new Set(list.body.lines.map((l) => l.rubricVersionId))];
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
  const r = starterRepos(em, () => organisationId);
  const library = readStarterLibrary(dir);
  const added = { rubrics: 0, lists: 0 };

  const versionIdByKey = new Map<string, string>();
  for (const entry of library.rubrics) {
    const existing = await publishedStarterRubric(r, entry.key);
    if (existing.rubric) {
      if (existing.version) versionIdByKey.set(entry.key, existing.version.id);
      continue;
    }
    versionIdByKey.set(entry.key, (await insertStarterRubric(r, entry, null)).id);
    added.rubrics++;
  }

  for (const entry of library.lists) {
    if (await r.lists.findOne({ where: { starterKey: entry.key } })) continue;
    // A teacher may have replaced a starter rubric's published version; then the list is not added.
    if (rubricKeysOf(entry).some((k) => !versionIdByKey.has(k))) continue;
    await insertStarterList(r, entry, versionIdByKey, null);
    added.lists++;
  }
  return added;
}
