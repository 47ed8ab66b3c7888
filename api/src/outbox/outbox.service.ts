import { Inject, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { OutboxItem, OutboxList } from '@stavemark/shared';
import { RequestContext } from '../common/request-context.js';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { listCaughtMail } from '../mail-catcher/mailbox.js';

/**
 * What the local mail catcher received (development, demo and tests only), joined to our
 * OutboundMail rows by Message-ID: an admin sees the mail of their own organisation, and password
 * resets sent to its members.
 */
@Injectable()
export class OutboxService {
  constructor(
    @Inject(ENV) private readonly env: Env,
    @InjectDataSource() private readonly db: DataSource,
  ) {}

  async list(): Promise<OutboxList> {
    const dir = this.env.MAIL_CATCHER_DIR;
    if (!dir) return { catcher: false, items: [] };
    const caught = await listCaughtMail(dir);
    const ids = caught.map((m) => m.messageId).filter((x): x is string => !!x);
    if (ids.length === 0) return { catcher: true, items: [] };
    const org = RequestContext.requireCaller().organisationId;
    const rows = (await this.db.query(
      `SELECT o.message_id, o.kind, o.status, o.attempts FROM outbound_mail o
        WHERE o.message_id = ANY($1)
          AND (o.organisation_id = $2
               OR (o.organisation_id IS NULL AND EXISTS (
                     SELECT 1 FROM people p JOIN memberships m ON m.person_id = p.id
                      WHERE p.email = o.to_address AND m.organisation_id = $2)))`,
      [ids, org],
    )) as { message_id: string; kind: OutboxItem['kind']; status: string; attempts: number }[];
    const ours = new Map(rows.map((r) => [r.message_id, r]));
    const items: OutboxItem[] = [];
    for (const m of caught) {
      const row = m.messageId ? ours.get(m.messageId) : undefined;
      if (!row) continue;
      items.push({
        id: m.id,
        receivedAt: m.receivedAt,
        to: m.to,
        subject: m.subject,
        text: m.text,
        html: m.html,
        kind: row.kind,
        status: row.status,
        attempts: row.attempts,
      });
    }
    // Newest first, at most 200.
    return { catcher: true, items: items.reverse().slice(0, 200) };
  }
}
