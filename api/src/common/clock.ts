/** The organisation's local calendar date (YYYY-MM-DD) for an instant, using the IANA zone. */
export function localDate(instant: Date, timeZone: string): string {
  // en-CA formats as YYYY-MM-DD.
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(instant);
}

/** True when the zone is a real IANA zone that Intl knows. */
export function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}

/** "Now", overridable in tests and demos via STAVEMARK_NOW (ISO instant). */
export function now(): Date {
  const fixed = process.env.STAVEMARK_NOW;
  return fixed ? new Date(fixed) : new Date();
}
