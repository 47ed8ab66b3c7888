import { useId, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { SelectButton } from 'primereact/selectbutton';
import type { ScheduleEntry } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ErrorMessage } from '@/components/ErrorMessage';
import { activeMembership, useCurrentUser } from '@/lib/auth';
import { formatPlainDate } from '@/lib/format';
import { useDaySchedule } from '../api/get-day-schedule';
import { OUTCOME_LABEL } from '../components/labels';
import { todayIn } from '../components/today';
import '../sittings.css';

type View = 'room' | 'examiner';

function EntryTable({
  entries,
  caption,
  show,
}: {
  entries: ScheduleEntry[];
  caption: string;
  show: 'examiner' | 'room';
}) {
  return (
    <table className="sm-table sm-schedule-table">
      <caption>{caption}</caption>
      <thead>
        <tr>
          <th scope="col">Time</th>
          <th scope="col">Candidate</th>
          <th scope="col">List</th>
          <th scope="col">{show === 'examiner' ? 'Examiners' : 'Room'}</th>
          <th scope="col">Sitting</th>
          <th scope="col">Outcome</th>
        </tr>
      </thead>
      <tbody>
        {entries.map((e) => (
          <tr key={`${e.slotId}-${caption}`}>
            <td className="sm-slot-time">
              {e.startTime}–{e.endTime}
            </td>
            <td>{e.candidate}</td>
            <td>{e.listName}</td>
            <td>
              {show === 'examiner'
                ? [e.examiner, e.secondExaminer && `${e.secondExaminer} (second)`]
                    .filter(Boolean)
                    .join(', ')
                : e.room}
            </td>
            <td>{e.sittingTitle}</td>
            <td>{e.outcome ? OUTCOME_LABEL[e.outcome] : ''}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The printable schedule of a day, per room (for the door) and per examiner (for the desk). */
export function DaySchedulePage() {
  const id = useId();
  const me = useCurrentUser();
  const tz = activeMembership(me)?.timeZone ?? 'UTC';
  const [params, setParams] = useSearchParams();
  const date = /^\d{4}-\d{2}-\d{2}$/.test(params.get('date') ?? '')
    ? params.get('date')!
    : todayIn(tz);
  const [view, setView] = useState<View>('room');
  const day = useDaySchedule(date);
  const data = day.data;

  return (
    <section aria-labelledby="schedule-title" className="sm-schedule">
      <p className="sm-breadcrumb sm-no-print">
        <Link to={paths.sittings.href()}>Sittings</Link>
      </p>
      <div className="sm-page-header">
        <div>
          <h1 id="schedule-title">Day schedule</h1>
          <p className="sm-page-subtitle">
            {formatPlainDate(date)} · times in {data?.timeZone ?? tz}
          </p>
        </div>
        <div className="sm-row-actions sm-no-print">
          <div className="sm-field">
            <label htmlFor={`${id}-date`}>Date</label>
            <InputText
              id={`${id}-date`}
              type="date"
              value={date}
              onChange={(e) => e.target.value && setParams({ date: e.target.value })}
            />
          </div>
          <SelectButton
            aria-label="Arrange by"
            value={view}
            options={[
              { label: 'By room', value: 'room' },
              { label: 'By examiner', value: 'examiner' },
            ]}
            onChange={(e) => e.value && setView(e.value as View)}
          />
          <Button type="button" label="Print" icon="pi pi-print" onClick={() => window.print()} />
        </div>
      </div>
      {day.isError && <ErrorMessage error={day.error} what="the day schedule" />}
      {data && (view === 'room' ? data.rooms.length === 0 : data.examiners.length === 0) && (
        <p className="sm-muted">Nothing is scheduled on this day.</p>
      )}
      {data &&
        (view === 'room'
          ? data.rooms.map((r) => (
              <section key={r.room} className="sm-sheet sm-schedule-sheet" aria-label={r.room}>
                <h2>{r.room}</h2>
                <EntryTable
                  entries={r.entries}
                  caption={`${r.room}, ${formatPlainDate(date)}`}
                  show="examiner"
                />
              </section>
            ))
          : data.examiners.map((e) => (
              <section
                key={e.examiner.id}
                className="sm-sheet sm-schedule-sheet"
                aria-label={e.examiner.displayName}
              >
                <h2>{e.examiner.displayName}</h2>
                <EntryTable
                  entries={e.entries}
                  caption={`${e.examiner.displayName}, ${formatPlainDate(date)}`}
                  show="room"
                />
              </section>
            )))}
    </section>
  );
}
