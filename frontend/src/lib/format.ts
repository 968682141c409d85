const dateTime = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });
const dateOnly = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium' });

/** "Mar 4, 2026, 9:15 AM" in the browser's zone, or the fallback when there is no date. */
export function formatDateTime(iso: string | null | undefined, fallback = '—'): string {
  if (!iso) return fallback;
  const ms = Date.parse(iso);
  return Number.isNaN(ms) ? fallback : dateTime.format(ms);
}

export function formatDate(iso: string | null | undefined, fallback = '—'): string {
  if (!iso) return fallback;
  const ms = Date.parse(iso);
  return Number.isNaN(ms) ? fallback : dateOnly.format(ms);
}

/** A percentage string from the API ("12.5") shown as "12.5%". The text is shown as sent: no rounding. */
export function formatPercent(value: string | null | undefined): string {
  return value ? `${value}%` : '—';
}

/**
 * "America/New_York" → "Eastern Time", the name people use (from the browser's time-zone data); the IANA
 * name itself when the browser has no such name.
 */
export function formatTimezone(zone: string): string {
  try {
    const name = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'longGeneric' })
      .formatToParts(new Date())
      .find((p) => p.type === 'timeZoneName')?.value;
    return name && !/^GMT/.test(name) ? name : zone;
  } catch {
    return zone;
  }
}

const recentThisYear = new Intl.DateTimeFormat('en-US', {
  month: 'short',
  day: 'numeric',
  hour: 'numeric',
  minute: '2-digit',
});

/** Like formatDateTime, without the year when it is this year: "Mar 4, 9:15 AM". */
export function formatRecent(iso: string | null | undefined, fallback = '—'): string {
  if (!iso) return fallback;
  const ms = Date.parse(iso);
  if (Number.isNaN(ms)) return fallback;
  return new Date(ms).getFullYear() === new Date().getFullYear()
    ? recentThisYear.format(ms)
    : dateTime.format(ms);
}

/** Today as YYYY-MM-DD on this computer's calendar (not UTC's, which is tomorrow in the US evening). */
export function localToday(now: Date = new Date()): string {
  const y = now.getFullYear();
  const m = String(now.getMonth() + 1).padStart(2, '0');
  const d = String(now.getDate()).padStart(2, '0');
  return `${y}-${m}-${d}`;
}
