// The chart of accounts every branch keeps. One chart, the same codes in every branch, so that a
// company-wide trial balance adds like accounts together. The codes are our own numbering (assets 1xxx,
// liabilities 2xxx, equity 3xxx, revenue 4xxx, expenses 5xxx — a common practice layout, not a standard).
// The migration 20261203200000_ledger.ts creates the same rows for every branch; the API test checks that
// the two lists agree.

export const ACCOUNT_TYPES = ['asset', 'liability', 'equity', 'revenue', 'expense'] as const;
export type AccountType = (typeof ACCOUNT_TYPES)[number];

export const SIDES = ['debit', 'credit'] as const;
export type Side = (typeof SIDES)[number];

export const ACCOUNT_TYPE_LABELS: Record<AccountType, string> = {
  asset: 'Asset',
  liability: 'Liability',
  equity: 'Equity',
  revenue: 'Revenue',
  expense: 'Expense',
};

export interface ChartAccount {
  code: string;
  name: string;
  type: AccountType;
  /** The side on which the balance normally sits (debit for assets and expenses, credit for the rest). */
  normalSide: Side;
  /** Lines on this account must name the salesperson they belong to (a sub-ledger). */
  salespersonSubledger: boolean;
  /** What the bookkeeper reads in the account list. */
  description: string;
}

/** The codes, by meaning, so that postings never write a code by hand. */
export const ACCOUNTS = {
  bank: '1010',
  processorClearing: '1050',
  accountsReceivable: '1200',
  customerDeposits: '2100',
  commissionsPayable: '2300',
  openingEquity: '3000',
  contractRevenue: '4000',
  refunds: '4900',
  processingFees: '5100',
  commissionExpense: '5200',
} as const;
export type AccountKey = keyof typeof ACCOUNTS;
export type AccountCode = (typeof ACCOUNTS)[AccountKey];

export const CHART_OF_ACCOUNTS: readonly ChartAccount[] = [
  {
    code: ACCOUNTS.bank,
    name: 'Bank — operating account',
    type: 'asset',
    normalSide: 'debit',
    salespersonSubledger: false,
    description: 'Money in the branch’s bank account: payouts from the processor, cash and cheques paid in.',
  },
  {
    code: ACCOUNTS.processorClearing,
    name: 'Card processor clearing',
    type: 'asset',
    normalSide: 'debit',
    salespersonSubledger: false,
    description: 'Card payments held by the processor, net of its fees, until it pays them out to the bank.',
  },
  {
    code: ACCOUNTS.accountsReceivable,
    name: 'Accounts receivable',
    type: 'asset',
    normalSide: 'debit',
    salespersonSubledger: false,
    description: 'Balances owed by homeowners for completed work.',
  },
  {
    code: ACCOUNTS.customerDeposits,
    name: 'Customer deposits (contract liability)',
    type: 'liability',
    normalSide: 'credit',
    salespersonSubledger: false,
    // ASC 606-10-45-2 (published, REFERENCE-VALUES.md): consideration received before the work is a
    // contract liability, not revenue.
    description: 'Deposits received before the work is done: owed back to the homeowner until completion.',
  },
  {
    code: ACCOUNTS.commissionsPayable,
    name: 'Commissions payable',
    type: 'liability',
    normalSide: 'credit',
    salespersonSubledger: true,
    description: 'Commissions earned by salespeople and not yet paid, kept per salesperson.',
  },
  {
    code: ACCOUNTS.openingEquity,
    name: 'Owner’s equity — opening balances',
    type: 'equity',
    normalSide: 'credit',
    salespersonSubledger: false,
    description: 'The other side of opening balances brought in when a branch starts using Loambook.',
  },
  {
    code: ACCOUNTS.contractRevenue,
    name: 'Contract revenue',
    type: 'revenue',
    normalSide: 'credit',
    salespersonSubledger: false,
    description: 'The contract price of completed work, recognised at completion (ASC 606).',
  },
  {
    code: ACCOUNTS.refunds,
    name: 'Refunds and allowances',
    type: 'revenue',
    normalSide: 'debit',
    salespersonSubledger: false,
    description:
      'Contra-revenue: money given back on work already recognised as revenue. A deposit refunded after a cancellation is not here: it comes out of customer deposits.',
  },
  {
    code: ACCOUNTS.processingFees,
    name: 'Card processing fees',
    type: 'expense',
    normalSide: 'debit',
    salespersonSubledger: false,
    description:
      'What the card processor keeps from each card payment. It does not give it back on a refund.',
  },
  {
    code: ACCOUNTS.commissionExpense,
    name: 'Commission expense',
    type: 'expense',
    normalSide: 'debit',
    salespersonSubledger: true,
    // ASC 340-40-25-4 practical expedient (secondary, REFERENCE-VALUES.md): expensed when incurred.
    description: 'Sales commissions, expensed when earned, kept per salesperson.',
  },
];

const BY_CODE = new Map(CHART_OF_ACCOUNTS.map((a) => [a.code, a]));

export function chartAccount(code: string): ChartAccount | undefined {
  return BY_CODE.get(code);
}

export function isAccountCode(value: unknown): value is AccountCode {
  return typeof value === 'string' && BY_CODE.has(value);
}

/** The normal side of an account type: debit for assets and expenses, credit for the others. */
export function normalSideOf(type: AccountType): Side {
  return type === 'asset' || type === 'expense' ? 'debit' : 'credit';
}
