import { REQUEST_KINDS, type CurrentFingering, type FingeringView } from '@stavemark/shared';
import { toPersonRef } from '../rubrics/rubrics.mapper.js';
import type { StudentFingering } from './entities/student-fingering.entity.js';

/** kind|key|mode|hand|inversion: one approved fingering's identity across its revisions. */
export function requestIdentityOf(
  f: Pick<StudentFingering, 'kind' | 'key' | 'mode' | 'hand' | 'inversion'>,
): string {
  return [f.kind, f.key, f.mode ?? '', f.hand, f.inversion ?? ''].join('|');
}

export function toFingeringView(f: StudentFingering): FingeringView {
  return {
    id: f.id,
    studentId: f.studentId,
    kind: f.kind,
    key: f.key,
    mode: f.mode,
    hand: f.hand,
    inversion: f.inversion,
    octaves: f.octaves,
    direction: f.direction,
    digits: f.digits,
    note: f.note,
    revision: f.revision,
    setBy: toPersonRef(f.setBy),
    setAt: f.createdAt.toISOString(),
  };
}

/** Groups rows by request; the highest revision is current, the rest its history (newest first). */
export function toCurrentFingerings(rows: StudentFingering[]): CurrentFingering[] {
  const groups = new Map<string, StudentFingering[]>();
  for (const r of rows) groups.set(r.request, [...(groups.get(r.request) ?? []), r]);
  const out: CurrentFingering[] = [];
  for (const group of groups.values()) {
    const [current, ...older] = [...group].sort((a, b) => b.revision - a.revision);
    out.push({ ...toFingeringView(current!), history: older.map(toFingeringView) });
  }
  const kindOrder = (k: string) => (REQUEST_KINDS as readonly string[]).indexOf(k);
  return out.sort(
    (a, b) =>
      kindOrder(a.kind) - kindOrder(b.kind) ||
      a.key.localeCompare(b.key) ||
      (a.mode ?? '').localeCompare(b.mode ?? '') ||
      a.hand.localeCompare(b.hand) ||
      (a.inversion ?? '').localeCompare(b.inversion ?? ''),
  );
}
