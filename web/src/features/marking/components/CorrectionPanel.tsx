import { useState } from 'react';
import { cellName, type DeskView } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { useCorrectCell } from '../api/correct-cell';

/** After submission a mark changes only as a correction with a reason (kept in the audit trail). */
export function CorrectionPanel({ desk, sheetId }: { desk: DeskView; sheetId: string }) {
  const correct = useCorrectCell(desk.slot.id, sheetId);
  const options = desk.requests.flatMap((r) =>
    r.criteria.map((c) => ({
      cell: cellName.mark(r.index, c.key),
      label: `Request ${r.index + 1}: ${c.label} (out of ${c.maxMark})`,
      max: c.maxMark,
    })),
  );
  const [cell, setCell] = useState(options[0]?.cell ?? '');
  const [value, setValue] = useState(0);
  const [reason, setReason] = useState('');
  const max = options.find((o) => o.cell === cell)?.max ?? 10;
  return (
    <details className="sm-desk-quickmarks">
      <summary>Correct a mark</summary>
      <form
        className="sm-desk-change"
        onSubmit={(e) => {
          e.preventDefault();
          correct.mutate(
            { changeId: crypto.randomUUID(), cell, value, reason },
            { onSuccess: () => setReason('') },
          );
        }}
      >
        <span className="sm-desk-change__field">
          <label htmlFor={`correct-${sheetId}`}>Mark</label>
          <select id={`correct-${sheetId}`} value={cell} onChange={(e) => setCell(e.target.value)}>
            {options.map((o) => (
              <option key={o.cell} value={o.cell}>
                {o.label}
              </option>
            ))}
          </select>
        </span>
        <label>
          New mark{' '}
          <input
            type="number"
            min={0}
            max={max}
            value={value}
            onChange={(e) => setValue(Number(e.target.value))}
          />
        </label>
        <label className="sm-desk-change__reason">
          Reason{' '}
          <input
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            required
            minLength={3}
          />
        </label>
        <button type="submit" className="sm-desk-nav" disabled={correct.isPending}>
          Record correction
        </button>
      </form>
      {correct.isSuccess && <Alert severity="success">Correction recorded with its reason.</Alert>}
      {correct.error && <Alert severity="error">{correct.error.message}</Alert>}
    </details>
  );
}
