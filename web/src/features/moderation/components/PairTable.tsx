import type { ModerationPairView, ModerationSheetView } from '@stavemark/shared';

const pct = (v: number | null) => (v === null ? '—' : `${Math.round(v * 100)} %`);

function markOf(sheet: ModerationSheetView | null, cell: string): string {
  if (!sheet) return '';
  const c = sheet.cells.find((x) => x.cell === cell);
  return typeof c?.value === 'number' ? String(c.value) : '—';
}

function askedBy(sheet: ModerationSheetView | null, index: number): boolean {
  return !sheet || sheet.cells.find((c) => c.cell === `asked:${index}`)?.value !== false;
}

/**
 * The two (or three) sheets of one slot side by side: per request its score on each sheet and how
 * far apart they are, then each criterion's marks. Flagged requests are marked in words as well
 * as colour, so the table reads without colour.
 */
export function PairTable({ pair }: { pair: ModerationPairView }) {
  const columns: { key: string; title: string; sheet: ModerationSheetView | null }[] = [
    {
      key: 'first',
      title: `First: ${pair.first?.examiner.displayName ?? 'not submitted'}`,
      sheet: pair.first,
    },
    {
      key: 'second',
      title: `Second: ${pair.second?.examiner.displayName ?? 'not submitted'}`,
      sheet: pair.second,
    },
  ];
  if (pair.third)
    columns.push({
      key: 'third',
      title: `Third: ${pair.third.examiner.displayName}`,
      sheet: pair.third,
    });
  const agreed = pair.agreed;
  return (
    <div className="sm-mod-scroll">
      <table className="sm-table sm-mod-table">
        <caption className="sm-visually-hidden">
          Marks of {pair.candidate.name} by each examiner
        </caption>
        <thead>
          <tr>
            <th scope="col">Request and criterion</th>
            {columns.map((c) => (
              <th key={c.key} scope="col" className="sm-num">
                {c.title}
              </th>
            ))}
            {agreed && (
              <th scope="col" className="sm-num">
                Agreed
              </th>
            )}
            <th scope="col" className="sm-num">
              Apart
            </th>
          </tr>
        </thead>
        {pair.requests.map((r) => (
          <tbody key={r.index} className={r.flagged ? 'sm-mod-flagged' : undefined}>
            <tr className="sm-mod-request">
              <th scope="rowgroup">
                {r.index + 1}. {r.label}
                {r.flagged && <span className="sm-mod-flag"> · outside tolerance</span>}
              </th>
              {columns.map((c) => (
                <td key={c.key} className="sm-num">
                  {askedBy(c.sheet, r.index)
                    ? pct(c.sheet?.requestScores[r.index] ?? null)
                    : 'not asked'}
                </td>
              ))}
              {agreed && (
                <td className="sm-num">{agreed.notAsked.includes(r.index) ? 'not asked' : ''}</td>
              )}
              <td className="sm-num">{r.difference === null ? '—' : pct(r.difference)}</td>
            </tr>
            {r.criteria.map((c) => {
              const cell = `mark:${r.index}:${c.key}`;
              return (
                <tr key={c.key}>
                  <td className="sm-mod-criterion">
                    {c.label} <span className="sm-muted">/ {c.maxMark}</span>
                    {c.tension && <span className="sm-mod-tension"> · see the caution above</span>}
                  </td>
                  {columns.map((col) => (
                    <td key={col.key} className="sm-num">
                      {markOf(col.sheet, cell)}
                    </td>
                  ))}
                  {agreed && <td className="sm-num">{agreed.marks[cell] ?? '—'}</td>}
                  <td />
                </tr>
              );
            })}
          </tbody>
        ))}
        <tfoot>
          <tr>
            <th scope="row">Total</th>
            {columns.map((c) => (
              <td key={c.key} className="sm-num">
                {c.sheet?.total ?? '—'} {c.sheet?.bandLabel ? `(${c.sheet.bandLabel})` : ''}
              </td>
            ))}
            {agreed && <td className="sm-num">{pair.result?.total ?? '—'}</td>}
            <td className="sm-num">
              {pair.total.difference === null
                ? '—'
                : `${pair.total.difference} (limit ${pair.total.limit.toFixed(1)})`}
            </td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
