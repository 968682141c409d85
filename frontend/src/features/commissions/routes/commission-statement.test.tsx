import { describe, expect, it, onTestFinished, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { CommissionStatementDetail, Role } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeUser, renderApp, signInAs } from '@/testing/render';
import { makeStatement, STATEMENT_ID } from '../testing/fixtures';
import { StatementPage } from './commission-statement';
import MyCommissionsRoute from './my-commissions';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function renderFor(role: Role, statement: CommissionStatementDetail) {
  signInAs(makeUser(role, role === 'branch_manager' ? { branchIds: [BRANCH_IDS.mrw] } : {}));
  const api = fakeApi({
    [`POST /api/commission-statements/${STATEMENT_ID}/approve`]: {
      body: { ...statement, status: 'approved' },
    },
    [`POST /api/commission-statements/${STATEMENT_ID}/pay`]: { body: { ...statement, status: 'paid' } },
  });
  renderApp(<StatementPage statement={statement} />);
  return api;
}

describe('a commission statement', () => {
  it('lists its lines with the contract’s homeowner, milestone and amount', async () => {
    renderFor('bookkeeper', makeStatement());
    const lines = await screen.findByRole('table', { name: 'Statement lines' });
    const row = within(lines).getByRole('row', { name: /Jordan Example/ });
    expect(
      within(row)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual([
      'Jul 9, 2026',
      'Jordan Example',
      'Deposit cleared, cancellation window closed',
      'Earned',
      '$216.80',
    ]);
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent('Jul 1 – Jul 15, 2026');
  });

  it('is approved only after a confirmation', async () => {
    const { calls } = renderFor('bookkeeper', makeStatement());
    await userEvent.click(await screen.findByRole('button', { name: 'Approve…' }));
    expect(await screen.findByText(/payable \$216\.80\? Its figures are then locked/)).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Not yet' }));
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);
    await userEvent.click(screen.getByRole('button', { name: 'Approve…' }));
    await userEvent.click(await screen.findByRole('button', { name: 'Approve' }));
    await waitFor(() =>
      expect(calls.filter((c) => c.method === 'POST').map((c) => c.path)).toEqual([
        `/api/commission-statements/${STATEMENT_ID}/approve`,
      ]),
    );
  });

  it('is marked paid with the date and reference, saying what is posted', async () => {
    // 9:30 pm on 20 July on this computer's clock: in a US zone UTC has reached the 21st.
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date(2026, 6, 20, 21, 30));
    onTestFinished(() => {
      vi.useRealTimers();
    });
    const { calls } = renderFor(
      'bookkeeper',
      makeStatement({ status: 'approved', approvedByName: 'Bea Books' }),
    );
    await userEvent.click(await screen.findByRole('button', { name: 'Mark paid…' }));
    const dialog = await screen.findByRole('dialog', { name: 'Mark the statement paid' });
    expect(dialog).toHaveTextContent('Posts $216.80 from commissions payable (Ana Seller) to the bank');
    const paidOn = within(dialog).getByLabelText('Paid on');
    // Paid today on this computer's calendar (not the period's last day, nor UTC's day).
    expect(paidOn).toHaveValue('2026-07-20');
    await userEvent.clear(paidOn);
    await userEvent.type(paidOn, '2026-07-17');
    await userEvent.type(within(dialog).getByLabelText('Reference'), 'Cheque 1042');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Mark paid $216.80' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST')).toHaveLength(1));
    expect(calls.find((c) => c.method === 'POST')).toMatchObject({
      path: `/api/commission-statements/${STATEMENT_ID}/pay`,
      body: { paidOn: '2026-07-17', reference: 'Cheque 1042' },
    });
  });

  it('says a negative statement pays nothing and carries forward', async () => {
    renderFor(
      'bookkeeper',
      makeStatement({
        status: 'approved',
        earned: '0.00',
        clawedBack: '216.80',
        net: '-216.80',
        payable: '0.00',
        carriedOut: '-216.80',
      }),
    );
    await userEvent.click(await screen.findByRole('button', { name: 'Mark paid…' }));
    expect(await screen.findByRole('dialog', { name: 'Mark the statement paid' })).toHaveTextContent(
      'This statement pays $0.00: nothing is posted, and −$216.80 carries into Ana Seller’s next statement.',
    );
  });

  it('offers no approval or payment to the manager or the salesperson', async () => {
    renderFor('branch_manager', makeStatement());
    expect(await screen.findByRole('table', { name: 'Statement lines' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Approve…' })).not.toBeInTheDocument();
  });
});

describe('my commissions', () => {
  it('lists the salesperson’s own statements, read only', async () => {
    signInAs(makeUser('salesperson'));
    const { calls } = fakeApi({ 'GET /api/commission-statements': { body: [makeStatement()] } });
    renderApp(<MyCommissionsRoute />);
    const table = await screen.findByRole('table', { name: 'Commission statements' });
    expect(within(table).getByRole('link', { name: 'Jul 1 – Jul 15, 2026' })).toHaveAttribute(
      'href',
      `/commissions/statements/${STATEMENT_ID}`,
    );
    expect(calls[0]!.query.get('salespersonId')).toBe('00000000-0000-4000-8000-000000000003');
    expect(screen.queryByRole('button', { name: /Build|Run/ })).not.toBeInTheDocument();
  });
});
