import { describe, expect, it, vi } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ApiError } from '@/lib/api-client';
import { makeBranch } from '@/testing/render';
import { valuesFromBranch } from '../branch-form-values';
import { BranchForm } from './branch-form';

function renderForm(onSubmit = vi.fn(async () => undefined)) {
  render(
    <BranchForm
      initialValues={valuesFromBranch(makeBranch())}
      onSubmit={onSubmit}
      onCancel={() => undefined}
      pending={false}
    />,
  );
  return onSubmit;
}

describe('branch form', () => {
  it('does not submit a percentage the server would refuse, and says why at the field', async () => {
    const onSubmit = renderForm();
    const margin = screen.getByLabelText('Margin floor %');
    await userEvent.clear(margin);
    await userEvent.type(margin, '12.345');
    await userEvent.click(screen.getByRole('button', { name: 'Save branch' }));
    expect(onSubmit).not.toHaveBeenCalled();
    expect(margin).toHaveAttribute('aria-invalid', 'true');
    expect(margin).toHaveAccessibleDescription(/Enter a percentage from 0 to 100 with at most two decimals/);

    // Fixing it lets the form through, with the value exactly as typed (a string, never a number).
    await userEvent.clear(margin);
    await userEvent.type(margin, '36.5');
    await userEvent.click(screen.getByRole('button', { name: 'Save branch' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]).toEqual([expect.objectContaining({ marginFloorPct: '36.5' })]);
  });

  it('refuses a manager limit below the salesperson’s', async () => {
    const onSubmit = renderForm();
    const manager = screen.getByLabelText('Manager discount limit %');
    await userEvent.clear(manager);
    await userEvent.type(manager, '5');
    await userEvent.click(screen.getByRole('button', { name: 'Save branch' }));
    expect(onSubmit).not.toHaveBeenCalled();
    expect(manager).toHaveAccessibleDescription(/cannot be below the salesperson/);
  });

  it('puts the server’s field errors on the fields, nested ones included', async () => {
    const onSubmit = vi.fn(async () => {
      throw new ApiError(409, {
        code: 'BRANCH.CODE_TAKEN',
        message: 'Another branch already uses this code.',
        details: [
          { field: 'code', message: 'Another branch already uses this code.' },
          { field: 'discountAuthority.salesperson', message: 'Too generous for this branch.' },
        ],
      });
    });
    renderForm(onSubmit);
    await userEvent.click(screen.getByRole('button', { name: 'Save branch' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));

    const code = screen.getByLabelText('Code');
    expect(code).toHaveAttribute('aria-invalid', 'true');
    expect(code).toHaveAccessibleDescription(/Another branch already uses this code\./);
    expect(screen.getByLabelText('Salesperson discount limit %')).toHaveAccessibleDescription(
      /Too generous for this branch\./,
    );
    expect(screen.getByLabelText('Name')).not.toHaveAttribute('aria-invalid');

    // Editing the field clears the server's complaint about it.
    await userEvent.type(code, 'X');
    expect(code).not.toHaveAttribute('aria-invalid');
  });

  it('uses dropdowns named by their labels for state, time zone and sales tax', () => {
    renderForm();
    expect(screen.getByLabelText('State')).toHaveAttribute('aria-haspopup', 'listbox');
    expect(screen.getByLabelText('Time zone')).toHaveAttribute('aria-haspopup', 'listbox');
    expect(screen.getByLabelText('Sales tax')).toHaveAttribute('aria-haspopup', 'listbox');
  });
});
