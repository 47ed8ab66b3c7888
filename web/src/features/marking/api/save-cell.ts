import type { SaveResult } from '@stavemark/shared';
import { apiRequest } from '@/lib/api-client';
import type { SendChange } from './save-queue';

/** The queue's sender: one cell to POST /mark-sheets/:id/cells. */
export const saveCellTo =
  (sheetId: string): SendChange =>
  (change) =>
    apiRequest<SaveResult>(`/mark-sheets/${encodeURIComponent(sheetId)}/cells`, {
      method: 'POST',
      body: {
        changeId: change.changeId,
        cell: change.cell,
        value: change.value,
        baseVersion: change.baseVersion,
      },
    });
