import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
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
import { ScopedRepository } from '../common/scoped-repository.js';
import { VersionedDocuments } from '../common/versioned-documents.js';
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
import { slug } from './versioning.js';

/** Rubrics and their versions (design.md §3): drafts change, published versions never do. */
@Injectable()
export class RubricsService {
  private readonly rubrics: ScopedRepository<Rubric>;
  private readonly docs: VersionedDocuments<Rubric, RubricVersion, RubricBody>;

  constructor(
    @InjectRepository(Rubric) rubricRepo: Repository<Rubric>,
    @InjectRepository(RubricVersion) versionRepo: Repository<RubricVersion>,
    @InjectDataSource() db: DataSource,
    audit: AuditService,
  ) {
    this.rubrics = new ScopedRepository(rubricRepo, 'rubric');
    this.docs = new VersionedDocuments(
      {
        noun: 'rubric',
        auditPrefix: 'rubric',
        parentKey: 'rubricId',
        apiPath: '/api/rubrics',
        documents: this.rubrics,
        versions: new ScopedRepository(versionRepo, 'rubric version'),
        summaryRelations: { criteria: true },
        viewRelations: { criteria: true, createdBy: true, publishedBy: true },
        columns: (body) => ({ name: body.name, kinds: body.kinds }),
        writeChildren: async (em, id, body, replace) => {
          if (replace) await em.delete(RubricCriterionRow, { rubricVersionId: id });
          await em.save(RubricCriterionRow, toCriterionRows(id, body));
        },
        snapshot: async (em, v) => ({
          name: v.name,
          kinds: v.kinds,
          criteria: (
            await em.find(RubricCriterionRow, {
              where: { rubricVersionId: v.id },
              order: { position: 'ASC' },
            })
          ).map(toCriterion),
        }),
      },
      db,
      audit,
    );
  }

  async list(q: ListRubricsQuery): Promise<RubricSummary[]> {
    return (await this.docs.listVisible(q.status))
      .map((d) => toRubricSummary(d.document, d.versions))
      .filter((s) => (q.kind ? s.kinds.includes(q.kind) : true))
      .sort((a, b) => a.name.localeCompare(b.name, 'en') || a.id.localeCompare(b.id));
  }

  async get(id: string): Promise<RubricDetail> {
    const d = await this.docs.getVisible(id);
    return toRubricDetail(d.document, d.versions);
  }

  async getVersion(id: string): Promise<RubricVersionView> {
    return toVersionView(await this.docs.getVersion(id));
  }

  async create(body: RubricBody, options: { action?: string } = {}): Promise<RubricVersionView> {
    return this.getVersion(await this.docs.create(body, options));
  }

  /** An edit of a published rubric: a new draft version; the published one stays as it was. */
  async createVersion(rubricId: string, body: RubricBody): Promise<RubricVersionView> {
    return this.getVersion(await this.docs.createVersion(rubricId, body));
  }

  async updateVersion(id: string, body: RubricBody): Promise<RubricVersionView> {
    await this.docs.updateVersion(id, body);
    return this.getVersion(id);
  }

  async publish(id: string): Promise<RubricVersionView> {
    await this.docs.publish(id);
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
    return this.create(file.rubric, { action: 'imported' });
  }
}
