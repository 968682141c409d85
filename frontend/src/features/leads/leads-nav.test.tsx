import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import type { Role } from '@loambook/common';
import { AppNav } from '@/app/layout/app-nav';
import { makeUser, renderApp, signInAs } from '@/testing/render';

describe('Leads in the navigation', () => {
  it.each<[Role, boolean]>([
    ['owner', true],
    ['branch_manager', true],
    ['salesperson', true],
    ['bookkeeper', true],
    ['crew_lead', false],
  ])('%s sees Leads: %s', async (role, shown) => {
    signInAs(makeUser(role));
    renderApp(<AppNav />);
    expect(await screen.findByRole('link', { name: 'Home' })).toBeInTheDocument();
    if (shown) expect(screen.getByRole('link', { name: 'Leads' })).toHaveAttribute('href', '/leads');
    else expect(screen.queryByRole('link', { name: 'Leads' })).not.toBeInTheDocument();
  });
});
