import type { MarkSheetView } from '@stavemark/shared';
import type { MarkCell } from './entities/mark-cell.entity.js';
import type { MarkSheet } from './entities/mark-sheet.entity.js';

/** Cells never saved (version 0, the placeholder a first save locks) are left out. */
export function toSheetView(sheet: MarkSheet, cells: MarkCell[]): MarkSheetView {
  return {
    id: sheet.id,
    slotId: sheet.slotId,
    examiner: {
      id: sheet.examinerMembershipId,
      displayName: sheet.examiner?.person?.displayName ?? '',
    },
    role: sheet.role,
    status: sheet.status,
    startedAt: sheet.startedAt.toISOString(),
    submittedAt: sheet.submittedAt?.toISOString() ?? null,
    cells: cells
      .filter((c) => c.version > 0)
      .map((c) => ({ cell: c.cell, value: c.value, version: c.version })),
  };
}
