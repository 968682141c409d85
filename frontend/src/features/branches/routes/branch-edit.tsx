import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Message } from 'primereact/message';
import type { Branch, BranchInput } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { useAppAbility } from '@/features/auth/ability';
import { NotFound } from '@/app/routes/not-found';
import { useBranch } from '../api/get-branch';
import { useDeleteBranch } from '../api/delete-branch';
import { useUpdateBranch } from '../api/update-branch';
import { branchPatch, valuesFromBranch } from '../branch-form-values';
import { BranchForm } from '../components/branch-form';
import { DeleteBranchDialog } from '../components/delete-branch-dialog';

export default function BranchEditRoute() {
  const { branchId = '' } = useParams();
  const branch = useBranch(branchId);

  if (branch.isPending) return <PageLoading label="Loading branch" />;
  if (branch.isError) {
    if (isApiError(branch.error) && (branch.error.status === 404 || branch.error.status === 400))
      return <NotFound />;
    return (
      <div className="page">
        <ApiErrorMessage error={branch.error} />
      </div>
    );
  }
  // Keyed so that the form starts again from the saved values when another branch is opened.
  return <EditBranch key={branch.data.id} branch={branch.data} />;
}

function EditBranch({ branch }: { branch: Branch }) {
  const navigate = useNavigate();
  const notify = useNotify();
  const ability = useAppAbility();
  const update = useUpdateBranch();
  const remove = useDeleteBranch();
  const [confirming, setConfirming] = useState(false);

  const submit = async (input: BranchInput) => {
    const patch = branchPatch(branch, input);
    if (Object.keys(patch).length === 0) {
      notify.info('Nothing changed', `${branch.code} is as it was.`);
    } else {
      const saved = await update.mutateAsync({ id: branch.id, patch });
      notify.success('Branch saved', `${saved.code} · ${saved.name} is up to date.`);
    }
    await navigate(paths.branches.href());
  };

  const confirmDelete = () => {
    setConfirming(false);
    remove.mutate(branch.id, {
      onSuccess: async () => {
        notify.success('Branch deleted', `${branch.code} · ${branch.name} is gone.`);
        await navigate(paths.branches.href());
      },
    });
  };

  return (
    <div className="page page--narrow">
      <PageHeader
        title={`${branch.code} · ${branch.name}`}
        description={
          <>
            <Link to={paths.branches.href()} className="back-link">
              <i className="pi pi-arrow-left" aria-hidden="true" /> All branches
            </Link>
            <span className="muted"> · Fields marked * are required.</span>
          </>
        }
      />
      <Card className="content-card">
        <BranchForm
          initialValues={valuesFromBranch(branch)}
          onSubmit={submit}
          onCancel={() => void navigate(paths.branches.href())}
          pending={update.isPending}
        />
      </Card>

      {ability.can('delete', 'Branch') ? (
        <Card className="content-card danger-zone" title="Delete this branch">
          {remove.isError ? <ApiErrorMessage error={remove.error} className="form-message" /> : null}
          {branch.inUse ? (
            <Message
              severity="info"
              className="w-full"
              text={`${branch.code} cannot be deleted: ${
                branch.userCount === 1
                  ? '1 person belongs to it'
                  : branch.userCount > 1
                    ? `${branch.userCount} people belong to it`
                    : 'records refer to it'
              }. A branch that has been used stays, so its history stays whole.`}
            />
          ) : (
            <div className="danger-zone__row">
              <p>Nobody and nothing belongs to {branch.code} yet, so it can be deleted.</p>
              <Button
                type="button"
                label="Delete branch"
                icon="pi pi-trash"
                severity="danger"
                outlined
                loading={remove.isPending}
                onClick={() => setConfirming(true)}
              />
            </div>
          )}
        </Card>
      ) : null}
      <DeleteBranchDialog
        branch={confirming ? branch : null}
        onConfirm={confirmDelete}
        onClose={() => setConfirming(false)}
      />
    </div>
  );
}
