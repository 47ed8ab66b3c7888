import { useId, useState } from 'react';
import { Dialog } from 'primereact/dialog';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { InputText } from 'primereact/inputtext';
import type { SittingView, SlotView } from '@stavemark/shared';
import { formatPlainDate } from '@/lib/format';
import { useSittings } from '../api/get-sittings';

interface Base {
  slot: SlotView | null;
  onHide: () => void;
}

// Each dialog's body is keyed by the slot, so its fields start afresh for every slot.

function StartAtBody({
  slot,
  onHide,
  onSubmit,
}: {
  slot: SlotView;
  onHide: () => void;
  onSubmit: (slot: SlotView, notBefore: string | null) => void;
}) {
  const id = useId();
  const [value, setValue] = useState(slot.notBefore ?? slot.startTime);
  return (
    <div className="sm-form">
      <div className="sm-field">
        <label htmlFor={`${id}-time`}>Start no earlier than</label>
        <InputText
          id={`${id}-time`}
          type="time"
          value={value}
          onChange={(e) => setValue(e.target.value)}
        />
        <small className="sm-field-hint">
          The slots after it follow on; a time inside a break or past the day’s end is refused.
        </small>
      </div>
      <div className="sm-form-actions">
        {slot.notBefore && (
          <Button
            type="button"
            label="Remove the chosen time"
            severity="secondary"
            onClick={() => onSubmit(slot, null)}
          />
        )}
        <Button type="button" label="Cancel" severity="secondary" onClick={onHide} />
        <Button
          type="button"
          label="Set start time"
          disabled={!/^\d\d:\d\d$/.test(value)}
          onClick={() => onSubmit(slot, value)}
        />
      </div>
    </div>
  );
}

/** A start time of the slot's own ("not before"), e.g. a candidate who can come only after school. */
export function StartAtDialog({
  slot,
  onHide,
  onSubmit,
}: Base & { onSubmit: (slot: SlotView, notBefore: string | null) => void }) {
  return (
    <Dialog
      header={slot ? `Start time for ${slot.candidate.name}` : ''}
      visible={slot !== null}
      onHide={onHide}
      style={{ width: '26rem' }}
    >
      {slot && <StartAtBody key={slot.id} slot={slot} onHide={onHide} onSubmit={onSubmit} />}
    </Dialog>
  );
}

function SwapBody({
  slot,
  sitting,
  onHide,
  onSubmit,
}: {
  slot: SlotView;
  sitting: SittingView;
  onHide: () => void;
  onSubmit: (slot: SlotView, withSlotId: string) => void;
}) {
  const id = useId();
  const [other, setOther] = useState<string | null>(null);
  const options = sitting.slots
    .filter((s) => s.id !== slot.id)
    .map((s) => ({ label: `${s.startTime} ${s.candidate.name}`, value: s.id }));
  return (
    <div className="sm-form">
      <div className="sm-field">
        <label htmlFor={`${id}-other`}>Candidate</label>
        <Dropdown
          inputId={`${id}-other`}
          value={other}
          options={options}
          placeholder="Choose a slot"
          onChange={(e) => setOther(e.value as string)}
        />
      </div>
      <div className="sm-form-actions">
        <Button type="button" label="Cancel" severity="secondary" onClick={onHide} />
        <Button
          type="button"
          label="Swap"
          disabled={!other}
          onClick={() => other && onSubmit(slot, other)}
        />
      </div>
    </div>
  );
}

export function SwapDialog({
  slot,
  sitting,
  onHide,
  onSubmit,
}: Base & { sitting: SittingView; onSubmit: (slot: SlotView, withSlotId: string) => void }) {
  return (
    <Dialog
      header={slot ? `Swap ${slot.candidate.name} with…` : ''}
      visible={slot !== null}
      onHide={onHide}
      style={{ width: '26rem' }}
    >
      {slot && (
        <SwapBody key={slot.id} slot={slot} sitting={sitting} onHide={onHide} onSubmit={onSubmit} />
      )}
    </Dialog>
  );
}

function ResitBody({
  slot,
  sitting,
  onHide,
  onSubmit,
}: {
  slot: SlotView;
  sitting: SittingView;
  onHide: () => void;
  onSubmit: (slot: SlotView, sittingId: string) => void;
}) {
  const id = useId();
  const sittings = useSittings();
  const [target, setTarget] = useState<string | null>(null);
  const paper = sitting.papers.find((p) => p.id === slot.paperId);
  const options = (sittings.data ?? [])
    .filter((s) => s.status === 'draft' || s.status === 'scheduled' || s.status === 'in_progress')
    .map((s) => ({
      label: `${formatPlainDate(s.date, 'short')} — ${s.title} (${s.room})`,
      value: s.id,
    }));
  return (
    <div className="sm-form">
      <div className="sm-field">
        <label htmlFor={`${id}-target`}>In the sitting</label>
        <Dropdown
          inputId={`${id}-target`}
          value={target}
          options={options}
          placeholder="Choose a sitting"
          onChange={(e) => setTarget(e.value as string)}
        />
        <small className="sm-field-hint">
          It needs a {paper?.name ?? 'matching'} list. The re-sit is linked to this attempt.
        </small>
      </div>
      <div className="sm-form-actions">
        <Button type="button" label="Cancel" severity="secondary" onClick={onHide} />
        <Button
          type="button"
          label="Add the re-sit"
          disabled={!target}
          onClick={() => target && onSubmit(slot, target)}
        />
      </div>
    </div>
  );
}

/** A re-sit: a new slot for the same candidate, in this sitting later or another with the same list. */
export function ResitDialog({
  slot,
  sitting,
  onHide,
  onSubmit,
}: Base & { sitting: SittingView; onSubmit: (slot: SlotView, sittingId: string) => void }) {
  return (
    <Dialog
      header={slot ? `Re-sit for ${slot.candidate.name}` : ''}
      visible={slot !== null}
      onHide={onHide}
      style={{ width: '32rem' }}
    >
      {slot && (
        <ResitBody
          key={slot.id}
          slot={slot}
          sitting={sitting}
          onHide={onHide}
          onSubmit={onSubmit}
        />
      )}
    </Dialog>
  );
}
