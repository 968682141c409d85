const calendarDate = new Intl.DateTimeFormat('en-US', {
  weekday: 'long',
  year: 'numeric',
  month: 'long',
  day: 'numeric',
  timeZone: 'UTC',
});

/** '2026-12-04' (a calendar date on the branch's clock) → 'Friday, December 4, 2026'. */
export function formatCalendarDate(iso: string): string {
  const ms = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(ms) ? iso : calendarDate.format(ms);
}

/** An instant on the branch's clock: 'Dec 4, 2026, 11:59 PM EST'. */
export function formatInZone(iso: string, timeZone: string): string {
  const ms = Date.parse(iso);
  if (Number.isNaN(ms)) return iso;
  try {
    return new Intl.DateTimeFormat('en-US', {
      month: 'short',
      day: 'numeric',
      year: 'numeric',
      hour: 'numeric',
      minute: '2-digit',
      timeZone,
      timeZoneName: 'short',
    }).format(ms);
  } catch {
    return new Date(ms).toLocaleString('en-US');
  }
}
