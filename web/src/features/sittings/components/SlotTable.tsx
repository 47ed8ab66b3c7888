import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Dropdown } from 'primereact/dropdown';
import { Tag } from 'primereact/tag';
import {
  SLOT_OUTCOMES,
  type SittingView,
  type SlotOutcome,
  type SlotView,
} from '@stavemark/shared';
import { OUTCOME_LABEL } from './labels';

export interface SlotActions {
  move: (slot: SlotView, direction: 'earlier' | 'later') => void;
  swap: (slot: SlotView) => void;
  startAt: (slot: SlotView) => void;
  remove: (slot: SlotView) => void;
  arrangement: (slot: SlotView) => void;
  outcome: (slot: SlotView, outcome: SlotOutcome) => void;
  resit: (slot: SlotView) => void;
}

function arrangementSummary(s: SlotView): string | null {
  const a = s.arrangement;
  if (!a) return null;
  const parts = [
    a.extraTimePercent ? `${a.extraTimePercent} % extra time` : null,
    a.restBreakMinutes ? `${a.restBreakMinutes} min rest` : null,
    ...a.substitutions.map((x) =>
      x.type === 'hands_separately'
        ? 'hands separately'
        : x.type === 'single_hand'
          ? `${x.hand === 'RH' ? 'right' : 'left'} hand only`
          : x.type === 'tempo_percent'
            ? `${x.percent} % tempo`
            : `at most ${x.octaves} octave(s)`,
    ),
  ].filter(Boolean);
  return parts.length ? parts.join(', ') : null;
}

/** The day's slots in order, with the drag-free editor: earlier, later, swap, a chosen start time. */
export function SlotTable({
  sitting,
  actions,
  busy,
  canPlan,
}: {
  sitting: SittingView;
  actions: SlotActions;
  busy: boolean;
  canPlan: boolean;
}) {
  const edit = sitting.permissions.edit;
  const paperName = new Map(sitting.papers.map((p) => [p.id, `${p.name}`]));
  const last = sitting.slots.length - 1;
  // A student's view carries no lists or examiners: only their own time.
  const ownOnly = sitting.papers.length === 0;

  const timeBody = (s: SlotView) => (
    <span className="sm-slot-time">
      {s.startTime}–{s.endTime}
      {s.notBefore && <span className="sm-muted"> (chosen)</span>}
    </span>
  );
  const candidateBody = (s: SlotView) => (
    <span>
      {s.candidate.name} <span className="sm-muted">{s.candidate.pupilNumber}</span>
      {s.resitOfSlotId && <Tag className="sm-tag-gap" severity="info" value="Re-sit" />}
    </span>
  );
  const minutesBody = (s: SlotView) => {
    const summary = arrangementSummary(s);
    return (
      <span>
        {s.minutes} min
        {s.lengthened && (
          <Tag
            className="sm-tag-gap"
            severity="warning"
            value="Access arrangement"
            title={summary ?? 'Longer slot'}
          />
        )}
        {summary && <div className="sm-muted sm-small">{summary}</div>}
      </span>
    );
  };
  const examinerBody = (s: SlotView) => (
    <span>
      {s.examiner?.displayName ?? <span className="sm-muted">None yet</span>}
      {s.secondExaminer && <div className="sm-small">Second: {s.secondExaminer.displayName}</div>}
      {s.ownPupilAcknowledged && (
        <div
          className="sm-small sm-warn-text"
          title={`Acknowledged by ${s.ownPupilAcknowledged.by}`}
        >
          Own pupil (acknowledged)
        </div>
      )}
    </span>
  );
  const outcomeBody = (s: SlotView) =>
    sitting.permissions.recordOutcomes ? (
      <Dropdown
        aria-label={`Outcome for ${s.candidate.name}`}
        value={s.outcome}
        placeholder="Not recorded"
        options={SLOT_OUTCOMES.map((o) => ({ label: OUTCOME_LABEL[o], value: o }))}
        disabled={busy}
        onChange={(e) => actions.outcome(s, e.value as SlotOutcome)}
      />
    ) : s.outcome ? (
      OUTCOME_LABEL[s.outcome]
    ) : (
      <span className="sm-muted">—</span>
    );
  const actionsBody = (s: SlotView) => (
    <span className="sm-row-actions sm-slot-actions">
      {edit && (
        <>
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-arrow-up"
            aria-label={`Move ${s.candidate.name} earlier`}
            disabled={busy || s.position === 0}
            onClick={() => actions.move(s, 'earlier')}
          />
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-arrow-down"
            aria-label={`Move ${s.candidate.name} later`}
            disabled={busy || s.position === last}
            onClick={() => actions.move(s, 'later')}
          />
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-sort-alt"
            aria-label={`Swap ${s.candidate.name}`}
            disabled={busy || last < 1}
            onClick={() => actions.swap(s)}
          />
          <Button
            type="button"
            size="small"
            text
            icon="pi pi-clock"
            aria-label={`Start time for ${s.candidate.name}`}
            disabled={busy}
            onClick={() => actions.startAt(s)}
          />
        </>
      )}
      {s.arrangement !== undefined && (
        <Button
          type="button"
          size="small"
          severity="secondary"
          label="Arrangement"
          aria-label={`Access arrangement for ${s.candidate.name}`}
          onClick={() => actions.arrangement(s)}
        />
      )}
      {edit && !s.outcome && (
        <Button
          type="button"
          size="small"
          text
          severity="danger"
          icon="pi pi-trash"
          aria-label={`Remove ${s.candidate.name}`}
          disabled={busy}
          onClick={() => actions.remove(s)}
        />
      )}
      {s.outcome && s.outcome !== 'completed' && canPlan && (
        <Button
          type="button"
          size="small"
          severity="secondary"
          label="Re-sit"
          aria-label={`Re-sit for ${s.candidate.name}`}
          onClick={() => actions.resit(s)}
        />
      )}
    </span>
  );

  return (
    <div className="sm-table-wrap">
      <DataTable
        value={sitting.slots}
        dataKey="id"
        size="small"
        aria-label="Slots"
        emptyMessage="No candidates yet: add them from a class."
        rowClassName={(s: SlotView) =>
          s.outcome === 'absent' || s.outcome === 'withdrawn' ? 'sm-row-muted' : ''
        }
      >
        <Column header="Time" body={timeBody} />
        <Column header="Candidate" body={candidateBody} />
        {!ownOnly && (
          <Column header="List" body={(s: SlotView) => paperName.get(s.paperId) ?? ''} />
        )}
        <Column header="Length" body={minutesBody} />
        {!ownOnly && <Column header="Examiners" body={examinerBody} />}
        {!ownOnly && <Column header="Outcome" body={outcomeBody} />}
        <Column header={<span className="sm-visually-hidden">Actions</span>} body={actionsBody} />
      </DataTable>
    </div>
  );
}
