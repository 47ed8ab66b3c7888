/** The locale for dates and numbers: the product speaks British English. */
export const LOCALE = 'en-GB';

/**
 * A calendar date ('YYYY-MM-DD', already in the organisation's zone) for reading, e.g.
 * "Tuesday 1 December 2026". Formatted in UTC so the browser's own zone cannot shift the day.
 */
export function formatPlainDate(isoDate: string, style: 'long' | 'short' = 'long'): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(isoDate);
  if (!m) return isoDate;
  const date = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return new Intl.DateTimeFormat(LOCALE, {
    timeZone: 'UTC',
    ...(style === 'long'
      ? { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' }
      : { day: 'numeric', month: 'short', year: 'numeric' }),
  }).format(date);
}

/** An instant shown as a date in the organisation's time zone. */
export function formatDateInZone(isoInstant: string, timeZone: string): string {
  const date = new Date(isoInstant);
  if (Number.isNaN(date.getTime())) return isoInstant;
  return new Intl.DateTimeFormat(LOCALE, {
    timeZone,
    day: 'numeric',
    month: 'short',
    year: 'numeric',
  }).format(date);
}

/** An instant shown as a 24-hour clock time in the organisation's time zone, e.g. 09:30. */
export function formatTimeInZone(isoInstant: string, timeZone: string): string {
  const date = new Date(isoInstant);
  if (Number.isNaN(date.getTime())) return isoInstant;
  return new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(date);
}

export function formatCount(n: number, singular: string, plural = `${singular}s`): string {
  return `${new Intl.NumberFormat(LOCALE).format(n)} ${n === 1 ? singular : plural}`;
}

const ROLE_LABELS = {
  admin: 'Administrator',
  teacher: 'Teacher',
  examiner: 'Examiner',
  student: 'Student',
} as const;

export function roleLabel(role: keyof typeof ROLE_LABELS): string {
  return ROLE_LABELS[role];
}
