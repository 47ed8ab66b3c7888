// Local SMTP server for development, the demo and tests: accepts every message sent to it and
// stores it as one JSON file (see mailbox.ts for the shape and the reader). No auth and no TLS,
// so it only ever listens on a loopback address.
//
// Run: node api/dist/mail-catcher/catcher.js   (env MAIL_CATCHER_PORT, MAIL_CATCHER_DIR,
// MAIL_CATCHER_HOST, MAIL_CATCHER_MAX_BYTES); normally started by api/scripts/mail.sh.
import { randomBytes } from 'node:crypto';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { simpleParser, type AddressObject, type EmailAddress } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import type { CaughtMail } from './mailbox.js';

export interface MailCatcherOptions {
  /** Folder for the JSON files; created when missing. */
  dir: string;
  /** Loopback address only (default 127.0.0.1). */
  host?: string;
  /** 0 picks a free port (see `port` on the result). Default 2525. */
  port?: number;
  /** Larger messages are refused with SMTP 552. Default 25 MiB. */
  maxBytes?: number;
  log?: (line: string) => void;
}

export interface RunningMailCatcher {
  host: string;
  port: number;
  dir: string;
  close(): Promise<void>;
}

export const DEFAULT_MAIL_CATCHER_PORT = 2525;
const DEFAULT_MAX_BYTES = 25 * 1024 * 1024;

export function isLoopbackHost(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127(\.\d{1,3}){3}$/.test(host);
}

function formatAddress(a: EmailAddress): string[] {
  // Group syntax ("Team: a@x, b@x;") nests addresses; list the members.
  if (a.group && a.group.length > 0) return a.group.flatMap(formatAddress);
  if (!a.address) return a.name ? [a.name] : [];
  return [a.name ? `"${a.name}" <${a.address}>` : a.address];
}

function addressList(field: AddressObject | AddressObject[] | undefined): string[] {
  if (!field) return [];
  const objects = Array.isArray(field) ? field : [field];
  return objects.flatMap((o) => o.value.flatMap(formatAddress));
}

let lastIdMs = 0;
/** Ids sort in arrival order within one catcher process, even within one millisecond. */
function nextId(): string {
  const now = Math.max(Date.now(), lastIdMs + 1);
  lastIdMs = now;
  return `${String(now).padStart(13, '0')}-${randomBytes(4).toString('hex')}`;
}

async function readAll(stream: SMTPServerDataStream): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

async function storeMessage(
  dir: string,
  raw: Buffer,
  session: SMTPServerSession,
): Promise<CaughtMail> {
  const parsed = await simpleParser(raw);
  const id = nextId();
  const mail: CaughtMail = {
    id,
    receivedAt: new Date().toISOString(),
    envelope: {
      from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
      to: session.envelope.rcptTo.map((r) => r.address),
    },
    from: parsed.from?.text ?? '',
    to: addressList(parsed.to),
    cc: addressList(parsed.cc),
    messageId: parsed.messageId ?? null,
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
    attachments: parsed.attachments.map((a) => ({
      filename: a.filename ?? null,
      contentType: a.contentType,
      size: a.size,
      contentBase64: a.content.toString('base64'),
    })),
  };
  await mkdir(dir, { recursive: true });
  // Write then rename, so a reader never sees half a file.
  const tmp = join(dir, `.${id}.json.tmp`);
  await writeFile(tmp, JSON.stringify(mail, null, 2));
  await rename(tmp, join(dir, `${id}.json`));
  return mail;
}

