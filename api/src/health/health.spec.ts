import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../test/support/test-app.js';
import { withAdmin } from '../../test/support/test-db.js';

describe('GET /api/health', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
  });
  afterAll(() => t.close().catch(() => undefined));

  it('answers 200 while the database is up', async () => {
    const res = await t.http().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: 'up' });
  });

  it('answers 503 when the database goes away', async () => {
    const name = new URL(t.url).pathname.slice(1);
    // Cut every connection and refuse new ones, as if the database server had stopped.
    await withAdmin(async (c) => {
      await c.query(`ALTER DATABASE ${name} WITH ALLOW_CONNECTIONS false`);
      await c.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()`, [name]);
    });
    const res = await t.http().get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body.database).toBe('down');
    await withAdmin((c) => c.query(`ALTER DATABASE ${name} WITH ALLOW_CONNECTIONS true`));
    const back = await t.http().get('/api/health');
    expect(back.status).toBe(200);
  });
});
