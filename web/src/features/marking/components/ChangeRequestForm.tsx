import { useState } from 'react';
import { HANDS, type DeskRequest, type Hands } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { useChangeRequest } from '../api/change-request';

const HAND_LABEL: Record<Hands, string> = {
  RH: 'Right hand',
  LH: 'Left hand',
  HT: 'Hands together',
};

/** The examiner asks something else than drawn (another key, hands, octaves); the reason is kept. */
export function ChangeRequestForm({
  slotId,
  request,
  disabled,
}: {
  slotId: string;
  request: DeskRequest;
  disabled: boolean;
}) {
  const change = useChangeRequest(slotId);
  const [key, setKey] = useState(request.key ?? '');
  const [hands, setHands] = useState<Hands>(request.hands);
  const [octaves, setOctaves] = useState(request.octaves);
  const [reason, setReason] = useState('');
  const counted = request.key !== null;
  return (
    <details className="sm-desk-quickmarks">
      <summary>Change this request</summary>
      {request.change && (
        <p className="sm-muted">
          Changed by {request.change.by}: {request.change.reason}
        </p>
      )}
      <form
        className="sm-desk-change"
        onSubmit={(e) => {
          e.preventDefault();
          change.mutate({
            index: request.index,
            ...(counted && key && key !== request.key ? { key } : {}),
            ...(hands !== request.hands ? { hands } : {}),
            ...(counted && octaves !== request.octaves ? { octaves } : {}),
            reason,
          });
        }}
      >
        {counted && (
          <label>
            Key{' '}
            <input
              value={key}
              onChange={(e) => setKey(e.target.value)}
              size={4}
              disabled={disabled}
            />
          </label>
        )}
        <label>
          Hands{' '}
          <select
            value={hands}
            onChange={(e) => setHands(e.target.value as Hands)}
            disabled={disabled}
          >
            {HANDS.map((h) => (
              <option key={h} value={h}>
                {HAND_LABEL[h]}
              </option>
            ))}
          </select>
        </label>
        {counted && (
          <label>
            Octaves{' '}
            <input
              type="number"
              min={1}
              max={4}
              value={octaves}
              onChange={(e) => setOctaves(Number(e.target.value))}
              disabled={disabled}
            />
          </label>
        )}
        <label className="sm-desk-change__reason">
          Reason{' '}
          <input
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            required
            minLength={3}
            disabled={disabled}
          />
        </label>
        <button type="submit" className="sm-desk-nav" disabled={disabled || change.isPending}>
          Change request
        </button>
      </form>
      {change.error && <Alert severity="error">{change.error.message}</Alert>}
    </details>
  );
}
