import 'reflect-metadata';
import { writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { DataSource } from 'typeorm';
import { loadEnv } from '../config/env.js';
import { dataSourceOptions } from './data-source-options.js';

/**
 * Writes a migration with the difference between the entities and the schema that the existing
 * migrations build: `npm run migration:generate -w api -- AddSittings`. It works on a scratch
 * database, never on the demo one. Review the file, then list the class in migrations/index.ts.
 */
async function main(): Promise<void> {
  const name = process.argv[2];
  if (!name || !/^[A-Z][A-Za-z0-9]+$/.test(name)) throw new Error('Give a name in PascalCase, e.g. AddSittings');
  const base = new URL(loadEnv().DATABASE_URL);
  const scratch = `stavemark_test_migration_${process.pid}`;
  const admin = new pg.Client({ connectionString: Object.assign(new URL(base), { pathname: '/postgres' }).toString() });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${scratch}`);
  const ds = new DataSource(dataSourceOptions(Object.assign(new URL(base), { pathname: `/${scratch}` }).toString()));
  try {
    await ds.initialize();
    await ds.runMigrations();
    const log = await ds.driver.createSchemaBuilder().log();
    if (log.upQueries.length === 0) {
      console.log('The entities and the migrations agree: nothing to generate.');
      return;
    }
    const ts = Date.now();
    const q = (list: { query: string }[]) => list.map((x) => `    await q.query(\`${x.query.replace(/`/g, '\\`')}\`);`).join('\n');
    const file = resolve(dirname(fileURLToPath(import.meta.url)), '../../src/migrations', `${ts}-${name}.ts`);
    writeFileSync(
      file,
      `import type { MigrationInterface, QueryRunner } from 'typeorm';\n\nexport class ${name}${ts} implements MigrationInterface {\n  name = '${name}${ts}';\n\n  async up(q: QueryRunner): Promise<void> {\n${q(log.upQueries)}\n  }\n\n  async down(q: QueryRunner): Promise<void> {\n${q([...log.downQueries].reverse())}\n  }\n}\n`,
    );
    console.log(`Wrote ${file}\nAdd ${name}${ts} to src/migrations/index.ts.`);
  } finally {
    if (ds.isInitialized) await ds.destroy();
    await admin.query(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
    await admin.end();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
