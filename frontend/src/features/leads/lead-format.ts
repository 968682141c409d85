import {
  LEAD_STAGE_LABELS,
  type LeadStage,
  type PreferredContact,
  type DuplicateReason,
} from '@loambook/common';

/**
 * A lead that has sat in one stage longer than this many days is flagged as stale in the pipeline. Our
 * rule of thumb (common practice in home-improvement sales, not from a source): two weeks without a move
 * means nobody has followed up, and a homeowner who was ready to fix a foundation is talking to someone
 * else. Stages that wait on the work itself (a scheduled or running job) are not flagged.
 */
export const STALE_AFTER_DAYS = 14;
const NOT_STALE: readonly LeadStage[] = ['scheduled', 'in_progress', 'paid_in_full', 'lost', 'cancelled'];

export function isStale(stage: LeadStage, daysInStage: number): boolean {
  return daysInStage > STALE_AFTER_DAYS && !NOT_STALE.includes(stage);
}

type Severity = 'success' | 'info' | 'warning' | 'danger' | 'secondary' | 'contrast' | undefined;

/** One tag colour per part of the line: selling, signed, in the field, done, out. */
export function stageSeverity(stage: LeadStage): Severity {
  switch (stage) {
    case 'new':
      return 'info';
    case 'inspection_booked':
    case 'inspected':
    case 'proposal_sent':
      return undefined;
    case 'contract_signed':
    case 'deposit_received':
      return 'warning';
    case 'scheduled':
    case 'in_progress':
      return 'contrast';
    case 'completed':
    case 'paid_in_full':
      return 'success';
    case 'lost':
    case 'cancelled':
      return 'secondary';
  }
}

export const stageLabel = (stage: LeadStage) => LEAD_STAGE_LABELS[stage];

export const PREFERRED_CONTACT_LABELS: Record<PreferredContact, string> = {
  phone: 'Phone call',
  text: 'Text message',
  email: 'E-mail',
};

export const DUPLICATE_REASON_LABELS: Record<DuplicateReason, string> = {
  address: 'same address',
  phone: 'same phone',
  email: 'same e-mail',
};

export function days(n: number): string {
  return n === 1 ? '1 day' : `${n} days`;
}

const weekdayOf = new Intl.DateTimeFormat('en-US', { weekday: 'short', timeZone: 'UTC' });

/** "2026-12-09" → "Wed 2026-12-09": the weekday of a calendar date, whatever the browser's zone. */
export function withWeekday(date: string): string {
  const ms = Date.parse(`${date}T12:00:00Z`);
  return Number.isNaN(ms) ? date : `${weekdayOf.format(ms)} ${date}`;
}

/** The digits and a leading + of a phone number, for a tel: or sms: link. */
export function dialable(phone: string): string {
  return phone.replace(/[^0-9+]/g, '');
}

/** The activity kinds of the timeline, with an icon and a word for each. */
export const ACTIVITY_KINDS: Record<string, { icon: string; label: string }> = {
  call: { icon: 'pi-phone', label: 'Call' },
  visit: { icon: 'pi-car', label: 'Visit' },
  note: { icon: 'pi-comment', label: 'Note' },
  email: { icon: 'pi-envelope', label: 'E-mail' },
  stage_change: { icon: 'pi-arrow-right', label: 'Stage' },
  transfer: { icon: 'pi-arrow-right-arrow-left', label: 'Transfer' },
  assignment: { icon: 'pi-user', label: 'Assignment' },
  inspection: { icon: 'pi-clipboard', label: 'Inspection' },
  proposal: { icon: 'pi-file', label: 'Proposal' },
  approval: { icon: 'pi-check-circle', label: 'Approval' },
  contract: { icon: 'pi-pen-to-square', label: 'Contract' },
  cancellation: { icon: 'pi-times-circle', label: 'Cancellation' },
  job: { icon: 'pi-wrench', label: 'Job' },
  payment: { icon: 'pi-credit-card', label: 'Payment' },
};

export function activityKind(kind: string): { icon: string; label: string } {
  return ACTIVITY_KINDS[kind] ?? { icon: 'pi-circle', label: kind };
}

const zonedFormats = new Map<string, Intl.DateTimeFormat>();

/** One formatter per zone and shape (building an Intl.DateTimeFormat is slow; a timeline has many rows). */
function zoned(timeZone: string | undefined, withYear: boolean): Intl.DateTimeFormat {
  const key = `${timeZone ?? ''}|${withYear}`;
  let f = zonedFormats.get(key);
  if (!f) {
    const options: Intl.DateTimeFormatOptions = {
      month: 'short',
      day: 'numeric',
      ...(withYear ? { year: 'numeric' } : {}),
      hour: 'numeric',
      minute: '2-digit',
      timeZoneName: 'short',
    };
    try {
      f = new Intl.DateTimeFormat('en-US', { ...options, timeZone });
    } catch {
      // A zone this browser does not know: its own zone, still named, rather than nothing.
      f = new Intl.DateTimeFormat('en-US', options);
    }
    zonedFormats.set(key, f);
  }
  return f;
}

/**
 * An instant on the branch's clock, with the zone's abbreviation: "Mar 4, 2026, 9:15 AM CST". Without a
 * zone (an older answer), the browser's own, still named.
 */
export function formatInBranchZone(
  iso: string | null | undefined,
  timeZone: string | undefined,
  fallback = '—',
): string {
  if (!iso) return fallback;
  const ms = Date.parse(iso);
  return Number.isNaN(ms) ? fallback : zoned(timeZone, true).format(ms);
}

/** Like formatInBranchZone, without the year when it is the branch's current year: "Mar 4, 9:15 AM CST". */
export function formatRecentInBranchZone(
  iso: string | null | undefined,
  timeZone: string | undefined,
  now: Date = new Date(),
  fallback = '—',
): string {
  if (!iso) return fallback;
  const ms = Date.parse(iso);
  if (Number.isNaN(ms)) return fallback;
  const year = (d: number | Date) =>
    zoned(timeZone, true)
      .formatToParts(d)
      .find((p) => p.type === 'year')?.value;
  return zoned(timeZone, year(ms) !== year(now)).format(ms);
}
