import type { InspectionStatus } from '@loambook/common';
import { formatTimezone } from '@/lib/format';

const wallClock = new Intl.DateTimeFormat('en-US', {
  weekday: 'short',
  month: 'short',
  day: 'numeric',
  year: 'numeric',
  hour: 'numeric',
  minute: '2-digit',
  timeZone: 'UTC',
});

/**
 * '2026-12-03T09:00' (the time on the branch's clock) → "Thu, Dec 3, 2026, 9:00 AM", shown as it is on
 * that clock whatever zone the browser is in.
 */
export function formatWallClock(local: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(local);
  if (!m) return local;
  const [y, mo, d, h, mi] = m.slice(1).map(Number) as [number, number, number, number, number];
  return wallClock.format(Date.UTC(y, mo - 1, d, h, mi));
}

/** "Eastern Time (UTC−05:00)": the zone by its everyday name, with the offset that tells DST apart. */
export function zoneLabel(timezone: string, utcOffset?: string): string {
  const name = formatTimezone(timezone);
  return utcOffset ? `${name} (UTC${utcOffset.replace('-', '−')})` : name;
}

export const STATUS_LABELS: Record<InspectionStatus, string> = {
  booked: 'Booked',
  completed: 'Completed',
  cancelled: 'Cancelled',
};

export const STATUS_SEVERITY: Record<InspectionStatus, 'info' | 'success' | 'secondary'> = {
  booked: 'info',
  completed: 'success',
  cancelled: 'secondary',
};

export function minutes(n: number): string {
  if (n < 60) return `${n} min`;
  const h = Math.floor(n / 60);
  const m = n % 60;
  return m ? `${h} h ${m} min` : `${h} h`;
}
