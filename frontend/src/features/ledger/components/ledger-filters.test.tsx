import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { LedgerFilters } from './ledger-filters';

const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;

function show(props: Partial<Parameters<typeof LedgerFilters>[0]> = {}) {
  signInAs(makeUser('bookkeeper'));
  fakeApi({});
  const onRange = vi.fn();
  const onReason = vi.fn();
  const onBranch = vi.fn();
  const onClear = vi.fn();
  renderApp(
    <LedgerFilters
      idPrefix="t"
      branch={{
        branchId: null,
        branches: [makeBranch(), makeBranch({ id: BRANCH_IDS.ald, code: 'ALD', name: 'Alderbank' })],
        allowAll: true,
        onChange: onBranch,
      }}
      range={{ from: '', to: '' }}
      onRange={onRange}
      reasonCode=""
      onReason={onReason}
      onClear={onClear}
      {...props}
    />,
  );
  return { onRange, onReason, onBranch, onClear };
}

describe('ledger filters', () => {
  it('applies a date range once it makes sense, and shows an end before the start on the field', async () => {
    const { onRange } = show();
    fireEvent.change(screen.getByLabelText('From'), { target: { value: '2026-12-10' } });
    expect(onRange).toHaveBeenLastCalledWith({ from: '2026-12-10', to: '' });
    fireEvent.change(screen.getByLabelText('To'), { target: { value: '2026-12-01' } });
    expect(onRange).toHaveBeenCalledTimes(1);
    expect(screen.getByLabelText('To')).toHaveAccessibleDescription(
      /The end date is before the start date\./,
    );
    expect(screen.getByLabelText('To')).toHaveAttribute('aria-invalid', 'true');
    fireEvent.change(screen.getByLabelText('To'), { target: { value: '2026-12-31' } });
    expect(onRange).toHaveBeenLastCalledWith({ from: '2026-12-10', to: '2026-12-31' });
    expect(screen.getByLabelText('To')).not.toHaveAttribute('aria-invalid');
  });

  it('chooses a reason and a branch, "All branches" included for those who may see every branch', async () => {
    const { onReason, onBranch } = show();
    await userEvent.click(screen.getByLabelText('Reason'));
    await userEvent.click(
      await screen.findByRole('option', { name: 'Processor payout to the bank', ...visibleList }),
    );
    expect(onReason).toHaveBeenCalledWith('processor.payout');
    await userEvent.click(screen.getByLabelText('Branch'));
    const list = within(await screen.findByRole('listbox', visibleList));
    expect(list.getByRole('option', { name: 'All branches', ...visibleList })).toBeInTheDocument();
    await userEvent.click(list.getByRole('option', { name: 'ALD · Alderbank', ...visibleList }));
    expect(onBranch).toHaveBeenCalledWith(BRANCH_IDS.ald);
  });

  it('offers no "All branches" where one branch must be chosen, and clears what is set', async () => {
    const { onClear } = show({
      branch: { branchId: BRANCH_IDS.mrw, branches: [makeBranch()], allowAll: false, onChange: vi.fn() },
      reasonCode: 'deposit.card',
    });
    await userEvent.click(screen.getByLabelText('Branch'));
    const list = within(await screen.findByRole('listbox', visibleList));
    expect(list.getAllByRole('option', visibleList).map((o) => o.getAttribute('aria-label'))).toEqual([
      'MRW · Marrowfield',
    ]);
    await userEvent.keyboard('{Escape}');
    await userEvent.click(screen.getByRole('button', { name: 'Clear filters' }));
    expect(onClear).toHaveBeenCalled();
  });
});
