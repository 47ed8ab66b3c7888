import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { formatCount, formatTimeInZone } from '@/lib/format';
import type { TodayView } from '../api/get-today';

export function ExaminerToday({ data, timeZone }: { data: NonNullable<TodayView['examiner']>; timeZone: string }) {
  return (
    <section className="sm-sheet" aria-labelledby="today-examiner">
      <h2 id="today-examiner">Your sittings today</h2>
      {data.sittings.length === 0 ? (
        <p className="sm-muted">No sittings are assigned to you today.</p>
      ) : (
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">Sitting</th>
              <th scope="col">Room</th>
              <th scope="col">Time</th>
              <th scope="col" className="sm-num">
                Your candidates
              </th>
            </tr>
          </thead>
          <tbody>
            {data.sittings.map((s) => (
              <tr key={s.id}>
                <td>{s.title}</td>
                <td>{s.room}</td>
                <td>
                  {formatTimeInZone(s.startsAt, timeZone)}–{formatTimeInZone(s.endsAt, timeZone)}
                </td>
                <td className="sm-num">{formatCount(s.mySlots, 'candidate')}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {data.sittings.length > 0 && <Link to={paths.marking.href()}>Open the marking desk</Link>}
    </section>
  );
}
