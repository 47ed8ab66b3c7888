import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnApplicationShutdown,
} from '@nestjs/common';
import PgBoss from 'pg-boss';
import type { EntityManager } from 'typeorm';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';

export const MAIL_QUEUE = 'outbound-mail';
/**
 * Mails per job: an import of 5,000 rows queues ~263 jobs rather than ~5,250, and a retry (with
 * back-off) of a job resends only its mails not yet sent. Small enough that a job finishes well
 * inside pg-boss's 15-minute expiry even when every send waits out the SMTP timeouts (20 × 40 s).
 */
export const MAILS_PER_JOB = 20;
/** `mailIds` since mails were batched; `mailId` is a job queued before that. */
export type MailJob = { mailIds: string[] } | { mailId: string };
export const mailIdsOf = (job: MailJob): string[] =>
  'mailIds' in job ? job.mailIds : [job.mailId];
export type MailJobHandler = (jobs: PgBoss.JobWithMetadata<MailJob>[]) => Promise<void>;

/** pg-boss runs SQL through this: inside our transaction, so a rolled-back change queues nothing. */
function inTransaction(em: EntityManager): PgBoss.Db {
  const runner = em.queryRunner;
  if (!runner?.isTransactionActive)
    throw new Error('Mail is queued only inside the transaction of the change that causes it');
  return {
    executeSql: async (text: string, values: unknown[]) => ({
      rows: (await runner.query(text, values, true)).records as unknown[],
    }),
  };
}

/**
 * The job queue for e-mail: pg-boss 10 (design.md §6), kept in PostgreSQL so several API
 * instances share it. Retries use pg-boss's exponential back-off. The server starts even when
 * PostgreSQL is down (health answers 503); the queue then starts on first use.
 */
@Injectable()
export class MailQueue implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('MailQueue');
  private readonly boss: PgBoss;
  private starting: Promise<void> | null = null;
  private workerId: string | null = null;
  private stopped = false;

  constructor(@Inject(ENV) private readonly env: Env) {
    this.boss = new PgBoss({
      connectionString: env.DATABASE_URL,
      max: 3,
      application_name: 'stavemark-mail-queue',
      // No cron jobs here; maintenance (expiry, archive) stays on.
      schedule: false,
    });
    this.boss.on('error', (err) => this.logger.warn(`job queue: ${err.message}`));
  }

  /**
   * Starts the queue before the server takes requests, so no transaction races pg-boss's own
   * start-up (schema, queue partition) for locks. With the database down the server still starts.
   */
  async onApplicationBootstrap(): Promise<void> {
    await this.ensureStarted().catch((err: unknown) => {
      this.logger.warn(
        `job queue not started yet: ${err instanceof Error ? err.message : String(err)}`,
      );
    });
  }

  /** Starts pg-boss (creating its schema on a new database) and the mail queue, once. */
  ensureStarted(): Promise<void> {
    if (this.stopped) return Promise.reject(new Error('The mail queue has stopped'));
    this.starting ??= (async () => {
      await this.boss.start();
      if (!(await this.boss.getQueue(MAIL_QUEUE))) {
        try {
          await this.boss.createQueue(MAIL_QUEUE, {
            name: MAIL_QUEUE,
            retryLimit: this.env.MAIL_RETRY_LIMIT,
            retryDelay: this.env.MAIL_RETRY_DELAY_SECONDS,
            retryBackoff: true,
          });
        } catch (err) {
          // Another instance created it at the same moment.
          if (!(await this.boss.getQueue(MAIL_QUEUE))) throw err;
        }
      }
    })().catch((err: unknown) => {
      this.starting = null;
      throw err;
    });
    return this.starting;
  }

  /** Registers the worker; retries in the background while the database is unreachable. */
  startWorker(handler: MailJobHandler): void {
    const attempt = (): void => {
      if (this.stopped) return;
      this.ensureStarted()
        .then(async () => {
          this.workerId = await this.boss.work<MailJob>(
            MAIL_QUEUE,
            {
              includeMetadata: true,
              // One job (up to MAILS_PER_JOB mails) per fetch: the expiry counts from the fetch.
              batchSize: 1,
              pollingIntervalSeconds: this.env.MAIL_POLL_SECONDS,
            },
            handler,
          );
        })
        .catch((err: unknown) => {
          this.logger.warn(
            `mail worker not started yet (${err instanceof Error ? err.message : String(err)}); retrying in 5 s`,
          );
          setTimeout(attempt, 5000).unref();
        });
    };
    attempt();
  }

  /** Queues the mails in jobs of up to MAILS_PER_JOB, in the caller's transaction. */
  async enqueue(em: EntityManager, mailIds: string[]): Promise<void> {
    if (mailIds.length === 0) return;
    const db = inTransaction(em);
    await this.ensureStarted();
    const jobs: { name: string; data: MailJob }[] = [];
    for (let i = 0; i < mailIds.length; i += MAILS_PER_JOB)
      jobs.push({ name: MAIL_QUEUE, data: { mailIds: mailIds.slice(i, i + MAILS_PER_JOB) } });
    await this.boss.insert(jobs, { db });
  }

  /** After commit: wake the worker instead of waiting for its next poll. */
  kick(): void {
    if (this.workerId) this.boss.notifyWorker(this.workerId);
  }

  async fail(jobId: string, err: unknown): Promise<void> {
    await this.boss.fail(MAIL_QUEUE, jobId, {
      message: err instanceof Error ? err.message : String(err),
    });
  }

  /** For tests and the Outbox: the pg-boss view of one job. */
  job(jobId: string): Promise<PgBoss.JobWithMetadata<MailJob> | null> {
    return this.boss.getJobById<MailJob>(MAIL_QUEUE, jobId);
  }

  async onApplicationShutdown(): Promise<void> {
    this.stopped = true;
    if (this.starting) {
      await this.starting.catch(() => undefined);
      await this.boss.stop({ graceful: true, timeout: 5000, wait: true }).catch(() => undefined);
    }
  }
}
