import {
  formatUsd,
  type PaymentKind,
  type PaymentMethod,
  type PaymentRequestStatus,
  type PaymentView,
} from '@loambook/common';

export const KIND_LABELS: Record<PaymentKind, string> = { deposit: 'Deposit', balance: 'Balance' };

export const METHOD_LABELS: Record<PaymentMethod, string> = {
  card: 'Card',
  cash: 'Cash',
  cheque: 'Cheque',
  transfer: 'Bank transfer',
};

export const REQUEST_STATUS: Record<
  PaymentRequestStatus,
  { label: string; severity: 'info' | 'success' | 'warning' | 'secondary' }
> = {
  open: { label: 'Waiting for payment', severity: 'info' },
  paid: { label: 'Paid', severity: 'success' },
  expired: { label: 'Expired', severity: 'warning' },
  cancelled: { label: 'Replaced', severity: 'secondary' },
};

/** How the money came: "Visa •••• 4242", "Cheque 1042", "Bank transfer". */
export function methodText(p: Pick<PaymentView, 'method' | 'cardBrand' | 'cardLast4' | 'reference'>): string {
  if (p.method === 'card') {
    const brand = p.cardBrand ? p.cardBrand.charAt(0).toUpperCase() + p.cardBrand.slice(1) : 'Card';
    return p.cardLast4 ? `${brand} •••• ${p.cardLast4}` : brand;
  }
  return p.reference ? `${METHOD_LABELS[p.method]} ${p.reference}` : METHOD_LABELS[p.method];
}

/** Dollars typed by a person: digits, at most two decimals ("1500", "1500.5", "1,500.00" once the commas go). */
export function cleanAmount(typed: string): string {
  return typed.trim().replace(/[$,\s]/g, '');
}

export const AMOUNT_PATTERN = /^\d{1,9}(\.\d{1,2})?$/;

export const usd = (amount: string) => formatUsd(amount);

/** Today as YYYY-MM-DD on this computer's calendar (a default for "received on"). */
export function localToday(now: Date = new Date()): string {
  const y = now.getFullYear();
  const m = String(now.getMonth() + 1).padStart(2, '0');
  const d = String(now.getDate()).padStart(2, '0');
  return `${y}-${m}-${d}`;
}
