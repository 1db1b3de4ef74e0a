const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

/**
 * When a drill was opened, as a person says it: "just now", "12 minutes ago", "yesterday",
 * "3 days ago", and past a week the date itself ("2 Dec", with the year once it is not this
 * year's).
 */
export function openedWhen(openedAt: string, now: number, locale = 'en'): string {
  const at = Date.parse(openedAt);
  const ago = now - at;
  if (Number.isNaN(at)) return '';
  if (ago < MINUTE) return 'just now';
  const relative = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' });
  if (ago < HOUR) return relative.format(-Math.floor(ago / MINUTE), 'minute');
  if (ago < DAY) return relative.format(-Math.floor(ago / HOUR), 'hour');
  const days = calendarDaysBetween(at, now);
  if (days < 7) return relative.format(-Math.max(1, days), 'day');
  const sameYear = new Date(at).getFullYear() === new Date(now).getFullYear();
  return new Date(at).toLocaleDateString(locale, {
    day: 'numeric',
    month: 'short',
    ...(sameYear ? {} : { year: 'numeric' }),
  });
}

/** The full local date and time, for a tooltip beside the short wording. */
export function openedAtInFull(openedAt: string, locale = 'en'): string {
  const at = Date.parse(openedAt);
  return Number.isNaN(at)
    ? ''
    : new Date(at).toLocaleString(locale, { dateStyle: 'medium', timeStyle: 'short' });
}

/** Midnights crossed from `from` to `to`, in local time ("yesterday" is one, whatever the hour). */
function calendarDaysBetween(from: number, to: number): number {
  const start = new Date(from);
  const end = new Date(to);
  const startDay = Date.UTC(start.getFullYear(), start.getMonth(), start.getDate());
  const endDay = Date.UTC(end.getFullYear(), end.getMonth(), end.getDate());
  return Math.round((endDay - startDay) / DAY);
}
