/**
 * The wire types of the payments API (issue #5), shared by the server (backend/src/payments) and the screens
 * (frontend/src/features/payments). Amounts are strings with two decimals ("1234.50"), dates 'YYYY-MM-DD',
 * instants ISO-8601.
 */
export const PAYMENT_KINDS = ['deposit', 'balance'] as const;
export type PaymentKind = (typeof PAYMENT_KINDS)[number];

export const PAYMENT_METHODS = ['card', 'cash', 'cheque', 'transfer'] as const;
export type PaymentMethod = (typeof PAYMENT_METHODS)[number];

/** What the bookkeeper records by hand: money that reached the bank without the processor. */
export const RECORDED_METHODS = ['cash', 'cheque', 'transfer'] as const;
export type RecordedMethod = (typeof RECORDED_METHODS)[number];

export type PaymentRequestStatus = 'open' | 'paid' | 'expired' | 'cancelled';

export interface PaymentRequestView {
  id: string;
  contractId: string;
  kind: PaymentKind;
  amount: string;
  status: PaymentRequestStatus;
  /** The processor's hosted payment page; null once the link no longer works. */
  url: string | null;
  expiresAt: string | null;
  emailedTo: string | null;
  emailedAt: string | null;
  emailCount: number;
  createdAt: string;
  paidAt: string | null;
}

export interface PaymentView {
  id: string;
  contractId: string;
  branchId: string;
  kind: PaymentKind;
  method: PaymentMethod;
  amount: string;
  fee: string;
  net: string;
  /** Refunded so far out of this payment. */
  refunded: string;
  receivedOn: string;
  reference: string | null;
  cardBrand: string | null;
  cardLast4: string | null;
  recordedBy: { id: string; name: string } | null;
  journalEntryId: string;
  createdAt: string;
}

export interface RefundView {
  id: string;
  paymentId: string;
  amount: string;
  status: 'pending' | 'succeeded' | 'failed';
  reason: string | null;
  refundedOn: string;
  journalEntryId: string | null;
  createdAt: string;
}

/** A clock that an initial payment starts under the state's rules (e.g. F.S. 489.126(2)(a)). */
export interface DepositClockView {
  code: string;
  title: string;
  source: string;
  startsWhen: string;
  rule: string;
}

export interface DepositWarning {
  /** The state's large-initial-payment rule is triggered by this amount. */
  largeInitialPayment: boolean;
  /** Deposit as a percentage of the price, for display. */
  depositPercent: string;
  message: string;
  clocks: DepositClockView[];
}

export interface ContractPayments {
  contractId: string;
  leadId: string;
  branchId: string;
  price: string;
  depositAmount: string;
  cancelled: boolean;
  completed: boolean;
  depositReceivedAt: string | null;
  /** Everything received, less refunds. */
  paid: string;
  refunded: string;
  /** Deposits received less deposit refunds. */
  depositHeld: string;
  /** price − paid, never below zero. */
  balanceDue: string;
  /** Card payments that can still be refunded (a cancelled contract). */
  refundable: string;
  requests: PaymentRequestView[];
  payments: PaymentView[];
  refunds: RefundView[];
  /** The state pack's warning for the contract's deposit, when it has one. */
  depositWarning: DepositWarning | null;
  /** Whether the processor is configured (links can be made). */
  processorEnabled: boolean;
}

export interface CreatePaymentLinkRequest {
  kind: PaymentKind;
  /** Defaults: the contract's deposit, or the balance due. */
  amount?: string;
}

export interface PaymentLinkResult {
  request: PaymentRequestView;
  /** Whether the homeowner was e-mailed (the lead has an address and the mail went out). */
  emailed: boolean;
  depositWarning: DepositWarning | null;
}

export interface RecordPaymentRequest {
  kind: PaymentKind;
  method: RecordedMethod;
  amount: string;
  receivedOn: string;
  reference?: string;
  /** The screen's id for this recording: the same id twice records once. */
  requestId?: string;
}

export interface RefundRequest {
  /** Defaults to everything refundable. */
  amount?: string;
  reason?: string;
  requestId?: string;
}

export interface PaymentListRow extends PaymentView {
  branchCode: string;
  leadId: string;
  homeownerName: string;
}

export interface PaymentList {
  rows: PaymentListRow[];
  total: number;
  page: number;
  pageSize: number;
  /** Sums over every row of the filter (not just this page). */
  totals: { amount: string; fee: string; net: string };
}

/** The public thank-you page's question: has the payment behind this checkout come in? */
export interface CheckoutStatus {
  /** received: recorded; processing: paid or being paid, not yet recorded; closed: link expired or replaced. */
  status: 'received' | 'processing' | 'closed';
  kind: PaymentKind;
  amount: string;
  branchName: string;
  branchPhone: string | null;
}
