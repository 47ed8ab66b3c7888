import { createHash, randomBytes } from 'node:crypto';
import type { Env } from '../config/env.js';
import type { TokenPurpose } from './entities/account-token.entity.js';

/** 32 random bytes, base64url: 43 characters, 256 bits (the shape linkTokenSchema accepts). */
export function newLinkToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Only this digest is stored; a database leak yields no usable link. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function linkLifetimeMs(purpose: TokenPurpose, env: Env): number {
  switch (purpose) {
    case 'invitation':
      return env.INVITATION_LINK_HOURS * 3600_000;
    case 'password_reset':
      return env.RESET_LINK_HOURS * 3600_000;
    case 'guardian_consent':
      return env.CONSENT_LINK_DAYS * 86_400_000;
  }
}

/** The web page each link opens; the token travels in the fragment, so it never reaches a server log. */
export const LINK_PAGE: Record<TokenPurpose, string> = {
  invitation: '/account/welcome',
  password_reset: '/account/reset-password',
  guardian_consent: '/account/consent',
};

export function linkUrl(publicUrl: string, purpose: TokenPurpose, token: string): string {
  return `${publicUrl.replace(/\/$/, '')}${LINK_PAGE[purpose]}#token=${token}`;
}
