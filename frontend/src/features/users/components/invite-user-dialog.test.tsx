import { describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import type { Role } from '@loambook/common';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { InviteUserDialog } from './invite-user-dialog';

// PrimeReact's own style makes the labelled input of a dropdown `pointer-events: none`; app.css (not loaded
// in tests) stretches it over the control so clicks land on it. Skip user-event's check for that reason.
const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

function renderDialogFor(role: Role, onInvited = vi.fn()) {
  const user = makeUser(role);
  signInAs(user);
  renderApp(
    <InviteUserDialog
      visible
      onClose={() => undefined}
      onInvited={onInvited}
      branches={[makeBranch()]}
      defaultBranchIds={[]}
    />,
  );
  return onInvited;
}

// In jsdom PrimeReact's overlay positioning leaves the open list `display: none` (it cannot measure
// anything), so the list is looked up with `hidden: true`; in a browser it shows (see the e2e journeys).
const visibleList = { hidden: true } as const;

async function roleOptions(): Promise<string[]> {
  await userEvent.click(await screen.findByLabelText('Role'));
  const list = await screen.findByRole('listbox', visibleList);
  return within(list)
    .getAllByRole('option', visibleList)
    .map((o) => o.textContent ?? '');
}

describe('invite dialog', () => {
  it('offers a branch manager only the roles they may invite', async () => {
    fakeApi({});
    renderDialogFor('branch_manager');
    expect(await roleOptions()).toEqual(['Salesperson', 'Crew lead']);
  });

  it('offers the owner every role', async () => {
    fakeApi({});
    renderDialogFor('owner');
    expect(await roleOptions()).toEqual([
      'Owner',
      'Branch manager',
      'Salesperson',
      'Bookkeeper',
      'Crew lead',
    ]);
  });

  it('checks the fields first, then shows the server’s e-mail error on the e-mail field', async () => {
    const { calls } = fakeApi({
      'POST /api/users': {
        status: 409,
        body: errorBody('USER.EMAIL_TAKEN', 'Someone already has an account with this e-mail.', [
          { field: 'email', message: 'Someone already has an account with this e-mail.' },
        ]),
      },
    });
    const onInvited = renderDialogFor('branch_manager');
    await userEvent.click(await screen.findByRole('button', { name: 'Send invitation' }));
    expect(screen.getByText('Enter the person’s name.')).toBeInTheDocument();
    expect(screen.getByText('Choose a role.')).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await userEvent.type(screen.getByLabelText('Name'), 'Dana Okafor');
    await userEvent.type(screen.getByLabelText('E-mail'), 'dana@example.test');
    await userEvent.click(screen.getByLabelText('Role'));
    await userEvent.click(await screen.findByRole('option', { name: 'Crew lead', ...visibleList }));
    await userEvent.click(screen.getByRole('button', { name: 'Send invitation' }));

    await waitFor(() => expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true'));
    expect(screen.getByLabelText('E-mail')).toHaveAccessibleDescription(
      /Someone already has an account with this e-mail\./,
    );
    // The manager's one branch was ticked for them.
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      name: 'Dana Okafor',
      email: 'dana@example.test',
      role: 'crew_lead',
      branchIds: [BRANCH_IDS.mrw],
    });
    expect(onInvited).not.toHaveBeenCalled();
  });
});
