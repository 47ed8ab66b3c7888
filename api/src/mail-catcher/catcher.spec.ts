import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startMailCatcher, type RunningMailCatcher } from './catcher.js';
import { clearCaughtMail, listCaughtMail, readCaughtMail, waitForCaughtMail } from './mailbox.js';

// The sender side is nodemailer (a general-purpose library from the npm registry), so what is
// checked here is that a message as a real SMTP client sends it comes back intact.
function transportFor(catcher: RunningMailCatcher) {
  return nodemailer.createTransport({
    host: catcher.host,
    port: catcher.port,
    secure: false,
    ignoreTLS: true,
  });
}

describe('mail catcher', () => {
  let dir: string;
  let catcher: RunningMailCatcher;

  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'stavemark-mail-'));
    catcher = await startMailCatcher({ dir, port: 0 });
  });
  afterAll(async () => {
    await catcher.close();
    await rm(dir, { recursive: true, force: true });
  });
  beforeEach(async () => {
    await clearCaughtMail(dir);
  });

  it('stores a message with its envelope, headers, bodies and attachments', async () => {
    const pdfBytes = Buffer.from('%PDF-1.4\n% not a real report, just bytes\n');
    const info = await transportFor(catcher).sendMail({
      from: '"Stavemark" <noreply@demo.example>',
      to: '"Ada Teacher" <teacher@demo.example>, student@demo.example',
      cc: 'examiner@demo.example',
      bcc: 'admin@demo.example',
      subject: 'Mark sheet — Grade 3 piano',
      text: 'Your mark sheet is attached. Crotchet = 60.',
      html: '<p>Your mark sheet is attached. <b>Crotchet = 60.</b></p>',
      attachments: [
        { filename: 'mark-sheet.pdf', content: pdfBytes, contentType: 'application/pdf' },
      ],
    });
    expect(info.accepted).toHaveLength(4);

    const all = await listCaughtMail(dir);
    expect(all).toHaveLength(1);
    const mail = all[0]!;
    expect(mail.id).toMatch(/^\d{13}-[0-9a-f]{8}$/);
    expect(Number.isNaN(Date.parse(mail.receivedAt))).toBe(false);
    expect(mail.envelope.from).toBe('noreply@demo.example');
    // Bcc is only in the envelope, never in the headers.
    expect([...mail.envelope.to].sort()).toEqual(
      [
        'admin@demo.example',
        'examiner@demo.example',
        'student@demo.example',
        'teacher@demo.example',
      ].sort(),
    );
    expect(mail.from).toBe('"Stavemark" <noreply@demo.example>');
    expect(mail.to).toEqual(['"Ada Teacher" <teacher@demo.example>', 'student@demo.example']);
    expect(mail.cc).toEqual(['examiner@demo.example']);
    expect([...mail.to, ...mail.cc].join(' ')).not.toContain('admin@');
    expect(mail.messageId).toBe(info.messageId);
    expect(mail.subject).toBe('Mark sheet — Grade 3 piano');
    expect(mail.text.trim()).toBe('Your mark sheet is attached. Crotchet = 60.');
    expect(mail.html).toBe('<p>Your mark sheet is attached. <b>Crotchet = 60.</b></p>');
    expect(mail.attachments).toHaveLength(1);
    const att = mail.attachments[0]!;
    expect(att.filename).toBe('mark-sheet.pdf');
    expect(att.contentType).toBe('application/pdf');
    expect(att.size).toBe(pdfBytes.length);
    expect(Buffer.from(att.contentBase64, 'base64').equals(pdfBytes)).toBe(true);

    expect(await readCaughtMail(dir, mail.id)).toEqual(mail);
  });

  it('keeps arrival order, reads by id, and clears', async () => {
    const t = transportFor(catcher);
    for (const n of [1, 2, 3]) {
      await t.sendMail({
        from: 'a@demo.example',
        to: 'b@demo.example',
        subject: `n${n}`,
        text: `${n}`,
      });
    }
    const all = await listCaughtMail(dir);
    expect(all.map((m) => m.subject)).toEqual(['n1', 'n2', 'n3']);
    expect(all[1]!.html).toBeNull();
    expect(all[1]!.attachments).toEqual([]);

    expect(await readCaughtMail(dir, '0000000000000-00000000')).toBeNull();
    // Ids that are not ours (for example a path) are never read.
    expect(await readCaughtMail(dir, '../etc/passwd')).toBeNull();

    expect(await clearCaughtMail(dir)).toBe(3);
    expect(await listCaughtMail(dir)).toEqual([]);
  });

  it('waits for a message that arrives later', async () => {
    const waiting = waitForCaughtMail(dir, (m) => m.subject === 'later', { timeoutMs: 5000 });
    setTimeout(() => {
      void transportFor(catcher).sendMail({
        from: 'a@demo.example',
        to: 'b@demo.example',
        subject: 'later',
        text: 'x',
      });
    }, 200);
    expect((await waiting).envelope.to).toEqual(['b@demo.example']);
    await expect(
      waitForCaughtMail(dir, (m) => m.subject === 'never', { timeoutMs: 300 }),
    ).rejects.toThrow(/No matching mail arrived/);
  });

  it('leaves no temp files behind and ignores foreign files in the folder', async () => {
    await transportFor(catcher).sendMail({
      from: 'a@demo.example',
      to: 'b@demo.example',
      subject: 's',
      text: 't',
    });
    await writeFile(join(dir, 'notes.json'), '{}');
    const names = await readdir(dir);
    expect(names.filter((n) => n.endsWith('.tmp'))).toEqual([]);
    expect(await listCaughtMail(dir)).toHaveLength(1);
    await rm(join(dir, 'notes.json'));
  });

  it('reports a corrupt stored file clearly instead of skipping it', async () => {
    await writeFile(join(dir, '0000000000001-deadbeef.json'), '{ not json');
    await expect(listCaughtMail(dir)).rejects.toThrow(
      /0000000000001-deadbeef\.json is not valid JSON/,
    );
    await rm(join(dir, '0000000000001-deadbeef.json'));
  });

  it('lists nothing for a folder that does not exist yet', async () => {
    expect(await listCaughtMail(join(dir, 'missing'))).toEqual([]);
  });
});

describe('mail catcher limits', () => {
  const cleanups: Array<() => Promise<void>> = [];
  afterEach(async () => {
    while (cleanups.length) await cleanups.pop()!();
  });
  async function tempDir() {
    const d = await mkdtemp(join(tmpdir(), 'stavemark-mail-'));
    cleanups.push(() => rm(d, { recursive: true, force: true }));
    return d;
  }

  it('refuses an oversized message with 552 and stores nothing', async () => {
    const dir = await tempDir();
    const catcher = await startMailCatcher({ dir, port: 0, maxBytes: 2048 });
    cleanups.push(() => catcher.close());
    await expect(
      transportFor(catcher).sendMail({
        from: 'a@demo.example',
        to: 'b@demo.example',
        subject: 'big',
        text: 'x'.repeat(10_000),
      }),
    ).rejects.toMatchObject({ responseCode: 552 });
    expect(await listCaughtMail(dir)).toEqual([]);
  });

  it('will not listen on a non-loopback address', async () => {
    await expect(
      startMailCatcher({ dir: await tempDir(), host: '0.0.0.0', port: 0 }),
    ).rejects.toThrow(/not a loopback address/);
  });

  it('says so when the port is taken', async () => {
    const dir = await tempDir();
    const first = await startMailCatcher({ dir, port: 0 });
    cleanups.push(() => first.close());
    await expect(startMailCatcher({ dir, port: first.port })).rejects.toThrow(/already in use/);
  });
});
