import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import { defineRulesFor } from '@loambook/common';
import { SESSION_KEY } from '@/features/auth/session-store';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { routes } from './router';

const me = (user: ReturnType<typeof makeUser>) => ({ body: { user, rules: defineRulesFor(user) } });

describe('routes and guards', () => {
  it('sends someone who is not signed in to sign-in, remembering where they were going', async () => {
    fakeApi({});
    const { router } = renderApp(null, { routes, initialEntry: '/admin/branches' });
    expect(await screen.findByRole('button', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(new URLSearchParams(router.state.location.search).get('returnTo')).toBe('/admin/branches');
  });

  it('treats an expired stored session as signed out', async () => {
    const user = makeUser('owner');
    window.localStorage.setItem(
      SESSION_KEY,
      JSON.stringify({
        accessToken: 'old',
        expiresAt: '2020-01-01T00:00:00.000Z',
        user,
        rules: defineRulesFor(user),
      }),
    );
    fakeApi({});
    const { router } = renderApp(null, { routes, initialEntry: '/' });
    expect(await screen.findByRole('button', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
  });

  it('ends the session on a 401 and says so on the sign-in page', async () => {
    const user = makeUser('owner');
    signInAs(user);
    fakeApi({
      'GET /api/auth/me': me(user),
      'GET /api/branches': { status: 401, body: errorBody('AUTH.REQUIRED', 'Please sign in.') },
    });
    const { router } = renderApp(null, { routes, initialEntry: '/admin/branches' });
    expect(await screen.findByText(/Your session ended/)).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(new URLSearchParams(router.state.location.search).get('returnTo')).toBe('/admin/branches');
    expect(window.localStorage.getItem(SESSION_KEY)).toBeNull();
  });

  it('tells a salesperson the People page is not part of their role', async () => {
    const user = makeUser('salesperson');
    signInAs(user);
    fakeApi({ 'GET /api/auth/me': me(user), 'GET /api/branches': { body: [makeBranch()] } });
    renderApp(null, { routes, initialEntry: '/admin/users' });
    expect(
      await screen.findByRole('heading', { name: "Your role doesn't include this" }),
    ).toBeInTheDocument();
  });

  it('shows a branch manager the branch list without the owner’s controls', async () => {
    const user = makeUser('branch_manager');
    signInAs(user);
    fakeApi({
      'GET /api/auth/me': me(user),
      'GET /api/branches': { body: [makeBranch({ inUse: false, userCount: 0 })] },
    });
    renderApp(null, { routes, initialEntry: '/admin/branches' });
    expect(await screen.findByRole('cell', { name: 'MRW' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'New branch' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Delete/ })).not.toBeInTheDocument();
    expect(screen.queryByRole('link', { name: /Edit/ })).not.toBeInTheDocument();
  });

  it('lets the owner delete an unused branch after confirming', async () => {
    const user = makeUser('owner');
    signInAs(user);
    const unused = makeBranch({
      id: BRANCH_IDS.ald,
      code: 'ALD',
      name: 'Port Alderwick',
      inUse: false,
      userCount: 0,
    });
    const { calls } = fakeApi({
      'GET /api/auth/me': me(user),
      'GET /api/branches': { body: [makeBranch(), unused] },
      [`DELETE /api/branches/${BRANCH_IDS.ald}`]: { status: 204 },
    });
    renderApp(null, { routes, initialEntry: '/admin/branches' });
    // The used branch has no delete button; the unused one has.
    expect(await screen.findByRole('button', { name: 'Delete ALD' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Delete MRW' })).not.toBeInTheDocument();
    screen.getByRole('button', { name: 'Delete ALD' }).click();
    expect(await screen.findByText('Delete branch ALD? This cannot be undone.')).toBeInTheDocument();
    screen.getByRole('button', { name: 'Delete' }).click();
    await waitFor(() => expect(calls.some((c) => c.method === 'DELETE')).toBe(true));
  });

  it('answers an unknown address with the not-found page', async () => {
    const user = makeUser('owner');
    signInAs(user);
    fakeApi({ 'GET /api/auth/me': me(user), 'GET /api/branches': { body: [] } });
    renderApp(null, { routes, initialEntry: '/no/such/page' });
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeInTheDocument();
  });
});
