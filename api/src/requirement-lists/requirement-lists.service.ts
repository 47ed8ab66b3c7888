import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, In, Repository } from 'typeorm';
import {
  drawRequests,
  DrawError,
  type ListRequirementListsQuery,
  type RequirementListDetail,
  type RequirementListSummary,
  type RequirementListVersionBody,
  type RequirementListVersionView,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { now } from '../common/clock.js';
import { conflict, DomainError, ErrorCode, invalid } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
import { callerSeesDrafts, isUniqueViolation } from '../rubrics/versioning.js';
import { RequirementLineRow } from './entities/requirement-line.entity.js';
import { RequirementListVersion } from './entities/requirement-list-version.entity.js';
import { RequirementList } from './entities/requirement-list.entity.js';
import {
  toLineRows,
  toListDetail,
  toListSummary,
  toListVersionView,
} from './requirement-lists.mapper.js';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const VERSION_RELATIONS = {
  lines: { rubricVersion: true },
  createdBy: true,
  publishedBy: true,
} as const;

/** Requirement lists per grade and their versions; lines are templates the draw works from. */
@Injectable()
export class RequirementListsService {
  private readonly lists: ScopedRepository<RequirementList>;
  private readonly versions: ScopedRepository<RequirementListVersion>;
  private readonly rubricVersions: ScopedRepository<RubricVersion>;

  constructor(
    @InjectRepository(RequirementList) listRepo: Repository<RequirementList>,
    @InjectRepository(RequirementListVersion) versionRepo: Repository<RequirementListVersion>,
    @InjectRepository(RubricVersion) rubricVersionRepo: Repository<RubricVersion>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
  ) {
    this.lists = new ScopedRepository(listRepo, 'requirement list');
    this.versions = new ScopedRepository(versionRepo, 'requirement list version');
    this.rubricVersions = new ScopedRepository(rubricVersionRepo, 'rubric version');
  }

  private async visibleVersions(
    where: { listId?: string; grade?: string } = {},
  ): Promise<Map<string, RequirementListVersion[]>> {
    const rows = await this.versions.find({
      where: { ...where, ...(callerSeesDrafts() ? {} : { status: 'published' as const }) },
      relations: { lines: true },
      order: { version: 'DESC' },
    });
    const byList = new Map<string, RequirementListVersion[]>();
    for (const v of rows) byList.set(v.listId, [...(byList.get(v.listId) ?? []), v]);
    return byList;
  }

  async list(q: ListRequirementListsQuery): Promise<RequirementListSummary[]> {
    const byList = await this.visibleVersions();
    if (byList.size === 0) return [];
    const lists = await this.lists.find({ where: { id: In([...byList.keys()]) } });
    return lists
      .map((l) => toListSummary(l, byList.get(l.id)!))
      .filter((s) => (q.grade ? s.grade === q.grade : true))
      .filter((s) =>
        q.status === 'published'
          ? s.published !== null
          : q.status === 'draft'
            ? s.latest.status === 'draft'
            : true,
      )
      .sort(
        (a, b) =>
          a.grade.localeCompare(b.grade, 'en', { numeric: true }) ||
          a.name.localeCompare(b.name, 'en') ||
          a.id.localeCompare(b.id),
      );
  }

  async get(id: string): Promise<RequirementListDetail> {
    const list = await this.lists.getById(id);
    const versions = (await this.visibleVersions({ listId: id })).get(id);
    if (!versions) throw new DomainError(ErrorCode.NotFound, 'No such requirement list.');
    return toListDetail(list, versions);
  }

  async getVersion(id: string): Promise<RequirementListVersionView> {
    const v = await this.versions.getOne({
      where: { id, ...(callerSeesDrafts() ? {} : { status: 'published' as const }) },
      relations: VERSION_RELATIONS,
    });
    return toListVersionView(v);
  }

  async create(
    body: RequirementListVersionBody,
    options: { starterKey?: string } = {},
  ): Promise<RequirementListVersionView> {
    const id = await this.db.transaction(async (em) => {
      await this.checkRubrics(em, body);
      const lists = this.lists.withManager(em);
      const list = await lists.save(lists.create({ starterKey: options.starterKey ?? null }));
      const v = await this.insertVersion(em, list.id, 1, body);
      await this.audit.record(
        {
          action: 'requirement_list.created',
          entity: 'requirement_list_version',
          entityId: v.id,
          after: { listId: list.id, version: 1, ...body },
        },
        em,
      );
      return v.id;
    });
    return this.getVersion(id);
  }

  /** An edit of a published list: a new draft version; the published one is unchanged. */
  async createVersion(
    listId: string,
    body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    const id = await this.db.transaction(async (em) => {
      await this.lists
        .withManager(em)
        .getOne({ where: { id: listId }, lock: { mode: 'pessimistic_write' } });
      await this.checkRubrics(em, body);
      const existing = await this.versions
        .withManager(em)
        .find({ where: { listId }, order: { version: 'DESC' } });
      const draft = existing.find((v) => v.status === 'draft');
      if (draft) {
        throw conflict(
          `Version ${draft.version} of this list is still a draft: edit that draft, or publish it before starting another.`,
          [{ path: 'listId', message: `draft version ${draft.version} exists (${draft.id})` }],
        );
      }
      const next = (existing[0]?.version ?? 0) + 1;
      const v = await this.insertVersion(em, listId, next, body);
      await this.audit.record(
        {
          action: 'requirement_list.version_created',
          entity: 'requirement_list_version',
          entityId: v.id,
          after: { listId, version: next, ...body },
        },
        em,
      );
      return v.id;
    });
    return this.getVersion(id);
  }

  async updateVersion(
    id: string,
    body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    await this.db.transaction(async (em) => {
      const versions = this.versions.withManager(em);
      const v = await versions.getOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      this.assertEditable(v);
      await this.checkRubrics(em, body);
      const before = toListVersionView({
        ...v,
        lines: await em.find(RequirementLineRow, {
          where: { listVersionId: id },
          relations: { rubricVersion: true },
        }),
      } as RequirementListVersion);
      Object.assign(v, {
        name: body.name,
        grade: body.grade,
        totalMarks: body.totalMarks,
        selectionRule: body.selectionRule,
      });
      await versions.save(v);
      await em.delete(RequirementLineRow, { listVersionId: id });
      await em.save(
        RequirementLineRow,
        toLineRows(id, body, new Set(before.lines.map((l) => l.id))),
      );
      await this.audit.record(
        {
          action: 'requirement_list.draft_updated',
          entity: 'requirement_list_version',
          entityId: id,
          before: {
            name: before.name,
            grade: before.grade,
            totalMarks: before.totalMarks,
            selectionRule: before.selectionRule,
            lines: before.lines,
          },
          after: body,
        },
        em,
      );
    });
    return this.getVersion(id);
  }

  /**
   * Publishing needs what a sitting will rely on: every line marked with a published rubric
   * version, and a selection rule the lines can always satisfy (checked with the shared draw).
   */
  async publish(id: string): Promise<RequirementListVersionView> {
    await this.db.transaction(async (em) => {
      const versions = this.versions.withManager(em);
      const v = await versions.getOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      this.assertEditable(v);
      const lines = await em.find(RequirementLineRow, {
        where: { listVersionId: id },
        relations: { rubricVersion: true },
        order: { position: 'ASC' },
      });
      const drafts = lines
        .map((l, i) => ({ l, i }))
        .filter(({ l }) => l.rubricVersion?.status !== 'published')
        .map(({ l, i }) => ({
          path: `lines.${i}.rubricVersionId`,
          message: `"${l.rubricVersion?.name}" version ${l.rubricVersion?.version} is still a draft: publish it first.`,
        }));
      if (drafts.length > 0) throw conflict(`${drafts[0]!.path}: ${drafts[0]!.message}`, drafts);
      const view = toListVersionView({ ...v, lines } as RequirementListVersion);
      try {
        drawRequests(view, view.selectionRule, 'publish-check');
      } catch (err) {
        if (err instanceof DrawError)
          throw conflict(`selectionRule: ${err.message}`, [
            { path: 'selectionRule', message: err.message },
          ]);
        throw err;
      }
      v.status = 'published';
      v.publishedAt = now();
      v.publishedByPersonId = RequestContext.requireCaller().personId;
      await versions.save(v);
      await this.audit.record(
        {
          action: 'requirement_list.published',
          entity: 'requirement_list_version',
          entityId: id,
          after: { listId: v.listId, version: v.version },
        },
        em,
      );
    });
    return this.getVersion(id);
  }

  /**
   * The hook for sittings (issue 5): call it in the transaction that schedules a sitting on this
   * version. From then on the version is pinned: nothing about it may change. Only a published
   * version can be used. Idempotent.
   */
  async markUsed(versionId: string, em: EntityManager): Promise<void> {
    const versions = this.versions.withManager(em);
    const v = await versions.getOne({
      where: { id: versionId },
      lock: { mode: 'pessimistic_write' },
    });
    if (v.status !== 'published')
      throw conflict(
        `Version ${v.version} of "${v.name}" is a draft; a sitting can use only a published version.`,
      );
    if (v.usedAt) return;
    v.usedAt = now();
    await versions.save(v);
  }

  private assertEditable(v: RequirementListVersion): void {
    if (v.usedAt) {
      throw new DomainError(
        ErrorCode.Immutable,
        `Version ${v.version} is used by a sitting and can never change; save your edit as a new version.`,
        [{ path: 'usedAt', message: 'used by a sitting' }],
      );
    }
    if (v.status !== 'draft') {
      throw new DomainError(
        ErrorCode.Immutable,
        `Version ${v.version} is published and cannot change; save your edit as a new version instead (POST /api/requirement-lists/${v.listId}/versions).`,
        [{ path: 'status', message: 'published versions are immutable' }],
      );
    }
  }

  /** Every line's rubric version must be this organisation's and meant for the line's kind. */
  private async checkRubrics(em: EntityManager, body: RequirementListVersionBody): Promise<void> {
    const ids = [
      ...new Set(body.lines.map((l) => l.rubricVersionId).filter((id) => UUID.test(id))),
    ];
    const found = ids.length
      ? await this.rubricVersions.withManager(em).find({ where: { id: In(ids) } })
      : [];
    const byId = new Map(found.map((r) => [r.id, r]));
    const problems: { path: string; message: string }[] = [];
    body.lines.forEach((l, i) => {
      const rv = byId.get(l.rubricVersionId);
      const path = `lines.${i}.rubricVersionId`;
      if (!rv) problems.push({ path, message: 'No such rubric version.' });
      else if (!rv.kinds.includes(l.kind)) {
        problems.push({
          path,
          message: `"${rv.name}" (version ${rv.version}) is not for ${l.kind.replace('_', ' ')} requests; it is for ${rv.kinds.join(', ')}.`,
        });
      }
    });
    if (problems.length > 0)
      throw invalid(`${problems[0]!.path}: ${problems[0]!.message}`, problems);
  }

  private async insertVersion(
    em: EntityManager,
    listId: string,
    version: number,
    body: RequirementListVersionBody,
  ): Promise<RequirementListVersion> {
    const versions = this.versions.withManager(em);
    try {
      const v = await versions.save(
        versions.create({
          listId,
          version,
          status: 'draft',
          name: body.name,
          grade: body.grade,
          totalMarks: body.totalMarks,
          selectionRule: body.selectionRule,
          createdByPersonId: RequestContext.caller()?.personId ?? null,
        }),
      );
      await em.save(RequirementLineRow, toLineRows(v.id, body, new Set()));
      return v;
    } catch (err) {
      if (isUniqueViolation(err))
        throw conflict(
          'Someone else changed this list at the same moment; reload it and try again.',
        );
      throw err;
    }
  }
}
