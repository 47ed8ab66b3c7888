import { randomUUID } from 'node:crypto';
import { Transform, type TransformCallback } from 'node:stream';
import { PayloadTooLargeException, UnsupportedMediaTypeException } from '@nestjs/common';
import type { Request, Response } from 'express';
import multer from 'multer';
import { invalid } from '../common/errors.js';
import { detectType, SNIFF_BYTES, type DetectedType } from './media-types.js';
import type { StorageDriver } from './storage-driver.js';

export interface UploadOptions {
  /** Folder-like prefix of the new object's key, e.g. `recordings/<organisation id>`. */
  keyPrefix: string;
  maxBytes: number;
  /** Content types (from the bytes) that may be kept, with the extension we file them under. */
  accept: Record<string, string>;
  /** What the file is, for messages: "a recording". */
  what: string;
  /** Names of the text fields that may travel with the file. */
  fields?: string[];
}

export interface ReceivedUpload {
  key: string;
  size: number;
  mime: string;
  ext: string;
  originalName: string;
  /** The first bytes, for cheap header reads (a WAV's duration). */
  head: Buffer;
  fields: Record<string, string>;
}

class RefusedType extends Error {
  constructor(readonly detected: DetectedType | null, readonly empty: boolean) {
    super('refused type');
  }
}

/** Holds back the first bytes until their type is known, then lets everything through, or fails the write. */
class SniffStream extends Transform {
  private chunks: Buffer[] = [];
  private length = 0;
  private decided = false;
  head: Buffer = Buffer.alloc(0);
  detected: DetectedType | null = null;

  constructor(private readonly accept: Record<string, string>) {
    super();
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback): void {
    if (this.decided) return cb(null, chunk);
    this.chunks.push(chunk);
    this.length += chunk.length;
    if (this.length < SNIFF_BYTES) return cb();
    this.decide(cb);
  }

  override _flush(cb: TransformCallback): void {
    if (this.decided) return cb();
    this.decide(cb);
  }

  private decide(cb: TransformCallback): void {
    this.decided = true;
    const all = Buffer.concat(this.chunks);
    this.chunks = [];
    this.head = Buffer.from(all.subarray(0, SNIFF_BYTES));
    if (all.length === 0) return cb(new RefusedType(null, true));
    detectType(this.head).then(
      (t) => {
        if (!t || !(t.mime in this.accept)) return cb(new RefusedType(t, false));
        this.detected = t;
        cb(null, all);
      },
      (err: unknown) => cb(err as Error),
    );
  }
}

type StoredFile = Express.Multer.File & { key?: string; head?: Buffer; detected?: DetectedType };

/** A multer storage engine that streams the file into a storage driver, checking its type from the first bytes. */
class SniffingEngine implements multer.StorageEngine {
  constructor(
    private readonly driver: StorageDriver,
    private readonly opts: UploadOptions,
  ) {}

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<StoredFile>) => void): void {
    const key = `${this.opts.keyPrefix}/${randomUUID()}`;
    const sniff = new SniffStream(this.opts.accept);
    file.stream.on('error', (err) => sniff.destroy(err));
    sniff.on('error', () => {
      // Keep reading (and discarding) the rest of the part so the request finishes cleanly.
      file.stream.unpipe(sniff);
      file.stream.resume();
    });
    file.stream.pipe(sniff);
    this.driver.write(key, sniff).then(
      ({ size }) => cb(null, { key, size, head: sniff.head, detected: sniff.detected ?? undefined }),
      (err: unknown) => cb(err),
    );
  }

  _removeFile(_req: Request, file: StoredFile, cb: (error: Error | null) => void): void {
    if (!file.key) return cb(null);
    this.driver.delete(file.key).then(
      () => cb(null),
      (err: unknown) => cb(err as Error),
    );
  }
}

const mb = (n: number): string => `${Math.round((n / 1024 / 1024) * 10) / 10} MB`;

function acceptedNames(accept: Record<string, string>): string {
  return [...new Set(Object.values(accept))].map((e) => e.toUpperCase()).join(', ');
}

/**
 * Streams one multipart file (field `file`) to storage: never held in memory, refused by size
 * while it arrives and by content (magic bytes) before it is kept. Resolves once it is stored;
 * on any refusal nothing is left in storage.
 */
export function receiveUpload(driver: StorageDriver, req: Request, res: Response, opts: UploadOptions): Promise<ReceivedUpload> {
  const allowedFields = new Set(opts.fields ?? []);
  const upload = multer({
    storage: new SniffingEngine(driver, opts),
    limits: { fileSize: opts.maxBytes, files: 1, fields: allowedFields.size + 2, parts: allowedFields.size + 3, fieldSize: 2000 },
  }).single('file');

  if (!req.is('multipart/form-data'))
    return Promise.reject(invalid(`Send ${opts.what} as multipart/form-data, in the form field “file”.`, [{ path: 'file', message: 'multipart/form-data expected' }]));

  return new Promise<ReceivedUpload>((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (err) return reject(toClearError(err, opts));
      const file = req.file as StoredFile | undefined;
      if (!file?.key || !file.detected || !file.head) {
        return reject(invalid(`Choose ${opts.what} to upload (form field “file”).`, [{ path: 'file', message: 'missing' }]));
      }
      const body = (req.body ?? {}) as Record<string, unknown>;
      const fields: Record<string, string> = {};
      for (const [name, value] of Object.entries(body)) {
        if (!allowedFields.has(name) || typeof value !== 'string') {
          void driver.delete(file.key).catch(() => undefined);
          return reject(invalid(`Unknown form field “${name}”.`, [{ path: name, message: 'unknown field' }]));
        }
        fields[name] = value;
      }
      resolve({
        key: file.key,
        size: file.size,
        mime: file.detected.mime,
        ext: opts.accept[file.detected.mime] ?? file.detected.ext,
        originalName: file.originalname,
        head: file.head,
        fields,
      });
    });
  });
}

function toClearError(err: unknown, opts: UploadOptions): Error {
  if (err instanceof RefusedType) {
    if (err.empty) return invalid('The file is empty.', [{ path: 'file', message: 'empty' }]);
    const seen = err.detected ? `its content is ${err.detected.mime}` : 'its content is not a recognised audio or video format';
    return new UnsupportedMediaTypeException(
      `That file cannot be kept as ${opts.what}: ${seen}, whatever its name says. Accepted: ${acceptedNames(opts.accept)}.`,
    );
  }
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE')
      return new PayloadTooLargeException(`The file is larger than ${mb(opts.maxBytes)}, the limit for ${opts.what}. Nothing was kept.`);
    if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT')
      return invalid('Send one file, in the form field “file”.', [{ path: 'file', message: 'one file expected' }]);
    return invalid(`The upload could not be read: ${err.message}.`);
  }
  // A disk or storage failure is ours, not the sender's: let it answer 500.
  if (err instanceof Error && 'syscall' in err) return err;
  if (err instanceof Error && /Request (aborted|closed)/.test(err.message)) return invalid('The upload stopped before it was complete. Nothing was kept; please try again.');
  return invalid(`The upload could not be read. Send ${opts.what} as multipart/form-data in the field “file”.`);
}
