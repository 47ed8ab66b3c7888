import { mkdtemp, rm } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../test/support/test-app.js';
import { startMailCatcher, type RunningMailCatcher } from '../mail-catcher/catcher.js';
import { waitForCaughtMail } from '../mail-catcher/mailbox.js';
import { OutboundMail } from './entities/outbound-mail.entity.js';
import { MailQueue } from './mail-queue.js';
import { MailService } from './mail.service.js';
import { listNames, renderMail } from './templates.js';

/** A port nothing listens on (bound, then released). */
async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

describe('e-mail templates', () => {
  const link = {
    url: 'http://localhost:3000/account/welcome#token=abc',
    forgotUrl: 'http://localhost:3000/account/forgot-password',
    lifetime: '72 hours',
  };
  it('text and HTML parts; names are escaped in HTML', () => {
    const m = renderMail(
      'invitation',
      { organisationName: 'Kestrel <Lane> & Co', displayName: 'Ada "A" Pendry' },
      link,
    );
    expect(m.subject).toBe('Welcome to Stavemark at Kestrel <Lane> & Co');
    expect(m.text).toContain('Hello Ada "A" Pendry,');
    expect(m.text).toContain(link.url);
    expect(m.html).toContain('Kestrel &lt;Lane&gt; &amp; Co');
    expect(m.html).toContain('Ada &quot;A&quot; Pendry');
    expect(m.html).not.toContain('<Lane>');
    expect(m.html).toContain(`href="${link.url}"`);
  });
  it('lists children as people write them', () => {
    expect(listNames(['Ada'])).toBe('Ada');
    expect(listNames(['Ada', 'Bram'])).toBe('Ada and Bram');
    expect(listNames(['Ada', 'Bram', 'Cleo'])).toBe('Ada, Bram and Cleo');
  });
});

describe('outbound mail: written with the change, sent after commit, retried with back-off', () => {
  let t: TestApp;
  let port: number;
  let dir: string;
  let catcher: RunningMailCatcher | undefined;

  beforeAll(async () => {
    port = await freePort();
    dir = await mkdtemp(join(tmpdir(), 'stavemark-retry-'));
    // Nothing listens on the SMTP port yet, so the first attempt fails.
    t = await createTestApp({
      seed: false,
      env: { SMTP_PORT: String(port), MAIL_RETRY_DELAY_SECONDS: '1', MAIL_POLL_SECONDS: '0.5' },
    });
  });
  afterAll(async () => {
    await t?.close();
    await catcher?.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('a rolled-back transaction leaves no mail and no job', async () => {
    const mail = t.app.get(MailService);
    await expect(
      t.db.transaction(async (em) => {
        await mail.enqueue(em, [
          {
            organisationId: null,
            kind: 'password_reset',
            toAddress: 'x@demo.example',
            toName: 'X',
            data: { displayName: 'X' },
            accountTokenId: null,
          },
        ]);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(await t.db.getRepository(OutboundMail).count()).toBe(0);
    const jobs = (await t.db.query(
      `SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'outbound-mail'`,
    )) as { n: number }[];
    expect(jobs[0]!.n).toBe(0);
  });

  it('queues mails 20 to a job, every mail in exactly one job', async () => {
    const mail = t.app.get(MailService);
    const mails = Array.from({ length: 50 }, (_, i) => ({
      organisationId: null,
      kind: 'password_reset' as const,
      toAddress: `batch${i}@demo.example`,
      toName: `Batch ${i}`,
      data: { displayName: `Batch ${i}` },
      accountTokenId: null,
    }));
    // Looked at inside the transaction, then rolled back, so the worker never sees them.
    const seen = await t.db
      .transaction(async (em) => {
        const ids = await mail.enqueue(em, mails);
        const jobs = (await em.query(
          `SELECT data->'mailIds' AS ids FROM pgboss.job WHERE name = 'outbound-mail' AND data->'mailIds' ?| $1`,
          [ids],
        )) as { ids: string[] }[];
        throw Object.assign(new Error('rollback'), { ids, jobs });
      })
      .catch((err: { ids: string[]; jobs: { ids: string[] }[] }) => err);
    expect(seen.jobs.map((j) => j.ids.length).sort((a, b) => a - b)).toEqual([10, 20, 20]);
    expect(seen.jobs.flatMap((j) => j.ids).sort()).toEqual([...seen.ids].sort());
  });

  it('refuses to queue outside a transaction', async () => {
    await expect(
      t.app.get(MailQueue).enqueue(t.db.manager, ['00000000-0000-4000-8000-000000000000']),
    ).rejects.toThrow(/inside the transaction/);
  });

  it('a failed send is marked retrying and sent once the SMTP server answers', async () => {
    const mail = t.app.get(MailService);
    // A reset mail carries a link; without a token row the template refuses, so use one.
    const [person] = (await t.db.query(
      `INSERT INTO people (email, display_name) VALUES ('retry@demo.example', 'Rita Retry') RETURNING id`,
    )) as { id: string }[];
    const [tok] = (await t.db.query(
      `INSERT INTO account_tokens (purpose, person_id) VALUES ('password_reset', $1) RETURNING id`,
      [person!.id],
    )) as { id: string }[];
    const [id] = await t.db.transaction((em) =>
      mail.enqueue(em, [
        {
          organisationId: null,
          kind: 'password_reset',
          toAddress: 'retry@demo.example',
          toName: 'Rita Retry',
          data: { displayName: 'Rita Retry' },
          accountTokenId: tok!.id,
        },
      ]),
    );
    mail.afterCommit();
    const repo = t.db.getRepository(OutboundMail);
    const deadline = Date.now() + 10_000;
    let row = await repo.findOneByOrFail({ id: id! });
    while (row.status !== 'retrying' && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 100));
      row = await repo.findOneByOrFail({ id: id! });
    }
    expect(row).toMatchObject({ status: 'retrying', attempts: 1 });
    expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
    // The row is marked first, then the job is failed back to the queue: wait for both.
    const jobOf = async () =>
      (
        (await t.db.query(
          `SELECT state, retry_count, start_after > now() AS later FROM pgboss.job WHERE data->'mailIds' ? $1`,
          [id],
        )) as {
          state: string;
          retry_count: number;
          later: boolean;
        }[]
      )[0];
    let job = await jobOf();
    while (job?.state !== 'retry' && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 50));
      job = await jobOf();
    }
    // pg-boss counts the retry when it fetches the job again; the next try waits (back-off).
    expect(job).toMatchObject({ state: 'retry', retry_count: 0, later: true });

    // The SMTP server comes back; the retry (after pg-boss's back-off) delivers it.
    catcher = await startMailCatcher({ dir, port });
    const caught = await waitForCaughtMail(
      dir,
      (m) => m.envelope.to.includes('retry@demo.example'),
      { timeoutMs: 15_000 },
    );
    expect(caught.subject).toBe('Choose a new Stavemark password');
    const deadline2 = Date.now() + 5000;
    while ((await repo.findOneByOrFail({ id: id! })).status !== 'sent' && Date.now() < deadline2)
      await new Promise((r) => setTimeout(r, 100));
    const sent = await repo.findOneByOrFail({ id: id! });
    expect(sent).toMatchObject({ status: 'sent', lastError: null, messageId: caught.messageId });
    expect(sent.attempts).toBeGreaterThanOrEqual(2);
  });
});
