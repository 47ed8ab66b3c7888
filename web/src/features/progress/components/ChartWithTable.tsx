import { useId, useState, type ReactNode } from 'react';

/**
 * A chart with its table view one button away (the table carries the same numbers, for screen
 * readers and for anyone who prefers figures to lines).
 */
export function ChartWithTable({
  title,
  description,
  chart,
  table,
}: {
  title: string;
  description?: ReactNode;
  chart: ReactNode;
  table: ReactNode;
}) {
  const [asTable, setAsTable] = useState(false);
  const headingId = useId();
  return (
    <section className="sm-sheet sm-chart-card" aria-labelledby={headingId}>
      <div className="sm-chart-head">
        <h2 id={headingId}>{title}</h2>
        <button
          type="button"
          className="sm-toggle"
          aria-pressed={asTable}
          onClick={() => setAsTable((v) => !v)}
        >
          {asTable ? 'Show chart' : 'Show table'}
        </button>
      </div>
      {description && <p className="sm-muted">{description}</p>}
      {asTable ? table : <div className="sm-chart">{chart}</div>}
    </section>
  );
}
