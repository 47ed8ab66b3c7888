import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { CellValue, DeskView, MarkSheetView } from '@stavemark/shared';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/lib/auth';
import { Alert } from '@/components/Alert';
import { ErrorMessage } from '@/components/ErrorMessage';
import { PageLoading } from '@/components/PageLoading';
import { SlotRecordingsPanel } from '@/features/recordings';
import { useDesk } from '../api/get-desk';
import { useOpenSitting, useStartSlot } from '../api/start-slot';
import { useSubmitSheet } from '../api/submit-sheet';
import { CorrectionPanel } from '../components/CorrectionPanel';
import { Countdown } from '../components/Countdown';
import { PlayingPhase } from '../components/PlayingPhase';
import { SaveStatus } from '../components/SaveStatus';
import { useSheet, type SheetState } from '../components/useSheet';
import { WriteUpPhase } from '../components/WriteUpPhase';
import '../marking.css';

type Phase = 'playing' | 'writeup';
const phaseKey = (sheetId: string) => `stavemark.marking.phase.${sheetId}`;

function show(v: CellValue): string {
  return v === null ? 'empty' : typeof v === 'string' ? `“${v}”` : String(v);
}

export function DeskPage() {
  const { slotId = '' } = useParams();
  const desk = useDesk(slotId);
  if (desk.isPending) return <PageLoading />;
  if (desk.isError) return <ErrorMessage error={desk.error} what="this slot" />;
  const d = desk.data;
  if (!d.sheet) return <StartPanel desk={d} />;
  return <Desk key={d.sheet.id} desk={d} sheet={d.sheet} />;
}

function StartPanel({ desk }: { desk: DeskView }) {
  const start = useStartSlot(desk.slot.id);
  const open = useOpenSitting();
  const scheduled = desk.slot.sittingStatus === 'scheduled';
  return (
    <section className="sm-desk" aria-labelledby="desk-title">
      <DeskHeader desk={desk} />
      <div className="sm-desk-start">
        {scheduled ? (
          <>
            <p>The sitting has not started yet. Start it when the first candidate is here.</p>
            <button
              type="button"
              className="sm-desk-primary sm-desk-big"
              disabled={open.isPending}
              onClick={() => open.mutate(desk.slot.sittingId)}
            >
              Start the sitting
            </button>
          </>
        ) : (
          <>
            <p>Starting the slot draws the requests (seeded and recorded) and starts the clock.</p>
            <button
              type="button"
              className="sm-desk-primary sm-desk-big"
              disabled={start.isPending}
              onClick={() => start.mutate()}
            >
              Start the slot
            </button>
          </>
        )}
        {(start.error ?? open.error) && (
          <Alert severity="error">{(start.error ?? open.error)?.message}</Alert>
        )}
      </div>
    </section>
  );
}

function DeskHeader({ desk, children }: { desk: DeskView; children?: React.ReactNode }) {
  const s = desk.slot;
  return (
    <header className="sm-desk-header">
      <div>
        <p className="sm-muted">
          <Link to={paths.marking.href()}>Marking</Link> · {s.sittingTitle} · {s.room}
        </p>
        <h1 id="desk-title">
          {s.candidate.name}{' '}
          <span className="sm-muted sm-desk-pupil">{s.candidate.pupilNumber}</span>
        </h1>
        <p className="sm-muted">
          {s.listName}
          {s.extraTimePercent > 0 && ` · extra time ${s.extraTimePercent} %`}
          {desk.role === 'second' && ' · second marker (blind)'}
          {desk.role === 'third' && ' · third marker (blind): the pair’s marks stay hidden'}
        </p>
      </div>
      {children}
    </header>
  );
}

