import { createHmac, timingSafeEqual } from 'node:crypto';
import { assertValidKey } from './storage-driver.js';

/** What a signed media URL grants: one object, served with one content type, until `expiresAt`. */
export interface MediaGrant {
  key: string;
  contentType: string;
  /** Seconds since the epoch. */
  expiresAt: number;
}

export type TokenCheck = { ok: true; grant: MediaGrant } | { ok: false; reason: 'malformed' | 'bad-signature' | 'expired' };

/** A key of its own for media URLs, derived from the app's secret, so a URL signature is never a valid token signature. */
export function mediaKeyFrom(appSecret: string): Buffer {
  return createHmac('sha256', appSecret).update('stavemark:media-url:v1').digest();
}

const b64 = (b: Buffer | string): string => Buffer.from(b).toString('base64url');

function sign(key: Buffer, payload: string): Buffer {
  return createHmac('sha256', key).update(payload).digest();
}

/** `<payload>.<signature>`, both base64url: safe in one path segment. */
export function signMediaToken(key: Buffer, grant: MediaGrant): string {
  assertValidKey(grant.key);
  const payload = b64(JSON.stringify({ k: grant.key, t: grant.contentType, e: grant.expiresAt }));
  return `${payload}.${b64(sign(key, payload))}`;
}

/** Checks the signature first (constant time), then the expiry: an altered expiry is a bad signature. */
export function verifyMediaToken(key: Buffer, token: string, nowSeconds: number): TokenCheck {
  const parts = token.split('.');
  if (parts.length !== 2 || !parts[0] || !parts[1]) return { ok: false, reason: 'malformed' };
  const [payload, sig] = parts as [string, string];
  const given = Buffer.from(sig, 'base64url');
  const expected = sign(key, payload);
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return { ok: false, reason: 'bad-signature' };
  let body: unknown;
  try {
    body = JSON.parse(Buffer.from(payload, 'base64url').toString('utf8'));
  } catch {
    return { ok: false, reason: 'malformed' };
  }
  const o = body as { k?: unknown; t?: unknown; e?: unknown };
  if (typeof o.k !== 'string' || typeof o.t !== 'string' || typeof o.e !== 'number') return { ok: false, reason: 'malformed' };
  if (o.e <= nowSeconds) return { ok: false, reason: 'expired' };
  return { ok: true, grant: { key: o.k, contentType: o.t, expiresAt: o.e } };
}
