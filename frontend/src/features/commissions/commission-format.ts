import {
  formatUsd,
  type CommissionLineKind,
  type CommissionMilestone,
  type CommissionPlanBasis,
  type CommissionRate,
  type CommissionStatementStatus,
  type CommissionTierMeasure,
  type CommissionTierMode,
} from '@loambook/common';

export const BASIS_LABELS: Record<CommissionPlanBasis, string> = {
  net_price: 'Net contract price',
  gross_margin: 'Gross margin',
};

export const BASIS_HINTS: Record<CommissionPlanBasis, string> = {
  net_price: 'The contract price without sales tax.',
  gross_margin: 'Net price less every cost of the job; a loss pays nothing.',
};

export const MEASURE_LABELS: Record<CommissionTierMeasure, string> = {
  monthly_volume: 'Monthly sales volume',
  margin_band: 'Margin band',
};

export const MODE_LABELS: Record<CommissionTierMode, string> = {
  step: 'Step — the tier reached pays on the whole amount',
  bracket: 'Bracket — each tier pays only on its own slice',
};

export const MILESTONE_LABELS: Record<CommissionMilestone, string> = {
  deposit_cleared_window_closed: 'Deposit cleared, cancellation window closed',
  job_completed: 'Job completed',
};

export const KIND_LABELS: Record<CommissionLineKind, string> = {
  earning: 'Earned',
  clawback: 'Clawed back',
};

export const STATUS_LABELS: Record<CommissionStatementStatus, string> = {
  draft: 'Draft',
  approved: 'Approved',
  paid: 'Paid',
};

export const STATUS_SEVERITY: Record<CommissionStatementStatus, 'secondary' | 'info' | 'success'> = {
  draft: 'secondary',
  approved: 'info',
  paid: 'success',
};

const day = new Intl.DateTimeFormat('en-US', {
  year: 'numeric',
  month: 'short',
  day: 'numeric',
  timeZone: 'UTC',
});
const monthDay = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', timeZone: 'UTC' });

/** '2026-07-09' → 'Jul 9, 2026'. */
export function formatDay(iso: string | null | undefined, fallback = '—'): string {
  if (!iso) return fallback;
  const ms = Date.parse(`${iso}T00:00:00Z`);
  return Number.isNaN(ms) ? iso : day.format(ms);
}

/** A pay period: 'Jul 1 – Jul 15, 2026'. */
export function formatPeriod(start: string, end: string): string {
  const s = Date.parse(`${start}T00:00:00Z`);
  const e = Date.parse(`${end}T00:00:00Z`);
  if (Number.isNaN(s) || Number.isNaN(e)) return `${start} – ${end}`;
  return `${monthDay.format(s)} – ${day.format(e)}`;
}

const tierFrom = (measure: CommissionTierMeasure, from: string) =>
  measure === 'monthly_volume' ? formatUsd(from) : `${from}%`;

/** One line for a table: "8% of net contract price", "Margin band, bracket: 0% → 4%, 30% → 6%". */
export function rateSummary(basis: CommissionPlanBasis, rate: CommissionRate): string {
  const of = BASIS_LABELS[basis].toLowerCase();
  if (rate.kind === 'flat') return `${rate.ratePct}% of ${of}`;
  const tiers = rate.tiers.map((t) => `${tierFrom(rate.measure, t.from)} → ${t.ratePct}%`).join(', ');
  return `${MEASURE_LABELS[rate.measure]}, ${rate.mode}: ${tiers} (of ${of})`;
}
