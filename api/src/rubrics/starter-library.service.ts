import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type {
  RubricVersionView,
  StarterAdoptedRef,
  StarterLibraryView,
  StarterListAdoption,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { conflict, invalid } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { isUniqueViolation } from '../common/versioned-documents.js';
import { RequirementListVersion } from '../requirement-lists/entities/requirement-list-version.entity.js';
import { RequirementList } from '../requirement-lists/entities/requirement-list.entity.js';
import { toListVersionView } from '../requirement-lists/requirement-lists.mapper.js';
import { RubricVersion } from './entities/rubric-version.entity.js';
import { Rubric } from './entities/rubric.entity.js';
import { RubricsService } from './rubrics.service.js';
import {
  insertStarterList,
  insertStarterRubric,
  publishedStarterRubric,
  readStarterLibrary,
  rubricKeysOf,
  starterRepos,
  STARTER_DIR,
  type StarterList,
  type StarterRepos,
  type StarterRubric,
} from './starter-library.js';

/**
 * The starter library for every school (the demo school gets it from the seed): what it holds,
 * and copying one entry into the caller's organisation as published version 1, the same as the
 * seed does. An entry is added once per school; asking again is refused with a pointer to it.
 */
@Injectable()
export class StarterLibraryService {
  private library: ReturnType<typeof readStarterLibrary> | null = null;
  private readonly rubrics: ScopedRepository<Rubric>;
  private readonly lists: ScopedRepository<RequirementList>;
  private readonly listVersions: ScopedRepository<RequirementListVersion>;

  constructor(
    @InjectRepository(Rubric) rubricRepo: Repository<Rubric>,
    @InjectRepository(RequirementList) listRepo: Repository<RequirementList>,
    @InjectRepository(RequirementListVersion) listVersionRepo: Repository<RequirementListVersion>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
    private readonly rubricsService: RubricsService,
  ) {
    this.rubrics = new ScopedRepository(rubricRepo, 'rubric');
    this.lists = new ScopedRepository(listRepo, 'requirement list');
    this.listVersions = new ScopedRepository(listVersionRepo, 'requirement list version');
  }

  /** The files ship with the app and do not change while it runs: read and check them once. */
  private entries(): ReturnType<typeof readStarterLibrary> {
    this.library ??= readStarterLibrary(STARTER_DIR);
    return this.library;
  }

  async catalogue(): Promise<StarterLibraryView> {
    const { rubrics, lists } = this.entries();
    const adoptedRubrics = await this.adopted(this.rubrics, RubricVersion, 'rubric_id');
    const adoptedLists = await this.adopted(this.lists, RequirementListVersion, 'list_id');
    return {
      rubrics: rubrics.map(({ key, file }) => ({
        key,
        name: file.rubric.name,
        kinds: file.rubric.kinds,
        criteriaCount: file.rubric.criteria.length,
        adopted: adoptedRubrics.get(key) ?? null,
      })),
      requirementLists: lists.map((l) => ({
        key: l.key,
        name: l.body.name,
        grade: l.body.grade,
        totalMarks: l.body.totalMarks,
        lineCount: l.body.lines.length,
        rubricKeys: rubricKeysOf(l),
        adopted: adoptedLists.get(l.key) ?? null,
      })),
    };
  }

  async adoptRubric(key: string): Promise<RubricVersionView> {
    const entry = this.rubricEntry(key);
    const id = await this.inTransaction(async (r) => {
      const existing = await publishedStarterRubric(r, key);
      if (existing.rubric)
        throw this.alreadyThere('rubric', entry.file.rubric.name, existing.rubric.id);
      return (await this.addRubric(r, entry)).id;
    });
    return this.rubricsService.getVersion(id);
  }

  /**
   * Adds a starter list; the starter rubrics its lines are marked with come too when the school
   * has none of them yet. A school's own copy is used as it now stands (its newest published
   * version), provided it is still meant for the line's kind.
   */
  async adoptList(key: string): Promise<StarterListAdoption> {
    const entry = this.listEntry(key);
    const { versionId, rubricsAdded } = await this.inTransaction(async (r) => {
      const existing = await r.lists.findOne({ where: { starterKey: key } });
      if (existing) throw this.alreadyThere('list', entry.body.name, existing.id);
      const rubricsAdded: StarterAdoptedRef[] = [];
      const versionIds = new Map<string, string>();
      for (const rubricKey of rubricKeysOf(entry)) {
        const mine = await publishedStarterRubric(r, rubricKey);
        if (mine.rubric && !mine.version)
          throw conflict(
            `Your school's copy of the starter rubric "${rubricKey}" has no published version; publish it, then add "${entry.body.name}".`,
            [
              {
                path: 'key',
                message: `starter rubric ${rubricKey} is not published (${mine.rubric.id})`,
              },
            ],
          );
        const version = mine.version ?? (await this.addRubric(r, this.rubricEntry(rubricKey)));
        if (!mine.version) rubricsAdded.push({ id: version.rubricId, name: version.name });
        const kinds = entry.body.lines
          .filter((l) => l.rubricVersionId === rubricKey)
          .map((l) => l.kind)
          .filter((k) => !version.kinds.includes(k));
        if (kinds.length > 0)
          throw conflict(
            `Your school's "${version.name}" (version ${version.version}) is no longer for ${[...new Set(kinds)].join(', ').replace(/_/g, ' ')} requests, which "${entry.body.name}" marks with it.`,
            [{ path: 'key', message: `rubric ${version.rubricId} does not cover every line` }],
          );
        versionIds.set(rubricKey, version.id);
      }
      const by = RequestContext.requireCaller().personId;
      const v = await insertStarterList(r, entry, versionIds, by);
      await this.audit.record(
        {
          action: 'requirement_list.adopted_from_starter',
          entity: 'requirement_list_version',
          entityId: v.id,
          after: { listId: v.listId, starterKey: key, version: 1, rubricsAdded },
        },
        r.em,
      );
      return { versionId: v.id, rubricsAdded };
    });
    const version = await this.listVersions.getOne({
      where: { id: versionId },
      relations: { lines: { rubricVersion: true }, createdBy: true, publishedBy: true },
    });
    return { version: toListVersionView(version), rubricsAdded };
  }

  private async addRubric(r: StarterRepos, entry: StarterRubric): Promise<RubricVersion> {
    const v = await insertStarterRubric(r, entry, RequestContext.requireCaller().personId);
    await this.audit.record(
      {
        action: 'rubric.adopted_from_starter',
        entity: 'rubric_version',
        entityId: v.id,
        after: { rubricId: v.rubricId, starterKey: entry.key, version: 1 },
      },
      r.em,
    );
    return v;
  }

  private inTransaction<T>(work: (r: StarterRepos) => Promise<T>): Promise<T> {
    const org = RequestContext.requireCaller().organisationId;
    return this.db
      .transaction((em) => work(starterRepos(em, () => org)))
      .catch((err: unknown) => {
        // Two people adding the same entry at once: the unique starter key stops the second.
        if (isUniqueViolation(err))
          throw conflict(
            'Someone else added this from the starter library at the same moment; reload the page to find it.',
          );
        throw err;
      });
  }

  private alreadyThere(what: 'rubric' | 'list', name: string, id: string) {
    const page = what === 'rubric' ? 'Rubrics' : 'Requirement lists';
    return conflict(
      `"${name}" from the starter library is already in your school; open it on the ${page} page (edit it there to make a new version).`,
      [{ path: 'key', message: `already added (${what} ${id})` }],
    );
  }

  private rubricEntry(key: string): StarterRubric {
    const { rubrics } = this.entries();
    const entry = rubrics.find((e) => e.key === key);
    if (!entry)
      throw invalid(
        `key: the starter library has no rubric "${key}"; it has ${rubrics.map((e) => `"${e.key}"`).join(', ')}.`,
        [{ path: 'key', message: `no starter rubric "${key}"` }],
      );
    return entry;
  }

  private listEntry(key: string): StarterList {
    const { lists } = this.entries();
    const entry = lists.find((e) => e.key === key);
    if (!entry)
      throw invalid(
        `key: the starter library has no requirement list "${key}"; it has ${lists.map((e) => `"${e.key}"`).join(', ')}.`,
        [{ path: 'key', message: `no starter requirement list "${key}"` }],
      );
    return entry;
  }

  /** Starter key → the school's copy (its id and current name), for rubrics or lists. */
  private async adopted(
    documents: ScopedRepository<Rubric> | ScopedRepository<RequirementList>,
    versionEntity: typeof RubricVersion | typeof RequirementListVersion,
    parentColumn: 'rubric_id' | 'list_id',
  ): Promise<Map<string, StarterAdoptedRef>> {
    const rows = await (documents as ScopedRepository<Rubric>)
      .qb('d')
      .innerJoin(versionEntity, 'v', `v.${parentColumn} = d.id`)
      .select(['d.starter_key AS key', 'd.id AS id', 'v.name AS name'])
      .andWhere('d.starterKey IS NOT NULL')
      .orderBy('v.version', 'DESC')
      .getRawMany<{ key: string; id: string; name: string }>();
    // Rows come newest version first: the first per key carries the current name.
    const out = new Map<string, StarterAdoptedRef>();
    for (const row of rows) if (!out.has(row.key)) out.set(row.key, { id: row.id, name: row.name });
    return out;
  }
}
