import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import express, { type NextFunction, type Request, type Response } from 'express';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { binary, mp3LikeFile, textFile, wavFile } from '../../test/support/media-fixtures.js';
import { createTestApp, type TestApp } from '../../test/support/test-app.js';
import { AllExceptionsFilter } from '../common/http-exception.filter.js';
import { LocalDiskDriver } from './local-disk-driver.js';
import { PLAYABLE_MEDIA, wavDurationSeconds } from './media-types.js';
import { mediaKeyFrom, signMediaToken, verifyMediaToken } from './signed-urls.js';
import { StorageService } from './storage.service.js';
import { receiveUpload } from './upload-receiver.js';

/** Every file under the storage folder (finished and partial), to prove a refusal leaves nothing. */
function filesUnder(dir: string): string[] {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => join(e.parentPath, e.name));
}

describe('uploads streamed to storage', () => {
  const dir = mkdtempSync(join(tmpdir(), 'stavemark-storage-'));
  const driver = new LocalDiskDriver(dir);
  // A bare Express app with the receiver on one route: the HTTP contract without the rest of the API.
  const app = express();
  app.post('/up', (req: Request, res: Response, next: NextFunction) => {
    receiveUpload(driver, req, res, { keyPrefix: 'test/org', maxBytes: 64 * 1024, accept: PLAYABLE_MEDIA, what: 'a recording', fields: ['note'] })
      .then((u) => res.status(201).json({ ...u, head: u.head.length }))
      .catch(next);
  });
  const filter = new AllExceptionsFilter();
  app.use((err: unknown, _req: Request, res: Response, _next: NextFunction) => {
    filter.catch(err, { switchToHttp: () => ({ getResponse: () => res }) } as never);
  });
  const http = () => supertest(app);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('keeps a WAV byte for byte, typed from its content, and reads its duration from the header', async () => {
    const wav = wavFile({ seconds: 1.5 });
    const res = await http().post('/up').attach('file', wav, { filename: 'take.wav', contentType: 'application/octet-stream' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ mime: 'audio/wav', ext: 'wav', size: wav.length, originalName: 'take.wav' });
    const stored = await new Promise<Buffer>((resolve, reject) => {
      const chunks: Buffer[] = [];
      driver.read(res.body.key as string).on('data', (c: Buffer) => chunks.push(c)).on('end', () => resolve(Buffer.concat(chunks))).on('error', reject);
    });
    expect(stored.equals(wav)).toBe(true);
    // RIFF/WAVE PCM: duration = data bytes / byte rate = (1.5 s × 8000 × 2) / 16000 (arithmetic of the header fields).
    expect(wavDurationSeconds(wav.subarray(0, 4100), wav.length)).toBe(1.5);
  });

  it('recognises MPEG audio frames behind an ID3 tag as audio/mpeg', async () => {
    const res = await http().post('/up').attach('file', mp3LikeFile(), { filename: 'take.mp3', contentType: 'audio/mpeg' }).field('note', 'first take');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ mime: 'audio/mpeg', ext: 'mp3', fields: { note: 'first take' } });
  });

  it('refuses a text file named .mp3 by its content (415) and keeps nothing', async () => {
    const before = filesUnder(dir).length;
    const res = await http().post('/up').attach('file', textFile(), { filename: 'song.mp3', contentType: 'audio/mpeg' });
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(/whatever its name says/);
    expect(res.body.message).toMatch(/WAV, MP3/);
    expect(filesUnder(dir).length).toBe(before);
  });

  it('refuses a file over the size limit (413) and removes what had arrived', async () => {
    const before = filesUnder(dir).length;
    const res = await http().post('/up').attach('file', wavFile({ seconds: 5 }), { filename: 'long.wav' });
    expect(res.status).toBe(413);
    expect(res.body.message).toMatch(/larger than 0\.1 MB/);
    expect(filesUnder(dir).length).toBe(before);
  });

  it('takes a file of exactly the limit', async () => {
    const wav = wavFile({ seconds: 1 });
    const exact = Buffer.concat([wav, Buffer.alloc(64 * 1024 - wav.length)]);
    const res = await http().post('/up').attach('file', exact, { filename: 'exact.wav' });
    expect(res.status).toBe(201);
    expect(res.body.size).toBe(64 * 1024);
  });

  it('answers clear 400s for no file, an empty file, a wrong field and an unknown field, keeping nothing', async () => {
    const before = filesUnder(dir).length;
    const none = await http().post('/up').field('note', 'x');
    expect(none.status).toBe(400);
    expect(none.body.message).toMatch(/Choose a recording/);
    const empty = await http().post('/up').attach('file', Buffer.alloc(0), { filename: 'empty.wav' });
    expect(empty.status).toBe(400);
    expect(empty.body.message).toMatch(/empty/);
    const wrong = await http().post('/up').attach('audio', wavFile({ seconds: 0.1 }), { filename: 'a.wav' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.message).toMatch(/form field “file”/);
    const extra = await http().post('/up').field('sneaky', '1').attach('file', wavFile({ seconds: 0.1 }), { filename: 'a.wav' });
    expect(extra.status).toBe(400);
    expect(extra.body.message).toMatch(/Unknown form field “sneaky”/);
    const json = await http().post('/up').send({ file: 'x' });
    expect(json.status).toBe(400);
    expect(json.body.message).toMatch(/multipart\/form-data/);
    expect(filesUnder(dir).length).toBe(before);
  });

  it('refuses keys that could leave the storage folder', async () => {
    await expect(driver.write('../escape', Readable.from([Buffer.from('x')]))).rejects.toThrow(/Invalid storage key/);
    expect(() => driver.read('a/../../b')).toThrow(/Invalid storage key/);
  });
});

