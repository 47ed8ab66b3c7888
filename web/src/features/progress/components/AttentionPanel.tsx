import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useAttention } from '../api/get-attention';
import { AttentionList } from './AttentionList';
import '../progress.css';

/** The attention list's first entries on a teacher's Today page. */
export function AttentionPanel() {
  const q = useAttention();
  return (
    <section className="sm-sheet" aria-labelledby="today-attention">
      <h2 id="today-attention">Needs attention</h2>
      {q.isPending && <p className="sm-muted">Loading…</p>}
      {q.isError && <p className="sm-muted">The attention list could not be loaded.</p>}
      {q.data &&
        (q.data.entries.length === 0 ? (
          <p className="sm-muted">Nothing to flag among your students.</p>
        ) : (
          <>
            <AttentionList entries={q.data.entries} limit={4} />
            <p>
              <Link to={paths.attention.href()}>All {q.data.entries.length} entries</Link>
            </p>
          </>
        ))}
    </section>
  );
}
