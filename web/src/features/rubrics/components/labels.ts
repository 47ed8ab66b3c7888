import type { RequestKind, VersionStatus } from '@stavemark/shared';

export const KIND_LABELS: Record<RequestKind, string> = {
  scale: 'Scales',
  arpeggio: 'Arpeggios',
  broken_chord: 'Broken chords',
  chromatic: 'Chromatic scales',
  dominant_seventh: 'Dominant sevenths',
  diminished_seventh: 'Diminished sevenths',
  passage: 'Passages',
  other: 'Other',
};

export const STATUS_LABELS: Record<VersionStatus, string> = {
  draft: 'Draft',
  published: 'Published',
};

/** The tension criterion carries the health caution (design.md §10) wherever it is shown. */
export function isTensionCriterion(c: { key: string; label: string }): boolean {
  return /tension/i.test(c.key) || /tension/i.test(c.label);
}

/** Marks 0..max that no descriptor covers, e.g. [0] when bands start at 1. */
export function undescribedMarks(
  maxMark: number,
  descriptors: readonly { min: number; max: number }[],
): number[] {
  if (!Number.isInteger(maxMark) || maxMark < 1 || maxMark > 10) return [];
  const out: number[] = [];
  for (let m = 0; m <= maxMark; m++)
    if (!descriptors.some((d) => d.min <= m && m <= d.max)) out.push(m);
  return out;
}

/** Bands of marks spread as evenly as possible over 0..max, one per level, lowest first. */
export function spreadBands(maxMark: number, levels: number): { min: number; max: number }[] {
  const marks = maxMark + 1;
  const n = Math.max(1, Math.min(levels, marks));
  const out: { min: number; max: number }[] = [];
  let start = 0;
  for (let i = 0; i < n; i++) {
    // Earlier bands take the remainder one mark at a time, so sizes differ by at most one.
    const size = Math.floor(marks / n) + (i < marks % n ? 1 : 0);
    out.push({ min: start, max: start + size - 1 });
    start += size;
  }
  return out;
}

/** "note_accuracy" from "Note accuracy": the criterion key a label suggests. */
export function keyFromLabel(label: string): string {
  const k = label
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '_')
    .replace(/^_+|_+$/g, '')
    .replace(/^[^a-z]+/, '')
    .slice(0, 40)
    .replace(/_+$/, '');
  return k;
}

export function formatWeightShare(weight: number, total: number): string {
  if (!(total > 0) || !(weight > 0)) return '—';
  return `${Math.round((weight / total) * 100)} %`;
}
