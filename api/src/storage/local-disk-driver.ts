import { randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream, mkdirSync } from 'node:fs';
import { mkdir, rename, stat, unlink } from 'node:fs/promises';
import { dirname, join, resolve, sep } from 'node:path';
import { Transform, type Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { assertValidKey, type ByteRange, type StorageDriver } from './storage-driver.js';

/** Files under one folder; writes go to a temporary name and are renamed when complete. */
export class LocalDiskDriver implements StorageDriver {
  readonly name = 'local-disk';
  readonly root: string;

  constructor(root: string) {
    this.root = resolve(root);
    mkdirSync(join(this.root, '.partial'), { recursive: true });
  }

  private pathOf(key: string): string {
    assertValidKey(key);
    const p = resolve(this.root, key);
    // The key alphabet already forbids "..": this is the second lock on the same door.
    if (!p.startsWith(this.root + sep)) throw new Error(`Storage key escapes the storage folder: ${key}`);
    return p;
  }

  async write(key: string, body: Readable): Promise<{ size: number }> {
    const final = this.pathOf(key);
    // Partial files live apart from finished ones, so a crash mid-upload never looks like an object.
    const partial = join(this.root, '.partial', `${randomBytes(12).toString('hex')}.part`);
    let size = 0;
    const counter = new Transform({
      transform(chunk: Buffer, _enc, cb) {
        size += chunk.length;
        cb(null, chunk);
      },
    });
    try {
      await pipeline(body, counter, createWriteStream(partial, { flags: 'wx' }));
      await mkdir(dirname(final), { recursive: true });
      await rename(partial, final);
    } catch (err) {
      await unlink(partial).catch(() => undefined);
      throw err;
    }
    return { size };
  }

  async stat(key: string): Promise<{ size: number } | null> {
    try {
      const s = await stat(this.pathOf(key));
      return s.isFile() ? { size: s.size } : null;
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw err;
    }
  }

  read(key: string, range?: ByteRange): Readable {
    return createReadStream(this.pathOf(key), range ? { start: range.start, end: range.end } : {});
  }

  async delete(key: string): Promise<void> {
    await unlink(this.pathOf(key)).catch((err: NodeJS.ErrnoException) => {
      if (err.code !== 'ENOENT') throw err;
    });
  }
}
