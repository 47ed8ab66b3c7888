import { DataSource } from 'typeorm';
import type { TestProject } from 'vitest/node';
import { dataSourceOptions } from '../../src/database/data-source-options.js';
import { migrate } from '../../src/database/migrate.js';
import { readDemoSchool, seedDemo } from '../../src/seed/demo-school.js';
import { DEMO_FILE } from '../../src/seed/seed.js';
import { createFromTemplate, dropDatabasesWithPrefix, SEEDED_TEMPLATE_DAY, TEST_DB_PREFIX, urlFor, withAdmin } from './test-db.js';

declare module 'vitest' {
  export interface ProvidedContext {
    templateDb: string;
    /** The template with the demo school seeded for SEEDED_TEMPLATE_DAY (a year of marks included). */
    seededTemplateDb: string;
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
  // Seeding the demo once here, not once per test file, keeps the suite quick on a busy machine.
  const seeded = `${runPrefix}seeded`;
  await createFromTemplate(seeded, template);
  const ds = new DataSource(dataSourceOptions(urlFor(seeded)));
  await ds.initialize();
  try {
    await ds.transaction((em) => seedDemo(em, readDemoSchool(DEMO_FILE), SEEDED_TEMPLATE_DAY));
  } finally {
    await ds.destroy();
  }
  project.provide('seededTemplateDb', seeded);
  project.provide('runPrefix', runPrefix);
  return async () => {
    await dropDatabasesWithPrefix(runPrefix);
  };
}
