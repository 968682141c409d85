import type { ReactElement, ReactNode } from 'react';
import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router';
import { QueryClient } from '@tanstack/react-query';
import { defineRulesFor, type AuthUser, type Branch, type Role } from '@loambook/common';
import { AppProvider } from '@/app/provider';
import { SESSION_KEY, type Session } from '@/features/auth/session-store';

export function testQueryClient(): QueryClient {
  return new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
}

export function makeUser(role: Role, overrides: Partial<AuthUser> = {}): AuthUser {
  return {
    id: `00000000-0000-4000-8000-00000000000${['owner', 'branch_manager', 'salesperson', 'bookkeeper', 'crew_lead'].indexOf(role) + 1}`,
    name: `${role} person`,
    email: `${role}@example.test`,
    role,
    branchIds: role === 'owner' || role === 'bookkeeper' ? [] : [BRANCH_IDS.mrw],
    ...overrides,
  };
}

export const BRANCH_IDS = {
  mrw: '11111111-1111-4111-8111-111111111111',
  ald: '22222222-2222-4222-8222-222222222222',
};

/** Signs a test person in the way the app would find them: a stored session with their real rules. */
export function signInAs(user: AuthUser): Session {
  const session: Session = {
    accessToken: `token-for-${user.role}`,
    expiresAt: new Date(Date.now() + 3600_000).toISOString(),
    user,
    rules: defineRulesFor(user),
  };
  window.localStorage.setItem(SESSION_KEY, JSON.stringify(session));
  return session;
}

export function makeBranch(overrides: Partial<Branch> = {}): Branch {
  return {
    id: BRANCH_IDS.mrw,
    code: 'MRW',
    name: 'Marrowfield',
    addressLine1: '410 Quarrystone Way',
    city: 'Marrowfield',
    state: 'FL',
    postalCode: '32901',
    phone: '555-0100',
    timezone: 'America/New_York',
    marginFloorPct: '38',
    discountAuthority: { salesperson: '8', branch_manager: '18' },
    salesTaxTreatment: 'materials_cost',
    salesTaxRatePct: '6',
    userCount: 4,
    inUse: true,
    createdAt: '2026-01-05T12:00:00.000Z',
    updatedAt: '2026-01-05T12:00:00.000Z',
    ...overrides,
  };
}

/** Renders inside the real providers (a fresh QueryClient without retries) and a memory router. */
export function renderApp(
  ui: ReactElement | null,
  options: { path?: string; routes?: RouteObject[]; initialEntry?: string } = {},
) {
  const queryClient = testQueryClient();
  const routes: RouteObject[] = options.routes ?? [{ path: options.path ?? '*', element: ui as ReactNode }];
  const router = createMemoryRouter(routes, {
    initialEntries: [options.initialEntry ?? options.path ?? '/'],
  });
  const result = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...result, router, queryClient };
}
