import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import { defineRulesFor, type AuthUser, type PaymentList } from '@loambook/common';
import { routes } from '@/app/router';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

// PrimeReact's Dropdown keeps its focus input under pointer-events: none; the click reaches it as in a browser.
const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const bookkeeper = makeUser('bookkeeper');

const list = (rows: PaymentList['rows']): PaymentList => ({
  rows,
  total: rows.length,
  page: 1,
  pageSize: 25,
  totals: rows.length
    ? { amount: '1500.00', fee: '29.30', net: '1470.70' }
    : { amount: '0.00', fee: '0.00', net: '0.00' },
});

const row = (over: Partial<PaymentList['rows'][number]>): PaymentList['rows'][number] => ({
  id: 'pay-1',
  contractId: 'c-1',
  branchId: BRANCH_IDS.mrw,
  kind: 'deposit',
  method: 'card',
  amount: '1000.00',
  fee: '29.30',
  net: '970.70',
  refunded: '0.00',
  receivedOn: '2026-12-01',
  reference: null,
  cardBrand: 'visa',
  cardLast4: '4242',
  recordedBy: null,
  journalEntryId: 'je-1',
  createdAt: '2026-12-01T15:00:00.000Z',
  branchCode: 'MRW',
  leadId: '55555555-5555-4555-8555-555555555555',
  homeownerName: 'Marisol Ebbing',
  ...over,
});

function open(user: AuthUser, answer: (q: URLSearchParams) => PaymentList) {
  signInAs(user);
  const { calls } = fakeApi({
    'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    'GET /api/branches': {
      body: [makeBranch(), makeBranch({ id: BRANCH_IDS.ald, code: 'ALD', name: 'Aldmoor' })],
    },
    'GET /api/payments': (req) => ({ body: answer(req.query) }),
  });
  renderApp(null, { routes, initialEntry: '/payments' });
  return calls;
}

describe('the bookkeeper’s payments list', () => {
  it('lists payments with how they came and the totals of the filter', async () => {
    open(bookkeeper, () =>
      list([
        row({}),
        row({
          id: 'pay-2',
          method: 'cheque',
          cardBrand: null,
          cardLast4: null,
          reference: '1042',
          amount: '500.00',
          fee: '0.00',
          net: '500.00',
          kind: 'balance',
        }),
      ]),
    );
    const table = await screen.findByRole('table', { name: 'Payments received' });
    expect(within(table).getByText('Visa •••• 4242')).toBeInTheDocument();
    expect(within(table).getByText('Cheque 1042')).toBeInTheDocument();
    expect(within(table).getAllByRole('link', { name: 'Marisol Ebbing' })[0]).toHaveAttribute(
      'href',
      '/leads/55555555-5555-4555-8555-555555555555',
    );
    expect(screen.getByLabelText('Totals of the filter')).toHaveTextContent('Net $1,470.70');
  });

  it('sends the filters to the server and shows an empty state with a way out', async () => {
    const calls = open(bookkeeper, (q) => (q.get('method') === 'cash' ? list([]) : list([row({})])));
    await screen.findByRole('table', { name: 'Payments received' });
    await userEvent.click(screen.getByLabelText('Method'));
    await userEvent.click(await screen.findByRole('option', { name: 'Cash', hidden: true }));
    expect(await screen.findByText('No payments match these filters')).toBeInTheDocument();
    await waitFor(() =>
      expect(calls.some((c) => c.path === '/api/payments' && c.query.get('method') === 'cash')).toBe(true),
    );
    await userEvent.click(screen.getAllByRole('button', { name: 'Clear filters' })[0]!);
    expect(await screen.findByRole('table', { name: 'Payments received' })).toBeInTheDocument();
  });

  it('is not in the navigation of a salesperson', async () => {
    const salesperson = makeUser('salesperson');
    signInAs(salesperson);
    fakeApi({
      'GET /api/auth/me': { body: { user: salesperson, rules: defineRulesFor(salesperson) } },
      'GET /api/branches': { body: [makeBranch()] },
    });
    renderApp(null, { routes, initialEntry: '/' });
    expect((await screen.findAllByRole('navigation', { name: 'Main' }))[0]).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Payments' })).not.toBeInTheDocument();
  });
});
