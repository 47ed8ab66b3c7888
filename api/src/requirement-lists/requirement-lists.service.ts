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
import { ScopedRepository } from '../common/scoped-repository.js';
import { VersionedDocuments } from '../common/versioned-documents.js';
import { RubricVersion } from '../rubrics/entities/rubric-version.entity.js';
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
  private readonly versions: ScopedRepository<RequirementListVersion>;
  private readonly rubricVersions: ScopedRepository<RubricVersion>;
  private readonly docs: VersionedDocuments<
    RequirementList,
    RequirementListVersion,
    RequirementListVersionBody
  >;

  constructor(
    @InjectRepository(RequirementList) listRepo: Repository<RequirementList>,
    @InjectRepository(RequirementListVersion) versionRepo: Repository<RequirementListVersion>,
    @InjectRepository(RubricVersion) rubricVersionRepo: Repository<RubricVersion>,
    @InjectDataSource() db: DataSource,
    audit: AuditService,
  ) {
    this.versions = new ScopedRepository(versionRepo, 'requirement list version');
    this.rubricVersions = new ScopedRepository(rubricVersionRepo, 'rubric version');
    this.docs = new VersionedDocuments(
      {
        noun: 'list',
        auditPrefix: 'requirement_list',
        parentKey: 'listId',
        apiPath: '/api/requirement-lists',
        documents: new ScopedRepository(listRepo, 'requirement list'),
        versions: this.versions,
        summaryRelations: { lines: true },
        viewRelations: VERSION_RELATIONS,
        columns: (body) => ({
          name: body.name,
          grade: body.grade,
          totalMarks: body.totalMarks,
          selectionRule: body.selectionRule,
        }),
        writeChildren: async (em, id, body, replace) => {
          // A line keeps its id across edits of the same draft (the draw preview refers to it).
          const keep = replace
            ? new Set(
                (await em.find(RequirementLineRow, { where: { listVersionId: id } })).map(
                  (l) => l.id,
                ),
              )
            : new Set<string>();
          if (replace) await em.delete(RequirementLineRow, { listVersionId: id });
          await em.save(RequirementLineRow, toLineRows(id, body, keep));
        },
        snapshot: async (em, v) => {
          const before = toListVersionView({ ...v, lines: await this.linesOf(em, v.id) });
          return {
            name: before.name,
            grade: before.grade,
            totalMarks: before.totalMarks,
            selectionRule: before.selectionRule,
            lines: before.lines,
          };
        },
        checkBody: (em, body) => this.checkRubrics(em, body),
        assertMutable: (v) => {
          if (v.usedAt) {
            throw new DomainError(
              ErrorCode.Immutable,
              `Version ${v.version} is used by a sitting and can never change; save your edit as a new version.`,
              [{ path: 'usedAt', message: 'used by a sitting' }],
            );
          }
        },
        checkPublish: (em, v) => this.checkPublishable(em, v),
      },
      db,
      audit,
    );
  }

  private linesOf(em: EntityManager, listVersionId: string): Promise<RequirementLineRow[]> {
    return em.find(RequirementLineRow, {
      where: { listVersionId },
      relations: { rubricVersion: true },
      order: { position: 'ASC' },
    });
  }

  async list(q: ListRequirementListsQuery): Promise<RequirementListSummary[]> {
    return (await this.docs.listVisible(q.status))
      .map((d) => toListSummary(d.document, d.versions))
      .filter((s) => (q.grade ? s.grade === q.grade : true))
      .sort(
        (a, b) =>
          a.grade.localeCompare(b.grade, 'en', { numeric: true }) ||
          a.name.localeCompare(b.name, 'en') ||
          a.id.localeCompare(b.id),
      );
  }

  async get(id: string): Promise<RequirementListDetail> {
    const d = await this.docs.getVisible(id);
    return toListDetail(d.document, d.versions);
  }

  async getVersion(id: string): Promise<RequirementListVersionView> {
    return toListVersionView(await this.docs.getVersion(id));
  }

  async create(body: RequirementListVersionBody): Promise<RequirementListVersionView> {
    return this.getVersion(await this.docs.create(body));
  }

  /** An edit of a published list: a new draft version; the published one is unchanged. */
  async createVersion(
    listId: string,
    body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    return this.getVersion(await this.docs.createVersion(listId, body));
  }

  async updateVersion(
    id: string,
    body: RequirementListVersionBody,
  ): Promise<RequirementListVersionView> {
    await this.docs.updateVersion(id, body);
    return this.getVersion(id);
  }

  async publish(id: string): Promise<RequirementListVersionView> {
    await this.docs.publish(id);
    return this.getVersion(id);
  }

  /**
   * Publishing needs what a sitting will rely on: every line marked with a published rubric
   * version, and a selection rule the lines can always satisfy (checked with the shared draw).
   */
  private async checkPublishable(em: EntityManager, v: RequirementListVersion): Promise<void> {
    const lines = await this.linesOf(em, v.id);
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
}
