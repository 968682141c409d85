import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { LeadDetail } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeUser, renderApp, signInAs } from '@/testing/render';
import { TransferDialog } from './transfer-dialog';

// The dialog's opening animation sets pointer-events: none for a moment.
const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });
const visibleList = { hidden: true } as const;
const lead = {
  id: 'lead-9',
  branchId: BRANCH_IDS.mrw,
  branchCode: 'MRW',
  homeownerName: 'Ines Holloway',
  salespersonId: null,
} as LeadDetail;

const directory = [
  { id: BRANCH_IDS.ald, code: 'ALD', name: 'Alderbank' },
  { id: BRANCH_IDS.mrw, code: 'MRW', name: 'Marrowfield' },
  { id: '33333333-3333-4333-8333-333333333399', code: 'SNF', name: 'Saltney Ford' },
];

describe('transfer dialog', () => {
  it('offers every other branch of the company, from the directory, and moves the lead there', async () => {
    // A manager of one branch: GET /branches would list MRW alone.
    signInAs(makeUser('branch_manager'));
    const onDone = vi.fn();
    const { calls } = fakeApi({
      'GET /api/branches/directory': { body: directory },
      'POST /api/leads/lead-9/transfer': (req) => ({
        body: { ...lead, branchId: (req.body as { branchId: string }).branchId, branchCode: 'SNF' },
      }),
    });
    renderApp(<TransferDialog lead={lead} visible onClose={() => {}} onDone={onDone} />);

    const dialog = await screen.findByRole('dialog', { name: 'Transfer to another branch' });
    await waitFor(() =>
      expect(within(dialog).getByLabelText(/Move to branch/)).not.toHaveAttribute('disabled'),
    );
    await userEvent.click(within(dialog).getByLabelText(/Move to branch/));
    const list = within(await screen.findByRole('listbox', visibleList));
    expect(list.getAllByRole('option', visibleList).map((o) => o.textContent)).toEqual([
      'ALD · Alderbank',
      'SNF · Saltney Ford',
    ]);
    await userEvent.click(list.getByRole('option', { name: 'SNF · Saltney Ford', ...visibleList }));
    await userEvent.click(within(dialog).getByRole('button', { name: 'Move lead' }));

    await waitFor(() => expect(onDone).toHaveBeenCalled());
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      branchId: '33333333-3333-4333-8333-333333333399',
    });
  });

  it('says so when the company has no other branch', async () => {
    signInAs(makeUser('branch_manager'));
    fakeApi({ 'GET /api/branches/directory': { body: [directory[1]] } });
    renderApp(<TransferDialog lead={lead} visible onClose={() => {}} onDone={() => {}} />);
    expect(await screen.findByText(/MRW is the company’s only branch/)).toBeInTheDocument();
  });
});
