import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import { makeApprovalRequest } from '@/features/proposals/testing/fixtures';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { ApprovalsNavItem } from './approvals-nav-item';

describe('Approvals in the navigation', () => {
  it('shows a manager the number waiting', async () => {
    signInAs(makeUser('branch_manager'));
    fakeApi({
      'GET /api/approvals': { body: [makeApprovalRequest(), makeApprovalRequest({ id: 'req-2' })] },
    });
    renderApp(
      <ul>
        <ApprovalsNavItem />
      </ul>,
    );
    const link = await screen.findByRole('link', { name: 'Approvals' });
    expect(link).toHaveAttribute('href', '/approvals');
    expect(await screen.findByText('2')).toBeInTheDocument();
    expect(link).toHaveAccessibleDescription('2 waiting');
  });

  it('is not there for a salesperson, who never asks for the queue', () => {
    signInAs(makeUser('salesperson'));
    const { calls } = fakeApi({});
    renderApp(
      <ul>
        <ApprovalsNavItem />
      </ul>,
    );
    expect(screen.queryByRole('link', { name: 'Approvals' })).not.toBeInTheDocument();
    expect(calls.some((c) => c.path === '/api/approvals')).toBe(false);
  });
});
