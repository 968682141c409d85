import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { BALANCED_TB } from '../testing/fixtures';
import { TrialBalanceTable } from './trial-balance-table';

function show(tb = BALANCED_TB) {
  signInAs(makeUser('bookkeeper'));
  fakeApi({});
  return renderApp(
    <TrialBalanceTable trialBalance={tb} accountHref={(id) => `/ledger/accounts?account=${id}`} />,
  );
}

const footerCells = () => {
  const table = screen.getByRole('table', { name: 'Trial balance' });
  const rows = within(table).getAllByRole('row');
  return within(rows.find((r) => within(r).queryByText('Total'))!)
    .getAllByRole('cell')
    .map((c) => c.textContent);
};

describe('trial balance table', () => {
  it('shows each balance in its column and the equal column totals, and says it balances', async () => {
    show();
    const fees = await screen.findByRole('row', { name: /5100/ });
    expect(within(fees).getByText('$116.60')).toBeInTheDocument();
    const revenue = screen.getByRole('row', { name: /4000/ });
    expect(
      within(revenue)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['4000', 'Contract revenue', 'Revenue', '', '$4,000.00']);
    // hand-checked: 970.70 + 2912.70 + 116.60 + 296.40 = 4296.40 each side
    expect(footerCells()).toEqual(['Total', '$4,296.40', '$4,296.40']);
    expect(screen.getByRole('status')).toHaveTextContent(
      'Balanced. Debits equal credits: $4,296.40 on each side.',
    );
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Card processor clearing' })).toHaveAttribute(
      'href',
      '/ledger/accounts?account=acc-1050',
    );
  });

  it('cannot be missed when the server says the columns differ', async () => {
    show({
      ...BALANCED_TB,
      rows: BALANCED_TB.rows.map((r) =>
        r.code === '4000' ? { ...r, creditTotal: '3999.99', creditBalance: '3999.99' } : r,
      ),
      totals: {
        debitTotal: '9267.10',
        creditTotal: '9267.09',
        debitBalance: '4296.40',
        creditBalance: '4296.39',
        difference: '-0.01',
        balanced: false,
      },
    });
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('OUT OF BALANCE by $0.01');
    expect(alert).toHaveTextContent('Debit balances $4,296.40, credit balances $4,296.39');
    expect(screen.queryByText(/^Balanced\./)).not.toBeInTheDocument();
    expect(screen.getByText('Difference')).toBeInTheDocument();
    expect(footerCells()).toEqual(['Total', '$4,296.40', '$4,296.39']);
  });

  it('does not take the server’s word alone: rows that do not add up to its totals are out of balance', async () => {
    // The totals say balanced, but a row was changed on the way: the rows add up to 4296.40 vs 4296.41.
    show({
      ...BALANCED_TB,
      rows: BALANCED_TB.rows.map((r) =>
        r.code === '2300' ? { ...r, creditTotal: '296.41', creditBalance: '296.41' } : r,
      ),
    });
    expect(await screen.findByRole('alert')).toHaveTextContent('OUT OF BALANCE by $0.01');
  });
});
