import '../leads.css';
import { useNavigate } from 'react-router';
import { Card } from 'primereact/card';
import { paths } from '@/app/paths';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useCreateLead } from '../api/create-lead';
import { LeadForm } from '../components/lead-form';
import { EMPTY_LEAD, toLeadInput, type LeadFormValues } from '../lead-form-values';

export default function LeadNewRoute() {
  const navigate = useNavigate();
  const notify = useNotify();
  const user = useCurrentUser();
  const { branchId, branches } = useCurrentBranch();
  const create = useCreateLead();
  const chooseSalesperson = user.role !== 'salesperson';

  const defaultBranch = branchId ?? (branches.length === 1 ? branches[0]!.id : '');
  const initial: LeadFormValues = {
    ...EMPTY_LEAD,
    branchId: defaultBranch,
    // Most houses are in the branch's own state.
    state: branches.find((b) => b.id === defaultBranch)?.state ?? '',
    salespersonId: user.role === 'salesperson' ? user.id : '',
  };

  const submit = async (values: LeadFormValues) => {
    const { lead, possibleDuplicates } = await create.mutateAsync(
      toLeadInput(values, { sendSalesperson: chooseSalesperson }),
    );
    const similar = possibleDuplicates.matches.length + possibleDuplicates.otherBranchMatches;
    notify.success(
      'Lead saved',
      similar
        ? `${lead.homeownerName} is in the pipeline. ${similar === 1 ? '1 similar lead was' : `${similar} similar leads were`} noted on the timeline.`
        : `${lead.homeownerName} is in the pipeline.`,
    );
    await navigate(paths.lead.href(lead.id));
  };

  return (
    <div className="page page--narrow">
      <PageHeader
        title="New lead"
        description="Fields marked * are required. A phone or an e-mail is needed."
      />
      <Card className="content-card">
        {/* Started again once the branches have loaded, so the branch default is the right one. */}
        <LeadForm
          key={branches.length ? 'ready' : 'loading'}
          initialValues={initial}
          onSubmit={submit}
          onCancel={() => void navigate(paths.leads.href())}
          pending={create.isPending}
          submitLabel="Save lead"
          mode="create"
          branches={branches}
          chooseSalesperson={chooseSalesperson}
        />
      </Card>
    </div>
  );
}
