import { Link } from 'react-router-dom';
import type { AttentionEntry } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { formatPlainDate } from '@/lib/format';
import { HealthCaution } from './HealthCaution';

const KIND: Record<AttentionEntry['kind'], string> = {
  tension: 'Tension',
  entrenched: 'Entrenched issue',
  rising_slips: 'Rising slips',
};

/** Attention entries, each with the sittings that are its evidence. */
export function AttentionList({ entries, limit }: { entries: AttentionEntry[]; limit?: number }) {
  const shown = limit ? entries.slice(0, limit) : entries;
  return (
    <ul className="sm-attention">
      {shown.map((e, i) => (
        <li key={`${e.student.id}-${e.kind}-${e.criterion?.key ?? ''}-${i}`} className={`sm-attention-${e.kind}`}>
          <div className="sm-attention-head">
            <span className="sm-kind">{KIND[e.kind]}</span>
            <Link to={paths.studentProgress.href(e.student.id)}>{e.student.name}</Link>
            {e.student.grade !== null && <span className="sm-muted">grade {e.student.grade}</span>}
          </div>
          <p>
            {e.summary}, since {formatPlainDate(e.since, 'short')}.
          </p>
          <details>
            <summary>Evidence: {e.evidence.length} sittings</summary>
            <ul>
              {e.evidence.map((ev) => (
                <li key={ev.slotId}>
                  <Link to={paths.studentProgress.href(e.student.id, ev.sittingId)}>
                    {formatPlainDate(ev.date, 'short')}: {ev.value}
                  </Link>{' '}
                  <span className="sm-muted">
                    in <Link to={paths.sitting.href(ev.sittingId)}>{ev.title}</Link>, marked by {ev.examiners.join(' and ') || 'no one'}
                  </span>
                </li>
              ))}
            </ul>
          </details>
          {e.caution && <HealthCaution text={e.caution} />}
        </li>
      ))}
    </ul>
  );
}
