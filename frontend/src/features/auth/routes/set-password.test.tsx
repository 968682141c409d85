import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor } from '@loambook/common';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp } from '@/testing/render';
import SetPasswordRoute from './set-password';

const routes = [
  { path: '/set-password', element: <SetPasswordRoute /> },
  { path: '/sign-in', element: <p>Sign-in page</p> },
  { path: '/', element: <p>Home page</p> },
];

const USED = 'This link has already been used. Sign in with your password, or ask for a new link.';

describe('set-password page', () => {
  it('says plainly that a used link cannot be used, with a way to sign in', async () => {
    fakeApi({
      'GET /api/auth/password-links/used-token-123': { status: 410, body: errorBody('AUTH.LINK_USED', USED) },
    });
    renderApp(null, { routes, initialEntry: '/set-password?token=used-token-123' });
    expect(await screen.findByText(USED)).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'This link can’t be used' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: /Go to sign in/ })).toHaveAttribute('href', '/sign-in');
    expect(screen.queryByLabelText('New password')).not.toBeInTheDocument();
  });

  it('shows whose link it is, hints at the rule while typing, and signs in on success', async () => {
    const user = makeUser('salesperson', { name: 'Wren Halloway', email: 'wren@example.test' });
    const { calls } = fakeApi({
      'GET /api/auth/password-links/good-token-123': {
        body: {
          email: user.email,
          name: user.name,
          purpose: 'invite',
          expiresAt: '2030-01-01T00:00:00.000Z',
        },
      },
      'POST /api/auth/password': {
        body: {
          accessToken: 't2',
          expiresAt: new Date(Date.now() + 3600_000).toISOString(),
          user,
          rules: defineRulesFor(user),
        },
      },
      'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    });
    const { router } = renderApp(null, { routes, initialEntry: '/set-password?token=good-token-123' });
    expect(await screen.findByText('wren@example.test')).toBeInTheDocument();
    expect(screen.getByText('Wren Halloway')).toBeInTheDocument();

    await userEvent.type(screen.getByLabelText('New password'), 'short');
    expect(screen.getByText(/Use at least 12 characters/)).toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('Repeat password'), 'short');
    await userEvent.click(screen.getByRole('button', { name: 'Set password and sign in' }));
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await userEvent.clear(screen.getByLabelText('New password'));
    await userEvent.type(screen.getByLabelText('New password'), 'wet clay heaves in spring');
    expect(screen.getByText(/Long enough/)).toBeInTheDocument();
    await userEvent.clear(screen.getByLabelText('Repeat password'));
    await userEvent.type(screen.getByLabelText('Repeat password'), 'wet clay heaves in spring');
    await userEvent.click(screen.getByRole('button', { name: 'Set password and sign in' }));

    expect(await screen.findByText('Home page')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/');
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      token: 'good-token-123',
      password: 'wet clay heaves in spring',
    });
    await waitFor(() =>
      expect(window.localStorage.getItem('loambook.session')).toContain('"accessToken":"t2"'),
    );
  });

  it('shows the server’s message when the link expires while the form is open', async () => {
    const expired = 'This link has expired. Ask for a new one.';
    fakeApi({
      'GET /api/auth/password-links/tok-expiring-1': {
        body: {
          email: 'a@example.test',
          name: 'A Person',
          purpose: 'reset',
          expiresAt: '2030-01-01T00:00:00.000Z',
        },
      },
      'POST /api/auth/password': { status: 410, body: errorBody('AUTH.LINK_EXPIRED', expired) },
    });
    renderApp(null, { routes, initialEntry: '/set-password?token=tok-expiring-1' });
    await userEvent.type(await screen.findByLabelText('New password'), 'a long enough password');
    await userEvent.type(screen.getByLabelText('Repeat password'), 'a long enough password');
    await userEvent.click(screen.getByRole('button', { name: 'Set password and sign in' }));
    expect(await screen.findByText(expired)).toBeInTheDocument();
  });
});
