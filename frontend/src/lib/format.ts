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

/** "America/New_York" → "New York (America)": easier to scan in a list. */
export function formatTimezone(zone: string): string {
  const [region, ...rest] = zone.split('/');
  if (rest.length === 0) return zone.replace(/_/g, ' ');
  return `${rest.join(' / ').replace(/_/g, ' ')} (${region})`;
}
