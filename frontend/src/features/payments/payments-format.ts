import {
  cardBrandName,
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
    const brand = cardBrandName(p.cardBrand);
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
