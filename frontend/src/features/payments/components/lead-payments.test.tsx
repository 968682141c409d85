import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import {
  defineRulesFor,
  type AuthUser,
  type ContractPayments,
  type ContractView,
  type LeadDetail,
} from '@loambook/common';
import { routes } from '@/app/router';
import { errorBody, fakeApi, type FakeRequest } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

const LEAD_ID = '55555555-5555-4555-8555-555555555555';
const CONTRACT_ID = '66666666-6666-4666-8666-666666666666';
const REQUEST_ID = '77777777-7777-4777-8777-777777777777';
const salesperson = makeUser('salesperson');
const bookkeeper = makeUser('bookkeeper');

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
  activities: [],
  transfers: [],
  moves: [],
  readOnly: false,
  timezone: 'America/Chicago',
};

const contract: ContractView = {
  id: CONTRACT_ID,
  status: 'signed',
  proposalId: 'prop-1',
  proposalVersion: 1,
  optionId: 'opt-1',
  option: { position: 1, title: 'Stabilise the slab' },
  leadId: LEAD_ID,
  branchId: BRANCH_IDS.mrw,
  salespersonId: salesperson.id,
  homeownerName: 'Marisol Ebbing',
  price: '5420.00',
  tax: '0.00',
  depositAmount: '1000.00',
  signedByName: 'Marisol Ebbing',
  signedAt: '2026-11-10T18:29:00.000Z',
  signedOn: '2026-11-10',
  signedIp: null,
  signedUserAgent: null,
  signedInPerson: true,
  cancellationStatement: 'You may cancel this transaction …',
  lastDayToCancel: '2026-11-13',
  cancellableUntil: '2026-11-14T04:59:59.999Z',
  windowOpen: false,
  notices: [],
  pdfUrl: `/api/contracts/${CONTRACT_ID}/pdf`,
  pdfStored: true,
  cancellation: null,
  canCancel: false,
  createdAt: '2026-11-10T18:29:00.000Z',
};

/** The warning of a cancelled contract that still holds the homeowner's money (16 CFR 429; FTC guidance). */
const DUE_BACK = 'every payment made under it is due back within 10 business days';

const LINK_URL = 'http://127.0.0.1:12111/pay/cs_test_a1b2c3';

function payments(overrides: Partial<ContractPayments> = {}): ContractPayments {
  return {
    contractId: CONTRACT_ID,
    leadId: LEAD_ID,
    branchId: BRANCH_IDS.mrw,
    price: '5420.00',
    depositAmount: '1000.00',
    cancelled: false,
    completed: false,
    depositReceivedAt: null,
    paid: '0.00',
    refunded: '0.00',
    depositHeld: '0.00',
    balanceDue: '5420.00',
    refundable: '0.00',
    requests: [
      {
        id: REQUEST_ID,
        contractId: CONTRACT_ID,
        kind: 'deposit',
        amount: '1000.00',
        status: 'open',
        url: LINK_URL,
        expiresAt: '2026-12-03T15:00:00.000Z',
        emailedTo: 'marisol@example.com',
        emailedAt: '2026-12-02T15:00:00.000Z',
        emailCount: 1,
        createdAt: '2026-12-02T15:00:00.000Z',
        paidAt: null,
      },
    ],
    payments: [],
    refunds: [],
    depositWarning: {
      largeInitialPayment: true,
      depositPercent: '18.4502',
      message:
        'An initial payment of $1,000.00 is 18.46% of the contract price. Once it is received, F.S. 489.126(2)(a) starts these clocks: …',
      clocks: [
        {
          code: 'FL_489_126_PERMIT',
          title: 'Apply for the permits',
          source: 'F.S. 489.126(2)(a)',
          startsWhen: 'the initial payment is received; due within 30 days after it',
          rule: '…',
        },
      ],
    },
    processorEnabled: true,
    ...overrides,
  };
}

function renderLead(
  user: AuthUser,
  view: ContractPayments,
  extra: Record<string, (req: FakeRequest) => { status?: number; body?: unknown }> = {},
) {
  signInAs(user);
  const { calls } = fakeApi({
    'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    'GET /api/branches': { body: [makeBranch()] },
    [`GET /api/leads/${LEAD_ID}`]: { body: lead },
    [`GET /api/leads/${LEAD_ID}/inspections`]: { body: [] },
    [`GET /api/leads/${LEAD_ID}/proposals`]: { body: [] },
    [`GET /api/leads/${LEAD_ID}/contract`]: { body: contract },
    [`GET /api/contracts/${CONTRACT_ID}/payments`]: { body: view },
    ...extra,
  });
  renderApp(null, { routes, initialEntry: `/leads/${LEAD_ID}` });
  return calls;
}

