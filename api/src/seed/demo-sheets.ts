// Writes submitted mark sheets straight into the tables, as the desk would have left them after
// submit: each cell at version 1, the sheet submitted. Only for the demo seed, where a year of
// marking has to appear in well under a second. The per-change log (mark_changes) exists to
// recognise a client's retried change ids; a seeded sheet was never typed, so it has none, and
// its cells name one seed change id per sheet.
import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { CellValue } from '@stavemark/shared';
import { bulkInsert } from '../common/bulk-sql.js';

export interface PlannedSheet {
  slotId: string;
  examinerMembershipId: string;
  role: 'first' | 'second';
  startedAt: Date;
  submittedAt: Date;
  /** Cell name (`mark:0:evenness`, `flag:1:slip`, `comment:overall`, `outcome`) → value. */
  cells: Record<string, CellValue>;
}

export async function writeSubmittedSheets(em: EntityManager, organisationId: string, sheets: PlannedSheet[]): Promise<number> {
  if (sheets.length === 0) return 0;
  const ids = sheets.map(() => randomUUID());
  await bulkInsert(
    em,
    'mark_sheets',
    [
      { name: 'id', type: 'uuid' },
      { name: 'organisation_id', type: 'uuid' },
      { name: 'slot_id', type: 'uuid' },
      { name: 'examiner_membership_id', type: 'uuid' },
      { name: 'role', type: 'text' },
      { name: 'status', type: 'text' },
      { name: 'started_at', type: 'timestamptz' },
      { name: 'submitted_at', type: 'timestamptz' },
    ],
    sheets.map((s, i) => [ids[i], organisationId, s.slotId, s.examinerMembershipId, s.role, 'submitted', s.startedAt, s.submittedAt]),
  );
  const cells: unknown[][] = [];
  sheets.forEach((s, i) => {
    const changeId = randomUUID();
    for (const [cell, value] of Object.entries(s.cells)) cells.push([organisationId, ids[i], cell, value, 1, changeId, s.submittedAt]);
  });
  await bulkInsert(
    em,
    'mark_cells',
    [
      { name: 'organisation_id', type: 'uuid' },
      { name: 'sheet_id', type: 'uuid' },
      { name: 'cell', type: 'text' },
      { name: 'value', type: 'jsonb' },
      { name: 'version', type: 'integer' },
      { name: 'last_change_id', type: 'uuid' },
      { name: 'updated_at', type: 'timestamptz' },
    ],
    cells,
  );
  return sheets.length;
}
