import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { makeApprovalRequest } from '@/features/proposals/testing/fixtures';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { ApprovalDetail } from './approval-detail';

function renderDetail(request = makeApprovalRequest(), isOwnRequest = false) {
  signInAs(makeUser('branch_manager'));
  fakeApi({});
  const onApprove = vi.fn(async () => undefined);
  const onRefuse = vi.fn(async () => undefined);
  renderApp(
    <ApprovalDetail
      request={request}
      isOwnRequest={isOwnRequest}
      pending={null}
      onApprove={onApprove}
      onRefuse={onRefuse}
    />,
  );
  return { onApprove, onRefuse };
}

describe('approval detail', () => {
  it('states the reasons in words against the submitter’s limits, and the figures per option', async () => {
    renderDetail();
    expect(await screen.findByText('Margin below the branch floor (38%)')).toBeInTheDocument();
    expect(screen.getByText('Discount beyond the salesperson’s authority (8%)')).toBeInTheDocument();
    const row = screen.getByRole('row', { name: /Stabilise the east wall/ });
    expect(row).toHaveTextContent('$1,650.00');
    expect(row).toHaveTextContent('15.00%');
    expect(row).toHaveTextContent('33.77%');
  });

  it('will not refuse without a note, and asks for confirmation before refusing', async () => {
    const { onRefuse } = renderDetail();
    await userEvent.click(await screen.findByRole('button', { name: 'Refuse' }));
    expect(onRefuse).not.toHaveBeenCalled();
    const note = screen.getByLabelText('Note');
    expect(note).toHaveAttribute('aria-invalid', 'true');
    expect(note).toHaveAccessibleDescription(/Say why you refuse it/);
    expect(screen.queryByText('Refuse this proposal?')).not.toBeInTheDocument();

    await userEvent.type(note, 'A 15% discount is too deep for a one-wall job.');
    expect(note).not.toHaveAttribute('aria-invalid');
    await userEvent.click(screen.getByRole('button', { name: 'Refuse' }));
    expect(await screen.findByText('Refuse this proposal?')).toBeInTheDocument();
    expect(onRefuse).not.toHaveBeenCalled();
    await userEvent.click(screen.getByRole('button', { name: 'Confirm refusal' }));
    await waitFor(() =>
      expect(onRefuse).toHaveBeenCalledWith('A 15% discount is too deep for a one-wall job.'),
    );
  });

  it('approves without a note', async () => {
    const { onApprove, onRefuse } = renderDetail();
    await userEvent.click(await screen.findByRole('button', { name: 'Approve' }));
    expect(onApprove).toHaveBeenCalledWith('');
    expect(onRefuse).not.toHaveBeenCalled();
  });

  it('says “Needs the owner” instead of offering buttons beyond the manager’s authority', async () => {
    renderDetail(makeApprovalRequest({ approver: 'owner', canDecide: false }));
    expect(await screen.findByText('Needs the owner')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Approve' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Refuse' })).not.toBeInTheDocument();
  });
});