export async function startMailCatcher(options: MailCatcherOptions): Promise<RunningMailCatcher> {
  const host = options.host ?? '127.0.0.1';
  const dir = resolve(options.dir);
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  const log = options.log ?? (() => {});
  if (!isLoopbackHost(host)) {
    throw new Error(
      `Mail catcher host ${host} is not a loopback address; it has no auth, so it only listens on 127.0.0.1 or ::1`,
    );
  }
  await mkdir(dir, { recursive: true });

  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Stavemark mail catcher (development only)',
    size: maxBytes,
    logger: false,
    closeTimeout: 2000,
    onData(stream, session, callback) {
      readAll(stream)
        .then(async (raw) => {
          if (stream.sizeExceeded) {
            const err = new Error(`Message exceeds the catcher's limit of ${maxBytes} bytes`);
            Object.assign(err, { responseCode: 552 });
            log(`refused a message of more than ${maxBytes} bytes`);
            callback(err);
            return;
          }
          const mail = await storeMessage(dir, raw, session);
          log(
            `caught ${mail.id} to=${mail.envelope.to.join(',')} subject=${JSON.stringify(mail.subject)}`,
          );
          callback(null, `Caught as ${mail.id}`);
        })
        .catch((err: unknown) => {
          // A temporary failure (451) tells the sender to keep the message and retry.
          const message = err instanceof Error ? err.message : String(err);
          log(`could not store a message: ${message}`);
          callback(
            Object.assign(new Error(`Could not store the message: ${message}`), {
              responseCode: 451,
            }),
          );
        });
    },
  });
  server.on('error', (err) => log(`smtp error: ${err.message}`));

  await new Promise<void>((resolvePromise, reject) => {
    const onError = (err: NodeJS.ErrnoException) => {
      reject(
        err.code === 'EADDRINUSE'
          ? new Error(
              `Mail catcher: port ${options.port ?? DEFAULT_MAIL_CATCHER_PORT} on ${host} is already in use`,
            )
          : err,
      );
    };
    server.server.once('error', onError);
    server.listen(options.port ?? DEFAULT_MAIL_CATCHER_PORT, host, () => {
      server.server.off('error', onError);
      resolvePromise();
    });
  });
  const port = (server.server.address() as AddressInfo).port;

  return {
    host,
    port,
    dir,
    close: () => new Promise<void>((resolveClose) => server.close(() => resolveClose())),
  };
}

function parsePort(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === '') return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > 65535) {
    throw new Error(`${name} must be a port number (0-65535), got ${JSON.stringify(value)}`);
  }
  return n;
}

function parseMaxBytes(value: string | undefined): number | undefined {
  if (value === undefined || value === '') return undefined;
  const n = Number(value);
  if (!Number.isSafeInteger(n) || n <= 0) {
    throw new Error(
      `MAIL_CATCHER_MAX_BYTES must be a positive whole number, got ${JSON.stringify(value)}`,
    );
  }
  return n;
}

async function main(): Promise<void> {
  // api/{src,dist}/mail-catcher/ → checkout root is three levels up.
  const checkout = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
  const dir = process.env.MAIL_CATCHER_DIR || join(checkout, '.local', 'mail');
  const port = parsePort(
    process.env.MAIL_CATCHER_PORT,
    DEFAULT_MAIL_CATCHER_PORT,
    'MAIL_CATCHER_PORT',
  );
  const maxBytes = parseMaxBytes(process.env.MAIL_CATCHER_MAX_BYTES);
  const catcher = await startMailCatcher({
    dir,
    port,
    host: process.env.MAIL_CATCHER_HOST || '127.0.0.1',
    maxBytes,
    log: (line) => console.log(`${new Date().toISOString()} ${line}`),
  });
  console.log(
    `Mail catcher listening on smtp://${catcher.host}:${catcher.port}, storing in ${catcher.dir}`,
  );
  const stop = (signal: string) => {
    console.log(`${signal}: stopping the mail catcher`);
    catcher.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.once('SIGTERM', () => stop('SIGTERM'));
  process.once('SIGINT', () => stop('SIGINT'));
}

const invokedDirectly =
  process.argv[1] !== undefined && import.meta.url === pathToFileURL(resolve(process.argv[1])).href;
if (invokedDirectly) {
  main().catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
