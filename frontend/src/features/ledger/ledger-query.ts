import { isReasonCode } from '@loambook/common';
import { ACCOUNT_PAGE_SIZES, type AccountPageSize } from './api/get-account-ledger';
import { JOURNAL_PAGE_SIZES, type JournalPageSize } from './api/get-journal';

/**
 * The ledger screens keep their filters in the address (?from=2026-12-01&to=2026-12-31&reason=deposit.card),
 * so a view can be bookmarked, sent to the accountant, and comes back with the browser's Back button.
 * Anything that does not read as a filter is dropped.
 */
const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** A real calendar day written YYYY-MM-DD ('2026-02-30' is not). */
export function isCalendarDay(value: string): boolean {
  const m = ISO_DAY.exec(value);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(y, mo - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}

export interface DateRange {
  from: string;
  to: string;
}

/** What is wrong with a pair of dates, by field; empty when they can be sent. */
export function rangeProblems(r: DateRange): Partial<Record<keyof DateRange, string>> {
  const p: Partial<Record<keyof DateRange, string>> = {};
  if (r.from && !isCalendarDay(r.from)) p.from = 'Enter a date like 2026-12-01.';
  if (r.to && !isCalendarDay(r.to)) p.to = 'Enter a date like 2026-12-31.';
  if (!p.from && !p.to && r.from && r.to && r.from > r.to) p.to = 'The end date is before the start date.';
  return p;
}

const day = (params: URLSearchParams, key: string) => {
  const v = params.get(key) ?? '';
  return isCalendarDay(v) ? v : '';
};
const page = (params: URLSearchParams) => {
  const n = Number(params.get('page'));
  return Number.isInteger(n) && n >= 1 ? n : 1;
};

export interface JournalView extends DateRange {
  reasonCode: string;
  page: number;
  pageSize: JournalPageSize;
}
export const DEFAULT_JOURNAL_PAGE_SIZE: JournalPageSize = 25;

export function journalViewFromParams(params: URLSearchParams): JournalView {
  const reason = params.get('reason') ?? '';
  const size = Number(params.get('size'));
  return {
    from: day(params, 'from'),
    to: day(params, 'to'),
    reasonCode: isReasonCode(reason) ? reason : '',
    page: page(params),
    pageSize: (JOURNAL_PAGE_SIZES as readonly number[]).includes(size)
      ? (size as JournalPageSize)
      : DEFAULT_JOURNAL_PAGE_SIZE,
  };
}

export function paramsFromJournalView(v: JournalView): URLSearchParams {
  const p = new URLSearchParams();
  if (v.from) p.set('from', v.from);
  if (v.to) p.set('to', v.to);
  if (v.reasonCode) p.set('reason', v.reasonCode);
  if (v.page > 1) p.set('page', String(v.page));
  if (v.pageSize !== DEFAULT_JOURNAL_PAGE_SIZE) p.set('size', String(v.pageSize));
  return p;
}

export interface AccountView extends DateRange {
  accountId: string;
  page: number;
  pageSize: AccountPageSize;
}
export const DEFAULT_ACCOUNT_PAGE_SIZE: AccountPageSize = 100;

export function accountViewFromParams(params: URLSearchParams): AccountView {
  const size = Number(params.get('size'));
  const account = params.get('account') ?? '';
  return {
    accountId: /^[0-9a-f-]{36}$/i.test(account) ? account : '',
    from: day(params, 'from'),
    to: day(params, 'to'),
    page: page(params),
    pageSize: (ACCOUNT_PAGE_SIZES as readonly number[]).includes(size)
      ? (size as AccountPageSize)
      : DEFAULT_ACCOUNT_PAGE_SIZE,
  };
}

export function paramsFromAccountView(v: AccountView): URLSearchParams {
  const p = new URLSearchParams();
  if (v.accountId) p.set('account', v.accountId);
  if (v.from) p.set('from', v.from);
  if (v.to) p.set('to', v.to);
  if (v.page > 1) p.set('page', String(v.page));
  if (v.pageSize !== DEFAULT_ACCOUNT_PAGE_SIZE) p.set('size', String(v.pageSize));
  return p;
}
