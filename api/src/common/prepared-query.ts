// A named prepared statement for the hottest queries (the caller of every request, the usual
// cell save): PostgreSQL parses and analyses it once per connection instead of on every call.
// It goes to the pool directly (TypeORM's query() sends unnamed statements), so only for
// statements outside a transaction. Errors are pg's own (`code`, `table`), not TypeORM's wrapper.
import type { DataSource } from 'typeorm';
import type { Pool } from 'pg';

export async function preparedQuery<T>(db: DataSource, name: string, text: string, values: unknown[]): Promise<T[]> {
  const pool = (db.driver as unknown as { master: Pool }).master;
  const res = await pool.query({ name, text, values });
  return res.rows as T[];
}
