import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, type EntityManager, In, Repository } from 'typeorm';
import type {
  ListRubricsQuery,
  RubricBody,
  RubricDetail,
  RubricFile,
  RubricSummary,
  RubricVersionView,
} from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { now } from '../common/clock.js';
import { conflict, DomainError, ErrorCode } from '../common/errors.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { RubricCriterionRow } from './entities/rubric-criterion.entity.js';
import { RubricVersion } from './entities/rubric-version.entity.js';
import { Rubric } from './entities/rubric.entity.js';
import { parseRubricFile, toRubricFile } from './rubric-file.js';
import {
  toCriterion,
  toCriterionRows,
  toRubricDetail,
  toRubricSummary,
  toVersionView,
} from './rubrics.mapper.js';
import { callerSeesDrafts, isUniqueViolation, slug } from './versioning.js';

const VERSION_RELATIONS = { criteria: true, createdBy: true, publishedBy: true } as const;

/** Rubrics and their versions (design.md §3): drafts change, published versions never do. */
@Injectable()
export class RubricsService {
  private readonly rubrics: ScopedRepository<Rubric>;
  private readonly versions: ScopedRepository<RubricVersion>;

  constructor(
    @InjectRepository(Rubric) rubricRepo: Repository<Rubric>,
    @InjectRepository(RubricVersion) versionRepo: Repository<RubricVersion>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly audit: AuditService,
  ) {
    this.rubrics = new ScopedRepository(rubricRepo, 'rubric');
    this.versions = new ScopedRepository(versionRepo, 'rubric version');
  }

  /** Versions the caller may see, grouped by rubric, newest first. */
  private async visibleVersions(
    where: { rubricId?: string } = {},
  ): Promise<Map<string, RubricVersion[]>> {
    const rows = await this.versions.find({
      where: { ...where, ...(callerSeesDrafts() ? {} : { status: 'published' as const }) },
      relations: { criteria: true },
      order: { version: 'DESC' },
    });
    const byRubric = new Map<string, RubricVersion[]>();
    for (const v of rows) byRubric.set(v.rubricId, [...(byRubric.get(v.rubricId) ?? []), v]);
    return byRubric;
  }

  async list(q: ListRubricsQuery): Promise<RubricSummary[]> {
    const byRubric = await this.visibleVersions();
    if (byRubric.size === 0) return [];
    const rubrics = await this.rubrics.find({ where: { id: In([...byRubric.keys()]) } });
    return rubrics
      .map((r) => toRubricSummary(r, byRubric.get(r.id)!))
      .filter((s) => (q.kind ? s.kinds.includes(q.kind) : true))
      .filter((s) =>
        q.status === 'published'
          ? s.published !== null
          : q.status === 'draft'
            ? s.latest.status === 'draft'
            : true,
      )
      .sort((a, b) => a.name.localeCompare(b.name, 'en') || a.id.localeCompare(b.id));
  }

  async get(id: string): Promise<RubricDetail> {
    const rubric = await this.rubrics.getById(id);
    const versions = (await this.visibleVersions({ rubricId: id })).get(id);
    // A rubric with nothing the caller may see (only a draft, for an examiner) is not there for them.
    if (!versions) throw new DomainError(ErrorCode.NotFound, 'No such rubric.');
    return toRubricDetail(rubric, versions);
  }

  async getVersion(id: string): Promise<RubricVersionView> {
    const v = await this.versions.getOne({
      where: { id, ...(callerSeesDrafts() ? {} : { status: 'published' as const }) },
      relations: VERSION_RELATIONS,
    });
    return toVersionView(v);
  }

  async create(
    body: RubricBody,
    options: { starterKey?: string; action?: string } = {},
  ): Promise<RubricVersionView> {
    const id = await this.db.transaction(async (em) => {
      const rubrics = this.rubrics.withManager(em);
      const rubric = await rubrics.save(rubrics.create({ starterKey: options.starterKey ?? null }));
      const v = await this.insertVersion(em, rubric.id, 1, body);
      await this.audit.record(
        {
          action: options.action ?? 'rubric.created',
          entity: 'rubric_version',
          entityId: v.id,
          after: { rubricId: rubric.id, version: 1, ...body },
        },
        em,
      );
      return v.id;
    });
    return this.getVersion(id);
  }

