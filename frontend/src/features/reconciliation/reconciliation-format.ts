import { formatUsd } from '@loambook/common';

const day = new Intl.DateTimeFormat('en-US', {
  year: 'numeric',
  month: 'short',
  day: 'numeric',
  timeZone: 'UTC',
});

/** '2026-11-04' (a business date, no time zone) → 'Nov 4, 2026'. */
export function formatDay(iso: string | null | undefined, fallback = '—'): string {
  if (!iso) return fallback;
  const ms = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(ms) ? iso : day.format(ms);
}

export function formatRange(from: string, to: string): string {
  return `${formatDay(from)} – ${formatDay(to)}`;
}

/** A signed amount string ("-296.40") → "−$296.40"; never through a JavaScript number. */
export function formatAmount(value: string | null | undefined): string {
  return value ? formatUsd(value) : '—';
}

/** Integer cents as a string ("-29640") → the dollar string "-296.40", digit by digit. */
export function centsToAmount(cents: string): string {
  const negative = cents.startsWith('-');
  const digits = (negative ? cents.slice(1) : cents).padStart(3, '0');
  return `${negative ? '-' : ''}${digits.slice(0, -2)}.${digits.slice(-2)}`;
}

export const accountLabel = (a: { name: string; last4: string }) => `${a.name} ··${a.last4}`;

/** The first and last day of the month a day is in. */
export function monthOf(iso: string): { from: string; to: string } {
  const y = Number(iso.slice(0, 4));
  const m = Number(iso.slice(5, 7));
  const last = new Date(Date.UTC(y, m, 0)).getUTCDate();
  const mm = String(m).padStart(2, '0');
  return { from: `${y}-${mm}-01`, to: `${y}-${mm}-${String(last).padStart(2, '0')}` };
}

export const isCalendarDay = (v: string | null | undefined): v is string =>
  !!v && /^\d{4}-\d{2}-\d{2}$/.test(v) && !Number.isNaN(Date.parse(`${v}T00:00:00Z`));
