import { CategoryScale, Chart as ChartJS, Legend, LinearScale, LineElement, PointElement, Tooltip, type ChartOptions } from 'chart.js';
import { Line } from 'react-chartjs-2';
import type { DeviationHistory } from '@stavemark/shared';
import { colours } from '@/app/theme/tokens';
import { signed } from '@/lib/stats-format';

ChartJS.register(CategoryScale, LinearScale, PointElement, LineElement, Tooltip, Legend);

/**
 * Mean distance from the reference per exercise (solid line, round markers) and mean signed
 * difference (dashed line, triangle markers): told apart by line and marker shape, not colour.
 */
export function DeviationChart({ points }: { points: DeviationHistory['points'] }) {
  const labels = points.map((p) => `${p.submittedAt.slice(0, 10)} ${p.title.length > 28 ? `${p.title.slice(0, 27)}…` : p.title}`);
  const options: ChartOptions<'line'> = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    plugins: {
      legend: { display: true, labels: { color: colours.ink, usePointStyle: true } },
      tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${signed(c.parsed.y ?? 0, 1)} points` } },
    },
    scales: {
      y: {
        // Room above and below the points, and 0 always in view.
        grace: '15%',
        beginAtZero: true,
        title: { display: true, text: 'Percentage points of the maximum', color: colours.ink },
        ticks: { color: colours.ink },
        grid: { color: (c) => (c.tick?.value === 0 ? colours.ink : colours.rule), lineWidth: (c) => (c.tick?.value === 0 ? 2 : 1) },
      },
      x: { ticks: { color: colours.ink }, grid: { display: false } },
    },
  };
  return (
    <div className="sm-std-chart" style={{ height: '18rem' }}>
      <Line
        role="img"
        aria-label={`Deviation over time. ${points.map((p, i) => `${labels[i]}: distance ${p.meanAbsoluteDifferencePercent.toFixed(1)}, difference ${signed(p.meanDifferencePercent, 1)}`).join('. ')}.`}
        options={options}
        data={{
          labels,
          datasets: [
            { label: 'Mean distance', data: points.map((p) => p.meanAbsoluteDifferencePercent), borderColor: colours.ink, backgroundColor: colours.ink, pointStyle: 'circle', pointRadius: 6 },
            { label: 'Mean difference (below 0: lower than the reference)', data: points.map((p) => p.meanDifferencePercent), borderColor: colours.ink, backgroundColor: colours.sheet, borderDash: [6, 4], pointStyle: 'triangle', pointRadius: 7 },
          ],
        }}
      />
    </div>
  );
}
