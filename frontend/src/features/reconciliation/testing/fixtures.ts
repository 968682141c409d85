import type {
  BankAccount,
  BankLineView,
  BankStatementPreview,
  CommissionPaymentTarget,
  MatchView,
  PayoutTarget,
  ReconciliationView,
} from '@loambook/common';

// Invented figures for the screens' tests: an operating account's November.
export const ACCOUNT: BankAccount = {
  id: 'aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa',
  branchId: null,
  branchName: null,
  name: 'Operating',
  last4: '0142',
  receivesPayouts: true,
  csvMapping: null,
  statementCount: 1,
  statementsThrough: '2026-11-30',
  lockedThrough: null,
  createdAt: '2026-11-01T12:00:00.000Z',
};

export const line = (over: Partial<BankLineView> = {}): BankLineView => ({
  id: 'l-1',
  statementId: 's-1',
  rowNumber: 2,
  postedOn: '2026-11-14',
  description: 'RENT - 1 CLAYFIELD ROW',
  amount: '-1800.00',
  amountCents: '-180000',
  locked: false,
  ...over,
});

export const payout = (over: Partial<PayoutTarget> = {}): PayoutTarget => ({
  id: 'p-1',
  processorPayoutId: 'po_test_c',
  arrivalDate: '2026-11-20',
  amount: '500.00',
  amountCents: '50000',
  currency: 'usd',
  status: 'paid',
  ...over,
});

export const commission = (over: Partial<CommissionPaymentTarget> = {}): CommissionPaymentTarget => ({
  id: 'c-1',
  salespersonId: 'u-1',
  salespersonName: 'Dana Loamfield',
  branchId: 'b-1',
  branchName: 'Marrowfield',
  periodStart: '2026-11-16',
  periodEnd: '2026-11-30',
  paidOn: '2026-12-01',
  payable: '150.00',
  bankAmountCents: '-15000',
  ...over,
});

export const match = (over: Partial<MatchView> = {}): MatchView => ({
  id: 'm-1',
  status: 'suggested',
  targetKind: 'payout',
  targetId: 'p-a',
  bankLine: line({
    id: 'l-a',
    postedOn: '2026-11-04',
    description: 'CARD PROCESSOR TRANSFER A',
    amount: '2129.80',
    amountCents: '212980',
  }),
  payout: payout({
    id: 'p-a',
    processorPayoutId: 'po_test_a',
    arrivalDate: '2026-11-03',
    amount: '2129.80',
    amountCents: '212980',
  }),
  commissionPayment: null,
  note: null,
  daysApart: 1,
  createdBy: { id: 'u-b', name: 'Bea Keeper' },
  createdAt: '2026-12-02T10:00:00.000Z',
  matchedBy: null,
  matchedAt: null,
  locked: false,
  ...over,
});

export const reconciliationView = (over: Partial<ReconciliationView> = {}): ReconciliationView => ({
  bankAccount: ACCOUNT,
  from: '2026-11-01',
  to: '2026-11-30',
  lockedPeriods: [],
  matched: [match()],
  unmatchedBankLines: [line()],
  unmatchedPayouts: [payout()],
  unmatchedCommissionPayments: [],
  summary: { bankLines: 2, moneyIn: '2129.80', moneyOut: '1800.00', suggested: 1, confirmed: 0 },
  lockBlockers: {
    unmatchedBankLines: 1,
    unconfirmedMatches: 1,
    unmatchedPayouts: 1,
    unmatchedCommissionPayments: 0,
    uncoveredDays: 0,
  },
  locked: false,
  ...over,
});

export const PREVIEW: BankStatementPreview = {
  fileName: 'nov.csv',
  fileBytes: 300,
  sha256: 'f'.repeat(64),
  rowCount: 4,
  columnCount: 4,
  rows: [
    ['Posting Date', 'Description', 'Debit', 'Credit'],
    ['11/04/2026', 'CARD PROCESSOR TRANSFER A', '', '2,129.80'],
    ['11/14/2026', 'RENT - 1 CLAYFIELD ROW', '1,800.00', ''],
    ['11/16/2026', 'COMMISSION', '296.40', ''],
  ],
  suggestion: {
    hasHeaderRow: true,
    dateColumn: 0,
    descriptionColumn: 1,
    amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 3 },
    dateFormat: 'MM/DD/YYYY',
    dateFormatCandidates: ['MM/DD/YYYY'],
  },
  savedMapping: null,
  mapping: {
    hasHeaderRow: true,
    dateColumn: 0,
    descriptionColumn: 1,
    amount: { kind: 'debit_credit', debitColumn: 2, creditColumn: 3 },
    dateFormat: 'MM/DD/YYYY',
  },
  mappingSource: 'suggested',
  check: null,
  duplicateOf: null,
};
