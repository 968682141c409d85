import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor, type AuthUser, type ContractView, type LeadDetail } from '@loambook/common';
import { routes } from '@/app/router';
import { makeContractView } from '@/testing/contract-view';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

const LEAD_ID = '55555555-5555-4555-8555-555555555555';
const CONTRACT_ID = '66666666-6666-4666-8666-666666666666';
const salesperson = makeUser('salesperson');

const lead: LeadDetail = {
  id: LEAD_ID,
  branchId: BRANCH_IDS.mrw,
  branchCode: 'MRW',
  homeownerName: 'Marisol Ebbing',
  addressLine1: '18 Quarry Lane',
  city: 'Marrowfield',
  state: 'FL',
  postalCode: '32901',
  stage: 'contract_signed',
  stageChangedAt: '2026-12-01T18:30:00.000Z',
  createdAt: '2026-11-01T15:00:00.000Z',
  daysInStage: 0,
  ageDays: 30,
  value: '2767.50',
  salespersonId: salesperson.id,
  salespersonName: salesperson.name,
  approvalPending: false,
  lastDayToCancel: '2026-12-04',
  phonePrimary: '555-0142',
  phoneSecondary: null,
  email: 'marisol@example.com',
  preferredContact: 'phone',
  yearBuilt: 1978,
  foundationType: 'slab',
  source: 'Referral',
  notes: null,
  lostReason: null,
  activities: [],
  transfers: [],
  moves: [],
  readOnly: false,
};

const contract = (overrides: Partial<ContractView> = {}): ContractView =>
  makeContractView({
    id: CONTRACT_ID,
    leadId: LEAD_ID,
    branchId: BRANCH_IDS.mrw,
    salespersonId: salesperson.id,
    ...overrides,
  });

function renderLead(user: AuthUser, view: ContractView, onCancel?: (note: unknown) => void) {
  signInAs(user);
  const { calls } = fakeApi({
    'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    'GET /api/branches': { body: [makeBranch()] },
    [`GET /api/leads/${LEAD_ID}`]: { body: lead },
    [`GET /api/leads/${LEAD_ID}/inspections`]: { body: [] },
    [`GET /api/leads/${LEAD_ID}/proposals`]: { body: [] },
    [`GET /api/leads/${LEAD_ID}/contract`]: { body: view },
    [`POST /api/contracts/${CONTRACT_ID}/cancel`]: (req) => {
      onCancel?.(req.body);
      return {
        body: contract({
          status: 'cancelled',
          windowOpen: true,
          canCancel: false,
          cancellation: {
            at: '2026-12-02T15:00:00.000Z',
            byKind: 'staff',
            by: { id: user.id, name: user.name },
            note: (req.body as { note: string }).note,
            afterWindow: false,
          },
        }),
      };
    },
  });
  renderApp(null, { routes, initialEntry: `/leads/${LEAD_ID}` });
  return calls;
}

describe('recording a cancellation on the lead page', () => {
  it('asks how the homeowner cancelled, says the deposit is due back, then records it', async () => {
    const sent: unknown[] = [];
    const calls = renderLead(salesperson, contract(), (body) => sent.push(body));

    await userEvent.click(await screen.findByRole('button', { name: 'Record cancellation' }));
    const dialog = await screen.findByRole('dialog', { name: 'Record the homeowner’s cancellation' });
    expect(dialog).toHaveTextContent('the $500.00 deposit included, is due back within 10 business days');
    expect(dialog).toHaveTextContent('option 2, Push piers on the east wall');
    expect(dialog).toHaveTextContent('It cannot be undone.');

    // The note is required: nothing is sent without it.
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record cancellation' }));
    expect(await within(dialog).findByText(/Say how the homeowner cancelled/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await userEvent.type(
      within(dialog).getByLabelText(/How the homeowner cancelled/),
      'Phoned the office on Wednesday at 10:15.',
    );
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record cancellation' }));
    await waitFor(() => expect(sent).toEqual([{ note: 'Phoned the office on Wednesday at 10:15.' }]));
    expect(await screen.findByText('Cancellation recorded')).toBeInTheDocument();
  });

  it('keeps the contract when the dialog is closed with “Keep the contract”', async () => {
    const calls = renderLead(salesperson, contract());
    await userEvent.click(await screen.findByRole('button', { name: 'Record cancellation' }));
    const dialog = await screen.findByRole('dialog', { name: 'Record the homeowner’s cancellation' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Keep the contract' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  /** The page has asked for the contract and had its answer rendered. */
  async function contractLoaded(calls: { path: string }[]) {
    await waitFor(() => expect(calls.some((c) => c.path.endsWith('/contract'))).toBe(true));
    await new Promise((r) => setTimeout(r, 100));
  }

  it.each([
    ['the window has closed', { windowOpen: false }],
    ['the contract is already cancelled', { status: 'cancelled' as const, canCancel: false }],
    ['the server says this person may not', { canCancel: false }],
  ])('offers nothing once %s', async (_case, overrides) => {
    const calls = renderLead(salesperson, contract(overrides));
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    await contractLoaded(calls);
    expect(screen.queryByRole('button', { name: 'Record cancellation' })).not.toBeInTheDocument();
  });

  it('offers nothing to someone who may not change the contract (another salesperson’s lead)', async () => {
    const colleague = makeUser('salesperson', { id: '00000000-0000-4000-8000-0000000000aa' });
    const calls = renderLead(colleague, contract({ salespersonId: salesperson.id }));
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    await contractLoaded(calls);
    expect(screen.queryByRole('button', { name: 'Record cancellation' })).not.toBeInTheDocument();
  });
});
