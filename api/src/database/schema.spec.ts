import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DataSource } from 'typeorm';
import { dataSourceOptions } from './data-source-options.js';
import { createTestDatabase } from '../../test/support/test-app.js';
import { dropDatabase } from '../../test/support/test-db.js';

describe('migrations and entities', () => {
  let ds: DataSource;
  let name: string;
  beforeAll(async () => {
    const db = await createTestDatabase();
    name = db.name;
    ds = new DataSource(dataSourceOptions(db.url));
    await ds.initialize();
  });
  afterAll(async () => {
    await ds.destroy();
    await dropDatabase(name);
  });

  it('the migrated schema is what the entities describe (nothing for synchronize to do)', async () => {
    const pending = await ds.driver.createSchemaBuilder().log();
    const statements = pending.upQueries.map((q) => q.query);
    expect(statements).toEqual([]);
  });

  it('every migration has run', async () => {
    expect(await ds.showMigrations()).toBe(false);
  });
});