describe('signed media URLs', () => {
  const key = mediaKeyFrom('a-secret-of-at-least-thirty-two-characters');
  const grant = { key: 'recordings/org/abc', contentType: 'audio/wav', expiresAt: 2_000_000_000 };

  it('verify what they signed, until they expire', () => {
    const token = signMediaToken(key, grant);
    expect(verifyMediaToken(key, token, 1_999_999_999)).toEqual({ ok: true, grant });
    expect(verifyMediaToken(key, token, 2_000_000_000)).toEqual({ ok: false, reason: 'expired' });
  });

  it('reject an altered expiry, key or signature, and another secret', () => {
    const token = signMediaToken(key, grant);
    const [payload, sig] = token.split('.') as [string, string];
    const later = Buffer.from(JSON.stringify({ k: grant.key, t: grant.contentType, e: 2_100_000_000 })).toString('base64url');
    expect(verifyMediaToken(key, `${later}.${sig}`, 0).ok).toBe(false);
    const other = Buffer.from(JSON.stringify({ k: 'recordings/org/xyz', t: grant.contentType, e: grant.expiresAt })).toString('base64url');
    expect(verifyMediaToken(key, `${other}.${sig}`, 0)).toEqual({ ok: false, reason: 'bad-signature' });
    expect(verifyMediaToken(key, `${payload}.${sig.slice(0, -2)}AA`, 0)).toEqual({ ok: false, reason: 'bad-signature' });
    expect(verifyMediaToken(mediaKeyFrom('another-secret-of-thirty-two-characters!'), token, 0)).toEqual({ ok: false, reason: 'bad-signature' });
    expect(verifyMediaToken(key, 'not-a-token', 0)).toEqual({ ok: false, reason: 'malformed' });
  });
});

