// How Crosswatt writes dates: the day, the month's name and the year ("2 Dec 2026"),
// in UTC, on every page. Public responses carry days only (YYYY-MM-DD); staff
// pages that get full times add the time of day with formatDayAndTime.
const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const dayAndTime = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  timeZone: 'UTC',
});

function parse(value: string): Date {
  return new Date(/^\d{4}-\d{2}-\d{2}$/.test(value) ? `${value}T00:00:00Z` : value);
}

/** "2 Dec 2026" for "2026-12-02" or an ISO time. */
export function formatDay(value: string): string {
  return day.format(parse(value));
}

/** "2 Dec 2026, 14:05" (UTC), for pages of moderators and admins. */
export function formatDayAndTime(value: string): string {
  return `${dayAndTime.format(parse(value))} UTC`;
}
