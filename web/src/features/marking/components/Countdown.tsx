import { useEffect, useState } from 'react';

function mmss(totalSeconds: number): string {
  const s = Math.abs(Math.round(totalSeconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

/** Time left until `endsAt`; past it, how far over (the overrun), in the warning colour. */
export function Countdown({ endsAt, label }: { endsAt: number; label: string }) {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const id = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(id);
  }, []);
  const left = (endsAt - now) / 1000;
  const over = left < 0;
  return (
    <div
      className={`sm-desk-clock${over ? ' sm-desk-clock--over' : ''}`}
      aria-label={`${label}: ${over ? `${mmss(left)} over` : `${mmss(left)} left`}`}
    >
      <span className="sm-desk-clock__label">{label}</span>
      <span className="sm-desk-clock__time">{over ? `+${mmss(left)}` : mmss(left)}</span>
      {over && <span className="sm-desk-clock__note">over time</span>}
    </div>
  );
}
