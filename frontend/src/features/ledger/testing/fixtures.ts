import { BRANCH_IDS } from '@/testing/render';
import type { JournalEntry, TrialBalance } from '@loambook/common';

const row = (
  code: string,
  name: string,
  type: TrialBalance['rows'][number]['type'],
  normalSide: 'debit' | 'credit',
  debitTotal: string,
  creditTotal: string,
  debitBalance: string,
  creditBalance: string,
): TrialBalance['rows'][number] => ({
  accountId: `acc-${code}`,
  code,
  name,
  type,
  normalSide,
  debitTotal,
  creditTotal,
  debitBalance,
  creditBalance,
});

/**
 * A month of one invented branch, hand-checked (the same figures as backend/test/ledger.e2e-spec.ts): a
 * $4,000 job with a $1,000 card deposit (fee 29.30), payout 970.70, balance 3,000 by card (fee 87.30),
 * commission 296.40. Debit balances 970.70 + 2912.70 + 116.60 + 296.40 = 4296.40 = 296.40 + 4000.00.
 */
export const BALANCED_TB: TrialBalance = {
  branchId: BRANCH_IDS.mrw,
  asOf: '2026-12-31',
  rows: [
    row('1010', 'Bank — operating account', 'asset', 'debit', '970.70', '0.00', '970.70', '0.00'),
    row('1050', 'Card processor clearing', 'asset', 'debit', '3883.40', '970.70', '2912.70', '0.00'),
    row('1200', 'Accounts receivable', 'asset', 'debit', '3000.00', '3000.00', '0.00', '0.00'),
    row(
      '2100',
      'Customer deposits (contract liability)',
      'liability',
      'credit',
      '1000.00',
      '1000.00',
      '0.00',
      '0.00',
    ),
    row('2300', 'Commissions payable', 'liability', 'credit', '0.00', '296.40', '0.00', '296.40'),
    row('4000', 'Contract revenue', 'revenue', 'credit', '0.00', '4000.00', '0.00', '4000.00'),
    row('5100', 'Card processing fees', 'expense', 'debit', '116.60', '0.00', '116.60', '0.00'),
    row('5200', 'Commission expense', 'expense', 'debit', '296.40', '0.00', '296.40', '0.00'),
  ],
  totals: {
    debitTotal: '9267.10',
    creditTotal: '9267.10',
    debitBalance: '4296.40',
    creditBalance: '4296.40',
    difference: '0.00',
    balanced: true,
  },
};

export function entry(overrides: Partial<JournalEntry> = {}): JournalEntry {
  return {
    id: 'e0000000-0000-4000-8000-000000000001',
    branchId: BRANCH_IDS.mrw,
    branchCode: 'MRW',
    reasonCode: 'deposit.card',
    reasonLabel: 'Deposit paid by card',
    sourceKind: 'event',
    sourceRef: 'evt_test_1',
    memo: 'Deposit paid by card',
    effectiveOn: '2026-12-01',
    postedAt: '2026-12-01T15:00:00.000Z',
    postedBy: null,
    postedByName: null,
    leadId: null,
    contractId: null,
    jobId: null,
    reversesEntryId: null,
    reversedByEntryId: null,
    total: '1000.00',
    lines: [
      {
        id: 'l1',
        accountId: 'acc-1050',
        accountCode: '1050',
        accountName: 'Card processor clearing',
        side: 'debit',
        amount: '970.70',
        salespersonId: null,
        salespersonName: null,
      },
      {
        id: 'l2',
        accountId: 'acc-5100',
        accountCode: '5100',
        accountName: 'Card processing fees',
        side: 'debit',
        amount: '29.30',
        salespersonId: null,
        salespersonName: null,
      },
      {
        id: 'l3',
        accountId: 'acc-2100',
        accountCode: '2100',
        accountName: 'Customer deposits (contract liability)',
        side: 'credit',
        amount: '1000.00',
        salespersonId: null,
        salespersonName: null,
      },
    ],
    ...overrides,
  };
}
