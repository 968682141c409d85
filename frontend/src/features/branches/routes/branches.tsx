import { useState } from 'react';
import { useNavigate } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import type { Branch } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { useAppAbility } from '@/features/auth/ability';
import { useBranches } from '../api/get-branches';
import { useDeleteBranch } from '../api/delete-branch';
import { BranchesTable } from '../components/branches-table';
import { DeleteBranchDialog } from '../components/delete-branch-dialog';

export default function BranchesRoute() {
  const ability = useAppAbility();
  const navigate = useNavigate();
  const notify = useNotify();
  const branches = useBranches();
  const deleteBranch = useDeleteBranch();
  const [toDelete, setToDelete] = useState<Branch | null>(null);

  const canCreate = ability.can('create', 'Branch');
  const canEdit = ability.can('update', 'Branch');
  const canDelete = ability.can('delete', 'Branch');

  const confirmDelete = (branch: Branch) => {
    setToDelete(null);
    deleteBranch.mutate(branch.id, {
      onSuccess: () => notify.success('Branch deleted', `${branch.code} · ${branch.name} is gone.`),
      onError: (error) =>
        notify.error(
          `${branch.code} was not deleted`,
          isApiError(error) ? error.message : 'Try again in a moment.',
        ),
    });
  };

  const newBranchButton = canCreate ? (
    <Button
      type="button"
      label="New branch"
      icon="pi pi-plus"
      onClick={() => void navigate(paths.newBranch.href())}
    />
  ) : null;

  return (
    <div className="page">
      <PageHeader
        title="Branches"
        description={
          canEdit
            ? 'Each branch’s address, time zone, pricing guardrails and sales-tax set-up.'
            : 'The branches you work with and their settings. Only an owner can change them.'
        }
        actions={newBranchButton}
      />
      <Card className="content-card">
        {branches.isPending ? (
          <TableSkeleton label="Loading branches" />
        ) : branches.isError ? (
          <ApiErrorMessage error={branches.error} />
        ) : branches.data.length === 0 ? (
          <EmptyState icon="pi-building" title="No branches yet">
            {canCreate
              ? 'Add the first branch to set its address, time zone, margin floor and discount limits.'
              : 'You are not assigned to a branch yet. Ask an owner to add you to one.'}
          </EmptyState>
        ) : (
          <BranchesTable
            branches={branches.data}
            canEdit={canEdit}
            canDelete={canDelete}
            onDelete={setToDelete}
          />
        )}
        {canDelete && branches.data?.some((b) => b.inUse) ? (
          <p className="table-footnote">
            A branch that people or records belong to cannot be deleted; it stays for the history. Open it to
            see why.
          </p>
        ) : null}
      </Card>
      <DeleteBranchDialog branch={toDelete} onConfirm={confirmDelete} onClose={() => setToDelete(null)} />
    </div>
  );
}