describe('GET /api/media/:token (Range, RFC 9110 §14)', () => {
  let t: TestApp;
  let storage: StorageService;
  const dir = mkdtempSync(join(tmpdir(), 'stavemark-media-'));
  const file = wavFile({ seconds: 0.625 }); // 44 + 10000 bytes
  const size = file.length;
  const objectKey = 'test/org/range-check';
  const get = (url: string) => t.http().get(url).buffer(true).parse(binary);

  beforeAll(async () => {
    t = await createTestApp({ seed: false, env: { STORAGE_DIR: dir } });
    storage = t.app.get(StorageService);
    await storage.driver.write(objectKey, Readable.from([file]));
  });
  afterAll(async () => {
    await t.close().catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  });

  it('serves the whole file with Accept-Ranges when no range is asked for', async () => {
    const res = await get(storage.signedUrl(objectKey, 'audio/wav').url);
    expect(res.status).toBe(200);
    expect(res.headers['accept-ranges']).toBe('bytes');
    expect(res.headers['content-type']).toBe('audio/wav');
    expect(Number(res.headers['content-length'])).toBe(size);
    expect((res.body as Buffer).equals(file)).toBe(true);
  });

  // The ranges are RFC 9110 §14.1.2's own examples: the first 500 bytes, the second 500, the final 500, from 9500 on.
  it.each([
    ['bytes=0-499', 0, 499],
    ['bytes=500-999', 500, 999],
    ['bytes=-500', size - 500, size - 1],
    ['bytes=9500-', 9500, size - 1],
    // A last-byte position past the end means "to the end" (RFC 9110 §14.1.2).
    ['bytes=10000-99999', 10000, size - 1],
  ])('%s → 206 with those bytes and Content-Range', async (range, start, end) => {
    const res = await get(storage.signedUrl(objectKey, 'audio/wav').url).set('Range', range);
    expect(res.status).toBe(206);
    expect(res.headers['content-range']).toBe(`bytes ${start}-${end}/${size}`);
    expect(Number(res.headers['content-length'])).toBe(end - start + 1);
    expect((res.body as Buffer).equals(file.subarray(start, end + 1))).toBe(true);
  });

  it('answers 416 with bytes */size for a range that starts past the end (RFC 9110 §15.5.17)', async () => {
    const res = await t.http().get(storage.signedUrl(objectKey, 'audio/wav').url).set('Range', `bytes=${size}-`);
    expect(res.status).toBe(416);
    expect(res.headers['content-range']).toBe(`bytes */${size}`);
    expect(res.body).toMatchObject({ statusCode: 416, error: 'Range Not Satisfiable' });
  });

  it('ignores a malformed Range and serves the whole file (RFC 9110 §14.2 lets a server ignore it)', async () => {
    const res = await get(storage.signedUrl(objectKey, 'audio/wav').url).set('Range', 'bytes=abc');
    expect(res.status).toBe(200);
    expect((res.body as Buffer).length).toBe(size);
  });

  it('answers 410 for an expired link and 403 for an altered one', async () => {
    const expired = storage.signedUrl(objectKey, 'audio/wav', -1).url;
    const gone = await t.http().get(expired);
    expect(gone.status).toBe(410);
    expect(gone.body).toMatchObject({ statusCode: 410, error: 'Gone', message: expect.stringMatching(/expired/) });

    const url = storage.signedUrl(objectKey, 'audio/wav').url;
    const token = url.split('/').pop()!;
    const [payload, sig] = token.split('.') as [string, string];
    const otherKey = Buffer.from(JSON.stringify({ k: 'test/org/other', t: 'audio/wav', e: 4_000_000_000 })).toString('base64url');
    for (const bad of [`${otherKey}.${sig}`, `${payload}.${sig.replace(/^./, (c) => (c === 'A' ? 'B' : 'A'))}`, 'garbage']) {
      const res = await t.http().get(`/api/media/${bad}`);
      expect(res.status).toBe(403);
      expect(res.body).toMatchObject({ statusCode: 403, message: 'This playback link is not valid.' });
    }
  });

  it('answers 404 once the file is gone, even with a valid link', async () => {
    await storage.driver.write('test/org/short-lived', Readable.from([file]));
    const url = storage.signedUrl('test/org/short-lived', 'audio/wav').url;
    await storage.delete('test/org/short-lived');
    const res = await t.http().get(url);
    expect(res.status).toBe(404);
  });
});
