// Draft → publish → new version, once for every versioned teaching document (rubrics and
// requirement lists, design.md §3). A document is an identity (`rubrics`, `requirement_lists`);
// what it says lives in numbered versions; at most one draft at a time; a published version never
// changes, and an edit of it starts the next version as a draft.
import type {
  DataSource,
  EntityManager,
  FindOptionsOrder,
  FindOptionsRelations,
  FindOptionsWhere,
} from 'typeorm';
import { In, QueryFailedError } from 'typeorm';
import type { Role, VersionStatus } from '@stavemark/shared';
import type { AuditService } from '../audit/audit.service.js';
import { now } from './clock.js';
import { conflict, DomainError, ErrorCode } from './errors.js';
import type { OrgOwned } from './org-owned.js';
import { RequestContext } from './request-context.js';
import type { ScopedRepository } from './scoped-repository.js';

const NEWEST_FIRST = { version: 'DESC' } as const;

/** Teachers and admins write rubrics, lists and fingerings; examiners and students only read. */
export function isTeachingStaff(roles: readonly Role[]): boolean {
  return roles.includes('admin') || roles.includes('teacher');
}

/** Drafts are work in progress: only those who can edit them see them. */
export function callerSeesDrafts(): boolean {
  return isTeachingStaff(RequestContext.requireCaller().roles);
}

/** PostgreSQL's unique_violation (SQLSTATE 23505), optionally on one named constraint or index. */
export function isUniqueViolation(err: unknown, constraint?: string): boolean {
  if (!(err instanceof QueryFailedError)) return false;
  const e = err.driverError as { code?: string; constraint?: string };
  return e.code === '23505' && (constraint === undefined || e.constraint === constraint);
}

/** The identity of a versioned document. */
export interface DocumentRow extends OrgOwned {
  id: string;
  starterKey: string | null;
}

/** The columns every version has, whatever the document. */
export interface VersionRow extends OrgOwned {
  id: string;
  version: number;
  status: VersionStatus;
  name: string;
  createdAt: Date;
  createdByPersonId: string | null;
  publishedAt: Date | null;
  publishedByPersonId: string | null;
}

/** What differs between rubrics and requirement lists; everything else is the same rule. */
export interface VersionedDocumentSpec<D extends DocumentRow, V extends VersionRow, B> {
  /** The document in words, for messages: "rubric", "list". */
  noun: string;
  /** Audit names: actions `${auditPrefix}.created` …, entity `${auditPrefix}_version`. */
  auditPrefix: string;
  /** The version's column that names its document. */
  parentKey: keyof V & string;
  /** The collection's API path, to say where a new version is made ("/api/rubrics"). */
  apiPath: string;
  documents: ScopedRepository<D>;
  versions: ScopedRepository<V>;
  /** Relations a summary needs (the child rows, to count them). */
  summaryRelations: FindOptionsRelations<V>;
  /** Relations the full view of one version needs. */
  viewRelations: FindOptionsRelations<V>;
  /** The version's own columns taken from a body. */
  columns(body: B): Partial<V>;
  /** Writes the child rows of a version (criteria, lines); `replace` when a draft is edited. */
  writeChildren(em: EntityManager, versionId: string, body: B, replace: boolean): Promise<void>;
  /** What a version says, for the audit's "before" of an edit. */
  snapshot(em: EntityManager, v: V): Promise<object>;
  /** Checks a body against the database before it is saved (throw `invalid` to refuse). */
  checkBody?(em: EntityManager, body: B): Promise<void>;
  /** A further reason a version can never change, checked before the draft rule. */
  assertMutable?(v: V): void;
  /** What must hold before a draft is published (throw `conflict` to refuse). */
  checkPublish?(em: EntityManager, v: V): Promise<void>;
}

/** A document with the versions the caller may see, newest first (at least one). */
export interface VisibleDocument<D, V> {
  document: D;
  versions: V[];
}

export class VersionedDocuments<D extends DocumentRow, V extends VersionRow, B> {
  constructor(
    private readonly spec: VersionedDocumentSpec<D, V, B>,
    private readonly db: DataSource,
    private readonly audit: AuditService,
  ) {}

  private parentOf(v: V): string {
    return v[this.spec.parentKey] as unknown as string;
  }

  private byParent(parentId: string): FindOptionsWhere<V> {
    return { [this.spec.parentKey]: parentId } as FindOptionsWhere<V>;
  }

  /** Examiners and students see published versions only. */
  private visibleWhere(where: FindOptionsWhere<V>): FindOptionsWhere<V> {
    return (
      callerSeesDrafts() ? where : { ...where, status: 'published' as const }
    ) as FindOptionsWhere<V>;
  }

  /** Every document with a version the caller may see; `status` keeps those with a published version or whose latest is a draft. */
  async listVisible(status?: VersionStatus): Promise<VisibleDocument<D, V>[]> {
    const rows = await this.spec.versions.find({
      where: this.visibleWhere({} as FindOptionsWhere<V>),
      relations: this.spec.summaryRelations,
      order: NEWEST_FIRST as FindOptionsOrder<V>,
    });
    const grouped = new Map<string, V[]>();
    for (const v of rows)
      grouped.set(this.parentOf(v), [...(grouped.get(this.parentOf(v)) ?? []), v]);
    if (grouped.size === 0) return [];
    const docs = await this.spec.documents.find({
      where: { id: In([...grouped.keys()]) } as FindOptionsWhere<D>,
    });
    return docs
      .map((document) => ({ document, versions: grouped.get(document.id)! }))
      .filter(({ versions }) =>
        status === 'published'
          ? versions.some((v) => v.status === 'published')
          : status === 'draft'
            ? versions[0]!.status === 'draft'
            : true,
      );
  }

