import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { ReconciliationView } from '@loambook/common';
import { fakeApi, type FakeRequest } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { ACCOUNT, match, reconciliationView } from '../testing/fixtures';
import ReconciliationRoute from './reconciliation';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function renderWorkspace(
  view: ReconciliationView,
  extra: Record<string, (r: FakeRequest) => { status?: number; body?: unknown }> = {},
) {
  signInAs(makeUser('bookkeeper'));
  const api = fakeApi({
    'GET /api/bank-accounts': { body: [ACCOUNT] },
    'GET /api/reconciliation': { body: view },
    ...extra,
  });
  renderApp(<ReconciliationRoute />, {
    initialEntry: `/reconciliation?account=${ACCOUNT.id}&from=2026-11-01&to=2026-11-30`,
  });
  return api;
}

describe('reconciliation workspace', () => {
  it('shows the matched pairs and what stands in the way of locking; confirms a suggestion', async () => {
    const { calls } = renderWorkspace(reconciliationView(), {
      'POST /api/reconciliation/matches/m-1/confirm': () => ({ body: match({ status: 'confirmed' }) }),
    });
    const pairs = await screen.findByRole('table', { name: 'Matched pairs' });
    const row = within(pairs).getAllByRole('row')[1]!;
    expect(within(row).getByText('CARD PROCESSOR TRANSFER A')).toBeInTheDocument();
    expect(within(row).getByRole('link', { name: 'Payout po_test_a' })).toHaveAttribute(
      'href',
      '/payouts/p-a',
    );
    expect(within(row).getByText('Suggested')).toBeInTheDocument();
    expect(within(row).getByText('+1 d')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Lock the period' })).toBeDisabled();
    expect(
      screen.getByText(
        /To lock this period: 1 bank line is not matched; 1 suggestion is not confirmed; 1 payout is not on the bank\./,
      ),
    ).toBeInTheDocument();
    const query = calls.find((c) => c.path === '/api/reconciliation')!.query;
    expect(Object.fromEntries(query)).toEqual({
      bankAccountId: ACCOUNT.id,
      from: '2026-11-01',
      to: '2026-11-30',
    });

    await userEvent.click(within(row).getByRole('button', { name: /Confirm the match of Nov 4, 2026/ }));
    await waitFor(() =>
      expect(
        calls.some((c) => c.method === 'POST' && c.path === '/api/reconciliation/matches/m-1/confirm'),
      ).toBe(true),
    );
  });

  it('locks a reconciled period only after the bookkeeper confirms', async () => {
    const done = reconciliationView({
      matched: [
        match({
          status: 'confirmed',
          matchedBy: { id: 'u-b', name: 'Bea Keeper' },
          matchedAt: '2026-12-02T10:00:00Z',
        }),
      ],
      unmatchedBankLines: [],
      unmatchedPayouts: [],
      summary: { bankLines: 1, moneyIn: '2129.80', moneyOut: '0.00', suggested: 0, confirmed: 1 },
      lockBlockers: {
        unmatchedBankLines: 0,
        unconfirmedMatches: 0,
        unmatchedPayouts: 0,
        unmatchedCommissionPayments: 0,
        uncoveredDays: 0,
      },
    });
    const { calls } = renderWorkspace(done, {
      'POST /api/reconciliation/lock': (r) => ({
        status: 201,
        body: {
          id: 'r-1',
          bankAccountId: ACCOUNT.id,
          periodStart: '2026-11-01',
          periodEnd: '2026-11-30',
          lockedBy: { id: 'u-b', name: 'Bea' },
          lockedAt: '2026-12-02T11:00:00Z',
          sent: r.body,
        },
      }),
    });
    await userEvent.click(await screen.findByRole('button', { name: 'Lock the period' }));
    const dialog = await screen.findByRole('dialog', { name: 'Lock the period' });
    expect(
      within(dialog).getByText(/Lock Nov 1, 2026 – Nov 30, 2026 on Operating ··0142\?.*cannot be removed/),
    ).toBeInTheDocument();
    await userEvent.click(within(dialog).getByRole('button', { name: 'Not yet' }));
    expect(calls.some((c) => c.path === '/api/reconciliation/lock')).toBe(false);
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());

    await userEvent.click(screen.getByRole('button', { name: 'Lock the period' }));
    await userEvent.click(
      within(await screen.findByRole('dialog', { name: 'Lock the period' })).getByRole('button', {
        name: 'Lock the period',
      }),
    );
    await waitFor(() =>
      expect(calls.find((c) => c.path === '/api/reconciliation/lock')?.body).toEqual({
        bankAccountId: ACCOUNT.id,
        from: '2026-11-01',
        to: '2026-11-30',
      }),
    );
  });

  it('asks before undoing a confirmed match, and shows a locked period as such', async () => {
    renderWorkspace(
      reconciliationView({ matched: [match({ status: 'confirmed', locked: true })], locked: true }),
    );
    expect(await screen.findByText('This period is reconciled and locked.')).toBeInTheDocument();
    expect(screen.getByText('Locked')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Undo the match/ })).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Suggest matches' })).toBeDisabled();
  });
});
