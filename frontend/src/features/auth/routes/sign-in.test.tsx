import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor } from '@loambook/common';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp } from '@/testing/render';
import SignInRoute from './sign-in';

const routes = [
  { path: '/sign-in', element: <SignInRoute /> },
  { path: '/admin/users', element: <p>People page</p> },
  { path: '/', element: <p>Home page</p> },
];

describe('sign-in page', () => {
  it('shows what is missing next to each field and sends nothing', async () => {
    const { fetchMock } = fakeApi({});
    renderApp(null, { routes, initialEntry: '/sign-in' });
    await userEvent.click(await screen.findByRole('button', { name: 'Sign in' }));
    expect(screen.getByText('Enter your e-mail address.')).toBeInTheDocument();
    expect(screen.getByText('Enter your password.')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(fetchMock).not.toHaveBeenCalled();

    await userEvent.type(screen.getByLabelText('E-mail'), 'not-an-address');
    expect(screen.getByText('Enter a valid e-mail address.')).toBeInTheDocument();
  });

  it('shows the server’s message when the e-mail and password do not match', async () => {
    fakeApi({
      'POST /api/auth/login': {
        status: 401,
        body: errorBody(
          'AUTH.INVALID_CREDENTIALS',
          'That e-mail and password do not match an active account.',
        ),
      },
    });
    renderApp(null, { routes, initialEntry: '/sign-in' });
    await userEvent.type(await screen.findByLabelText('E-mail'), 'ines@example.test');
    await userEvent.type(screen.getByLabelText('Password'), 'wrong password');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(
      await screen.findByText('That e-mail and password do not match an active account.'),
    ).toBeInTheDocument();
    expect(screen.queryByText('Home page')).not.toBeInTheDocument();
  });

  it('shows the server’s message when there were too many attempts (429)', async () => {
    fakeApi({
      'POST /api/auth/login': {
        status: 429,
        body: errorBody('AUTH.TOO_MANY_ATTEMPTS', 'Too many attempts. Wait a few minutes and try again.'),
      },
    });
    renderApp(null, { routes, initialEntry: '/sign-in' });
    await userEvent.type(await screen.findByLabelText('E-mail'), 'ines@example.test');
    await userEvent.type(screen.getByLabelText('Password'), 'anything');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(
      await screen.findByText('Too many attempts. Wait a few minutes and try again.'),
    ).toBeInTheDocument();
  });

  it('signs in and goes back to the page the person came from', async () => {
    const user = makeUser('owner', { name: 'Ines Varga' });
    const { calls } = fakeApi({
      'POST /api/auth/login': {
        body: {
          accessToken: 't1',
          expiresAt: new Date(Date.now() + 3600_000).toISOString(),
          user,
          rules: defineRulesFor(user),
        },
      },
      'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    });
    const { router } = renderApp(null, {
      routes,
      initialEntry: '/sign-in?returnTo=%2Fadmin%2Fusers&reason=session-ended',
    });
    expect(await screen.findByText(/Your session ended/)).toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('E-mail'), ' ines@example.test ');
    await userEvent.type(screen.getByLabelText('Password'), 'clay-and-rebar-2026');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('People page')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/admin/users');
    expect(calls[0]?.body).toEqual({ email: 'ines@example.test', password: 'clay-and-rebar-2026' });
    await waitFor(() =>
      expect(JSON.parse(window.localStorage.getItem('loambook.session') ?? '{}').accessToken).toBe('t1'),
    );
  });
});