  /** An edit of a published rubric: a new draft version; the published one stays as it was. */
  async createVersion(rubricId: string, body: RubricBody): Promise<RubricVersionView> {
    const id = await this.db.transaction(async (em) => {
      // Locking the rubric row serialises version numbering for this rubric.
      await this.rubrics
        .withManager(em)
        .getOne({ where: { id: rubricId }, lock: { mode: 'pessimistic_write' } });
      const existing = await this.versions
        .withManager(em)
        .find({ where: { rubricId }, order: { version: 'DESC' } });
      const draft = existing.find((v) => v.status === 'draft');
      if (draft) {
        throw conflict(
          `Version ${draft.version} of this rubric is still a draft: edit that draft, or publish it before starting another.`,
          [{ path: 'rubricId', message: `draft version ${draft.version} exists (${draft.id})` }],
        );
      }
      const next = (existing[0]?.version ?? 0) + 1;
      const v = await this.insertVersion(em, rubricId, next, body);
      await this.audit.record(
        {
          action: 'rubric.version_created',
          entity: 'rubric_version',
          entityId: v.id,
          after: { rubricId, version: next, ...body },
        },
        em,
      );
      return v.id;
    });
    return this.getVersion(id);
  }

  async updateVersion(id: string, body: RubricBody): Promise<RubricVersionView> {
    await this.db.transaction(async (em) => {
      const versions = this.versions.withManager(em);
      const v = await versions.getOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      this.assertDraft(v);
      const oldCriteria = await em.find(RubricCriterionRow, {
        where: { rubricVersionId: id },
        order: { position: 'ASC' },
      });
      const before = { name: v.name, kinds: v.kinds, criteria: oldCriteria.map(toCriterion) };
      v.name = body.name;
      v.kinds = body.kinds;
      await versions.save(v);
      await em.delete(RubricCriterionRow, { rubricVersionId: id });
      await em.save(RubricCriterionRow, toCriterionRows(id, body));
      await this.audit.record(
        {
          action: 'rubric.draft_updated',
          entity: 'rubric_version',
          entityId: id,
          before,
          after: body,
        },
        em,
      );
    });
    return this.getVersion(id);
  }

  async publish(id: string): Promise<RubricVersionView> {
    await this.db.transaction(async (em) => {
      const versions = this.versions.withManager(em);
      const v = await versions.getOne({ where: { id }, lock: { mode: 'pessimistic_write' } });
      this.assertDraft(v);
      v.status = 'published';
      v.publishedAt = now();
      v.publishedByPersonId = RequestContext.requireCaller().personId;
      await versions.save(v);
      await this.audit.record(
        {
          action: 'rubric.published',
          entity: 'rubric_version',
          entityId: id,
          after: { rubricId: v.rubricId, version: v.version },
        },
        em,
      );
    });
    return this.getVersion(id);
  }

  async export(id: string): Promise<{ fileName: string; file: RubricFile }> {
    const view = await this.getVersion(id);
    const rubric = await this.rubrics.getById(view.rubricId);
    return {
      fileName: `${slug(view.name)}-v${view.version}.rubric.json`,
      file: toRubricFile(view, rubric.starterKey, now()),
    };
  }

  /** An imported file always becomes a new rubric with one draft version, whatever it was before. */
  async import(content: Buffer): Promise<RubricVersionView> {
    const file = parseRubricFile(content);
    return this.create(file.rubric, { action: 'rubric.imported' });
  }

  private assertDraft(v: RubricVersion): void {
    if (v.status !== 'draft') {
      throw new DomainError(
        ErrorCode.Immutable,
        `Version ${v.version} is published and cannot change; save your edit as a new version instead (POST /api/rubrics/${v.rubricId}/versions).`,
        [{ path: 'status', message: 'published versions are immutable' }],
      );
    }
  }

  private async insertVersion(
    em: EntityManager,
    rubricId: string,
    version: number,
    body: RubricBody,
  ): Promise<RubricVersion> {
    const versions = this.versions.withManager(em);
    try {
      const v = await versions.save(
        versions.create({
          rubricId,
          version,
          status: 'draft',
          name: body.name,
          kinds: body.kinds,
          createdByPersonId: RequestContext.caller()?.personId ?? null,
        }),
      );
      await em.save(RubricCriterionRow, toCriterionRows(v.id, body));
      return v;
    } catch (err) {
      if (isUniqueViolation(err))
        throw conflict(
          'Someone else changed this rubric at the same moment; reload it and try again.',
        );
      throw err;
    }
  }
}
