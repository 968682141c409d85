import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import { defineRulesFor, type UserSummary } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { routes } from '@/app/router';

const person = (overrides: Partial<UserSummary>): UserSummary => ({
  id: '99999999-9999-4999-8999-999999999999',
  name: 'Caleb Ferro',
  email: 'caleb@example.test',
  role: 'salesperson',
  active: true,
  branchIds: [BRANCH_IDS.mrw],
  invitationPending: false,
  lastSignInAt: null,
  createdAt: '2026-01-05T12:00:00.000Z',
  ...overrides,
});

describe('people page', () => {
  it('lists the people of the branch chosen in the switcher, with their status', async () => {
    const owner = makeUser('owner');
    signInAs(owner);
    window.localStorage.setItem(`loambook.branch.${owner.id}`, BRANCH_IDS.ald);
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: owner, rules: defineRulesFor(owner) } },
      'GET /api/branches': {
        body: [makeBranch(), makeBranch({ id: BRANCH_IDS.ald, code: 'ALD', name: 'Port Alderwick' })],
      },
      'GET /api/users': (req) => ({
        body:
          req.query.get('branchId') === BRANCH_IDS.ald
            ? [
                person({
                  id: 'a',
                  name: 'Tobias Renwick',
                  branchIds: [BRANCH_IDS.ald],
                  invitationPending: true,
                }),
              ]
            : [person({}), person({ id: 'b', name: 'Hector Ilori', active: false })],
      }),
    });
    renderApp(null, { routes, initialEntry: '/admin/users' });
    expect(await screen.findByText('Tobias Renwick')).toBeInTheDocument();
    expect(screen.getByText('Invitation pending')).toBeInTheDocument();
    expect(screen.getByText(/Showing ALD · Port Alderwick/)).toBeInTheDocument();
    expect(screen.queryByText('Caleb Ferro')).not.toBeInTheDocument();
    await waitFor(() =>
      expect(calls.some((c) => c.path === '/api/users' && c.query.get('branchId') === BRANCH_IDS.ald)).toBe(
        true,
      ),
    );
    expect(screen.getByRole('button', { name: 'Resend invite to Tobias Renwick' })).toBeInTheDocument();
  });

  it('shows Deactivated and offers Reactivate for someone deactivated', async () => {
    const owner = makeUser('owner');
    signInAs(owner);
    fakeApi({
      'GET /api/auth/me': { body: { user: owner, rules: defineRulesFor(owner) } },
      'GET /api/branches': { body: [makeBranch()] },
      'GET /api/users': { body: [person({ name: 'Hector Ilori', active: false })] },
    });
    renderApp(null, { routes, initialEntry: '/admin/users' });
    expect(await screen.findByText('Deactivated')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Reactivate Hector Ilori' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Deactivate Hector Ilori' })).not.toBeInTheDocument();
  });
});
