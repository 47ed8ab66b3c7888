import 'reflect-metadata';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { DataSource } from 'typeorm';
import { localDate, now } from '../common/clock.js';
import { loadEnv } from '../config/env.js';
import { dataSourceOptions } from '../database/data-source-options.js';
import { readDemoSchool, seedDemo } from './demo-school.js';

const here = dirname(fileURLToPath(import.meta.url));
export const DEMO_FILE = resolve(here, '../../../seed-data/demo-school.json');

/**
 * Seeds the demo school relative to a clock: SEED_TODAY (YYYY-MM-DD) if set, else today in the
 * school's zone, so "today's sitting" and "a year of results" stay true whenever it runs.
 */
export async function seed(url: string, today?: string): Promise<void> {
  const env = loadEnv();
  if (env.NODE_ENV === 'production') throw new Error('The demo school is never seeded in production.');
  const data = readDemoSchool(DEMO_FILE);
  const day = today ?? process.env.SEED_TODAY ?? localDate(now(), data.organisation.timeZone);
  const ds = new DataSource(dataSourceOptions(url));
  await ds.initialize();
  try {
    const t0 = performance.now();
    await ds.transaction((em) => seedDemo(em, data, day));
    // The time is printed, not tested: it depends on how busy the machine is.
    console.log(`Seeded the demo school "${data.organisation.name}" for ${day} in ${((performance.now() - t0) / 1000).toFixed(1)} s.`);
  } finally {
    await ds.destroy();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  seed(loadEnv().DATABASE_URL).catch((err: unknown) => {
    console.error('Seeding failed:', err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
