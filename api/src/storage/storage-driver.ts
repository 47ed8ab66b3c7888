import type { Readable } from 'node:stream';

/** Inclusive byte range, as HTTP Range uses it. */
export interface ByteRange {
  start: number;
  end: number;
}

/**
 * Where stored files live. The local-disk driver is the only one today; an S3-compatible driver
 * implements the same five calls (PutObject from a stream, HeadObject, GetObject with Range,
 * DeleteObject), so features never touch paths (design.md §11).
 */
export interface StorageDriver {
  readonly name: string;
  /**
   * Writes the stream to `key`; the object appears only when the stream ends without error
   * (a failed or aborted write leaves nothing behind). Resolves to the bytes written.
   */
  write(key: string, body: Readable): Promise<{ size: number }>;
  /** Size of the object, or null when there is none. */
  stat(key: string): Promise<{ size: number } | null>;
  /** The object's bytes, or one inclusive range of them. */
  read(key: string, range?: ByteRange): Readable;
  /** Removes the object; removing one that is not there is not an error. */
  delete(key: string): Promise<void>;
}

export const STORAGE_DRIVER = Symbol('STORAGE_DRIVER');

/** Keys are our own (feature/organisation/uuid.ext): a strict alphabet keeps paths and object names safe. */
const KEY = /^[a-z0-9][a-z0-9_-]*(\/[a-z0-9][a-z0-9_-]*)*(\.[a-z0-9]{1,8})?$/;

export function assertValidKey(key: string): void {
  if (key.length > 300 || !KEY.test(key)) throw new Error(`Invalid storage key: ${JSON.stringify(key)}`);
}
