import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ContractView, LeadDetail, ProposalSummary } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeUser, renderApp, signInAs } from '@/testing/render';
import { LeadProposals } from './lead-proposals';

const salesperson = makeUser('salesperson');

const lead = {
  id: 'lead-1',
  branchId: BRANCH_IDS.mrw,
  salespersonId: salesperson.id,
  homeownerName: 'Marisol Ebbing',
} as LeadDetail;

const summary = (overrides: Partial<ProposalSummary> = {}): ProposalSummary => ({
  id: 'prop-1',
  leadId: 'lead-1',
  branchId: BRANCH_IDS.mrw,
  version: 1,
  previousId: null,
  status: 'draft',
  salespersonId: salesperson.id,
  createdAt: '2026-12-01T15:00:00.000Z',
  updatedAt: '2026-12-01T15:00:00.000Z',
  sentAt: null,
  options: [
    {
      id: 'opt-1',
      position: 1,
      title: 'Stabilise the east wall',
      netTotal: '2767.50',
      customerTotal: '2767.50',
      grossMarginPct: '47.10',
    },
  ],
  ...overrides,
});

function renderFor(proposals: ProposalSummary[], contract?: Partial<ContractView>) {
  signInAs(salesperson);
  fakeApi({
    'GET /api/leads/lead-1': { body: lead },
    'GET /api/leads/lead-1/proposals': { body: proposals },
    'GET /api/leads/lead-1/contract': contract
      ? { body: contract }
      : { status: 404, body: { code: 'NOT_FOUND', message: 'No contract.', details: null } },
  });
  return renderApp(null, {
    routes: [
      { path: '/leads/:leadId', element: <LeadProposals leadId="lead-1" /> },
      { path: '/leads/:leadId/proposals/new', element: <p>builder</p> },
    ],
    initialEntry: '/leads/lead-1',
  });
}

describe('lead proposals', () => {
  it('offers “New proposal” on a lead without one', async () => {
    const { router } = renderFor([]);
    await userEvent.click(await screen.findByRole('button', { name: 'New proposal' }));
    expect(router.state.location.pathname).toBe('/leads/lead-1/proposals/new');
  });

  it('lists the versions with status and totals, and starts no second line of versions', async () => {
    renderFor([
      summary({ id: 'prop-2', version: 2, status: 'sent', sentAt: '2026-12-01T16:00:00.000Z' }),
      summary({ status: 'superseded' }),
    ]);
    expect(await screen.findByRole('link', { name: 'Version 2' })).toHaveAttribute(
      'href',
      '/proposals/prop-2',
    );
    expect(screen.getByRole('link', { name: 'Version 1' })).toHaveAttribute('href', '/proposals/prop-1');
    expect(screen.getByText('Sent to the homeowner')).toBeInTheDocument();
    expect(screen.getAllByText('$2,767.50')).toHaveLength(2);
    expect(screen.queryByRole('button', { name: 'New proposal' })).not.toBeInTheDocument();
  });

  it('shows the signed contract with its last day to cancel', async () => {
    renderFor([summary({ status: 'signed' })], {
      id: 'contract-1',
      status: 'signed',
      proposalVersion: 1,
      option: { position: 1, title: 'Stabilise the east wall' },
      price: '2767.50',
      depositAmount: '0.00',
      signedByName: 'Marisol Ebbing',
      signedAt: '2026-12-01T18:29:00.000Z',
      signedInPerson: false,
      lastDayToCancel: '2026-12-04',
      windowOpen: true,
      cancellation: null,
    });
    expect(await screen.findByText('Last day to cancel')).toBeInTheDocument();
    expect(screen.getByText('Friday, December 4, 2026')).toBeInTheDocument();
    expect(screen.getByText('Marisol Ebbing (online)')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Contract PDF' })).toBeInTheDocument();
  });
});
