import { useNavigate } from 'react-router';
import { Card } from 'primereact/card';
import type { BranchInput } from '@loambook/common';
import { paths } from '@/app/paths';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { useCreateBranch } from '../api/create-branch';
import { EMPTY_BRANCH } from '../branch-form-values';
import { BranchForm } from '../components/branch-form';

export default function BranchNewRoute() {
  const navigate = useNavigate();
  const notify = useNotify();
  const create = useCreateBranch();

  const submit = async (input: BranchInput) => {
    const branch = await create.mutateAsync(input);
    notify.success('Branch added', `${branch.code} · ${branch.name} is ready.`);
    await navigate(paths.branches.href());
  };

  return (
    <div className="page page--narrow">
      <PageHeader title="New branch" description="Fields marked * are required." />
      <Card className="content-card">
        <BranchForm
          initialValues={EMPTY_BRANCH}
          onSubmit={submit}
          onCancel={() => void navigate(paths.branches.href())}
          pending={create.isPending}
        />
      </Card>
    </div>
  );
}
