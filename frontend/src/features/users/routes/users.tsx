import { useState } from 'react';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import type { UserSummary } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { useAppAbility } from '@/features/auth/ability';
import { useBranches } from '@/features/branches/api/get-branches';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useResendInvitation } from '../api/resend-invitation';
import { useUpdateUser } from '../api/update-user';
import { useUsers } from '../api/get-users';
import { DeactivateUserDialog } from '../components/deactivate-user-dialog';
import { EditUserDialog } from '../components/edit-user-dialog';
import { InviteUserDialog } from '../components/invite-user-dialog';
import { UsersTable } from '../components/users-table';

const why = (error: unknown) => (isApiError(error) ? error.message : 'Try again in a moment.');

export default function UsersRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const { branchId, branch } = useCurrentBranch();
  const users = useUsers({ branchId });
  const branches = useBranches();
  const update = useUpdateUser();
  const resend = useResendInvitation();

  const [inviting, setInviting] = useState(false);
  const [editing, setEditing] = useState<UserSummary | null>(null);
  const [deactivating, setDeactivating] = useState<UserSummary | null>(null);
  const [busyId, setBusyId] = useState<string | null>(null);

  const canInvite = ability.can('create', 'User');
  const branchList = branches.data ?? [];

  const deactivate = (user: UserSummary) => {
    setDeactivating(null);
    setBusyId(user.id);
    update.mutate(
      { id: user.id, patch: { active: false } },
      {
        onSuccess: () => notify.success(`${user.name} is deactivated`, 'They have been signed out.'),
        onError: (error) => notify.error(`${user.name} is still active`, why(error)),
        onSettled: () => setBusyId(null),
      },
    );
  };

  const reactivate = (user: UserSummary) => {
    setBusyId(user.id);
    update.mutate(
      { id: user.id, patch: { active: true } },
      {
        onSuccess: (u) =>
          notify.success(
            `${u.name} is active again`,
            u.invitationPending
              ? 'Send a new invitation so they can set a password.'
              : 'They can sign in again.',
          ),
        onError: (error) => notify.error(`${user.name} is still deactivated`, why(error)),
        onSettled: () => setBusyId(null),
      },
    );
  };

  const resendInvitation = (user: UserSummary) => {
    setBusyId(user.id);
    resend.mutate(user.id, {
      onSuccess: () => notify.success('Invitation sent', `A new link is on its way to ${user.email}.`),
      onError: (error) => notify.error('The invitation was not sent', why(error)),
      onSettled: () => setBusyId(null),
    });
  };

  return (
    <div className="page">
      <PageHeader
        title="People"
        description={
          <>
            {ability.can('manage', 'all')
              ? 'Everyone with a Loambook account, their roles and branches.'
              : 'The people in your branches. You can invite and change salespeople and crew leads.'}{' '}
            <span className="scope-note">
              {branch ? `Showing ${branch.code} · ${branch.name}.` : 'Showing all branches.'}
            </span>
          </>
        }
        actions={
          canInvite ? (
            <Button
              type="button"
              label="Invite person"
              icon="pi pi-user-plus"
              onClick={() => setInviting(true)}
            />
          ) : null
        }
      />
      <Card className="content-card">
        {users.isPending ? (
          <TableSkeleton label="Loading people" />
        ) : users.isError ? (
          <ApiErrorMessage error={users.error} />
        ) : users.data.length === 0 ? (
          <EmptyState
            icon="pi-users"
            title={branch ? `Nobody works from ${branch.code} yet` : 'Nobody here yet'}
          >
            {canInvite ? 'Invite the first person: they get an e-mail to set a password.' : null}
          </EmptyState>
        ) : (
          <UsersTable
            users={users.data}
            branches={branchList}
            actions={{
              onEdit: setEditing,
              onDeactivate: setDeactivating,
              onReactivate: reactivate,
              onResend: resendInvitation,
              busyId,
            }}
          />
        )}
      </Card>

      <InviteUserDialog
        visible={inviting}
        onClose={() => setInviting(false)}
        onInvited={(user) => {
          setInviting(false);
          notify.success(
            'Invitation sent',
            `${user.name} will get an e-mail at ${user.email} to set a password.`,
          );
        }}
        branches={branchList}
        branchesLoading={branches.isPending}
        defaultBranchIds={branchId ? [branchId] : []}
      />
      <EditUserDialog
        user={editing}
        onClose={() => setEditing(null)}
        onSaved={(user) => {
          setEditing(null);
          notify.success('Changes saved', `${user.name} is up to date.`);
        }}
        branches={branchList}
        branchesLoading={branches.isPending}
      />
      <DeactivateUserDialog
        user={deactivating}
        onConfirm={deactivate}
        onClose={() => setDeactivating(null)}
      />
    </div>
  );
}
