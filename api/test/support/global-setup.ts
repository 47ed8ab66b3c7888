import type { TestProject } from 'vitest/node';
import { migrate } from '../../src/database/migrate.js';
import { dropDatabasesWithPrefix, TEST_DB_PREFIX, urlFor, withAdmin } from './test-db.js';

declare module 'vitest' {
  export interface ProvidedContext {
    templateDb: string;
    runPrefix: string;
  }
}

/** Migrates once into a template database; each test file clones it (fast on 2 cores). */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const runPrefix = `${TEST_DB_PREFIX}${process.pid}_`;
  const template = `${runPrefix}template`;
  await dropDatabasesWithPrefix(runPrefix);
  await withAdmin((c) => c.query(`CREATE DATABASE ${template}`));
  await migrate(urlFor(template));
  // A template must have no open connections when cloned: migrate() has closed its own.
  project.provide('templateDb', template);
  project.provide('runPrefix', runPrefix);
  return async () => {
    await dropDatabasesWithPrefix(runPrefix);
  };
}
