import { describe, expect, it } from 'vitest';
import { screen, within } from '@testing-library/react';
import {
  defineRulesFor,
  type AuthUser,
  type ContractCommissionSplitsView,
  type ContractView,
  type LeadDetail,
  type ProposalSummary,
} from '@loambook/common';
import { routes } from '@/app/router';
import { makeContractView } from '@/testing/contract-view';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

const LEAD_ID = '55555555-5555-4555-8555-555555555555';
const CONTRACT_ID = '66666666-6666-4666-8666-666666666666';
const JOB_ID = '88888888-8888-4888-8888-888888888888';
const salesperson = makeUser('salesperson');

// Instants and what the branch's clock showed then (US zone rules: EST = UTC−5, CST = UTC−6 in winter,
// CDT = UTC−5 in summer; 15 U.S.C. 260a, memory). Past years, so that the year is always written.
const CALL_AT = '2025-03-04T15:15:00.000Z'; // 10:15 AM EST, 9:15 AM CST
const SIGNED_AT = '2025-07-20T18:29:00.000Z'; // 2:29 PM EDT, 1:29 PM CDT

function leadIn(timezone: string | undefined, overrides: Partial<LeadDetail> = {}): LeadDetail {
  return {
    id: LEAD_ID,
    branchId: BRANCH_IDS.mrw,
    branchCode: 'MRW',
    homeownerName: 'Marisol Ebbing',
    addressLine1: '18 Quarry Lane',
    city: 'Marrowfield',
    state: 'FL',
    postalCode: '32901',
    stage: 'scheduled',
    stageChangedAt: '2025-07-21T18:30:00.000Z',
    createdAt: '2025-03-01T15:00:00.000Z',
    daysInStage: 0,
    ageDays: 30,
    value: '5420.00',
    salespersonId: salesperson.id,
    salespersonName: salesperson.name,
    approvalPending: false,
    lastDayToCancel: null,
    phonePrimary: '555-0142',
    phoneSecondary: null,
    email: 'marisol@example.com',
    preferredContact: 'phone',
    yearBuilt: 1978,
    foundationType: 'slab',
    source: 'Referral',
    notes: null,
    lostReason: null,
    activities: [
      {
        id: 'act-1',
        kind: 'call',
        body: 'Asked about the crack over the garage door.',
        data: {},
        actorName: salesperson.name,
        branchCode: 'MRW',
        createdAt: CALL_AT,
      },
    ],
    transfers: [],
    moves: [],
    readOnly: false,
    ...(timezone ? { timezone } : {}),
    job: { id: JOB_ID, number: 'MRW-2507-004', status: 'scheduled' },
    ...overrides,
  };
}

const signed: ProposalSummary = {
  id: 'prop-1',
  leadId: LEAD_ID,
  branchId: BRANCH_IDS.mrw,
  version: 1,
  previousId: null,
  status: 'signed',
  salespersonId: salesperson.id,
  createdAt: '2025-07-18T15:00:00.000Z',
  updatedAt: '2025-07-20T18:29:00.000Z',
  sentAt: '2025-07-18T16:00:00.000Z',
  options: [
    {
      id: 'opt-1',
      position: 1,
      title: 'Stabilise the slab',
      netTotal: '5420.00',
      customerTotal: '5420.00',
      grossMarginPct: '51.20',
    },
  ],
};

const contract: ContractView = makeContractView({
  id: CONTRACT_ID,
  option: { position: 1, title: 'Stabilise the slab' },
  leadId: LEAD_ID,
  branchId: BRANCH_IDS.mrw,
  salespersonId: salesperson.id,
  price: '5420.00',
  depositAmount: '0.00',
  signedAt: SIGNED_AT,
  signedOn: '2025-07-20',
  lastDayToCancel: '2025-07-23',
  cancellableUntil: '2025-07-24T04:59:59.999Z',
  windowOpen: false,
  canCancel: false,
  createdAt: SIGNED_AT,
});

const splits: ContractCommissionSplitsView = {
  contractId: CONTRACT_ID,
  leadId: LEAD_ID,
  branchId: BRANCH_IDS.mrw,
  plan: { id: 'plan-1', name: 'Branch standard' },
  stored: false,
  earned: false,
  cancelled: false,
  splits: [
    {
      salespersonId: salesperson.id,
      salespersonName: salesperson.name,
      sharePct: '100',
      monthVolumeBefore: '0.00',
    },
  ],
  preview: null,
  eligible: [{ id: salesperson.id, name: salesperson.name }],
};

function renderLead(user: AuthUser, lead: LeadDetail) {
  signInAs(user);
  fakeApi({
    'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    'GET /api/branches': { body: [makeBranch()] },
    [`GET /api/leads/${LEAD_ID}`]: { body: lead },
    [`GET /api/leads/${LEAD_ID}/inspections`]: { body: [] },
    [`GET /api/leads/${LEAD_ID}/proposals`]: { body: [signed] },
    [`GET /api/leads/${LEAD_ID}/contract`]: { body: contract },
    [`GET /api/contracts/${CONTRACT_ID}/commission-splits`]: { body: splits },
  });
  renderApp(null, { routes, initialEntry: `/leads/${LEAD_ID}` });
}

const timeline = async () => {
  const heading = await screen.findByRole('heading', { name: 'Timeline' });
  return heading.closest('section') as HTMLElement;
};

describe('the lead page', () => {
  it.each([
    ['America/Chicago', 'Mar 4, 2025, 9:15 AM CST', 'Jul 20, 2025, 1:29 PM CDT'],
    ['America/New_York', 'Mar 4, 2025, 10:15 AM EST', 'Jul 20, 2025, 2:29 PM EDT'],
  ])(
    'shows the timeline and the contract on the branch’s clock (%s), whatever the browser’s',
    async (zone, called, signedWhen) => {
      renderLead(salesperson, leadIn(zone));
      const t = await timeline();
      expect(within(t).getByText(called)).toHaveAttribute('datetime', CALL_AT);
      const card = await screen.findByRole('region', { name: 'Contract' });
      expect(card).toHaveTextContent(signedWhen);
    },
  );

  it('links the lead’s job beside the contract and shows the commission split', async () => {
    renderLead(salesperson, leadIn('America/Chicago'));
    const link = await screen.findByRole('link', { name: /Job MRW-2507-004/ });
    expect(link).toHaveAttribute('href', `/jobs/${JOB_ID}`);
    expect(link).toHaveTextContent('Scheduled');
    // in the card that holds the contract
    const proposals = screen.getByRole('region', { name: 'Proposals' });
    expect(within(proposals).getByRole('link', { name: /Job MRW-2507-004/ })).toBe(link);
    const commission = await screen.findByRole('region', { name: 'Commission' });
    expect(await within(commission).findByText('Plan: Branch standard', { exact: false })).toBeVisible();
    expect(commission).toHaveTextContent('100%');
  });

  it('offers no job link when the lead has none (or the person may not open it)', async () => {
    renderLead(salesperson, leadIn('America/Chicago', { job: null }));
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    await screen.findByRole('region', { name: 'Contract' });
    expect(screen.queryByRole('link', { name: /^Job / })).not.toBeInTheDocument();
  });
});
