import { api } from './e2e-support/api';

describe('health and documents', () => {
  it('GET /api/health answers 200 with the database up', async () => {
    const res = await api().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: 'up' });
  });

  it('sends security headers', async () => {
    const res = await api().get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('an unknown API route answers 404 in the error shape', async () => {
    const res = await api().get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ statusCode: 404, error: 'Not Found', message: 'No such route.' });
  });

  it('every documented operation has a summary', async () => {
    const doc = await api().get('/api/docs-json');
    for (const [p, ops] of Object.entries(doc.body.paths as Record<string, Record<string, { summary?: string }>>)) {
      for (const [m, op] of Object.entries(ops)) expect(`${m} ${p}: ${op.summary ?? ''}`).toMatch(/: \S/);
    }
  });

  it('the docs page is served', async () => {
    const res = await api().get('/api/docs');
    expect(res.status).toBe(200);
    expect(res.text).toContain('swagger');
  });
});
