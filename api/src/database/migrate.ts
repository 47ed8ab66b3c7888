import 'reflect-metadata';
import { pathToFileURL } from 'node:url';
import { DataSource } from 'typeorm';
import { loadEnv } from '../config/env.js';
import { dataSourceOptions } from './data-source-options.js';

/** Runs pending migrations; used by `npm start` and the test scripts. */
export async function migrate(url: string): Promise<string[]> {
  const ds = new DataSource(dataSourceOptions(url));
  await ds.initialize();
  try {
    const ran = await ds.runMigrations({ transaction: 'each' });
    return ran.map((m) => m.name);
  } finally {
    await ds.destroy();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  migrate(loadEnv().DATABASE_URL)
    .then((ran) => console.log(ran.length ? `Migrated: ${ran.join(', ')}` : 'Database schema is up to date.'))
    .catch((err: unknown) => {
      console.error('Migration failed:', err instanceof Error ? err.message : err);
      process.exit(1);
    });
}
