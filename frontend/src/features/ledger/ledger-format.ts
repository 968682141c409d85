import { formatUsd } from '@loambook/common';

const day = new Intl.DateTimeFormat('en-US', {
  year: 'numeric',
  month: 'short',
  day: 'numeric',
  timeZone: 'UTC',
});

/** '2026-12-01' (a business date, no time zone) → 'Dec 1, 2026'. */
export function formatDay(iso: string | null | undefined, fallback = '—'): string {
  if (!iso) return fallback;
  const ms = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(ms) ? iso : day.format(ms);
}

/** An amount in a debit or credit column: blank for zero, so the eye finds the figures. */
export function columnAmount(value: string | null | undefined): string {
  if (!value || /^-?0+(\.0+)?$/.test(value)) return '';
  return formatUsd(value);
}
