import type { EntityManager, FindManyOptions, FindOneOptions, FindOptionsWhere, ObjectLiteral, Repository, SelectQueryBuilder } from 'typeorm';
import { notFound } from './errors.js';
import { RequestContext } from './request-context.js';
import type { OrgOwned } from './org-owned.js';

type Where<T> = FindOptionsWhere<T> | FindOptionsWhere<T>[] | undefined;

/**
 * The one place organisation scoping happens (design.md §2): every read adds the caller's
 * organisation to the filter and every write refuses a record of another organisation. Services
 * use this instead of a raw TypeORM repository for org-owned records, so no query can forget it.
 */
export class ScopedRepository<T extends OrgOwned & ObjectLiteral> {
  constructor(
    private readonly repo: Repository<T>,
    private readonly what: string,
    private readonly orgId: () => string = () => RequestContext.requireCaller().organisationId,
  ) {}

  /** The same scope inside a transaction. */
  withManager(manager: EntityManager): ScopedRepository<T> {
    return new ScopedRepository(manager.getRepository<T>(this.repo.target), this.what, this.orgId);
  }

  /** Scope to an explicit organisation (seed, background jobs) rather than the caller's. */
  forOrganisation(organisationId: string): ScopedRepository<T> {
    return new ScopedRepository(this.repo, this.what, () => organisationId);
  }

  private scope(where: Where<T>): FindOptionsWhere<T> | FindOptionsWhere<T>[] {
    const org = { organisationId: this.orgId() } as FindOptionsWhere<T>;
    if (!where) return org;
    if (Array.isArray(where)) return where.map((w) => ({ ...w, ...org }));
    return { ...where, ...org };
  }

  find(options: FindManyOptions<T> = {}): Promise<T[]> {
    return this.repo.find({ ...options, where: this.scope(options.where as Where<T>) });
  }

  findAndCount(options: FindManyOptions<T> = {}): Promise<[T[], number]> {
    return this.repo.findAndCount({ ...options, where: this.scope(options.where as Where<T>) });
  }

  count(options: FindManyOptions<T> = {}): Promise<number> {
    return this.repo.count({ ...options, where: this.scope(options.where as Where<T>) });
  }

  findOne(options: FindOneOptions<T>): Promise<T | null> {
    return this.repo.findOne({ ...options, where: this.scope(options.where as Where<T>) });
  }

  /** A record of another organisation is "not there": 404, never 403 (no existence leak). */
  async getOne(options: FindOneOptions<T>): Promise<T> {
    const found = await this.findOne(options);
    if (!found) throw notFound(this.what);
    return found;
  }

  getById(id: string, options: Omit<FindOneOptions<T>, 'where'> = {}): Promise<T> {
    return this.getOne({ ...options, where: { id } as FindOptionsWhere<T> });
  }

  create(values: Omit<Partial<T>, 'organisationId'>): T {
    return this.repo.create({ ...values, organisationId: this.orgId() } as T);
  }

  async save(entity: T): Promise<T> {
    if (entity.organisationId !== this.orgId()) throw notFound(this.what);
    return this.repo.save(entity);
  }

  async saveMany(entities: T[]): Promise<T[]> {
    const org = this.orgId();
    if (entities.some((e) => e.organisationId !== org)) throw notFound(this.what);
    return this.repo.save(entities);
  }

  /** A query builder that already filters on the organisation; add joins and conditions with andWhere. */
  qb(alias: string): SelectQueryBuilder<T> {
    return this.repo.createQueryBuilder(alias).where(`${alias}.organisationId = :__org`, { __org: this.orgId() });
  }
}
