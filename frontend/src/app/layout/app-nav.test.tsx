import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import type { Role } from '@loambook/common';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { AppNav } from './app-nav';

function renderNavFor(role: Role) {
  signInAs(makeUser(role));
  renderApp(<AppNav />);
}

describe('main navigation', () => {
  it('shows a salesperson no admin links', async () => {
    renderNavFor('salesperson');
    expect(await screen.findByRole('link', { name: 'Home' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Branches' })).not.toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'People' })).not.toBeInTheDocument();
    expect(screen.queryByText('Admin')).not.toBeInTheDocument();
  });

  it('shows a crew lead no admin links', async () => {
    renderNavFor('crew_lead');
    expect(await screen.findByRole('link', { name: 'Home' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Branches' })).not.toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'People' })).not.toBeInTheDocument();
  });

  it('shows the owner Branches and People', async () => {
    renderNavFor('owner');
    expect(await screen.findByRole('link', { name: 'Branches' })).toHaveAttribute('href', '/admin/branches');
    expect(screen.getByRole('link', { name: 'People' })).toHaveAttribute('href', '/admin/users');
  });

  it('shows a branch manager both, and a bookkeeper Branches only', async () => {
    renderNavFor('branch_manager');
    expect(await screen.findByRole('link', { name: 'People' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Branches' })).toBeInTheDocument();
  });

  it('shows a bookkeeper Branches but not People', async () => {
    renderNavFor('bookkeeper');
    expect(await screen.findByRole('link', { name: 'Branches' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'People' })).not.toBeInTheDocument();
  });
});
