import { ServiceUnavailableException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { describe, expect, it } from 'vitest';
import { DomainError } from '../common/errors.js';
import { AuthGuard } from './auth.guard.js';

// How the guard turns passport's outcome into an answer: only a token that is missing, bad or
// refused is a 401; a failure while checking a good token is the server's (503), so the desk's
// queue retries instead of signing the examiner out.
describe('AuthGuard.handleRequest', () => {
  const guard = new AuthGuard(new Reflector());

  it('passes the caller through', () => {
    expect(guard.handleRequest(null, { personId: 'p' }, undefined)).toEqual({ personId: 'p' });
  });

  it('answers 401 for no caller, and says when the token has expired', () => {
    const expired = Object.assign(new Error('jwt expired'), { name: 'TokenExpiredError' });
    expect(() => guard.handleRequest(null, false, expired)).toThrow(/expired/);
    let thrown: unknown;
    try {
      guard.handleRequest(null, false, new Error('No auth token'));
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(DomainError);
    expect((thrown as DomainError).code).toBe('unauthenticated');
  });

  it('answers 503, not 401, when checking the session itself failed', () => {
    const poolTimeout = new Error('timeout exceeded when trying to connect');
    expect(() => guard.handleRequest(poolTimeout, false, undefined)).toThrow(ServiceUnavailableException);
  });
});
