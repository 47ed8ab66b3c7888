import { useCallback, useEffect, useMemo, useState, useSyncExternalStore } from 'react';
import type { CellValue, MarkSheetView } from '@stavemark/shared';
import { saveCellTo } from '../api/save-cell';
import { queueKey, SaveQueue, type CellConflict } from '../api/save-queue';

/**
 * The examiner's sheet as the desk shows it: the server's cells with the queue's waiting changes
 * on top. Every change goes into the persistent queue first, then to the server.
 */
export function useSheet(sheet: MarkSheetView, personId: string) {
  const queue = useMemo(
    () => new SaveQueue(queueKey(personId, sheet.id), saveCellTo(sheet.id)),
    [personId, sheet.id],
  );
  const [values, setValues] = useState<Map<string, CellValue>>(() => {
    const m = new Map<string, CellValue>(sheet.cells.map((c) => [c.cell, c.value]));
    for (const [cell, value] of queue.pendingValues()) m.set(cell, value);
    return m;
  });

  useEffect(() => {
    queue.seedVersions(sheet.cells);
    queue.resume();
    const online = () => queue.wake();
    window.addEventListener('online', online);
    return () => {
      window.removeEventListener('online', online);
      queue.stop();
    };
  }, [queue, sheet.cells]);

  // A submitted sheet is the server's alone (corrections arrive as a reloaded desk); a draft shows
  // the local values, which may be ahead of any view the server sent.
  const serverValues = useMemo(
    () => new Map<string, CellValue>(sheet.cells.map((c) => [c.cell, c.value])),
    [sheet.cells],
  );
  const shown = sheet.status === 'submitted' ? serverValues : values;

  const snapshot = useSyncExternalStore(
    useCallback((l: () => void) => queue.subscribe(l), [queue]),
    queue.getSnapshot,
  );

  const set = useCallback(
    (cell: string, value: CellValue) => {
      setValues((m) => new Map(m).set(cell, value));
      queue.enqueue(cell, value);
    },
    [queue],
  );

  const resolve = useCallback(
    (conflict: CellConflict, value: CellValue) => {
      setValues((m) => new Map(m).set(conflict.cell, value));
      queue.resolve(conflict, value);
    },
    [queue],
  );

  return { values: shown, set, resolve, snapshot, readOnly: sheet.status === 'submitted' };
}

export type SheetState = ReturnType<typeof useSheet>;
