import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { ContractCommissionSplitsView, Role } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { CONTRACT_ID, LEAD_ID, makeSplitsView, OTHER_SELLER_ID, SELLER_ID } from '../testing/fixtures';
import { ContractSplitsEditor, LeadCommissionSplits } from './contract-splits-editor';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;
const URL = `/api/contracts/${CONTRACT_ID}/commission-splits`;

function renderFor(role: Role, view: ContractCommissionSplitsView = makeSplitsView()) {
  signInAs(makeUser(role));
  const api = fakeApi({
    [`GET ${URL}`]: { body: view },
    [`PUT ${URL}`]: (req) => ({
      body: makeSplitsView({
        stored: true,
        splits: (req.body as { splits: { salespersonId: string; sharePct: string }[] }).splits.map((s) => ({
          ...s,
          salespersonName: s.salespersonId === SELLER_ID ? 'Ana Seller' : 'Ben Seller',
          monthVolumeBefore: '0.00',
        })),
      }),
    }),
  });
  renderApp(<ContractSplitsEditor contractId={CONTRACT_ID} />);
  return api;
}

describe('contract commission split', () => {
  it('shows what each salesperson is due under the plan', async () => {
    renderFor('branch_manager');
    const table = await screen.findByRole('table', { name: 'Commission split' });
    const row = within(table).getByRole('row', { name: /Ana Seller/ });
    // 5,420.00 × 8 % = 433.60, half at each milestone
    expect(
      within(row)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['Ana Seller', '100%', '$433.60', '$216.80', '$216.80']);
    expect(screen.getByText(/the whole commission goes to the contract’s salesperson/)).toBeInTheDocument();
  });

  it('lets the manager split it, and says inline when the shares do not add up to 100', async () => {
    const { calls } = renderFor('branch_manager');
    await userEvent.click(await screen.findByRole('button', { name: 'Change split' }));
    await userEvent.clear(screen.getByLabelText('Share (%)'));
    await userEvent.type(screen.getByLabelText('Share (%)'), '60');
    await userEvent.click(screen.getByRole('button', { name: 'Add salesperson' }));
    await userEvent.click(screen.getByLabelText('Salesperson 2'));
    await userEvent.click(await screen.findByRole('option', { name: 'Ben Seller', ...visibleList }));
    const shares = screen.getAllByLabelText('Share (%)');
    await userEvent.type(shares[1]!, '30');
    expect(screen.getByRole('status')).toHaveTextContent('The shares add up to 90%, not 100%.');
    await userEvent.click(screen.getByRole('button', { name: 'Save split' }));
    expect(await screen.findByText('Fix the split first.')).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'PUT')).toHaveLength(0);

    await userEvent.clear(shares[1]!);
    await userEvent.type(shares[1]!, '40');
    expect(screen.getByRole('status')).toHaveTextContent('The shares add up to 100%.');
    await userEvent.click(screen.getByRole('button', { name: 'Save split' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'PUT')).toHaveLength(1));
    expect(calls.find((c) => c.method === 'PUT')?.body).toEqual({
      splits: [
        { salespersonId: SELLER_ID, sharePct: '60' },
        { salespersonId: OTHER_SELLER_ID, sharePct: '40' },
      ],
    });
  });

  it('keeps the split once commission is earned', async () => {
    renderFor('branch_manager', makeSplitsView({ stored: true, earned: true }));
    expect(await screen.findByText(/the split is kept as it is/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Change split' })).not.toBeInTheDocument();
  });

  it('is read only for the salesperson', async () => {
    renderFor('salesperson');
    expect(await screen.findByRole('table', { name: 'Commission split' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Change split' })).not.toBeInTheDocument();
  });

  it('shows on a lead page only once the lead has a contract', async () => {
    signInAs(makeUser('branch_manager'));
    const first = fakeApi({
      [`GET /api/leads/${LEAD_ID}/contract`]: {
        status: 404,
        body: { code: 'CONTRACT.NOT_FOUND', message: 'No such contract.', details: null, requestId: 't' },
      },
    });
    const { unmount } = renderApp(<LeadCommissionSplits leadId={LEAD_ID} />);
    await waitFor(() => expect(first.calls.some((c) => c.path.endsWith('/contract'))).toBe(true));
    await new Promise((r) => setTimeout(r, 50));
    expect(screen.queryByRole('heading', { name: 'Commission' })).not.toBeInTheDocument();
    expect(first.calls.some((c) => c.path.endsWith('/commission-splits'))).toBe(false);
    unmount();
    fakeApi({
      [`GET /api/leads/${LEAD_ID}/contract`]: { body: { id: CONTRACT_ID } },
      [`GET ${URL}`]: { body: makeSplitsView() },
    });
    renderApp(<LeadCommissionSplits leadId={LEAD_ID} />);
    expect(await screen.findByRole('heading', { name: 'Commission' })).toBeInTheDocument();
    expect(await screen.findByRole('table', { name: 'Commission split' })).toBeInTheDocument();
  });
});
