import type { TodayView } from '../api/get-today';

export function TeacherToday({ data }: { data: NonNullable<TodayView['teacher']> }) {
  return (
    <section className="sm-sheet" aria-labelledby="today-teacher">
      <h2 id="today-teacher">Your classes</h2>
      {data.classes.length === 0 ? (
        <p className="sm-muted">You do not teach a class in this organisation yet.</p>
      ) : (
        <table className="sm-table">
          <thead>
            <tr>
              <th scope="col">Class</th>
              <th scope="col">Code</th>
              <th scope="col" className="sm-num">
                Grade
              </th>
              <th scope="col" className="sm-num">
                Students
              </th>
            </tr>
          </thead>
          <tbody>
            {data.classes.map((c) => (
              <tr key={c.id}>
                <td>{c.name}</td>
                <td>{c.code}</td>
                <td className="sm-num">{c.grade ?? '—'}</td>
                <td className="sm-num">{c.studentCount}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
