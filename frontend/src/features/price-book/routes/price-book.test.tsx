import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { Role } from '@loambook/common';
import { CurrentBranchProvider } from '@/features/branches/current-branch';
import { ITEMS } from '@/features/proposals/testing/fixtures';
import { errorBody, fakeApi, type FakeRequest } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import PriceBookRoute from './price-book';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;

function renderFor(
  role: Role,
  routes: Record<
    string,
    { status?: number; body?: unknown } | ((r: FakeRequest) => { status?: number; body?: unknown })
  > = {},
) {
  signInAs(makeUser(role));
  const api = fakeApi({
    'GET /api/branches': { body: [makeBranch()] },
    [`GET /api/branches/${BRANCH_IDS.mrw}/price-book`]: {
      body: [ITEMS.point, { ...ITEMS.lb, inUse: true }, { ...ITEMS.mobilise, active: false }],
    },
    ...routes,
  });
  renderApp(
    <CurrentBranchProvider>
      <PriceBookRoute />
    </CurrentBranchProvider>,
  );
  return api;
}

describe('price book', () => {
  it('shows the margin at list from cost and price, and offers Delete only for unused items', async () => {
    renderFor('branch_manager');
    const point = await screen.findByRole('row', { name: /PU-POINT/ });
    // (45.00 − 18.00) / 45.00 = 60.00%; (11.50 − 5.20) / 11.50 = 54.78%.
    expect(within(point).getByText('60.00%')).toBeInTheDocument();
    expect(within(screen.getByRole('row', { name: /PU-LB/ })).getByText('54.78%')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Delete PU-POINT' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Delete PU-LB' })).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Reactivate MOBILISE' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Deactivate PU-POINT' })).toBeInTheDocument();
  });

  it('is read-only for a salesperson', async () => {
    renderFor('salesperson');
    expect(await screen.findByRole('row', { name: /PU-POINT/ })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'New item' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Edit/ })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Delete/ })).not.toBeInTheDocument();
  });

  it('checks a new item at the fields, then shows the server’s “code taken” on the code', async () => {
    const { calls } = renderFor('branch_manager', {
      [`POST /api/branches/${BRANCH_IDS.mrw}/price-book`]: {
        status: 409,
        body: errorBody('PRICE_BOOK.CODE_TAKEN', "This branch's price book already has the code PU-POINT.", [
          { field: 'code', message: 'This code is taken in this branch.' },
        ]),
      },
    });
    await userEvent.click(await screen.findByRole('button', { name: 'New item' }));
    await userEvent.click(screen.getByRole('button', { name: 'Add item' }));
    expect(screen.getByLabelText('Unit cost')).toHaveAccessibleDescription(/Enter an amount of 0 or more/);
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await userEvent.type(screen.getByLabelText('Code'), 'pu-point');
    await userEvent.type(screen.getByLabelText('Description'), 'Injection point, second rig');
    await userEvent.click(screen.getByLabelText('Category'));
    await userEvent.click(await screen.findByRole('option', { name: /Soil stabilisation/, ...visibleList }));
    await userEvent.click(screen.getByLabelText('Unit'));
    await userEvent.click(await screen.findByRole('option', { name: 'point', ...visibleList }));
    await userEvent.type(screen.getByLabelText('Unit cost'), '20');
    await userEvent.type(screen.getByLabelText('Unit price'), '30');
    // (30 − 20) / 30 = 33.33%, under the branch's 38% floor.
    expect(screen.getByText('33.33%')).toBeInTheDocument();
    expect(screen.getByText(/Below the branch’s 38% margin floor/)).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Add item' }));

    await waitFor(() => expect(screen.getByLabelText('Code')).toHaveAttribute('aria-invalid', 'true'));
    expect(screen.getByLabelText('Code')).toHaveAccessibleDescription(/This code is taken in this branch\./);
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      code: 'PU-POINT',
      description: 'Injection point, second rig',
      category: 'soil_stabilisation',
      unit: 'point',
      unitCost: '20',
      unitPrice: '30',
      active: true,
    });
  });

  it('deletes an unused item only after confirming', async () => {
    const { calls } = renderFor('branch_manager', {
      [`DELETE /api/price-book/${ITEMS.point.id}`]: { status: 204 },
    });
    await userEvent.click(await screen.findByRole('button', { name: 'Delete PU-POINT' }));
    expect(calls.some((c) => c.method === 'DELETE')).toBe(false);
    expect(await screen.findByText(/Delete PU-POINT \(Injection point setup/)).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Delete item' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'DELETE')).toBe(true));
  });
});
