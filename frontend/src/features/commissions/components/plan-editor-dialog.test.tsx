import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { CommissionPlanView } from '@loambook/common';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { createCommissionPlan } from '../api/save-commission-plan';
import { makePlan } from '../testing/fixtures';
import { PlanEditorDialog } from './plan-editor-dialog';

// See invite-user-dialog.test.tsx: PrimeReact's dropdown input is pointer-events: none without app.css.
const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function renderEditor(plan: CommissionPlanView | null = null) {
  signInAs(makeUser('owner'));
  const onSubmit = vi.fn((input: Parameters<typeof createCommissionPlan>[0]) => createCommissionPlan(input));
  renderApp(
    <PlanEditorDialog
      state={{ plan }}
      branches={[makeBranch()]}
      onSubmit={onSubmit}
      onClose={() => undefined}
      pending={false}
    />,
  );
  return onSubmit;
}

describe('commission plan editor', () => {
  it('builds a tiered plan, checks the tiers inline, and sends the strings as typed', async () => {
    const { calls } = fakeApi({ 'POST /api/commission-plans': { status: 201, body: makePlan() } });
    renderEditor();
    await userEvent.type(await screen.findByLabelText('Name'), 'Volume 2027');
    await userEvent.type(screen.getByLabelText('Starts on'), '2027-01-01');
    await userEvent.click(screen.getByLabelText('Tiers'));
    await userEvent.click(screen.getByLabelText(/Bracket/));
    const tiers = screen.getByRole('table', { name: 'Tiers' });
    expect(within(tiers).getByText('From monthly volume ($)')).toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('Tier 1 rate'), '5');
    await userEvent.click(screen.getByRole('button', { name: 'Add tier' }));
    // A second tier that does not start above the first.
    await userEvent.type(screen.getByLabelText('Tier 2 starts at'), '0');
    await userEvent.type(screen.getByLabelText('Tier 2 rate'), '7');
    await userEvent.click(screen.getByRole('button', { name: 'Add plan' }));
    expect(await screen.findByText('Each tier must start above the one before it.')).toBeInTheDocument();
    expect(screen.getByLabelText('Tier 2 starts at')).toHaveAttribute('aria-invalid', 'true');
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await userEvent.clear(screen.getByLabelText('Tier 2 starts at'));
    await userEvent.type(screen.getByLabelText('Tier 2 starts at'), '50,000');
    await userEvent.click(screen.getByRole('button', { name: 'Add plan' }));
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST')).toHaveLength(1));
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      branchId: null,
      name: 'Volume 2027',
      basis: 'net_price',
      rate: {
        kind: 'tiered',
        measure: 'monthly_volume',
        mode: 'bracket',
        tiers: [
          { from: '0', ratePct: '5' },
          { from: '50000', ratePct: '7' },
        ],
      },
      firstMilestonePct: '50',
      effectiveFrom: '2027-01-01',
      active: true,
    });
  });

  it('puts the server’s field errors on the fields', async () => {
    fakeApi({
      'POST /api/commission-plans': {
        status: 422,
        body: errorBody('COMMISSION.PLAN_INVALID', 'The rate must be a percentage from 0 to 100.', [
          { field: 'rate.ratePct', message: 'The rate must be a percentage from 0 to 100.' },
        ]),
      },
    });
    renderEditor();
    await userEvent.type(await screen.findByLabelText('Name'), 'Flat');
    await userEvent.type(screen.getByLabelText('Starts on'), '2027-01-01');
    await userEvent.type(screen.getByLabelText('Rate (%)'), '8');
    await userEvent.click(screen.getByRole('button', { name: 'Add plan' }));
    await waitFor(() => expect(screen.getByLabelText('Rate (%)')).toHaveAttribute('aria-invalid', 'true'));
    expect(screen.getByLabelText('Rate (%)')).toHaveAccessibleDescription(
      /The rate must be a percentage from 0 to 100\./,
    );
  });

  it('keeps the terms of a plan in use, and says why', async () => {
    fakeApi({});
    renderEditor(makePlan({ inUse: true }));
    expect(await screen.findByText(/Contracts are already computed under this plan/)).toBeInTheDocument();
    expect(screen.getByLabelText('Rate (%)')).toBeDisabled();
    expect(screen.getByLabelText(/Earned when the deposit has cleared/)).toBeDisabled();
    expect(screen.getByLabelText('Name')).toBeEnabled();
  });
});
