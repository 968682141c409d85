// Why an amount moved. Every journal entry carries one of these codes (the database keeps the code as text
// so that later features can add their own; the screens label the ones listed here).

export const REASON_CODES = [
  'deposit.card',
  'deposit.bank',
  'processor.payout',
  'job.completed',
  'balance.card',
  'balance.bank',
  'commission.earned',
  'commission.paid',
  'commission.clawback',
  'refund.cancellation',
  'refund.revenue',
  'opening.balance',
  'reversal',
] as const;
export type ReasonCode = (typeof REASON_CODES)[number];

export const REASON_LABELS: Record<ReasonCode, string> = {
  'deposit.card': 'Deposit paid by card',
  'deposit.bank': 'Deposit paid by cash, cheque or transfer',
  'processor.payout': 'Processor payout to the bank',
  'job.completed': 'Job completed: revenue recognised',
  'balance.card': 'Balance paid by card',
  'balance.bank': 'Balance paid by cash, cheque or transfer',
  'commission.earned': 'Commission earned',
  'commission.paid': 'Commission paid',
  'commission.clawback': 'Commission clawed back',
  'refund.cancellation': 'Deposit refunded after cancellation',
  'refund.revenue': 'Refund on completed work',
  'opening.balance': 'Opening balance',
  reversal: 'Reversal (correction)',
};

export function isReasonCode(value: unknown): value is ReasonCode {
  return typeof value === 'string' && (REASON_CODES as readonly string[]).includes(value);
}

/** The label of a code, or the code itself when a later feature's code is not listed here. */
export function reasonLabel(code: string): string {
  return isReasonCode(code) ? REASON_LABELS[code] : code;
}
