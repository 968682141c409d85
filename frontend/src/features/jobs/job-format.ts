import {
  addCalendarDays,
  calendarWeekday,
  money,
  todayInZone,
  type InstallKind,
  type JobClock,
  type JobStatus,
  type StopReason,
} from '@loambook/common';
import { localToday } from '@/lib/format';

export const STATUS_LABELS: Record<JobStatus, string> = {
  unscheduled: 'Not scheduled',
  scheduled: 'Scheduled',
  in_progress: 'In progress',
  completed: 'Completed',
  cancelled: 'Cancelled',
};

export const STATUS_SEVERITY: Record<JobStatus, 'secondary' | 'info' | 'warning' | 'success' | 'danger'> = {
  unscheduled: 'secondary',
  scheduled: 'info',
  in_progress: 'warning',
  completed: 'success',
  cancelled: 'danger',
};

export const JOB_STATUSES: JobStatus[] = [
  'unscheduled',
  'scheduled',
  'in_progress',
  'completed',
  'cancelled',
];

export const KIND_LABELS: Record<InstallKind, string> = {
  injection: 'Injection point',
  push_pier: 'Push pier',
  helical_pile: 'Helical pile',
};

export const KIND_SHORT: Record<InstallKind, string> = {
  injection: 'Point',
  push_pier: 'Pier',
  helical_pile: 'Pile',
};

export const STOP_REASON_LABELS: Record<StopReason, string> = {
  surface_return: 'Material came back to the surface',
  lift_observed: 'Lift seen on the gauge or level',
  planned_quantity: 'Planned quantity reached',
  other: 'Other reason (say why)',
};

export const STOP_REASON_SHORT: Record<StopReason, string> = {
  surface_return: 'Surface return',
  lift_observed: 'Lift seen',
  planned_quantity: 'Planned qty',
  other: 'Other',
};

export const CLOCK_STATE_LABELS: Record<JobClock['state'], string> = {
  not_started: 'Not started yet',
  running: 'Running',
  due_soon: 'Due soon',
  overdue: 'Overdue',
  met: 'Met',
};

export const CLOCK_STATE_SEVERITY: Record<
  JobClock['state'],
  'secondary' | 'info' | 'warning' | 'success' | 'danger'
> = {
  not_started: 'secondary',
  running: 'info',
  due_soon: 'warning',
  overdue: 'danger',
  met: 'success',
};

const SHORT_WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** '2026-12-08' → 'Tue Dec 8' (a calendar day: no time zone can move it). */
export function formatDay(date: string | null | undefined, fallback = '—'): string {
  if (!date || !ISO_DATE.test(date)) return fallback;
  const month = MONTHS[Number(date.slice(5, 7)) - 1] ?? '';
  return `${SHORT_WEEKDAYS[calendarWeekday(date)]} ${month} ${Number(date.slice(8, 10))}`;
}

/** '2026-12-08' → 'Tue Dec 8, 2026'. */
export function formatDayLong(date: string | null | undefined, fallback = '—'): string {
  if (!date || !ISO_DATE.test(date)) return fallback;
  return `${formatDay(date)}, ${date.slice(0, 4)}`;
}

/** The job's working days: 'Tue Dec 8 – Thu Dec 10 (3 days)'. */
export function formatRun(startOn: string | null, durationDays: number): string {
  if (!startOn) return 'Not scheduled';
  const days = durationDays === 1 ? '1 day' : `${durationDays} days`;
  if (durationDays <= 1) return `${formatDay(startOn)} (${days})`;
  return `${formatDay(startOn)} – ${formatDay(addCalendarDays(startOn, durationDays - 1))} (${days})`;
}

export const lastDay = (startOn: string, durationDays: number) => addCalendarDays(startOn, durationDays - 1);

/** Today on the branch's clock, falling back to the device's day when the zone is unknown. */
export function todayFor(timezone: string | null | undefined): string {
  try {
    if (timezone) return todayInZone(timezone);
  } catch {
    // an unknown zone: the device's own day below
  }
  return localToday();
}

/** The Monday on or before the date. */
export function mondayOf(date: string): string {
  const wd = calendarWeekday(date);
  return addCalendarDays(date, wd === 0 ? -6 : 1 - wd);
}

export function daysBetween(from: string, to: string): string[] {
  const out: string[] = [];
  for (let d = from; d <= to; d = addCalendarDays(d, 1)) out.push(d);
  return out;
}

export const isWeekend = (date: string) => [0, 6].includes(calendarWeekday(date));

/** A decimal string shown with thousands separators, as sent (no rounding): '12500.5' → '12,500.5'. */
export function formatQty(value: string | null | undefined, fallback = '—'): string {
  if (value === null || value === undefined || value === '') return fallback;
  const [whole = '', frac] = value.split('.');
  const sign = whole.startsWith('-') ? '-' : '';
  const digits = whole.replace('-', '').replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  const trimmed = frac?.replace(/0+$/, '');
  return `${sign}${digits}${trimmed ? `.${trimmed}` : ''}`;
}

/** Sum of decimal strings (quantities), through decimal.js. */
export function sumDecimals(values: (string | null | undefined)[]): string {
  let total = money('0');
  for (const v of values) {
    if (v) {
      try {
        total = total.plus(money(v));
      } catch {
        // not a number: left out
      }
    }
  }
  return total.toString();
}

/** Margin drift in points, with its sign spelled out: '-4.2' → '−4.2 pts'. */
export function formatPoints(value: string | null | undefined): string {
  if (!value) return '—';
  const neg = value.startsWith('-');
  return `${neg ? '−' : money(value).isZero() ? '' : '+'}${value.replace('-', '')} pts`;
}

export const DECIMAL = /^\d{1,9}(\.\d{1,2})?$/;

export function dialable(phone: string): string {
  return phone.replace(/[^0-9+]/g, '');
}

export function mapsHref(address: string): string {
  return `https://www.openstreetmap.org/search?query=${encodeURIComponent(address)}`;
}

/** Whole days from `a` to `b` ('2026-12-01' → '2026-12-04' is 3). */
export function daysFrom(a: string, b: string): number {
  return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000);
}

/**
 * A price-book unit as people say it: 'lump_sum' → 'lump sum'. Labour is counted in person-hours
 * everywhere (the plan's 'hour' lines, the day notes, the actuals): one person working one hour.
 */
export const formatUnit = (unit: string) => (unit === 'hour' ? 'person-hour' : unit.replace(/_/g, ' '));

/** Labour as a count of person-hours: '24' → '24 person-hours', '1' → '1 person-hour'. */
export function formatPersonHours(value: string | null | undefined, fallback = '—'): string {
  const q = formatQty(value, '');
  if (!q) return fallback;
  return `${q} ${q === '1' ? 'person-hour' : 'person-hours'}`;
}
