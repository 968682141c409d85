import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor, type LeadSummary, type PipelineResponse } from '@loambook/common';
import { routes } from '@/app/router';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

const lead = (overrides: Partial<LeadSummary>): LeadSummary => ({
  id: '33333333-3333-4333-8333-333333333333',
  branchId: BRANCH_IDS.mrw,
  branchCode: 'MRW',
  homeownerName: 'Marisol Ebbing',
  addressLine1: '18 Quarry Lane',
  city: 'Marrowfield',
  stage: 'inspected',
  stageChangedAt: '2026-11-10T15:00:00.000Z',
  createdAt: '2026-11-01T15:00:00.000Z',
  daysInStage: 21,
  ageDays: 30,
  value: '48250.00',
  salespersonId: null,
  salespersonName: 'Caleb Ferro',
  approvalPending: true,
  lastDayToCancel: null,
  ...overrides,
});

function pipeline(items: LeadSummary[]): PipelineResponse {
  return {
    items,
    total: items.length,
    page: 1,
    pageSize: 25,
    stages: [
      { stage: 'new', count: 3, value: '0.00' },
      { stage: 'inspected', count: 2, value: '48250.00' },
      { stage: 'contract_signed', count: 1, value: '1234567.5' },
    ],
  };
}

describe('pipeline', () => {
  it('shows each stage’s count and value in dollars, and filters by a stage when it is clicked', async () => {
    const manager = makeUser('branch_manager');
    signInAs(manager);
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: manager, rules: defineRulesFor(manager) } },
      'GET /api/branches': { body: [makeBranch()] },
      'GET /api/users': { body: [] },
      'GET /api/leads': (req) => ({
        body: pipeline(
          req.query.get('stage') === 'inspected'
            ? [lead({})]
            : [
                lead({}),
                lead({
                  id: '44444444-4444-4444-8444-444444444444',
                  homeownerName: 'Dorrit Vane',
                  stage: 'contract_signed',
                  value: '1234567.50',
                  daysInStage: 1,
                  approvalPending: false,
                  lastDayToCancel: '2026-12-09',
                }),
              ],
        ),
      }),
    });
    renderApp(null, { routes, initialEntry: '/leads' });

    const strip = await screen.findByRole('navigation', { name: 'Stages' });
    const inspected = await within(strip).findByRole('button', { name: /^Inspected: 2 leads/ });
    expect(inspected).toHaveTextContent('$48,250.00');
    expect(within(strip).getByRole('button', { name: /^Contract signed/ })).toHaveTextContent(
      '$1,234,567.50',
    );
    // Stages with no leads are still on the line, at zero.
    expect(within(strip).getByRole('button', { name: /^Scheduled: 0 leads, \$0\.00/ })).toBeInTheDocument();
    expect(inspected).toHaveAttribute('aria-pressed', 'false');

    // The flags of the trade: an approval waiting, and the cancellation clock with its weekday.
    expect(await screen.findByText('Dorrit Vane')).toBeInTheDocument();
    expect(screen.getByText('Approval waiting')).toBeInTheDocument();
    expect(screen.getByText('Can cancel until Wed 2026-12-09')).toBeInTheDocument();

    await userEvent.click(inspected);
    await waitFor(() =>
      expect(calls.some((c) => c.path === '/api/leads' && c.query.get('stage') === 'inspected')).toBe(true),
    );
    await waitFor(() => expect(screen.queryByText('Dorrit Vane')).not.toBeInTheDocument());
    expect(within(strip).getByRole('button', { name: /^Inspected/ })).toHaveAttribute('aria-pressed', 'true');
    expect(screen.getByText('Marisol Ebbing')).toBeInTheDocument();
  });

  it('asks for the longest-waiting leads first: the oldest stage change, ascending', async () => {
    const owner = makeUser('owner');
    signInAs(owner);
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: owner, rules: defineRulesFor(owner) } },
      'GET /api/branches': { body: [makeBranch()] },
      'GET /api/users': { body: [] },
      'GET /api/leads': { body: pipeline([]) },
    });
    renderApp(null, { routes, initialEntry: '/leads' });
    expect(await screen.findByText('No leads yet')).toBeInTheDocument();
    const first = calls.find((c) => c.path === '/api/leads');
    expect(first?.query.get('sort')).toBe('daysInStage');
    expect(first?.query.get('order')).toBe('asc');
  });
});
