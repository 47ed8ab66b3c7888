import { BarElement, CategoryScale, Chart as ChartJS, LinearScale, Tooltip, type ChartOptions } from 'chart.js';
import { Bar } from 'react-chartjs-2';
import type { SeverityFigure } from '@stavemark/shared';
import { colours } from '@/app/theme/tokens';
import { signed } from '@/lib/stats-format';

ChartJS.register(CategoryScale, LinearScale, BarElement, Tooltip);

/**
 * Each examiner's mean difference from the other marker as a block on a thin line (the 95 %
 * interval), one row per examiner with the figure in the row's label, and a heavier rule at 0.
 * Shape and labels carry the meaning, so it reads the same without colour; the table beside it
 * gives every number.
 */
export function SeverityChart({ figures }: { figures: SeverityFigure[] }) {
  const shown = figures.filter((f) => f.shown && f.meanDifference !== null && f.lower !== null && f.upper !== null);
  if (shown.length === 0) return null;
  const extent = Math.max(2, ...shown.flatMap((f) => [Math.abs(f.lower!), Math.abs(f.upper!)])) * 1.15;
  const w = extent / 60;
  const labels = shown.map((f) => `${f.examiner.name}: ${signed(f.meanDifference!, 1)} (${signed(f.lower!, 1)} to ${signed(f.upper!, 1)})`);
  // Two lines per row (name, then figures): one long line is cut at the canvas's left edge.
  const tickLines = shown.map((f) => [f.examiner.name, `${signed(f.meanDifference!, 1)} (${signed(f.lower!, 1)} to ${signed(f.upper!, 1)})`]);
  const options: ChartOptions<'bar'> = {
    indexAxis: 'y',
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    layout: { padding: { left: 8, right: 8 } },
    plugins: {
      legend: { display: false },
      tooltip: { callbacks: { label: (c) => labels[c.dataIndex] ?? '' } },
    },
    scales: {
      x: {
        min: -extent,
        max: extent,
        title: { display: true, text: 'Percentage points from the other marker (lower ← severe · lenient → higher)', color: colours.ink },
        ticks: { color: colours.ink },
        grid: {
          color: (c) => (c.tick?.value === 0 ? colours.ink : colours.rule),
          lineWidth: (c) => (c.tick?.value === 0 ? 2 : 1),
        },
      },
      y: { ticks: { color: colours.ink, font: { size: 13 } }, grid: { display: false } },
    },
  };
  return (
    <div className="sm-severity-chart" style={{ height: `${4 + shown.length * 3.2}rem` }}>
      <Bar
        role="img"
        aria-label={`Severity chart. ${labels.join('. ')}.`}
        options={options}
        data={{
          labels: tickLines,
          datasets: [
            {
              label: '95 % interval',
              data: shown.map((f) => [f.lower!, f.upper!] as [number, number]),
              backgroundColor: colours.ink,
              barThickness: 3,
              grouped: false,
            },
            {
              label: 'Mean difference',
              data: shown.map((f) => [f.meanDifference! - w, f.meanDifference! + w] as [number, number]),
              backgroundColor: colours.ink,
              borderColor: colours.sheet,
              borderWidth: 1,
              barThickness: 20,
              grouped: false,
            },
          ],
        }}
      />
    </div>
  );
}
