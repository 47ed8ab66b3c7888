import { formatCount } from '@/lib/format';
import type { TodayView } from '../api/get-today';

export function ExaminerToday({ data }: { data: NonNullable<TodayView['examiner']> }) {
  return (
    <section className="sm-sheet" aria-labelledby="today-examiner">
      <h2 id="today-examiner">Your sittings today</h2>
      {data.sittings.length === 0 ? (
        <p className="sm-muted">No sittings are assigned to you today.</p>
      ) : (
        <p>{formatCount(data.sittings.length, 'sitting')} assigned to you today.</p>
      )}
    </section>
  );
}
