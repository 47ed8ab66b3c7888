import { useState } from 'react';
import type { SittingView } from '@stavemark/shared';
import { Alert } from '@/components/Alert';
import { formatTimeInZone } from '@/lib/format';
import { useSetRecordedExam } from '../api/set-recorded-exam';
import { SlotRecordingsPanel } from './SlotRecordingsPanel';
import '../recordings.css';

/**
 * The sitting page's recordings: per slot, opened on demand (each answer signs playback URLs).
 * A student sees their own slot open; the planner can make the sitting a recorded exam, in which
 * candidates add their own recording.
 */
export function SittingRecordings({ sitting }: { sitting: SittingView }) {
  const ownOnly = sitting.papers.length === 0;
  const [open, setOpen] = useState<ReadonlySet<string>>(() => new Set(ownOnly ? sitting.slots.map((s) => s.id) : []));
  const setRecorded = useSetRecordedExam();
  if (sitting.status === 'draft' || sitting.slots.length === 0) return null;
  const toggle = (id: string) =>
    setOpen((prev) => {
      const next = new Set(prev);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  return (
    <section className="sm-sheet sm-sitting-recordings" aria-labelledby="recordings-title">
      <div className="sm-section-header">
        <h2 id="recordings-title">Recordings</h2>
        {sitting.permissions.edit && (
          <label className="sm-sitting-recordings__exam">
            <input
              type="checkbox"
              checked={sitting.recordedExam}
              disabled={setRecorded.isPending}
              onChange={(e) => setRecorded.mutate({ sittingId: sitting.id, recordedExam: e.target.checked })}
            />{' '}
            Recorded exam: candidates add their own recording
          </label>
        )}
      </div>
      <p className="sm-muted">
        Recordings are shown to the candidate’s teachers, the examiners marking the slot while the sitting runs, and the candidate. A minor’s recording needs a
        guardian’s consent on record; every recording is deleted after the school’s retention period.
      </p>
      {setRecorded.error && <Alert severity="error">{setRecorded.error.message}</Alert>}
      <ul className="sm-sitting-recordings__slots">
        {sitting.slots.map((slot) => {
          const isOpen = open.has(slot.id);
          return (
            <li key={slot.id}>
              <button type="button" className="sm-sitting-recordings__toggle" aria-expanded={isOpen} onClick={() => toggle(slot.id)}>
                <span className={`pi ${isOpen ? 'pi-chevron-down' : 'pi-chevron-right'}`} aria-hidden="true" /> {slot.candidate.name}
                <span className="sm-muted"> · {formatTimeInZone(slot.startsAt, sitting.timeZone)}</span>
              </button>
              {isOpen && <SlotRecordingsPanel slotId={slot.id} candidate={slot.candidate.name} />}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