function Desk({ desk, sheet: view }: { desk: DeskView; sheet: MarkSheetView }) {
  const user = useCurrentUser();
  const sheet = useSheet(view, user.id);
  const [phase, setPhaseState] = useState<Phase>(() =>
    view.status === 'submitted'
      ? 'writeup'
      : ((localStorage.getItem(phaseKey(view.id)) as Phase | null) ?? 'playing'),
  );
  const [current, setCurrent] = useState(0);
  const setPhase = (p: Phase) => {
    localStorage.setItem(phaseKey(view.id), p);
    setPhaseState(p);
  };
  const started = Date.parse(view.startedAt);
  const playingEnds =
    started + Math.max(desk.slot.minutes - desk.slot.writeUpGapMinutes, 1) * 60_000;
  const slotEnds = started + desk.slot.minutes * 60_000;

  return (
    <section className="sm-desk" aria-labelledby="desk-title">
      <DeskHeader desk={desk}>
        <div className="sm-desk-header__side">
          {view.status === 'submitted' ? (
            <p className="sm-desk-status sm-desk-status--saved" role="status">
              Submitted — read-only
            </p>
          ) : (
            <>
              <Countdown
                endsAt={phase === 'playing' ? playingEnds : slotEnds}
                label={phase === 'playing' ? 'Playing time' : 'Write-up'}
              />
              <SaveStatus snapshot={sheet.snapshot} />
            </>
          )}
        </div>
      </DeskHeader>

      <div className="sm-desk-tabs" role="tablist" aria-label="Phase">
        <button
          type="button"
          role="tab"
          aria-selected={phase === 'playing'}
          className="sm-desk-tab"
          onClick={() => setPhase('playing')}
        >
          While playing
        </button>
        <button
          type="button"
          role="tab"
          aria-selected={phase === 'writeup'}
          className="sm-desk-tab"
          onClick={() => setPhase('writeup')}
        >
          Write-up
        </button>
      </div>

      <Conflicts sheet={sheet} />
      <SlotRecordingsPanel slotId={desk.slot.id} candidate={desk.slot.candidate.name} variant="desk" />

      {phase === 'playing' ? (
        <PlayingPhase
          desk={desk}
          sheet={sheet}
          current={current}
          setCurrent={setCurrent}
          onWriteUp={() => setPhase('writeup')}
        />
      ) : (
        <>
          <WriteUpPhase desk={desk} sheet={sheet} />
          {view.status === 'draft' && <SubmitPanel desk={desk} sheetId={view.id} sheet={sheet} />}
          {view.status === 'submitted' && <CorrectionPanel desk={desk} sheetId={view.id} />}
        </>
      )}
    </section>
  );
}

function Conflicts({ sheet }: { sheet: SheetState }) {
  const { conflicts, refused } = sheet.snapshot;
  if (conflicts.length === 0 && refused.length === 0) return null;
  return (
    <div className="sm-desk-conflicts">
      {conflicts.map((c) => (
        <Alert key={c.cell} severity="warn">
          <strong>{c.cell}</strong> was changed elsewhere. Yours: {show(c.yours)}; on the server:{' '}
          {show(c.theirs)}.{' '}
          <button
            type="button"
            className="sm-desk-inline"
            onClick={() => sheet.resolve(c, c.yours)}
          >
            Keep mine
          </button>{' '}
          <button
            type="button"
            className="sm-desk-inline"
            onClick={() => sheet.resolve(c, c.theirs)}
          >
            Keep the server’s
          </button>
        </Alert>
      ))}
      {refused.map((r) => (
        <Alert key={r.change.changeId} severity="error">
          Not saved ({r.change.cell} = {show(r.change.value)}): {r.message}
        </Alert>
      ))}
    </div>
  );
}

function SubmitPanel({
  desk,
  sheetId,
  sheet,
}: {
  desk: DeskView;
  sheetId: string;
  sheet: SheetState;
}) {
  const submit = useSubmitSheet(desk.slot.id, sheetId);
  const [confirming, setConfirming] = useState(false);
  const { pending, conflicts, state, lastChangeId } = sheet.snapshot;
  const blocked = pending > 0 || conflicts.length > 0;
  const error = submit.error instanceof ApiError ? submit.error : null;
  return (
    <section className="sm-desk-submit" aria-label="Submit">
      {blocked ? (
        <p>
          {state === 'offline'
            ? `Offline: ${pending} change(s) wait to be saved.`
            : pending > 0
              ? 'Saving the last changes…'
              : 'Resolve the conflicts above first.'}{' '}
          The sheet can be submitted once every change is saved.
        </p>
      ) : confirming ? (
        <p>
          Submit this sheet? It becomes read-only; a later change needs a correction with a reason.
        </p>
      ) : null}
      {confirming ? (
        <>
          <button
            type="button"
            className="sm-desk-primary sm-desk-big"
            disabled={blocked || submit.isPending}
            onClick={() => submit.mutate({ lastChangeId, confirm: true })}
          >
            Yes, submit
          </button>{' '}
          <button type="button" className="sm-desk-nav" onClick={() => setConfirming(false)}>
            Not yet
          </button>
        </>
      ) : (
        <button
          type="button"
          className="sm-desk-primary sm-desk-big"
          disabled={blocked}
          onClick={() => setConfirming(true)}
        >
          Submit sheet
        </button>
      )}
      {error && (
        <Alert severity="error">
          {error.message}
          {error.fieldErrors.length > 0 && (
            <ul>
              {error.fieldErrors.slice(0, 8).map((f) => (
                <li key={f.path}>{f.message}</li>
              ))}
            </ul>
          )}
        </Alert>
      )}
    </section>
  );
}
