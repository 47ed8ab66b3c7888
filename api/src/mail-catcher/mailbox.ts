// Reads the messages that the local mail catcher (catcher.ts) stored, one JSON file each.
// Used by the API's Outbox and by tests; it has no dependency on Nest.
import { readdir, readFile, rm } from 'node:fs/promises';
import { join } from 'node:path';

export interface CaughtAttachment {
  filename: string | null;
  contentType: string;
  size: number;
  contentBase64: string;
}

export interface CaughtMail {
  /** Sortable by arrival: a zero-padded millisecond timestamp, then random hex. */
  id: string;
  /** ISO 8601, UTC. */
  receivedAt: string;
  /** What the SMTP client said in MAIL FROM / RCPT TO (includes Bcc recipients). */
  envelope: { from: string | null; to: string[] };
  /** The From: header as text, e.g. `"Stavemark" <noreply@demo.example>`; '' when absent. */
  from: string;
  /** Each address of the To: header as text. */
  to: string[];
  cc: string[];
  messageId: string | null;
  subject: string;
  text: string;
  html: string | null;
  attachments: CaughtAttachment[];
}

/** File names the catcher writes: `<id>.json`. Temp files start with a dot and are never listed. */
const ID_PATTERN = /^[0-9]{13}-[0-9a-f]{8}$/;

export function isCaughtMailId(id: string): boolean {
  return ID_PATTERN.test(id);
}

async function readMailFile(dir: string, id: string): Promise<CaughtMail> {
  const file = join(dir, `${id}.json`);
  const raw = await readFile(file, 'utf8');
  try {
    return JSON.parse(raw) as CaughtMail;
  } catch (err) {
    throw new Error(`Caught mail file ${file} is not valid JSON: ${(err as Error).message}`);
  }
}

async function listIds(dir: string): Promise<string[]> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch (err) {
    // No folder yet means nothing was caught yet.
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
  return names
    .filter((n) => n.endsWith('.json'))
    .map((n) => n.slice(0, -'.json'.length))
    .filter(isCaughtMailId)
    .sort();
}

/** Every stored message, oldest first (arrival order). */
export async function listCaughtMail(dir: string): Promise<CaughtMail[]> {
  const ids = await listIds(dir);
  const mails: CaughtMail[] = [];
  for (const id of ids) {
    try {
      mails.push(await readMailFile(dir, id));
    } catch (err) {
      // Removed by clearCaughtMail between readdir and readFile: not an error.
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') continue;
      throw err;
    }
  }
  return mails;
}

/** One message by id, or null when there is none with that id. */
export async function readCaughtMail(dir: string, id: string): Promise<CaughtMail | null> {
  // Rejecting anything but our own id shape also keeps `id` from escaping `dir`.
  if (!isCaughtMailId(id)) return null;
  try {
    return await readMailFile(dir, id);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw err;
  }
}

/** Deletes every stored message; returns how many were removed. */
export async function clearCaughtMail(dir: string): Promise<number> {
  const ids = await listIds(dir);
  await Promise.all(ids.map((id) => rm(join(dir, `${id}.json`), { force: true })));
  return ids.length;
}

/**
 * Waits until a stored message matches, polling the folder (mail is often sent by a background
 * job, so it arrives a little after the request that caused it). Rejects after `timeoutMs`.
 */
export async function waitForCaughtMail(
  dir: string,
  predicate: (mail: CaughtMail) => boolean,
  { timeoutMs = 10_000, intervalMs = 100 }: { timeoutMs?: number; intervalMs?: number } = {},
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await listCaughtMail(dir)).find(predicate);
    if (found) return found;
    if (Date.now() >= deadline) {
      throw new Error(`No matching mail arrived in ${dir} within ${timeoutMs} ms`);
    }
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
}