const panel = async () => {
  const heading = await screen.findByRole('heading', { name: 'Payments' });
  return heading.closest('section') as HTMLElement;
};

describe('the payments panel on the lead page', () => {
  it('shows the link to copy, the amounts and the Florida deposit warning to the salesperson', async () => {
    const sent: string[] = [];
    renderLead(salesperson, payments(), {
      [`POST /api/payment-requests/${REQUEST_ID}/resend`]: () => {
        sent.push('resend');
        return { body: { ...payments().requests[0], emailCount: 2 } };
      },
    });
    const p = await panel();
    expect(within(p).getByLabelText('Deposit payment link')).toHaveValue(LINK_URL);
    expect(p).toHaveTextContent('Balance due');
    expect(p).toHaveTextContent('$5,420.00');
    expect(p).toHaveTextContent('F.S. 489.126(2)(a)');
    expect(p).toHaveTextContent('Apply for the permits');
    expect(within(p).getByText('Waiting for payment')).toBeInTheDocument();
    // the link's times on the branch's clock (15:00Z is 9:00 AM CST, UTC−6 in winter)
    expect(p).toHaveTextContent(/Made Dec 2, 2026, 9:00\sAM CST/);
    expect(p).toHaveTextContent(/works until Dec 3, 2026, 9:00\sAM CST/);
    // the salesperson asks for money but does not record it
    expect(within(p).getByRole('button', { name: 'Request balance' })).toBeInTheDocument();
    expect(within(p).queryByRole('button', { name: 'Record a payment' })).not.toBeInTheDocument();

    await userEvent.click(within(p).getByRole('button', { name: 'E-mail again' }));
    await waitFor(() => expect(sent).toEqual(['resend']));
    expect(await screen.findByText('Link e-mailed again')).toBeInTheDocument();
  });

  it('puts the server’s refusal of a link amount on the amount field', async () => {
    const bodies: unknown[] = [];
    renderLead(salesperson, payments({ requests: [] }), {
      [`POST /api/contracts/${CONTRACT_ID}/payment-links`]: (req) => {
        bodies.push(req.body);
        return {
          status: 422,
          body: errorBody('PAYMENT.AMOUNT_TOO_SMALL', 'A card payment must be at least $0.50.', {
            field: 'amount',
          }),
        };
      },
    });
    const p = await panel();
    await userEvent.click(within(p).getByRole('button', { name: 'Request deposit' }));
    const dialog = await screen.findByRole('dialog', { name: 'Request the deposit by card' });
    const amount = within(dialog).getByLabelText('Deposit amount');
    expect(amount).toHaveValue('1000.00');
    // more than is due is refused before anything is sent
    await userEvent.clear(amount);
    await userEvent.type(amount, '6000');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Make the link' }));
    expect(await within(dialog).findByText(/more than the \$5,420\.00 left to pay/)).toBeInTheDocument();
    expect(bodies).toEqual([]);
    await userEvent.clear(amount);
    await userEvent.type(amount, '0.40');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Make the link' }));
    expect(await within(dialog).findByText('A card payment must be at least $0.50.')).toBeInTheDocument();
    expect(amount).toHaveAttribute('aria-invalid', 'true');
    expect(bodies).toEqual([{ kind: 'deposit', amount: '0.40' }]);
  });

  it('lets the bookkeeper record a cheque after reviewing what will be posted', async () => {
    const bodies: Record<string, unknown>[] = [];
    renderLead(bookkeeper, payments(), {
      [`POST /api/contracts/${CONTRACT_ID}/payments`]: (req) => {
        bodies.push(req.body as Record<string, unknown>);
        return {
          status: 201,
          body: {
            id: 'pay-1',
            contractId: CONTRACT_ID,
            branchId: BRANCH_IDS.mrw,
            kind: 'deposit',
            method: 'cheque',
            amount: '1000.00',
            fee: '0.00',
            net: '1000.00',
            refunded: '0.00',
            receivedOn: '2026-12-01',
            reference: '1042',
            cardBrand: null,
            cardLast4: null,
            recordedBy: { id: bookkeeper.id, name: bookkeeper.name },
            journalEntryId: 'je-1',
            createdAt: '2026-12-02T15:00:00.000Z',
          },
        };
      },
    });
    const p = await panel();
    await userEvent.click(within(p).getByRole('button', { name: 'Record a payment' }));
    const dialog = await screen.findByRole('dialog', { name: 'Record a payment' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Review' }));
    expect(await within(dialog).findByText(/Enter the amount in dollars/)).toBeInTheDocument();

    await userEvent.type(within(dialog).getByLabelText('Amount'), '1000');
    const day = within(dialog).getByLabelText('Received on');
    await userEvent.clear(day);
    await userEvent.type(day, '2025-06-30');
    await userEvent.type(within(dialog).getByLabelText('Reference'), '1042');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Review' }));
    expect(
      await within(dialog).findByText(/This posts bank \/ customer deposits at once/),
    ).toBeInTheDocument();
    expect(bodies).toEqual([]);
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record payment' }));
    await waitFor(() => expect(bodies).toHaveLength(1));
    expect(bodies[0]).toMatchObject({
      kind: 'deposit',
      method: 'cheque',
      amount: '1000',
      receivedOn: '2025-06-30',
      reference: '1042',
    });
    expect(bodies[0]!.requestId).toMatch(/^[0-9a-f-]{36}$/);
    expect(await screen.findByText('Payment recorded')).toBeInTheDocument();
  });

  it('refunds a cancelled contract only after the bookkeeper confirms', async () => {
    const bodies: unknown[] = [];
    renderLead(
      bookkeeper,
      payments({
        cancelled: true,
        paid: '1000.00',
        depositHeld: '1000.00',
        balanceDue: '0.00',
        refundable: '1000.00',
        requests: [],
        depositWarning: null,
        payments: [
          {
            id: 'pay-1',
            contractId: CONTRACT_ID,
            branchId: BRANCH_IDS.mrw,
            kind: 'deposit',
            method: 'card',
            amount: '1000.00',
            fee: '29.30',
            net: '970.70',
            refunded: '0.00',
            receivedOn: '2026-11-10',
            reference: null,
            cardBrand: 'visa',
            cardLast4: '4242',
            recordedBy: null,
            journalEntryId: 'je-1',
            createdAt: '2026-11-10T18:40:00.000Z',
          },
        ],
      }),
      {
        [`POST /api/contracts/${CONTRACT_ID}/refunds`]: (req) => {
          bodies.push(req.body);
          return {
            status: 201,
            body: [
              {
                id: 'ref-1',
                paymentId: 'pay-1',
                amount: '1000.00',
                status: 'succeeded',
                reason: null,
                refundedOn: '2026-12-02',
                journalEntryId: 'je-2',
                createdAt: '2026-12-02T15:00:00.000Z',
              },
            ],
          };
        },
      },
    );
    const p = await panel();
    expect(p).toHaveTextContent('Visa •••• 4242');
    expect(p).toHaveTextContent(DUE_BACK);
    expect(within(p).queryByRole('button', { name: 'Record a payment' })).not.toBeInTheDocument();
    await userEvent.click(within(p).getByRole('button', { name: 'Refund' }));
    const dialog = await screen.findByRole('dialog', { name: 'Refund to the card' });
    expect(within(dialog).getByLabelText('Amount to refund')).toHaveValue('1000.00');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Refund' }));
    expect(await within(dialog).findByText(/Tick the box to confirm/)).toBeInTheDocument();
    expect(bodies).toEqual([]);
    await userEvent.click(within(dialog).getByLabelText(/refund it to the card now/));
    await userEvent.click(within(dialog).getByRole('button', { name: 'Refund' }));
    await waitFor(() => expect(bodies).toHaveLength(1));
    expect(bodies[0]).toMatchObject({ amount: '1000.00' });
    expect(await screen.findByText('Refund made')).toBeInTheDocument();
  });

  it.each([
    ['nothing was ever received', '0.00', '0.00', 'nothing is owed back'],
    ['everything received was refunded', '0.00', '1000.00', 'has been refunded'],
  ])('on a cancelled contract where %s, warns of no refund due', async (_, paid, refunded, says) => {
    renderLead(
      bookkeeper,
      payments({
        cancelled: true,
        paid,
        refunded,
        depositHeld: paid,
        balanceDue: '0.00',
        refundable: '0.00',
        requests: [],
        depositWarning: null,
      }),
    );
    const p = await panel();
    expect(p).toHaveTextContent(says);
    expect(p).not.toHaveTextContent(DUE_BACK);
    expect(within(p).queryByRole('button', { name: 'Refund' })).not.toBeInTheDocument();
  });

  it('shows nothing when the person may not see the contract’s money', async () => {
    const calls = renderLead(salesperson, payments(), {
      [`GET /api/contracts/${CONTRACT_ID}/payments`]: () => ({
        status: 404,
        body: errorBody('CONTRACT.NOT_FOUND', 'No such contract.'),
      }),
    });
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    await waitFor(() => expect(calls.some((c) => c.path.endsWith('/payments'))).toBe(true));
    await new Promise((r) => setTimeout(r, 100));
    expect(screen.queryByRole('heading', { name: 'Payments' })).not.toBeInTheDocument();
  });
});
