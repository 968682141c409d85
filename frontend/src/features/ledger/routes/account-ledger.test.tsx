import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { AccountLedger, LedgerAccount } from '@loambook/common';
import { CurrentBranchProvider } from '@/features/branches/current-branch';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import AccountLedgerRoute from './account-ledger';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;
const CLEARING = 'a0000000-0000-4000-8000-000000001050';

const accounts: LedgerAccount[] = [
  {
    id: 'a0000000-0000-4000-8000-000000001010',
    branchId: BRANCH_IDS.mrw,
    code: '1010',
    name: 'Bank — operating account',
    type: 'asset',
    normalSide: 'debit',
    salespersonSubledger: false,
  },
  {
    id: CLEARING,
    branchId: BRANCH_IDS.mrw,
    code: '1050',
    name: 'Card processor clearing',
    type: 'asset',
    normalSide: 'debit',
    salespersonSubledger: false,
  },
];

// Clearing after a card deposit (net 970.70), its payout, and a refund of the whole 1,000.00 deposit: the
// processor keeps its 29.30 fee (Stripe refunds documentation), so the account ends 29.30 on the credit side.
const ledger: AccountLedger & { total: number; page: number; pageSize: number } = {
  account: { ...accounts[1]!, branchCode: 'MRW' },
  from: '2026-12-02',
  to: null,
  openingBalance: '970.70',
  closingBalance: '-29.30',
  debitTotal: '0.00',
  creditTotal: '1000.00',
  lines: [
    {
      entryId: 'e1',
      lineId: 'l1',
      effectiveOn: '2026-12-04',
      postedAt: '2026-12-04T14:00:00.000Z',
      reasonCode: 'refund.cancellation',
      reasonLabel: 'Deposit refunded after cancellation',
      memo: null,
      side: 'credit',
      amount: '1000.00',
      salespersonId: null,
      salespersonName: null,
      balance: '-29.30',
    },
  ],
  total: 1,
  page: 1,
  pageSize: 100,
};

function show(initialEntry: string) {
  signInAs(makeUser('bookkeeper'));
  localStorage.setItem(`loambook.branch.${makeUser('bookkeeper').id}`, BRANCH_IDS.mrw);
  const api = fakeApi({
    'GET /api/branches': { body: [makeBranch()] },
    'GET /api/ledger/accounts': { body: accounts },
    [`GET /api/ledger/accounts/${CLEARING}/lines`]: { body: ledger },
  });
  renderApp(
    <CurrentBranchProvider>
      <AccountLedgerRoute />
    </CurrentBranchProvider>,
    { path: '/ledger/accounts', initialEntry },
  );
  return api;
}

describe('account ledger', () => {
  it('asks for an account, then shows its lines with the opening, running and closing balances', async () => {
    const { calls } = show('/ledger/accounts?from=2026-12-02');
    expect(
      await screen.findByText('Choose an account', { selector: '.empty-state__title' }),
    ).toBeInTheDocument();
    await userEvent.click(screen.getByLabelText('Account'));
    await userEvent.click(
      await screen.findByRole('option', { name: '1050 · Card processor clearing', ...visibleList }),
    );
    const table = await screen.findByRole('table', { name: 'Lines of 1050 Card processor clearing' });
    expect(within(table).getByText('Opening balance, before Dec 2, 2026')).toBeInTheDocument();
    expect(within(table).getByText('$970.70')).toBeInTheDocument();
    const refund = within(table).getByRole('row', { name: /Deposit refunded after cancellation/ });
    // a debit-normal account below zero: shown as an amount on the credit side
    expect(
      within(refund)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['Dec 4, 2026', 'Deposit refunded after cancellation', '', '', '', '$1,000.00', '$29.30 Cr']);
    expect(within(table).getByText('Closing balance')).toBeInTheDocument();
    const q = calls.find((c) => c.path.endsWith('/lines'))!.query;
    expect(q.get('from')).toBe('2026-12-02');
  });
});
