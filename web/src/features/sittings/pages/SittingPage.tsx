import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import { ConfirmDialog, confirmDialog } from 'primereact/confirmdialog';
import type { SittingStatus, SittingView, SlotOutcome, SlotView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { SittingRecordings } from '@/features/recordings';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { notify } from '@/lib/notify';
import { downloadCalendar } from '../api/download-calendar';
import { useSitting } from '../api/get-sitting';
import { useChangeStatus } from '../api/change-status';
import { useMoveSlot } from '../api/move-slot';
import { useSwapSlots } from '../api/swap-slots';
import { useUpdateSlot } from '../api/update-slot';
import { useRemoveSlot } from '../api/remove-slot';
import { useRecordOutcome } from '../api/record-outcome';
import { useCreateResit } from '../api/create-resit';
import { useDeleteSitting } from '../api/delete-sitting';
import { AddCandidatesDialog } from '../components/AddCandidatesDialog';
import { ArrangementDialog } from '../components/ArrangementDialog';
import { DoubleMarkingDialog } from '../components/DoubleMarkingDialog';
import { PlanSittingDialog } from '../components/PlanSittingDialog';
import { ResitDialog, StartAtDialog, SwapDialog } from '../components/SlotDialogs';
import { SlotTable } from '../components/SlotTable';
import { STATUS_ACTION, STATUS_LABEL, STATUS_SEVERITY } from '../components/labels';
import { PlanProblemAlert, useAcknowledgingRun } from '../components/problems';
import '../sittings.css';

const CONFIRM: Partial<Record<SittingStatus, string>> = {
  scheduled:
    'The requirement lists, their rubrics and the band policy are pinned for this sitting, and every examiner and candidate (a guardian for a minor) is e-mailed their times with a calendar file.',
  marking_closed: 'Every slot needs an outcome. After this, marks can no longer change.',
  published: 'Results are released as they stand. This cannot be undone.',
};

function Plan({ sitting }: { sitting: SittingView }) {
  return (
    <div className="sm-plan-facts">
      <section className="sm-sheet" aria-labelledby="papers-title">
        <h2 id="papers-title">Lists and slot lengths</h2>
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">List</th>
              <th scope="col">Grade</th>
              <th scope="col" className="sm-num">
                Suggested
              </th>
              <th scope="col" className="sm-num">
                Slot
              </th>
            </tr>
          </thead>
          <tbody>
            {sitting.papers.map((p) => (
              <tr key={p.id}>
                <td>
                  {p.name} <span className="sm-muted">v{p.version}</span>
                </td>
                <td>{p.grade}</td>
                <td className="sm-num">{p.suggestedMinutes} min</td>
                <td className="sm-num">
                  {p.effectiveMinutes} min
                  {p.slotMinutes !== null && <span className="sm-muted"> (fixed)</span>}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="sm-muted sm-small">
          Write-up gap of {sitting.writeUpGapMinutes} min included; {sitting.changeoverMinutes} min
          changeover between candidates.
        </p>
      </section>
      <section className="sm-sheet" aria-labelledby="day-title">
        <h2 id="day-title">The day</h2>
        <dl className="sm-facts">
          <dt>Slots</dt>
          <dd>
            {sitting.dayStart}–{sitting.dayEnd} ({sitting.timeZone})
          </dd>
          <dt>Breaks</dt>
          <dd>
            {sitting.breaks.length
              ? sitting.breaks
                  .map((b) => `${b.start}–${b.end}${b.label ? ` ${b.label}` : ''}`)
                  .join('; ')
              : 'None'}
          </dd>
          <dt>Examiners</dt>
          <dd>
            {sitting.examiners.length
              ? sitting.examiners
                  .map((e, i) => `${e.displayName}${i === 0 ? ' (leads)' : ''}`)
                  .join(', ')
              : 'None yet'}
          </dd>
          {sitting.pinned && (
            <>
              <dt>Pinned</dt>
              <dd>
                {sitting.papers.map((p) => `${p.name} v${p.version}`).join(', ')};{' '}
                {sitting.pinned.rubricVersionIds.length} rubric version(s); band policy v
                {sitting.pinned.bandPolicy.version}
              </dd>
            </>
          )}
        </dl>
      </section>
    </div>
  );
}

export function SittingPage() {
  const { sittingId = '' } = useParams();
  const me = useCurrentUser();
  const roles = activeMembership(me)?.roles ?? [];
  const canPlan = roles.includes('admin') || roles.includes('teacher');
  const navigate = useNavigate();
  const sitting = useSitting(sittingId);
  const { problem, run } = useAcknowledgingRun();
  const status = useChangeStatus();
  const move = useMoveSlot();
  const swap = useSwapSlots();
  const update = useUpdateSlot();
  const remove = useRemoveSlot();
  const outcome = useRecordOutcome();
  const resit = useCreateResit();
  const del = useDeleteSitting();
  const [editing, setEditing] = useState(false);
  const [adding, setAdding] = useState(false);
  const [doubling, setDoubling] = useState(false);
  const [arrangementFor, setArrangementFor] = useState<{ studentId: string; name: string } | null>(
    null,
  );
  const [startAt, setStartAt] = useState<SlotView | null>(null);
  const [swapping, setSwapping] = useState<SlotView | null>(null);
  const [resitFor, setResitFor] = useState<SlotView | null>(null);

  if (sitting.isPending) return <PageLoading />;
  if (sitting.isError) return <ErrorMessage error={sitting.error} what="the sitting" />;
  const s = sitting.data;
  const busy = [status, move, swap, update, remove, outcome, resit].some((m) => m.isPending);

  const changeTo = (next: Exclude<SittingStatus, 'draft'>) => {
    const go = () =>
      void run(
        (ack) =>
          status.mutateAsync({
            id: s.id,
            input: { status: next, ...(ack ? { acknowledgeOwnPupil: true } : {}) },
          }),
        () =>
          notify({
            severity: 'success',
            summary: `${s.title}: ${STATUS_LABEL[next].toLowerCase()}.`,
          }),
      );
    const message = CONFIRM[next];
    if (!message) return go();
    confirmDialog({
      header: `${STATUS_ACTION[next]}?`,
      message,
      acceptLabel: STATUS_ACTION[next],
      rejectLabel: 'Not yet',
      rejectClassName: 'p-button-secondary',
      accept: go,
    });
  };
  const actions = {
    move: (slot: SlotView, direction: 'earlier' | 'later') =>
      void run(() => move.mutateAsync({ id: slot.id, input: { direction } })),
    swap: (slot: SlotView) => setSwapping(slot),
    startAt: (slot: SlotView) => setStartAt(slot),
    remove: (slot: SlotView) =>
      confirmDialog({
        header: `Take ${slot.candidate.name} out of this sitting?`,
        message:
          s.status === 'draft'
            ? 'Their slot is removed and the day closes up.'
            : 'Their slot is removed, the day closes up, and they are told it is cancelled.',
        acceptLabel: 'Take out',
        acceptClassName: 'p-button-danger',
        rejectLabel: 'Keep',
        rejectClassName: 'p-button-secondary',
        accept: () => void run(() => remove.mutateAsync(slot.id)),
      }),
    arrangement: (slot: SlotView) =>
      setArrangementFor({ studentId: slot.studentId, name: slot.candidate.name }),
    outcome: (slot: SlotView, value: SlotOutcome) =>
      void run(() => outcome.mutateAsync({ id: slot.id, input: { outcome: value } })),
    resit: (slot: SlotView) => setResitFor(slot),
  };

  return (
    <section aria-labelledby="sitting-title">
      <p className="sm-breadcrumb">
        <Link to={paths.sittings.href()}>Sittings</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="sitting-title">
            {s.title} <Tag severity={STATUS_SEVERITY[s.status]} value={STATUS_LABEL[s.status]} />
          </h1>
          <p className="sm-page-subtitle">
            {formatPlainDate(s.date)}, {s.room}
            {s.plannedBy && <> · planned by {s.plannedBy.displayName}</>}
          </p>
        </div>
        <div className="sm-row-actions sm-no-print">
          <Button
            type="button"
            label="Calendar file"
            icon="pi pi-download"
            severity="secondary"
            onClick={() =>
              void downloadCalendar(s.id, `${s.date}.ics`).catch((e: unknown) =>
                notify({
                  severity: 'error',
                  summary: 'The calendar could not be downloaded.',
                  detail: e instanceof Error ? e.message : undefined,
                }),
              )
            }
          />
          {/* The agreement report: admins, the planner and the lead examiner (first on the panel), as the API allows; not only while the plan can change. */}
          {s.status !== 'draft' &&
            (roles.includes('admin') ||
              (roles.includes('teacher') && s.plannedBy?.displayName === me.displayName) ||
              (roles.includes('examiner') && s.examiners[0]?.displayName === me.displayName)) && (
              <Button
                type="button"
                label="Agreement report"
                icon="pi pi-chart-bar"
                severity="secondary"
                onClick={() => navigate(paths.sittingAgreement.href(s.id))}
              />
            )}
          {s.papers.length > 0 && (
            <Button
              type="button"
              label="Day schedule"
              icon="pi pi-print"
              severity="secondary"
              onClick={() => navigate(paths.daySchedule.href(s.date))}
            />
          )}
          {(s.status === 'marking_closed' || s.status === 'published') &&
            (roles.includes('admin') || roles.includes('teacher')) && (
              <>
                <Button type="button" label="Results" icon="pi pi-table" severity="secondary" onClick={() => navigate(paths.sittingResults.href(s.id))} />
                <Button type="button" label="Moderation" icon="pi pi-clone" severity="secondary" onClick={() => navigate(paths.moderation.href(s.id))} />
                <Button type="button" label="Release results" icon="pi pi-megaphone" severity="secondary" onClick={() => navigate(paths.release.href(s.id))} />
              </>
            )}
          {s.permissions.changeStatus.map((next) => (
            <Button
              key={next}
              type="button"
              label={STATUS_ACTION[next]}
              icon="pi pi-send"
              disabled={busy}
              onClick={() => changeTo(next)}
            />
          ))}
        </div>
      </div>

      <PlanProblemAlert problem={problem} />

      {s.papers.length > 0 && <Plan sitting={s} />}

      <section aria-labelledby="slots-title" className="sm-slots">
        <div className="sm-section-header">
          <h2 id="slots-title">
            {s.papers.length > 0 ? `Slots (${s.slots.length})` : 'Your slot'}
          </h2>
          {s.permissions.edit && (
            <div className="sm-row-actions">
              <Button
                type="button"
                size="small"
                severity="secondary"
                label="Change the plan"
                icon="pi pi-pencil"
                onClick={() => setEditing(true)}
              />
              <Button
                type="button"
                size="small"
                severity="secondary"
                label="Double marking"
                icon="pi pi-users"
                disabled={s.examiners.length < 2 || s.slots.length === 0}
                onClick={() => setDoubling(true)}
              />
              <Button
                type="button"
                size="small"
                label="Add candidates"
                icon="pi pi-user-plus"
                onClick={() => setAdding(true)}
              />
              {s.status === 'draft' && (
                <Button
                  type="button"
                  size="small"
                  severity="danger"
                  text
                  label="Delete draft"
                  onClick={() =>
                    confirmDialog({
                      header: 'Delete this draft sitting?',
                      message: 'Its plan and slots are removed. Nobody has been told about it yet.',
                      acceptLabel: 'Delete',
                      acceptClassName: 'p-button-danger',
                      rejectLabel: 'Keep',
                      rejectClassName: 'p-button-secondary',
                      accept: () =>
                        del.mutate(s.id, { onSuccess: () => navigate(paths.sittings.href()) }),
                    })
                  }
                />
              )}
            </div>
          )}
        </div>
        <SlotTable sitting={s} actions={actions} busy={busy} canPlan={canPlan} />
      </section>

      <SittingRecordings sitting={s} />

      {s.permissions.edit && (
        <>
          <PlanSittingDialog
            visible={editing}
            onHide={() => setEditing(false)}
            sitting={s}
            defaultDate={s.date}
            onSaved={() => notify({ severity: 'success', summary: 'The plan is saved.' })}
          />
          <AddCandidatesDialog sitting={s} visible={adding} onHide={() => setAdding(false)} />
          <DoubleMarkingDialog sitting={s} visible={doubling} onHide={() => setDoubling(false)} />
        </>
      )}
      <ArrangementDialog candidate={arrangementFor} onHide={() => setArrangementFor(null)} />
      <StartAtDialog
        slot={startAt}
        onHide={() => setStartAt(null)}
        onSubmit={(slot, notBefore) => {
          setStartAt(null);
          void run(() => update.mutateAsync({ id: slot.id, changes: { notBefore } }));
        }}
      />
      <SwapDialog
        slot={swapping}
        sitting={s}
        onHide={() => setSwapping(null)}
        onSubmit={(slot, withSlotId) => {
          setSwapping(null);
          void run(() => swap.mutateAsync({ id: slot.id, input: { withSlotId } }));
        }}
      />
      <ResitDialog
        slot={resitFor}
        sitting={s}
        onHide={() => setResitFor(null)}
        onSubmit={(slot, target) => {
          setResitFor(null);
          void run(
            (ack) =>
              resit.mutateAsync({
                id: slot.id,
                input: { sittingId: target, ...(ack ? { acknowledgeOwnPupil: true } : {}) },
              }),
            (view) => {
              notify({
                severity: 'success',
                summary: `Re-sit for ${slot.candidate.name} added to ${view.title}.`,
              });
              navigate(paths.sitting.href(view.id));
            },
          );
        }}
      />
      <ConfirmDialog />
    </section>
  );
}
