import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer } from 'node:net';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CellValue } from '@stavemark/shared';

// Issue 6: "restarting the API mid-slot loses nothing". The suite's shared server belongs to the
// test runner, so this journey runs an API of its own (the same build, on its own seeded
// database and a free port), kills it without warning in the middle of the write-up, types on
// while it is down, starts it again, and then compares the sheet in the database with what was
// typed. A kill -9 is harsher than a restart: nothing gets a chance to flush.

const root = fileURLToPath(new URL('../..', import.meta.url));
const webDist = `${root}web/dist`;
const baseDb = process.env.DATABASE_URL;
const dbName = `stavemark_test_restart_${process.pid}_${Date.now()}`;
const dbUrl = baseDb ? Object.assign(new URL(baseDb), { pathname: `/${dbName}` }).toString() : '';

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
const port = await freePort();
const url = `http://127.0.0.1:${port}`;
// The browser helpers read the server's address when they are first imported.
process.env.E2E_BASE_URL = url;
const { launch, screenshot } = await import('./support/browser');
const { DEMO, navLink, signIn } = await import('./support/sign-in');

async function admin(sql: string) {
  const c = new pg.Client({
    connectionString: Object.assign(new URL(baseDb!), { pathname: '/postgres' }).toString(),
  });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}

const serverEnv = {
  ...process.env,
  NODE_ENV: 'test',
  PORT: String(port),
  DATABASE_URL: dbUrl,
  PUBLIC_URL: url,
  WEB_DIST: webDist,
  ACCESS_TOKEN_TTL_SECONDS: '900',
};

let server: ChildProcess | null = null;
async function startServer(): Promise<void> {
  const child = spawn(process.execPath, ['api/dist/main.js'], {
    cwd: root,
    env: serverEnv,
    stdio: ['ignore', 'ignore', 'ignore'],
  });
  server = child;
  for (let i = 0; i < 600; i++) {
    if (child.exitCode !== null) throw new Error(`the API exited with ${child.exitCode}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('the API did not start');
}
async function killServer(): Promise<void> {
  const child = server;
  server = null;
  if (!child || child.exitCode !== null) return;
  const gone = new Promise((r) => child.once('exit', r));
  child.kill('SIGKILL');
  await gone;
}

const ready = !!baseDb && existsSync(`${webDist}/index.html`) && existsSync(`${root}api/dist/main.js`);

describe('the marking desk across an API crash and restart', () => {
  beforeAll(async () => {
    if (!ready)
      throw new Error(
        'This journey needs DATABASE_URL (set by api/scripts/test-all.sh), a built web/dist and api/dist.',
      );
    await admin(`CREATE DATABASE "${dbName}"`);
    for (const script of ['api/dist/database/migrate.js', 'api/dist/seed/seed.js']) {
      const r = spawnSync(process.execPath, [script], {
        cwd: root,
        env: { ...serverEnv, SEED_TODAY: undefined },
        encoding: 'utf8',
      });
      if (r.status !== 0) throw new Error(`${script} failed: ${r.stderr}`);
    }
    await startServer();
  });
  afterAll(async () => {
    await killServer();
    if (baseDb) await admin(`DROP DATABASE IF EXISTS "${dbName}" WITH (FORCE)`).catch(() => {});
  });

  it('changes typed while the API is down wait in the queue and reach the database when it is back', async () => {
    const s = await launch();
    try {
      const { page } = s;
      await signIn(page, DEMO.examiner);
      await navLink(page, 'Marking').click();
      await page.getByRole('heading', { name: 'Marking today', level: 1 }).waitFor();
      const first = page.getByRole('table').first().getByRole('link').first();
      const candidate = (await first.textContent())!.trim();
      await first.click();
      await page.getByRole('heading', { name: new RegExp(candidate) }).waitFor();
      const slotId = new URL(page.url()).pathname.split('/').at(-1)!;
      await page.getByRole('button', { name: /^Start the (sitting|slot)$/ }).first().waitFor();
      const openSitting = page.getByRole('button', { name: 'Start the sitting' });
      if (await openSitting.isVisible()) await openSitting.click();
      await page.getByRole('button', { name: 'Start the slot' }).click();
      await page.locator('#current-request').waitFor();

      const expected = new Map<string, CellValue>();
      await page.keyboard.press('w');
      const stops = page.locator('[data-desk-stop]');
      await stops.first().waitFor();
      const total = await stops.count();
      expect(total).toBeGreaterThan(6);
      await stops.first().focus();
      const typeStop = async (i: number) => {
        const el = page.locator(':focus');
        const cell = (await el.getAttribute('data-cell'))!;
        if ((await el.evaluate((e) => e.tagName)) === 'TEXTAREA') {
          const text = `Typed while step ${i}`;
          await page.keyboard.type(text);
          await page.keyboard.press('Enter');
          expected.set(cell, text);
        } else {
          const mark = (i % 3) + 2;
          await page.keyboard.press(String(mark));
          expected.set(cell, mark);
        }
      };
      for (let i = 0; i < 3; i++) await typeStop(i);
      await page.getByText('All changes saved').waitFor();

      // The API dies mid-slot; the examiner goes on marking.
      await killServer();
      for (let i = 3; i < 7; i++) await typeStop(i);
      await page.getByText('Offline — 4 changes queued').waitFor({ timeout: 30_000 });
      await screenshot(page, 'marking-desk-api-down');

      // The API comes back (same database): the queue drains in order, nothing is lost.
      await startServer();
      await page.getByText('All changes saved').waitFor({ timeout: 60_000 });

      const db = new pg.Client({ connectionString: dbUrl });
      await db.connect();
      try {
        const { rows } = await db.query<{ cell: string; value: CellValue }>(
          `SELECT c.cell, c.value FROM mark_cells c JOIN mark_sheets ms ON ms.id = c.sheet_id
            WHERE ms.slot_id = $1 AND c.version > 0`,
          [slotId],
        );
        expect(Object.fromEntries(rows.map((r) => [r.cell, r.value]))).toEqual(
          Object.fromEntries(expected),
        );
        // Each change was applied once: one applied change per cell typed.
        const { rows: applied } = await db.query<{ n: number }>(
          `SELECT count(*)::int AS n FROM mark_changes m JOIN mark_sheets ms ON ms.id = m.sheet_id
            WHERE ms.slot_id = $1 AND m.result = 'applied'`,
          [slotId],
        );
        expect(applied[0]!.n).toBe(expected.size);
      } finally {
        await db.end();
      }
      expect(s.problems).toEqual([]);
    } finally {
      await s.close();
    }
  });
});
