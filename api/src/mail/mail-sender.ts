import { Inject, Injectable, Logger, type OnApplicationBootstrap } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import nodemailer, { type Transporter } from 'nodemailer';
import type PgBoss from 'pg-boss';
import { IsNull, Repository } from 'typeorm';
import { now } from '../common/clock.js';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { AccountToken } from '../invitations/entities/account-token.entity.js';
import {
  hashLinkToken,
  linkLifetimeMs,
  linkUrl,
  newLinkToken,
} from '../invitations/link-tokens.js';
import { OutboundMail } from './entities/outbound-mail.entity.js';
import { mailIdsOf, MailQueue, type MailJob } from './mail-queue.js';
import { lifetimeWords, renderMail, type LinkFacts, type MailData } from './templates.js';

/** Sends queued mail over SMTP (nodemailer): the local catcher in development and tests, any server in production. */
@Injectable()
export class MailSender implements OnApplicationBootstrap {
  private readonly logger = new Logger('MailSender');
  private readonly transport: Transporter;

  constructor(
    @Inject(ENV) private readonly env: Env,
    private readonly queue: MailQueue,
    @InjectRepository(OutboundMail) private readonly mails: Repository<OutboundMail>,
    @InjectRepository(AccountToken) private readonly tokens: Repository<AccountToken>,
  ) {
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

  onApplicationBootstrap(): void {
    if (!this.env.MAIL_WORKER_ENABLED) return;
    this.queue.startWorker((jobs) => this.process(jobs));
  }

  /**
   * One batch from the queue. Every mail of a job is tried; a job with a failed mail fails as a
   * whole, so pg-boss retries it with back-off, and the retry skips the mails already sent.
   */
  async process(jobs: PgBoss.JobWithMetadata<MailJob>[]): Promise<void> {
    for (const job of jobs) {
      let failure: unknown = null;
      for (const mailId of mailIdsOf(job.data)) {
        try {
          await this.sendOne(mailId, job.retryCount >= job.retryLimit);
        } catch (err) {
          this.logger.warn(
            `mail ${mailId}: attempt ${job.retryCount + 1} failed: ${(err as Error).message}`,
          );
          failure ??= err;
        }
      }
      if (failure) await this.queue.fail(job.id, failure);
    }
  }

  async sendOne(mailId: string, lastTry: boolean): Promise<void> {
    const mail = await this.mails.findOne({
      where: { id: mailId },
      relations: { accountToken: true },
    });
    if (!mail || mail.status === 'sent' || mail.status === 'cancelled') return;
    await this.mails.update({ id: mail.id }, { status: 'sending', attempts: () => 'attempts + 1' });

    let link: LinkFacts | null = null;
    if (mail.accountToken) {
      link = await this.mintLink(mail.accountToken);
      if (!link) {
        await this.mails.update(
          { id: mail.id },
          {
            status: 'cancelled',
            lastError: 'The link was already used or replaced; nothing to send.',
          },
        );
        return;
      }
    }
    const rendered = renderMail(mail.kind, mail.data as unknown as MailData, link);
    try {
      const info = (await this.transport.sendMail({
        from: this.env.MAIL_FROM,
        to: { name: mail.toName, address: mail.toAddress },
        subject: rendered.subject,
        text: rendered.text,
        html: rendered.html,
        attachments: rendered.attachments,
      })) as { messageId?: string };
      await this.mails.update(
        { id: mail.id },
        {
          status: 'sent',
          sentAt: new Date(),
          messageId: info.messageId ?? null,
          subject: rendered.subject,
          lastError: null,
        },
      );
    } catch (err) {
      await this.mails.update(
        { id: mail.id },
        {
          status: lastTry ? 'failed' : 'retrying',
          subject: rendered.subject,
          lastError: (err as Error).message.slice(0, 500),
        },
      );
      throw err;
    }
  }

  /**
   * A fresh token for this sending: only its hash is stored, and the expiry counts from now. A
   * retry mints another, so a link from an attempt that never arrived cannot be used.
   */
  private async mintLink(token: AccountToken): Promise<LinkFacts | null> {
    const raw = newLinkToken();
    const lifetime = linkLifetimeMs(token.purpose, this.env);
    const result = await this.tokens.update(
      { id: token.id, usedAt: IsNull(), revokedAt: IsNull() },
      { tokenHash: hashLinkToken(raw), expiresAt: new Date(now().getTime() + lifetime) },
    );
    if (!result.affected) return null;
    return {
      url: linkUrl(this.env.PUBLIC_URL, token.purpose, raw),
      forgotUrl: `${this.env.PUBLIC_URL.replace(/\/$/, '')}/account/forgot-password`,
      lifetime: lifetimeWords(lifetime),
    };
  }
}
