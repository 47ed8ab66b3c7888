import { describe, expect, it } from 'vitest';
import { apiRequest, ApiError, SESSION_ENDED_NOTICE, SessionEndedError } from './api-client';
import { sessionStore } from './session-store';
import { apiError, json, mockApi } from '@/test/fetch-mock';
import { makeSession, makeUser } from '@/test/factories';

const user = makeUser(['teacher']);

describe('apiRequest', () => {
  it('sends JSON with the in-memory bearer token and the refresh cookie', async () => {
    sessionStore.start(makeSession(user, 'token-a'));
    const api = mockApi({ 'POST /api/things': () => json(201, { ok: true }) });

    await expect(apiRequest('/things', { method: 'POST', body: { name: 'x' } })).resolves.toEqual({
      ok: true,
    });

    const [req] = api.requests;
    expect(req?.headers.get('Authorization')).toBe('Bearer token-a');
    expect(req?.headers.get('Content-Type')).toBe('application/json');
    expect(req?.credentials).toBe('include');
    expect(req?.body).toEqual({ name: 'x' });
  });

  it('never writes the token to web storage', async () => {
    sessionStore.start(makeSession(user, 'secret-token'));
    mockApi({ 'GET /api/things': () => json(200, []) });
    await apiRequest('/things');
    const stored = [...Object.values(localStorage), ...Object.values(sessionStorage)].join(' ');
    expect(stored).not.toContain('secret-token');
  });

  it('leaves out empty query values', async () => {
    sessionStore.start(makeSession(user));
    const api = mockApi({ 'GET /api/users': () => json(200, { items: [] }) });
    await apiRequest('/users', { query: { search: '', role: undefined, page: 2 } });
    expect(api.requests[0]?.query.toString()).toBe('page=2');
  });

  it('throws an ApiError carrying the API body', async () => {
    sessionStore.start(makeSession(user));
    mockApi({
      'POST /api/users': () =>
        apiError(400, 'Some fields are not right.', {
          details: [{ path: 'email', message: 'Enter a valid e-mail address.' }],
        }),
    });
    const error = await apiRequest('/users', { method: 'POST', body: {} }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    const apiErr = error as ApiError;
    expect(apiErr.status).toBe(400);
    expect(apiErr.message).toBe('Some fields are not right.');
    expect(apiErr.fieldErrors).toEqual([
      { path: 'email', message: 'Enter a valid e-mail address.' },
    ]);
  });

  it('reads the Retry-After seconds of a 429', async () => {
    mockApi({
      'POST /api/auth/login': () =>
        apiError(429, 'Too many attempts.', {}, { 'Retry-After': '42' }),
    });
    const error = (await apiRequest('/auth/login', {
      method: 'POST',
      body: {},
      renewOn401: false,
    }).catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(429);
    expect(error.retryAfterSeconds).toBe(42);
  });

  it('on a 401 renews the token once and retries with the new one', async () => {
    sessionStore.start(makeSession(user, 'old'));
    const api = mockApi({
      'GET /api/today': (req) =>
        req.headers.get('Authorization') === 'Bearer new'
          ? json(200, { date: '2026-12-01' })
          : apiError(401, 'Token expired.'),
      'POST /api/auth/refresh': () => json(200, makeSession(user, 'new')),
    });

    await expect(apiRequest('/today')).resolves.toEqual({ date: '2026-12-01' });
    expect(api.calls('POST /api/auth/refresh')).toHaveLength(1);
    expect(api.calls('POST /api/auth/refresh')[0]?.credentials).toBe('include');
    expect(api.calls('GET /api/today').map((r) => r.headers.get('Authorization'))).toEqual([
      'Bearer old',
      'Bearer new',
    ]);
    expect(sessionStore.getAccessToken()).toBe('new');
    expect(sessionStore.getState().status).toBe('signed-in');
  });

  it('shares one refresh between requests that fail together', async () => {
    sessionStore.start(makeSession(user, 'old'));
    let releaseRefresh: () => void = () => undefined;
    const refreshGate = new Promise<void>((resolve) => (releaseRefresh = resolve));
    const api = mockApi({
      'GET /api/a': (req) =>
        req.headers.get('Authorization') === 'Bearer new'
          ? json(200, 'a')
          : apiError(401, 'Expired.'),
      'GET /api/b': (req) =>
        req.headers.get('Authorization') === 'Bearer new'
          ? json(200, 'b')
          : apiError(401, 'Expired.'),
      'GET /api/c': (req) =>
        req.headers.get('Authorization') === 'Bearer new'
          ? json(200, 'c')
          : apiError(401, 'Expired.'),
      'POST /api/auth/refresh': async () => {
        await refreshGate;
        return json(200, makeSession(user, 'new'));
      },
    });

    const all = Promise.all([apiRequest('/a'), apiRequest('/b'), apiRequest('/c')]);
    // Let all three 401s arrive before the refresh answers.
    await new Promise((r) => setTimeout(r, 10));
    releaseRefresh();
    await expect(all).resolves.toEqual(['a', 'b', 'c']);
    expect(api.calls('POST /api/auth/refresh')).toHaveLength(1);
  });

  it('retries without a new refresh when another request already renewed the token', async () => {
    sessionStore.start(makeSession(user, 'old'));
    let answerSlow: () => void = () => undefined;
    const slowGate = new Promise<void>((r) => (answerSlow = r));
    const api = mockApi({
      // /slow is sent with the old token but answers only after /fast has renewed it.
      'GET /api/slow': async (req) => {
        if (req.headers.get('Authorization') === 'Bearer new') return json(200, 'slow');
        await slowGate;
        return apiError(401, 'Expired.');
      },
      'GET /api/fast': (req) =>
        req.headers.get('Authorization') === 'Bearer new'
          ? json(200, 'fast')
          : apiError(401, 'Expired.'),
      'POST /api/auth/refresh': () => json(200, makeSession(user, 'new')),
    });
    const slow = apiRequest('/slow');
    await expect(apiRequest('/fast')).resolves.toBe('fast');
    answerSlow();
    await expect(slow).resolves.toBe('slow');
    expect(api.calls('POST /api/auth/refresh')).toHaveLength(1);
  });

  it('when the refresh fails, ends the session with a message and throws SessionEndedError', async () => {
    sessionStore.start(makeSession(user, 'old'));
    let ended = 0;
    sessionStore.onEnd(() => (ended += 1));
    const api = mockApi({
      'GET /api/today': () => apiError(401, 'Token expired.'),
      'POST /api/auth/refresh': () => apiError(401, 'No session.'),
    });

    await expect(apiRequest('/today')).rejects.toBeInstanceOf(SessionEndedError);
    expect(sessionStore.getState()).toEqual({ status: 'signed-out', notice: SESSION_ENDED_NOTICE });
    expect(SESSION_ENDED_NOTICE).toBe('Your session has ended; please sign in again.');
    expect(sessionStore.getAccessToken()).toBeNull();
    expect(ended).toBe(1);
    expect(api.calls('GET /api/today')).toHaveLength(1); // no retry without a token
  });

  it('ends the session when the retried request is refused again', async () => {
    sessionStore.start(makeSession(user, 'old'));
    const api = mockApi({
      'GET /api/today': () => apiError(401, 'Revoked.'),
      'POST /api/auth/refresh': () => json(200, makeSession(user, 'new')),
    });
    await expect(apiRequest('/today')).rejects.toBeInstanceOf(SessionEndedError);
    expect(api.calls('GET /api/today')).toHaveLength(2);
    expect(sessionStore.getState().status).toBe('signed-out');
  });

  it('does not try to refresh on a sign-in 401 (that is a wrong password)', async () => {
    const api = mockApi({
      'POST /api/auth/login': () => apiError(401, 'The e-mail or password is not right.'),
    });
    const error = (await apiRequest('/auth/login', {
      method: 'POST',
      body: {},
      renewOn401: false,
    }).catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.message).toBe('The e-mail or password is not right.');
    expect(api.calls('POST /api/auth/refresh')).toHaveLength(0);
  });

  it('turns a non-JSON server fault into a readable ApiError', async () => {
    sessionStore.start(makeSession(user));
    mockApi({
      'GET /api/today': () =>
        new Response('<html>Bad gateway</html>', { status: 502, statusText: 'Bad Gateway' }),
    });
    const error = (await apiRequest('/today').catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(502);
    expect(error.message).toBe('The server could not answer. Please try again in a moment.');
  });
});
