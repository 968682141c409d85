import { describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { commission, line, payout } from '../testing/fixtures';
import { UnmatchedLists } from './unmatched-lists';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function show(props: Partial<Parameters<typeof UnmatchedLists>[0]> = {}) {
  signInAs(makeUser('bookkeeper'));
  return renderApp(
    <UnmatchedLists
      bankLines={[
        line(),
        line({
          id: 'l-2',
          rowNumber: 6,
          postedOn: '2026-11-25',
          description: 'CARD PROCESSOR TRANSFER C',
          amount: '500.00',
          amountCents: '50000',
        }),
      ]}
      payouts={[payout()]}
      commissionPayments={[commission()]}
      receivesPayouts
      {...props}
    />,
  );
}

describe('unmatched lists', () => {
  it('lists the bank lines on one side and the payouts and commission payments on the other', async () => {
    show();
    const bank = await screen.findByRole('region', { name: /On the bank, not matched/ });
    expect(within(bank).getByText('2')).toBeInTheDocument();
    expect(within(bank).getByText('RENT - 1 CLAYFIELD ROW')).toBeInTheDocument();
    expect(within(bank).getByText('−$1,800.00')).toBeInTheDocument();
    expect(within(bank).getByText('$500.00')).toBeInTheDocument();

    const books = screen.getByRole('region', { name: /In the books, not on the bank/ });
    const payouts = within(books).getByRole('list', { name: 'Unmatched payouts' });
    expect(within(payouts).getByRole('link', { name: 'Payout po_test_c' })).toHaveAttribute(
      'href',
      '/payouts/p-1',
    );
    expect(within(payouts).getByText('Nov 20, 2026')).toBeInTheDocument();
    // A commission payment is money out: shown as the debit the bank should carry.
    const commissions = within(books).getByRole('list', { name: 'Unmatched commission payments' });
    expect(within(commissions).getByText('Commission to Dana Loamfield')).toBeInTheDocument();
    expect(within(commissions).getByText('−$150.00')).toBeInTheDocument();
  });

  it('offers to match a bank line by hand, and hands over the line', async () => {
    const onMatch = vi.fn();
    show({ onMatch });
    await userEvent.click(
      await screen.findByRole('button', { name: 'Match the line of Nov 25, 2026, $500.00' }),
    );
    expect(onMatch).toHaveBeenCalledWith(expect.objectContaining({ id: 'l-2', amountCents: '50000' }));
  });

  it('offers nothing to change without the right, nor on a locked line', async () => {
    show({ bankLines: [line({ locked: true })] });
    expect(await screen.findByText('RENT - 1 CLAYFIELD ROW')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Match/ })).not.toBeInTheDocument();
  });

  it('says so when both sides are empty, and when payouts do not arrive on the account', async () => {
    show({ bankLines: [], payouts: [], commissionPayments: [], receivesPayouts: false });
    expect(await screen.findByText('Every bank line is matched')).toBeInTheDocument();
    expect(screen.getByText('Processor payouts are not paid into this account.')).toBeInTheDocument();
    expect(screen.getByText('Every commission paid in this period is matched.')).toBeInTheDocument();
  });
});
