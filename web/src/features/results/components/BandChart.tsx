import { BarElement, CategoryScale, Chart as ChartJS, LinearScale, Tooltip, type Plugin } from 'chart.js';
import { Bar } from 'react-chartjs-2';
import type { BandCount } from '@stavemark/shared';
import { colours, fonts } from '@/app/theme/tokens';
import { LOCALE } from '@/lib/format';

ChartJS.register(CategoryScale, LinearScale, BarElement, Tooltip);

const pct = (x: number) => `${new Intl.NumberFormat(LOCALE, { maximumFractionDigits: 0 }).format(x)}\u00a0%`;

/** Prints each bar's count above it, so the chart reads without colour or hovering. */
const countLabels: Plugin<'bar'> = {
  id: 'smCountLabels',
  afterDatasetsDraw(chart) {
    const { ctx } = chart;
    const meta = chart.getDatasetMeta(0);
    const data = chart.data.datasets[0]?.data ?? [];
    ctx.save();
    ctx.fillStyle = colours.ink;
    ctx.font = `600 12px ${fonts.body}`;
    ctx.textAlign = 'center';
    meta.data.forEach((bar, i) => {
      ctx.fillText(String(data[i] ?? ''), bar.x, bar.y - 4);
    });
    ctx.restore();
  },
};

/**
 * The band distribution as bars (one colour: the band is named on the axis and the count printed
 * on the bar, so nothing depends on telling colours apart), with the same figures as a table beside it.
 */
export function BandChart({ bands, title, id }: { bands: BandCount[]; title: string; id: string }) {
  const total = bands.reduce((s, b) => s + b.count, 0);
  const summary = bands.map((b) => `${b.label}: ${b.count}`).join(', ');
  return (
    <div className="sm-band-chart">
      <figure className="sm-band-chart-figure" aria-labelledby={`${id}-caption`}>
        <div className="sm-band-chart-canvas">
          <Bar
            aria-label={`${title}. ${summary}.`}
            role="img"
            data={{
              labels: bands.map((b) => b.label),
              datasets: [{ label: 'Results', data: bands.map((b) => b.count), backgroundColor: colours.ink, borderColor: colours.ink, maxBarThickness: 56 }],
            }}
            options={{
              responsive: true,
              maintainAspectRatio: false,
              animation: false,
              layout: { padding: { top: 18 } },
              plugins: { legend: { display: false }, tooltip: { callbacks: { label: (c) => `${c.parsed.y} of ${total}` } } },
              scales: {
                x: { ticks: { color: colours.ink, font: { family: fonts.body } }, grid: { display: false } },
                y: { beginAtZero: true, ticks: { precision: 0, color: colours.inkMuted, font: { family: fonts.body } }, grid: { color: colours.rule } },
              },
            }}
            plugins={[countLabels]}
          />
        </div>
        <figcaption id={`${id}-caption`} className="sm-muted">{title}</figcaption>
      </figure>
      <table className="sm-table sm-band-table" aria-label={`${title} (table)`}>
        <thead>
          <tr>
            <th scope="col">Band</th>
            <th scope="col" className="sm-num">Results</th>
            <th scope="col" className="sm-num">Share</th>
          </tr>
        </thead>
        <tbody>
          {bands.map((b) => (
            <tr key={b.key}>
              <th scope="row">{b.label}</th>
              <td className="sm-num">{b.count}</td>
              <td className="sm-num">{total ? pct(b.percent) : '—'}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <th scope="row">All</th>
            <td className="sm-num">{total}</td>
            <td className="sm-num">{total ? '100 %' : '—'}</td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
