import { randomBytes } from 'node:crypto';
import type { NestExpressApplication } from '@nestjs/platform-express';
import supertest from 'supertest';
import { inject } from 'vitest';
import { DataSource } from 'typeorm';
import { createApp } from '../../src/app.factory.js';
import { loadEnv } from '../../src/config/env.js';
import { dataSourceOptions } from '../../src/database/data-source-options.js';
import { readDemoSchool, seedDemo } from '../../src/seed/demo-school.js';
import { DEMO_FILE } from '../../src/seed/seed.js';
import { createFromTemplate, dropDatabase, SEEDED_TEMPLATE_DAY } from './test-db.js';

export interface TestApp {
  app: NestExpressApplication;
  http: () => supertest.Agent;
  db: DataSource;
  url: string;
  close: () => Promise<void>;
}

/** A database of this file's own, cloned from the migrated template (or the seeded one). */
export async function createTestDatabase(template: 'migrated' | 'seeded' = 'migrated'): Promise<{ name: string; url: string }> {
  const name = `${inject('runPrefix')}${randomBytes(4).toString('hex')}`;
  const url = await createFromTemplate(name, inject(template === 'seeded' ? 'seededTemplateDb' : 'templateDb'));
  return { name, url };
}

/** The whole Nest application in-process, on its own database, optionally with the demo school. */
export async function createTestApp(opts: { seed?: boolean; today?: string; env?: Record<string, string> } = {}): Promise<TestApp> {
  const today = opts.today ?? SEEDED_TEMPLATE_DAY;
  // The demo for the usual day is cloned ready-seeded; another day is seeded here.
  const preseeded = opts.seed !== false && today === SEEDED_TEMPLATE_DAY;
  const { name, url } = await createTestDatabase(preseeded ? 'seeded' : 'migrated');
  Object.assign(process.env, { NODE_ENV: 'test', DATABASE_URL: url, ...opts.env });
  const db = new DataSource(dataSourceOptions(url));
  await db.initialize();
  if (opts.seed !== false && !preseeded) {
    await db.transaction((em) => seedDemo(em, readDemoSchool(DEMO_FILE), today));
  }
  const app = await createApp(loadEnv(), { logger: false });
  await app.init();
  return {
    app,
    http: () => supertest.agent(app.getHttpServer()),
    db,
    url,
    close: async () => {
      await app.close();
      await db.destroy();
      await dropDatabase(name);
    },
  };
}

export async function signIn(t: TestApp, email: string, password = 'stavemark-demo'): Promise<string> {
  const res = await t.http().post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return (res.body as { accessToken: string }).accessToken;
}
