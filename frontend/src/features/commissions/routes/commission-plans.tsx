import '../commissions.css';
import { useState } from 'react';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Column } from 'primereact/column';
import { DataTable } from 'primereact/datatable';
import { Tag } from 'primereact/tag';
import type { CommissionPlanView } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { tableLayout } from '@/components/table-layout';
import { useMediaQuery, WIDE_TABLE } from '@/lib/use-media-query';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useCommissionPlans } from '../api/get-commission-plans';
import { useSaveCommissionPlan } from '../api/save-commission-plan';
import { formatDay, rateSummary } from '../commission-format';
import { PlanEditorDialog, type PlanEditorState } from '../components/plan-editor-dialog';

/** The owner's commission plans (the bookkeeper reads them). */
export default function CommissionPlansRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const wide = useMediaQuery(WIDE_TABLE);
  const { branches } = useCurrentBranch();
  const plans = useCommissionPlans();
  const save = useSaveCommissionPlan();
  const [editor, setEditor] = useState<PlanEditorState | null>(null);
  const canManage = ability.can('create', 'CommissionPlan');

  return (
    <div className="page commissions-page">
      <PageHeader
        title="Commission plans"
        description="What each contract pays its salespeople: a rate of the net price or of the gross margin, flat or in tiers. Part is earned once the deposit has cleared and the homeowner can no longer cancel, the rest when the job is completed."
        actions={
          canManage ? (
            <Button label="New plan" icon="pi pi-plus" onClick={() => setEditor({ plan: null })} />
          ) : null
        }
      />
      <Card className="content-card">
        {plans.isPending ? (
          <TableSkeleton label="Loading the commission plans" />
        ) : plans.isError ? (
          <ApiErrorMessage error={plans.error} />
        ) : plans.data.length === 0 ? (
          <EmptyState icon="pi-percentage" title="No commission plans yet">
            {canManage
              ? 'Add a company-wide default, and a plan for any branch that pays differently. Until then no commission is earned.'
              : 'The owner has not set up a plan yet: no commission is earned until then.'}
          </EmptyState>
        ) : (
          <DataTable
            value={plans.data}
            dataKey="id"
            size="small"
            pt={{ table: { 'aria-label': 'Commission plans' } }}
            {...tableLayout(wide)}
          >
            <Column header="Name" field="name" />
            <Column
              header="Applies to"
              body={(p: CommissionPlanView) => p.branchCode ?? 'Company-wide default'}
            />
            <Column header="Rate" body={(p: CommissionPlanView) => rateSummary(p.basis, p.rate)} />
            <Column header="At first milestone" body={(p: CommissionPlanView) => `${p.firstMilestonePct}%`} />
            <Column header="Starts" body={(p: CommissionPlanView) => formatDay(p.effectiveFrom)} />
            <Column
              header="Status"
              body={(p: CommissionPlanView) => (
                <span className="commission-tags">
                  {p.active ? (
                    <Tag value="Active" severity="success" />
                  ) : (
                    <Tag value="Inactive" severity="secondary" />
                  )}
                  {p.inUse ? <Tag value="In use" severity="info" /> : null}
                </span>
              )}
            />
            {canManage ? (
              <Column
                header="Actions"
                headerClassName="visually-hidden-header"
                body={(p: CommissionPlanView) => (
                  <Button
                    type="button"
                    label="Edit"
                    icon="pi pi-pencil"
                    text
                    size="small"
                    aria-label={`Edit ${p.name}`}
                    onClick={() => setEditor({ plan: p })}
                  />
                )}
              />
            ) : null}
          </DataTable>
        )}
      </Card>
      <PlanEditorDialog
        state={editor}
        branches={branches}
        pending={save.isPending}
        onClose={() => setEditor(null)}
        onSubmit={async (input, plan) => {
          const saved = await save.mutateAsync({ id: plan?.id ?? null, input });
          setEditor(null);
          notify.success(plan ? 'Plan saved' : 'Plan added', saved.name);
        }}
      />
    </div>
  );
}
