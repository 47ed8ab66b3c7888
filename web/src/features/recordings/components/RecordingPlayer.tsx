import { useEffect, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { RecordingView } from '@stavemark/shared';
import { getPlayback } from '../api/get-playback';
import { clock } from './time';

const STEP = 5;
const SPEEDS = [1, 0.75, 0.5] as const;

/**
 * Our own small player: play, ±5 s, speed, and a seek bar that asks the server for byte ranges.
 * No native `controls`: a focused native player takes the arrow keys and space, and the marking
 * desk's shortcuts must keep working. Only the seek bar's own keys (arrows, Home, End) stop at
 * the player; every other key (digits, flag letters) goes on to the desk.
 */
export function RecordingPlayer({ recording, label }: { recording: RecordingView; label: string }) {
  const media = useRef<HTMLMediaElement | null>(null);
  const [src, setSrc] = useState(recording.playbackUrl);
  const [playing, setPlaying] = useState(false);
  const [time, setTime] = useState(0);
  const [duration, setDuration] = useState(recording.durationSeconds ?? 0);
  const [speed, setSpeed] = useState<(typeof SPEEDS)[number]>(1);
  const [problem, setProblem] = useState<string | null>(null);
  // Where to carry on after a renewed URL (the signed link lives a few minutes).
  const resume = useRef<{ at: number; play: boolean } | null>(null);
  const renewing = useRef(false);

  useEffect(() => {
    if (media.current) media.current.playbackRate = speed;
  }, [speed, src]);

  const el = () => media.current;

  const onError = () => {
    const m = el();
    if (renewing.current) {
      setProblem('The recording cannot be played here. It may have been deleted, or its format is not supported by this browser.');
      renewing.current = false;
      return;
    }
    renewing.current = true;
    resume.current = { at: m?.currentTime ?? time, play: playing };
    getPlayback(recording.id)
      .then((p) => setSrc(p.playbackUrl))
      .catch((e: unknown) => {
        renewing.current = false;
        setProblem(e instanceof Error ? e.message : 'The recording could not be loaded.');
      });
  };

  const onLoaded = () => {
    const m = el();
    if (!m) return;
    if (Number.isFinite(m.duration) && m.duration > 0) setDuration(m.duration);
    const r = resume.current;
    resume.current = null;
    renewing.current = false;
    if (r) {
      m.currentTime = r.at;
      if (r.play) void m.play().catch(() => undefined);
    }
  };

  const seekTo = (t: number) => {
    const m = el();
    if (!m) return;
    const end = duration || (Number.isFinite(m.duration) ? m.duration : 0);
    const next = Math.max(0, end ? Math.min(t, end) : t);
    m.currentTime = next;
    setTime(next);
  };

  const toggle = () => {
    const m = el();
    if (!m) return;
    setProblem(null);
    if (m.paused) void m.play().catch(() => setProblem('The browser did not start playback; press Play again.'));
    else m.pause();
  };

  const fromPointer = (e: PointerEvent<HTMLDivElement>) => {
    const box = e.currentTarget.getBoundingClientRect();
    if (!duration || box.width === 0) return;
    seekTo(((e.clientX - box.left) / box.width) * duration);
  };

  const onBarKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const keys: Record<string, () => number> = {
      ArrowRight: () => time + STEP,
      ArrowUp: () => time + STEP,
      ArrowLeft: () => time - STEP,
      ArrowDown: () => time - STEP,
      Home: () => 0,
      End: () => duration,
    };
    const to = keys[e.key];
    if (!to) return; // digits and letters go on to the desk
    e.preventDefault();
    e.stopPropagation();
    seekTo(to());
  };

  const shared = {
    ref: (node: HTMLMediaElement | null) => {
      media.current = node;
    },
    src,
    preload: 'metadata' as const,
    onLoadedMetadata: onLoaded,
    onDurationChange: onLoaded,
    onTimeUpdate: () => setTime(el()?.currentTime ?? 0),
    onPlay: () => setPlaying(true),
    onPause: () => setPlaying(false),
    onEnded: () => setPlaying(false),
    onError,
  };
  const fraction = duration ? Math.min(time / duration, 1) : 0;

  return (
    <div className="sm-player" role="group" aria-label={`Player: ${label}`}>
      {recording.kind === 'video' ? (
        // No caption track: a performance recording carries no speech.
        <video {...shared} className="sm-player__video" playsInline tabIndex={-1} />
      ) : (
        <audio {...shared} tabIndex={-1} />
      )}
      <div className="sm-player__controls">
        <button type="button" className="sm-player__button sm-player__play" onClick={toggle} aria-label={playing ? `Pause ${label}` : `Play ${label}`}>
          <span className={`pi ${playing ? 'pi-pause' : 'pi-play'}`} aria-hidden="true" /> {playing ? 'Pause' : 'Play'}
        </button>
        <button type="button" className="sm-player__button" onClick={() => seekTo(time - STEP)} aria-label={`Back ${STEP} seconds`}>
          −{STEP} s
        </button>
        <button type="button" className="sm-player__button" onClick={() => seekTo(time + STEP)} aria-label={`Forward ${STEP} seconds`}>
          +{STEP} s
        </button>
        <div
          className="sm-player__bar"
          role="slider"
          tabIndex={0}
          aria-label="Position"
          aria-valuemin={0}
          aria-valuemax={Math.round(duration)}
          aria-valuenow={Math.round(time)}
          aria-valuetext={`${clock(time)} of ${clock(duration)}`}
          onPointerDown={(e) => {
            e.currentTarget.setPointerCapture?.(e.pointerId);
            fromPointer(e);
          }}
          onPointerMove={(e) => {
            if (e.buttons === 1) fromPointer(e);
          }}
          onKeyDown={onBarKey}
        >
          <div className="sm-player__fill" style={{ width: `${fraction * 100}%` }} />
        </div>
        <span className="sm-player__time" aria-hidden="true">
          {clock(time)} / {clock(duration)}
        </span>
        <button
          type="button"
          className="sm-player__button"
          onClick={() => setSpeed(SPEEDS[(SPEEDS.indexOf(speed) + 1) % SPEEDS.length]!)}
          aria-label={`Playback speed ${speed}×; change`}
        >
          {speed}×
        </button>
      </div>
      {problem && (
        <p className="sm-player__problem" role="alert">
          {problem}
        </p>
      )}
    </div>
  );
}
