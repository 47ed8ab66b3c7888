import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { formatPlainDate } from '@/lib/format';
import type { TodayView } from '../api/get-today';

export function AdminToday({ data }: { data: NonNullable<TodayView['admin']> }) {
  return (
    <section className="sm-sheet" aria-labelledby="today-admin">
      <h2 id="today-admin">The organisation</h2>
      <dl className="sm-figures">
        <div>
          <dt>People with a sign-in</dt>
          <dd>{data.people}</dd>
        </div>
        <div>
          <dt>Students</dt>
          <dd>{data.students}</dd>
        </div>
        <div>
          <dt>Classes</dt>
          <dd>{data.classes}</dd>
        </div>
      </dl>
      <p>
        {data.term ? (
          <>
            Current term: <strong>{data.term.name}</strong>,{' '}
            {formatPlainDate(data.term.startsOn, 'short')} to{' '}
            {formatPlainDate(data.term.endsOn, 'short')}.
          </>
        ) : (
          'No term covers today.'
        )}
      </p>
      <p>
        <Link to={paths.people.href()}>Manage people</Link>
      </p>
    </section>
  );
}
