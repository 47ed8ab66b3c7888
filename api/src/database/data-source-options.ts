import type { DataSourceOptions } from 'typeorm';
import { migrations } from '../migrations/index.js';
import { entities } from './entities.js';
import { SnakeNamingStrategy } from './snake-naming.strategy.js';

export function dataSourceOptions(url: string, extra: Partial<DataSourceOptions> = {}): DataSourceOptions {
  return {
    type: 'postgres',
    url,
    entities,
    migrations,
    namingStrategy: new SnakeNamingStrategy(),
    // gen_random_uuid() is built into PostgreSQL 13+: no extension to install.
    uuidExtension: 'pgcrypto',
    installExtensions: false,
    // Schema changes only through migrations (design.md §6).
    synchronize: false,
    migrationsRun: false,
    ...extra,
  } as DataSourceOptions;
}
