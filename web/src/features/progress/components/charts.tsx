import {
  CategoryScale,
  Chart as ChartJS,
  Legend,
  LinearScale,
  LineElement,
  PointElement,
  Tooltip,
  type ChartOptions,
  type PointStyle,
} from 'chart.js';
import { Line } from 'react-chartjs-2';
import type { ProgressView } from '@stavemark/shared';
import { colours, fonts } from '@/app/theme/tokens';
import { formatPlainDate } from '@/lib/format';

ChartJS.register(CategoryScale, LinearScale, PointElement, LineElement, Legend, Tooltip);

// Readable without colour: every series has its own point shape and dash pattern as well as a
// colour, and the legend shows the shape next to each label.
const SHAPES: PointStyle[] = ['circle', 'rect', 'triangle', 'rectRot', 'crossRot', 'star', 'cross', 'rectRounded', 'line'];
const DASHES: number[][] = [[], [8, 4], [2, 3], [10, 3, 2, 3], [4, 4], [1, 4], [12, 6], [6, 2, 2, 2], [3, 6]];
const PALETTE = [colours.ink, colours.copper, colours.successText, colours.dangerText, colours.focus, colours.warningText, colours.inkMuted, colours.inkRaised, colours.copperHover];

export function seriesStyle(i: number, label: string) {
  const colour = PALETTE[i % PALETTE.length]!;
  return {
    label,
    borderColor: colour,
    backgroundColor: colour,
    pointStyle: SHAPES[i % SHAPES.length]!,
    borderDash: DASHES[i % DASHES.length]!,
    pointRadius: 5,
    pointHoverRadius: 7,
    borderWidth: 2,
    spanGaps: true,
  };
}

/** The x axis: one place per sitting, absent ones labelled as such (they have no point). */
export function sittingLabels(v: ProgressView): string[][] {
  return v.sittings.map((s) => {
    const day = formatPlainDate(s.date, 'short');
    return s.outcome === 'completed' ? [day] : [day, `(${s.outcome})`];
  });
}

function options(yTitle: string, max: number | undefined): ChartOptions<'line'> {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    font: { family: fonts.body },
    plugins: {
      legend: { position: 'bottom', labels: { usePointStyle: true, color: colours.ink, font: { family: fonts.body } } },
      tooltip: { usePointStyle: true },
    },
    scales: {
      x: { ticks: { color: colours.ink, font: { family: fonts.body } }, grid: { color: colours.rule } },
      y: {
        min: 0,
        max,
        title: { display: true, text: yTitle, color: colours.ink, font: { family: fonts.body } },
        ticks: { color: colours.ink, font: { family: fonts.body } },
        grid: { color: colours.rule },
      },
    },
  };
}

/** Overall percentage per sitting, one series per comparable line (list and grade). */
export function OverallChart({ v }: { v: ProgressView }) {
  const datasets = v.lines.map((line, li) => ({
    ...seriesStyle(li, `${line.listName} (grade ${line.grade})`),
    data: v.sittings.map((s) => (s.line === li && s.result ? Math.round(s.result.percentage * 10) / 10 : null)),
  }));
  return (
    <Line
      aria-label="Overall percentage per sitting"
      role="img"
      data={{ labels: sittingLabels(v), datasets }}
      options={options('Percentage of the total', 100)}
    />
  );
}

/** Every criterion's share of its maximum per sitting. */
export function CriteriaChart({ v, criteria }: { v: ProgressView; criteria: { key: string; label: string }[] }) {
  const datasets = criteria.map((c, i) => ({
    ...seriesStyle(i, c.label),
    data: v.sittings.map((s) => {
      const f = s.result?.criteria.find((x) => x.key === c.key)?.fraction;
      return f === undefined ? null : Math.round(f * 1000) / 10;
    }),
  }));
  return (
    <Line
      aria-label="Each criterion per sitting"
      role="img"
      data={{ labels: sittingLabels(v), datasets }}
      options={options('Share of the criterion’s maximum (%)', 100)}
    />
  );
}

/** Fingering slips per 100 notes played. */
export function SlipChart({ v }: { v: ProgressView }) {
  const datasets = [
    {
      ...seriesStyle(1, 'Slips per 100 notes'),
      data: v.sittings.map((s) => (s.result?.slipRate === null || !s.result ? null : Math.round(s.result.slipRate * 10) / 10)),
    },
  ];
  return (
    <Line
      aria-label="Fingering slips per 100 notes per sitting"
      role="img"
      data={{ labels: sittingLabels(v), datasets }}
      options={options('Slips per 100 notes', undefined)}
    />
  );
}
