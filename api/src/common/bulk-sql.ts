import type { EntityManager } from 'typeorm';

export interface BulkColumn {
  name: string;
  /** PostgreSQL array element type, e.g. 'uuid', 'text', 'date', 'integer', 'jsonb'. */
  type: string;
}

/**
 * One INSERT of any number of rows, as arrays per column through unnest(): a single statement
 * with one parameter per column, so a 5,000-row import is not 5,000 round trips and never hits
 * PostgreSQL's 65,535-parameter limit. Returns the `returning` columns of each inserted row (match
 * them by a unique column: RETURNING order is not promised).
 */
export async function bulkInsert(
  em: EntityManager,
  table: string,
  columns: BulkColumn[],
  rows: unknown[][],
  returning?: string,
  onConflict = '',
): Promise<Record<string, string>[]> {
  if (rows.length === 0) return [];
  const arrays = columns.map((_, i) => rows.map((r) => (r[i] === undefined ? null : r[i])));
  const params = arrays.map((a, i) =>
    columns[i]!.type === 'jsonb' ? a.map((v) => (v === null ? null : JSON.stringify(v))) : a,
  );
  const sql =
    `INSERT INTO ${table} (${columns.map((c) => c.name).join(', ')}) ` +
    `SELECT * FROM unnest(${columns.map((c, i) => `$${i + 1}::${c.type}[]`).join(', ')}) ` +
    `${onConflict}${returning ? ` RETURNING ${returning}` : ''}`;
  const result = (await em.query(sql, params)) as Record<string, string>[];
  return returning ? result : [];
}
