import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { EntityManager, Repository } from 'typeorm';
import { ScopedRepository } from '../common/scoped-repository.js';
import { RequestContext } from '../common/request-context.js';
import { AuditEvent } from './entities/audit-event.entity.js';

@Injectable()
export class AuditService {
  private readonly events: ScopedRepository<AuditEvent>;

  constructor(@InjectRepository(AuditEvent) repo: Repository<AuditEvent>) {
    this.events = new ScopedRepository(repo, 'audit event');
  }

  /** Records a change; pass the transaction's manager so the event commits with the change. */
  async record(
    change: { action: string; entity: string; entityId: string; before?: object | null; after?: object | null },
    manager?: EntityManager,
  ): Promise<void> {
    const repo = manager ? this.events.withManager(manager) : this.events;
    await repo.save(
      repo.create({
        actorPersonId: RequestContext.caller()?.personId ?? null,
        action: change.action,
        entity: change.entity,
        entityId: change.entityId,
        before: (change.before as Record<string, unknown> | null) ?? null,
        after: (change.after as Record<string, unknown> | null) ?? null,
      }),
    );
  }
}
