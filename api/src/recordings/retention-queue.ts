import { Inject, Injectable, Logger, type OnApplicationBootstrap, type OnApplicationShutdown } from '@nestjs/common';
import PgBoss from 'pg-boss';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { RecordingsRetention } from './recordings-retention.js';

export const RETENTION_QUEUE = 'recording-retention';

/**
 * Deletes recordings past their organisation's retention period on a pg-boss schedule (design.md
 * §6: the same pg-boss 10 schema and start-up pattern as the mail queue). pg-boss runs the cron
 * once across all API instances, so two servers never delete the same batch twice. This instance
 * only schedules and works this queue; the mail queue's instance keeps doing maintenance.
 */
@Injectable()
export class RetentionQueue implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('RecordingRetention');
  private boss: PgBoss | null = null;
  private starting: Promise<void> | null = null;
  private stopped = false;

  constructor(
    @Inject(ENV) private readonly env: Env,
    private readonly retention: RecordingsRetention,
  ) {}

  onApplicationBootstrap(): void {
    if (!this.env.RECORDING_RETENTION_WORKER_ENABLED) return;
    // In the background: a server whose database is down still starts (health answers 503).
    this.start();
  }

  private start(): void {
    if (this.stopped) return;
    this.starting = (async () => {
      const boss = new PgBoss({
        connectionString: this.env.DATABASE_URL,
        max: 2,
        application_name: 'stavemark-recording-retention',
        supervise: false,
        schedule: true,
      });
      boss.on('error', (err) => this.logger.warn(`job queue: ${err.message}`));
      this.boss = boss;
      await boss.start();
      if (!(await boss.getQueue(RETENTION_QUEUE))) {
        await boss.createQueue(RETENTION_QUEUE, { name: RETENTION_QUEUE, retryLimit: 3, retryDelay: 300 }).catch(async (err: unknown) => {
          if (!(await boss.getQueue(RETENTION_QUEUE))) throw err;
        });
      }
      await boss.schedule(RETENTION_QUEUE, this.env.RECORDING_RETENTION_CRON, {}, { tz: 'UTC' });
      await boss.work(RETENTION_QUEUE, { pollingIntervalSeconds: 30 }, async () => {
        const n = await this.retention.purgeExpired();
        if (n) this.logger.log(`deleted ${n} recording(s) past their retention period`);
      });
    })().catch((err: unknown) => {
      this.logger.warn(`retention job not started yet (${err instanceof Error ? err.message : String(err)}); retrying in 30 s`);
      const b = this.boss;
      this.boss = null;
      void b?.stop({ graceful: false, wait: false }).catch(() => undefined);
      setTimeout(() => this.start(), 30_000).unref();
    });
  }

  /** For tests: the schedules pg-boss holds. */
  async schedules(): Promise<PgBoss.Schedule[]> {
    await this.starting;
    return this.boss ? this.boss.getSchedules() : [];
  }

  async onApplicationShutdown(): Promise<void> {
    this.stopped = true;
    await this.starting?.catch(() => undefined);
    await this.boss?.stop({ graceful: true, timeout: 5000, wait: true }).catch(() => undefined);
  }
}
