// Sending sitting invitations. The product's mail module (api/src/mail) renders a fixed set of
// kinds and sends no attachments yet, so sittings write their own rows (SittingMail, shaped like
// OutboundMail) behind this small interface and queue them in pg-boss like the mail module does:
// written in the change's transaction, sent after commit, retried with back-off. When OutboundMail
// gains attachments and a sitting kind, an implementation over MailService replaces this one.
import { Inject, Injectable, Logger, type OnApplicationBootstrap, type OnApplicationShutdown } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import nodemailer, { type Transporter } from 'nodemailer';
import PgBoss from 'pg-boss';
import type { EntityManager, Repository } from 'typeorm';
import { bulkInsert } from '../common/bulk-sql.js';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { SittingMail } from './entities/sitting-mail.entity.js';
import type { OutgoingInvitation } from './sitting-invitations.js';

export interface SittingMailContext {
  organisationId: string;
  sittingId: string;
}

export abstract class SittingMailer {
  /** Writes the mails in the caller's transaction; nothing is sent if it rolls back. */
  abstract enqueue(em: EntityManager, ctx: SittingMailContext, mails: OutgoingInvitation[]): Promise<string[]>;
  /** After commit: send now rather than at the next poll. */
  abstract afterCommit(): void;
}

export const SITTING_MAIL_QUEUE = 'sitting-mail';

@Injectable()
export class QueuedSittingMailer extends SittingMailer implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('SittingMailer');
  private readonly boss: PgBoss;
  private readonly transport: Transporter;
  private starting: Promise<void> | null = null;
  private workerId: string | null = null;
  private stopped = false;

  constructor(
    @Inject(ENV) private readonly env: Env,
    @InjectRepository(SittingMail) private readonly mails: Repository<SittingMail>,
  ) {
    super();
    this.boss = new PgBoss({ connectionString: env.DATABASE_URL, max: 2, application_name: 'stavemark-sitting-mail', schedule: false });
    this.boss.on('error', (err) => this.logger.warn(`job queue: ${err.message}`));
    this.transport = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 20_000,
    });
  }

  private ensureStarted(): Promise<void> {
    if (this.stopped) return Promise.reject(new Error('The sitting mail queue has stopped'));
    this.starting ??= (async () => {
      await this.boss.start();
      if (!(await this.boss.getQueue(SITTING_MAIL_QUEUE))) {
        try {
          await this.boss.createQueue(SITTING_MAIL_QUEUE, {
            name: SITTING_MAIL_QUEUE,
            retryLimit: this.env.MAIL_RETRY_LIMIT,
            retryDelay: this.env.MAIL_RETRY_DELAY_SECONDS,
            retryBackoff: true,
          });
        } catch (err) {
          if (!(await this.boss.getQueue(SITTING_MAIL_QUEUE))) throw err; // else another instance made it
        }
      }
    })().catch((err: unknown) => {
      this.starting = null;
      throw err;
    });
    return this.starting;
  }

  onApplicationBootstrap(): void {
    const attempt = (): void => {
      if (this.stopped) return;
      this.ensureStarted()
        .then(async () => {
          this.workerId = await this.boss.work<{ mailId: string }>(
            SITTING_MAIL_QUEUE,
            { includeMetadata: true, batchSize: 10, pollingIntervalSeconds: this.env.MAIL_POLL_SECONDS },
            (jobs) => this.process(jobs),
          );
        })
        .catch((err: unknown) => {
          this.logger.warn(`sitting mail worker not started yet (${err instanceof Error ? err.message : String(err)}); retrying in 5 s`);
          setTimeout(attempt, 5000).unref();
        });
    };
    attempt();
  }

  async enqueue(em: EntityManager, ctx: SittingMailContext, mails: OutgoingInvitation[]): Promise<string[]> {
    if (mails.length === 0) return [];
    const runner = em.queryRunner;
    if (!runner?.isTransactionActive) throw new Error('Sitting mail is queued only inside the transaction of the change that causes it');
    const rows = await bulkInsert(
      em,
      'sitting_mail',
      [
        { name: 'organisation_id', type: 'uuid' },
        { name: 'sitting_id', type: 'uuid' },
        { name: 'kind', type: 'text' },
        { name: 'to_address', type: 'text' },
        { name: 'to_name', type: 'text' },
        { name: 'subject', type: 'text' },
        { name: 'body_text', type: 'text' },
        { name: 'ics', type: 'text' },
        { name: 'ics_filename', type: 'text' },
      ],
      mails.map((m) => [ctx.organisationId, ctx.sittingId, m.kind, m.to.address, m.to.name, m.subject, m.text, m.ics, m.filename]),
      'id',
    );
    const ids = rows.map((r) => r.id!);
    await this.ensureStarted();
    // pg-boss writes its jobs through our transaction, so a rolled-back change queues nothing.
    const db: PgBoss.Db = { executeSql: async (text, values) => ({ rows: (await runner.query(text, values as unknown[], true)).records as unknown[] }) };
    await this.boss.insert(ids.map((mailId) => ({ name: SITTING_MAIL_QUEUE, data: { mailId } })), { db });
    return ids;
  }

  afterCommit(): void {
    if (this.workerId) this.boss.notifyWorker(this.workerId);
  }

  async process(jobs: PgBoss.JobWithMetadata<{ mailId: string }>[]): Promise<void> {
    for (const job of jobs) {
      try {
        await this.sendOne(job.data.mailId, job.retryCount >= job.retryLimit);
      } catch (err) {
        this.logger.warn(`sitting mail ${job.data.mailId}: attempt ${job.retryCount + 1} failed: ${(err as Error).message}`);
        await this.boss.fail(SITTING_MAIL_QUEUE, job.id, { message: (err as Error).message });
      }
    }
  }

  private async sendOne(mailId: string, lastTry: boolean): Promise<void> {
    const mail = await this.mails.findOne({ where: { id: mailId } });
    if (!mail || mail.status === 'sent') return;
    await this.mails.update({ id: mail.id }, { status: 'sending', attempts: () => 'attempts + 1' });
    try {
      const info = (await this.transport.sendMail({
        from: this.env.MAIL_FROM,
        to: { name: mail.toName, address: mail.toAddress },
        subject: mail.subject,
        text: mail.bodyText,
        attachments: [{ filename: mail.icsFilename, content: mail.ics, contentType: 'text/calendar; charset=utf-8; method=PUBLISH' }],
      })) as { messageId?: string };
      await this.mails.update({ id: mail.id }, { status: 'sent', sentAt: new Date(), messageId: info.messageId ?? null, lastError: null });
    } catch (err) {
      await this.mails.update({ id: mail.id }, { status: lastTry ? 'failed' : 'retrying', lastError: (err as Error).message.slice(0, 500) });
      throw err;
    }
  }

  async onApplicationShutdown(): Promise<void> {
    this.stopped = true;
    if (this.starting) {
      await this.starting.catch(() => undefined);
      await this.boss.stop({ graceful: true, timeout: 5000, wait: true }).catch(() => undefined);
    }
  }
}
