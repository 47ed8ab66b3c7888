import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import type { TodayView } from '../api/get-today';

export function StudentToday({ data }: { data: NonNullable<TodayView['student']> }) {
  return (
    <section className="sm-sheet" aria-labelledby="today-student">
      <h2 id="today-student">Your lessons</h2>
      <p>
        {data.name}
        {data.grade !== null ? `, preparing grade ${data.grade}` : ''}. <Link to={paths.myProgress.href()}>Your progress over the year</Link>
      </p>
      {data.classes.length === 0 ? (
        <p className="sm-muted">You are not in a class yet.</p>
      ) : (
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">Class</th>
              <th scope="col">Code</th>
              <th scope="col">Teachers</th>
            </tr>
          </thead>
          <tbody>
            {data.classes.map((c) => (
              <tr key={c.id}>
                <td>{c.name}</td>
                <td>{c.code}</td>
                <td>{c.teachers.join(', ') || '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
