import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import type { BandPolicyBody, BandPolicyVersionView, BandPolicyView } from '@stavemark/shared';
import { AuditService } from '../audit/audit.service.js';
import { RequestContext } from '../common/request-context.js';
import { ScopedRepository } from '../common/scoped-repository.js';
import { BandPolicyVersion } from './entities/band-policy.entity.js';
import { SittingsService } from './sittings.service.js';

function toView(v: BandPolicyVersion): BandPolicyVersionView {
  return {
    id: v.id,
    version: v.version,
    bands: v.bands,
    below: v.below,
    createdAt: v.createdAt.toISOString(),
    createdBy: v.createdBy ? { id: v.createdBy.id, displayName: v.createdBy.displayName } : null,
  };
}

/** The organisation's band policy as versions (design.md §4.1): an edit is a new version; sittings pin one. */
@Injectable()
export class BandPolicyService {
  private readonly versions: ScopedRepository<BandPolicyVersion>;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(BandPolicyVersion) repo: Repository<BandPolicyVersion>,
    private readonly sittings: SittingsService,
    private readonly audit: AuditService,
  ) {
    this.versions = new ScopedRepository(repo, 'band policy');
  }

  async get(): Promise<BandPolicyView> {
    await this.db.transaction((em) => this.sittings.currentBandPolicy(em));
    const all = await this.versions.find({ relations: { createdBy: true }, order: { version: 'DESC' } });
    return { current: toView(all[0]!), versions: all.map(toView) };
  }

  async create(body: BandPolicyBody): Promise<BandPolicyView> {
    await this.db.transaction(async (em) => {
      const current = await this.sittings.currentBandPolicy(em);
      // Serialise concurrent edits: the unique (organisation, version) index refuses a twin anyway.
      await em.query(`SELECT pg_advisory_xact_lock(hashtext('band_policies:' || $1))`, [current.organisationId]);
      const latest = await this.versions.withManager(em).findOne({ where: {}, order: { version: 'DESC' } });
      const repo = this.versions.withManager(em);
      const v = await repo.save(repo.create({ version: (latest?.version ?? 0) + 1, bands: body.bands, below: body.below, createdByPersonId: RequestContext.requireCaller().personId }));
      await this.audit.record({ action: 'band_policy.version_created', entity: 'band_policy', entityId: v.id, before: latest ? { version: latest.version, bands: latest.bands, below: latest.below } : null, after: { version: v.version, ...body } }, em);
    });
    return this.get();
  }
}
