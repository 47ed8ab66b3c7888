import { Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import { bulkInsert } from '../common/bulk-sql.js';
import type { MailKind } from './entities/outbound-mail.entity.js';
import { MailQueue } from './mail-queue.js';
import type { MailData } from './templates.js';

export interface NewMail {
  organisationId: string | null;
  kind: MailKind;
  toAddress: string;
  toName: string;
  data: MailData;
  accountTokenId: string | null;
  /** The sitting a sitting mail is about. */
  sittingId?: string | null;
}

/**
 * Writes e-mails as OutboundMail rows plus their jobs in the caller's transaction (design.md §7):
 * a rolled-back change sends nothing. Call `afterCommit()` once the transaction has committed.
 */
@Injectable()
export class MailService {
  constructor(private readonly queue: MailQueue) {}

  async enqueue(em: EntityManager, mails: NewMail[]): Promise<string[]> {
    const ids = await bulkInsert(
      em,
      'outbound_mail',
      [
        { name: 'organisation_id', type: 'uuid' },
        { name: 'kind', type: 'text' },
        { name: 'to_address', type: 'text' },
        { name: 'to_name', type: 'text' },
        { name: 'data', type: 'jsonb' },
        { name: 'account_token_id', type: 'uuid' },
        { name: 'sitting_id', type: 'uuid' },
      ],
      mails.map((m) => [m.organisationId, m.kind, m.toAddress, m.toName, m.data, m.accountTokenId, m.sittingId ?? null]),
      'id',
    ).then((rows) => rows.map((r) => r.id!));
    await this.queue.enqueue(em, ids);
    return ids;
  }

  afterCommit(): void {
    this.queue.kick();
  }
}