  /** One document; one with nothing the caller may see (only a draft, for an examiner) is not there. */
  async getVisible(id: string): Promise<VisibleDocument<D, V>> {
    const document = await this.spec.documents.getById(id);
    const versions = await this.spec.versions.find({
      where: this.visibleWhere(this.byParent(id)),
      relations: this.spec.summaryRelations,
      order: NEWEST_FIRST as FindOptionsOrder<V>,
    });
    if (versions.length === 0)
      throw new DomainError(ErrorCode.NotFound, `No such ${this.spec.noun}.`);
    return { document, versions };
  }

  getVersion(id: string): Promise<V> {
    return this.spec.versions.getOne({
      where: this.visibleWhere({ id } as FindOptionsWhere<V>),
      relations: this.spec.viewRelations,
    });
  }

  /** A new document with its first version, a draft. Returns the version's id. */
  create(body: B, options: { action?: string } = {}): Promise<string> {
    return this.db.transaction(async (em) => {
      await this.spec.checkBody?.(em, body);
      const documents = this.spec.documents.withManager(em);
      const doc = await documents.save(documents.create({ starterKey: null } as Partial<D>));
      const v = await this.insertVersion(em, doc.id, 1, body);
      await this.record(em, options.action ?? 'created', v.id, null, {
        [this.spec.parentKey]: doc.id,
        version: 1,
        ...body,
      });
      return v.id;
    });
  }

  /** An edit of a published document: the next version, a draft; the published one is unchanged. */
  createVersion(documentId: string, body: B): Promise<string> {
    return this.db.transaction(async (em) => {
      // Locking the document row serialises version numbering for it.
      await this.spec.documents.withManager(em).getOne({
        where: { id: documentId } as FindOptionsWhere<D>,
        lock: { mode: 'pessimistic_write' },
      });
      await this.spec.checkBody?.(em, body);
      const existing = await this.spec.versions
        .withManager(em)
        .find({ where: this.byParent(documentId), order: NEWEST_FIRST as FindOptionsOrder<V> });
      const draft = existing.find((v) => v.status === 'draft');
      if (draft) {
        throw conflict(
          `Version ${draft.version} of this ${this.spec.noun} is still a draft: edit that draft, or publish it before starting another.`,
          [
            {
              path: this.spec.parentKey,
              message: `draft version ${draft.version} exists (${draft.id})`,
            },
          ],
        );
      }
      const next = (existing[0]?.version ?? 0) + 1;
      const v = await this.insertVersion(em, documentId, next, body);
      await this.record(em, 'version_created', v.id, null, {
        [this.spec.parentKey]: documentId,
        version: next,
        ...body,
      });
      return v.id;
    });
  }

  /** Replaces what a draft says. */
  async updateVersion(id: string, body: B): Promise<void> {
    await this.db.transaction(async (em) => {
      const { versions, v } = await this.lockEditable(em, id);
      await this.spec.checkBody?.(em, body);
      const before = await this.spec.snapshot(em, v);
      Object.assign(v, this.spec.columns(body));
      await versions.save(v);
      await this.spec.writeChildren(em, id, body, true);
      await this.record(em, 'draft_updated', id, before, body as object);
    });
  }

  async publish(id: string): Promise<void> {
    await this.db.transaction(async (em) => {
      const { versions, v } = await this.lockEditable(em, id);
      await this.spec.checkPublish?.(em, v);
      v.status = 'published';
      v.publishedAt = now();
      v.publishedByPersonId = RequestContext.requireCaller().personId;
      await versions.save(v);
      await this.record(em, 'published', id, null, {
        [this.spec.parentKey]: this.parentOf(v),
        version: v.version,
      });
    });
  }

  /** The version, locked for this transaction, provided it may still change. */
  private async lockEditable(
    em: EntityManager,
    id: string,
  ): Promise<{ versions: ScopedRepository<V>; v: V }> {
    const versions = this.spec.versions.withManager(em);
    const v = await versions.getOne({
      where: { id } as FindOptionsWhere<V>,
      lock: { mode: 'pessimistic_write' },
    });
    this.assertEditable(v);
    return { versions, v };
  }

  private assertEditable(v: V): void {
    this.spec.assertMutable?.(v);
    if (v.status !== 'draft') {
      throw new DomainError(
        ErrorCode.Immutable,
        `Version ${v.version} is published and cannot change; save your edit as a new version instead (POST ${this.spec.apiPath}/${this.parentOf(v)}/versions).`,
        [{ path: 'status', message: 'published versions are immutable' }],
      );
    }
  }

  private async insertVersion(
    em: EntityManager,
    documentId: string,
    version: number,
    body: B,
  ): Promise<V> {
    const versions = this.spec.versions.withManager(em);
    try {
      const v = await versions.save(
        versions.create({
          ...this.spec.columns(body),
          [this.spec.parentKey]: documentId,
          version,
          status: 'draft',
          createdByPersonId: RequestContext.caller()?.personId ?? null,
        } as Partial<V>),
      );
      await this.spec.writeChildren(em, v.id, body, false);
      return v;
    } catch (err) {
      if (isUniqueViolation(err))
        throw conflict(
          `Someone else changed this ${this.spec.noun} at the same moment; reload it and try again.`,
        );
      throw err;
    }
  }

  private record(
    em: EntityManager,
    action: string,
    versionId: string,
    before: object | null,
    after: object,
  ): Promise<unknown> {
    return this.audit.record(
      {
        action: `${this.spec.auditPrefix}.${action}`,
        entity: `${this.spec.auditPrefix}_version`,
        entityId: versionId,
        ...(before ? { before } : {}),
        after,
      },
      em,
    );
  }
}
