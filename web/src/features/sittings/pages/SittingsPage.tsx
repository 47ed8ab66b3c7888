import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { DataTable } from 'primereact/datatable';
import { Column } from 'primereact/column';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import { ConfirmDialog } from 'primereact/confirmdialog';
import type { SittingSummary } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useSittings } from '../api/get-sittings';
import { PlanSittingDialog } from '../components/PlanSittingDialog';
import { STATUS_LABEL, STATUS_SEVERITY } from '../components/labels';
import { todayIn } from '../components/today';
import '../sittings.css';

export function SittingsPage() {
  const me = useCurrentUser();
  const membership = activeMembership(me);
  const roles = membership?.roles ?? [];
  const plans = roles.includes('admin') || roles.includes('teacher');
  const staff = plans || roles.includes('examiner');
  const today = todayIn(membership?.timeZone ?? 'UTC');
  const sittings = useSittings();
  const navigate = useNavigate();
  const [planning, setPlanning] = useState(false);

  const titleBody = (s: SittingSummary) => <Link to={paths.sitting.href(s.id)}>{s.title}</Link>;
  const statusBody = (s: SittingSummary) => (
    <Tag severity={STATUS_SEVERITY[s.status]} value={STATUS_LABEL[s.status]} />
  );
  const onlyMine = !staff;

  return (
    <section aria-labelledby="sittings-title">
      <div className="sm-page-header">
        <div>
          <h1 id="sittings-title">Sittings</h1>
          <p className="sm-page-subtitle">
            {onlyMine
              ? 'Your mock exams and their times.'
              : plans
                ? 'Timed mock-exam days: plan them, schedule them, record outcomes.'
                : 'The sittings you examine at.'}
          </p>
        </div>
        <div className="sm-row-actions">
          {staff && (
            <Button
              type="button"
              label="Day schedule"
              icon="pi pi-calendar"
              severity="secondary"
              onClick={() => navigate(paths.daySchedule.href(today))}
            />
          )}
          {plans && (
            <Button
              type="button"
              label="Plan a sitting"
              icon="pi pi-plus"
              onClick={() => setPlanning(true)}
            />
          )}
        </div>
      </div>
      {sittings.isError && <ErrorMessage error={sittings.error} what="the sittings" />}
      <div className="sm-table-wrap">
        <DataTable
          value={sittings.data ?? []}
          dataKey="id"
          size="small"
          aria-label="Sittings"
          loading={sittings.isFetching}
          emptyMessage={
            sittings.isPending
              ? 'Loading…'
              : onlyMine
                ? 'No mock exams for you yet.'
                : 'No sittings yet.'
          }
        >
          <Column header="Date" body={(s: SittingSummary) => formatPlainDate(s.date, 'short')} />
          <Column header="Sitting" body={titleBody} />
          <Column field="room" header="Room" />
          {onlyMine ? (
            <Column
              header="Your time"
              body={(s: SittingSummary) =>
                s.mySlot ? `${s.mySlot.startTime}–${s.mySlot.endTime}` : '—'
              }
            />
          ) : (
            <Column header="Day" body={(s: SittingSummary) => `${s.dayStart}–${s.dayEnd}`} />
          )}
          {!onlyMine && (
            <Column
              header="Candidates"
              className="sm-num"
              body={(s: SittingSummary) => s.candidateCount}
            />
          )}
          {!onlyMine && (
            <Column
              header="Examiners"
              body={(s: SittingSummary) =>
                s.examiners.map((e) => e.displayName).join(', ') || (
                  <span className="sm-muted">None yet</span>
                )
              }
            />
          )}
          <Column header="Status" body={statusBody} />
        </DataTable>
      </div>
      {plans && (
        <PlanSittingDialog
          visible={planning}
          onHide={() => setPlanning(false)}
          defaultDate={today}
          onSaved={(s) => navigate(paths.sitting.href(s.id))}
        />
      )}
      <ConfirmDialog />
    </section>
  );
}
