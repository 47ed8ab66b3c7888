import { vi } from 'vitest';

export interface RecordedRequest {
  method: string;
  path: string;
  query: URLSearchParams;
  headers: Headers;
  body: unknown;
  credentials: RequestCredentials | undefined;
}

type Handler = (req: RecordedRequest) => Response | Promise<Response>;

export function json(
  status: number,
  body: unknown,
  headers: Record<string, string> = {},
): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: { 'Content-Type': 'application/json', ...headers },
  });
}

export function apiError(
  status: number,
  message: string,
  extra: Record<string, unknown> = {},
  headers: Record<string, string> = {},
) {
  const error =
    {
      400: 'Bad Request',
      401: 'Unauthorized',
      403: 'Forbidden',
      404: 'Not Found',
      409: 'Conflict',
      429: 'Too Many Requests',
    }[status] ?? 'Error';
  return json(status, { statusCode: status, error, message, ...extra }, headers);
}

/**
 * Replaces fetch with a table of handlers keyed "METHOD /api/path". A request nobody expected
 * fails the test (with a 599 the client turns into an error) and is listed in `unexpected`.
 */
export function mockApi(routes: Record<string, Handler>) {
  const requests: RecordedRequest[] = [];
  const unexpected: string[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = new URL(typeof input === 'string' ? input : input.toString(), 'http://localhost');
    const method = (init?.method ?? 'GET').toUpperCase();
    const req: RecordedRequest = {
      method,
      path: url.pathname,
      query: url.searchParams,
      headers: new Headers(init?.headers),
      body: typeof init?.body === 'string' ? JSON.parse(init.body) : undefined,
      credentials: init?.credentials,
    };
    requests.push(req);
    const handler = routes[`${method} ${url.pathname}`];
    if (!handler) {
      unexpected.push(`${method} ${url.pathname}`);
      return json(599, {
        statusCode: 599,
        error: 'Test',
        message: `No mock for ${method} ${url.pathname}`,
      });
    }
    return handler(req);
  });
  vi.stubGlobal('fetch', fetchMock);
  return {
    fetchMock,
    requests,
    unexpected,
    calls: (key: string) => requests.filter((r) => `${r.method} ${r.path}` === key),
  };
}
