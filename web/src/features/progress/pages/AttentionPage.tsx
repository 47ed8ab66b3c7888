import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { useAttention } from '../api/get-attention';
import { AttentionList } from '../components/AttentionList';
import '../progress.css';

export function AttentionPage() {
  const q = useAttention();
  return (
    <section aria-labelledby="attention-title">
      <div className="sm-page-header">
        <div>
          <h1 id="attention-title">Attention</h1>
          <p className="sm-page-subtitle">
            Habits worth a look in the last twelve months: a criterion below 60 % three sittings running (marked by at least two
            examiners), persistently low marks for freedom from tension, and fingering slips on the rise.
          </p>
        </div>
      </div>
      {q.isPending && <PageLoading label="Loading the attention list…" />}
      {q.isError && <ErrorMessage error={q.error} what="the attention list" />}
      {q.data && (
        <section className="sm-sheet" aria-label="Students needing attention">
          <p className="sm-muted">
            {q.data.entries.length === 0
              ? `Nothing to flag among your ${q.data.students} students.`
              : `${q.data.entries.length} entries among ${q.data.students} students.`}
          </p>
          <AttentionList entries={q.data.entries} />
        </section>
      )}
    </section>
  );
}
