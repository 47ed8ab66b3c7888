import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { loadEnv } from '../config/env.js';
import { dataSourceOptions } from './data-source-options.js';

/** The one DataSource the TypeORM CLI loads (`typeorm migration:run -d dist/database/data-source.js`). */
export default new DataSource(dataSourceOptions(loadEnv().DATABASE_URL));
