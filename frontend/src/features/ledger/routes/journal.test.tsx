import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { Role } from '@loambook/common';
import { CurrentBranchProvider } from '@/features/branches/current-branch';
import { errorBody, fakeApi, type FakeRequest } from '@/testing/fake-api';
import { makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { entry } from '../testing/fixtures';
import JournalRoute from './journal';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function renderFor(
  role: Role,
  routes: Record<
    string,
    { status?: number; body?: unknown } | ((r: FakeRequest) => { status?: number; body?: unknown })
  > = {},
  initialEntry = '/ledger/journal',
) {
  signInAs(makeUser(role));
  const api = fakeApi({
    'GET /api/branches': { body: [makeBranch()] },
    'GET /api/ledger/journal': { body: { items: [entry()], total: 1, page: 1, pageSize: 25 } },
    ...routes,
  });
  renderApp(
    <CurrentBranchProvider>
      <JournalRoute />
    </CurrentBranchProvider>,
    { path: '/ledger/journal', initialEntry },
  );
  return api;
}

describe('journal', () => {
  it('shows each entry with its lines in the debit and credit columns, filters from the address', async () => {
    const { calls } = renderFor(
      'bookkeeper',
      {},
      '/ledger/journal?from=2026-12-01&to=2026-12-31&reason=deposit.card',
    );
    expect(
      await screen.findByText('Deposit paid by card', { selector: '.journal-entry-head__reason' }),
    ).toBeInTheDocument();
    const fees = screen.getByRole('row', { name: /5100/ });
    expect(
      within(fees)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['5100 Card processing fees', '', '$29.30', '']);
    const deposits = screen.getByRole('row', { name: /2100/ });
    expect(within(deposits).getAllByRole('cell').at(-1)?.textContent).toBe('$1,000.00');
    const q = calls.find((c) => c.path === '/api/ledger/journal')!.query;
    expect(Object.fromEntries(q)).toEqual({
      from: '2026-12-01',
      to: '2026-12-31',
      reasonCode: 'deposit.card',
      page: '1',
      pageSize: '25',
    });
    expect(screen.getByLabelText('From')).toHaveValue('2026-12-01');
  });

  it('downloads the same filters as CSV with the token', async () => {
    const create = vi.fn(() => 'blob:ledger');
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: create, revokeObjectURL: vi.fn() }));
    const save = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(() => undefined);
    const { fetchMock } = renderFor('bookkeeper', {}, '/ledger/journal?from=2026-12-01');
    await screen.findByRole('row', { name: /5100/ });
    const api = fetchMock.getMockImplementation()!;
    fetchMock.mockImplementation(async (input: RequestInfo | URL, init?: RequestInit) =>
      String(input).includes('format=csv')
        ? new Response('entry_id,effective_on\r\n', {
            status: 200,
            headers: {
              'Content-Type': 'text/csv',
              'Content-Disposition': 'attachment; filename="journal-from-2026-12-01.csv"',
            },
          })
        : api(input, init),
    );
    await userEvent.click(screen.getByRole('button', { name: 'Download the journal as CSV' }));
    await waitFor(() => expect(save).toHaveBeenCalled());
    expect(create).toHaveBeenCalled();
    const [url, init] = fetchMock.mock.calls.find(([u]) => String(u).includes('format=csv'))!;
    const query = new URL(String(url), 'http://localhost').searchParams;
    expect(Object.fromEntries(query)).toEqual({ from: '2026-12-01', format: 'csv' });
    expect((init?.headers as Record<string, string>).Authorization).toBe('Bearer token-for-bookkeeper');
    expect(await screen.findByText('journal-from-2026-12-01.csv')).toBeInTheDocument();
  });

  it('reverses an entry after asking why, and shows the server’s refusal', async () => {
    const { calls } = renderFor('bookkeeper', {
      'POST /api/ledger/entries/e0000000-0000-4000-8000-000000000001/reverse': {
        status: 409,
        body: errorBody('LEDGER.ALREADY_REVERSED', 'This entry has already been reversed.'),
      },
    });
    await userEvent.click(await screen.findByRole('button', { name: /Reverse the entry of Dec 1, 2026/ }));
    const dialog = await screen.findByRole('dialog', { name: 'Reverse this entry' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Post reversal' }));
    expect(within(dialog).getByLabelText('Reason')).toHaveAccessibleDescription(
      /Say why the entry is reversed\./,
    );
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);
    await userEvent.type(within(dialog).getByLabelText('Reason'), 'Duplicate of the cheque entry');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Post reversal' }));
    expect(await within(dialog).findByText('This entry has already been reversed.')).toBeInTheDocument();
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ reason: 'Duplicate of the cheque entry' });
  });

  it('offers no reversal of an entry already reversed', async () => {
    renderFor('bookkeeper', {
      'GET /api/ledger/journal': {
        body: {
          items: [entry({ reversedByEntryId: 'e0000000-0000-4000-8000-000000000002' })],
          total: 1,
          page: 1,
          pageSize: 25,
        },
      },
    });
    expect(await screen.findByText('Reversed')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Reverse the entry/ })).not.toBeInTheDocument();
  });

  it('says when nothing matches the filters', async () => {
    renderFor(
      'owner',
      { 'GET /api/ledger/journal': { body: { items: [], total: 0, page: 1, pageSize: 25 } } },
      '/ledger/journal?reason=refund.revenue',
    );
    expect(await screen.findByText('No entries match these filters')).toBeInTheDocument();
  });
});
