import '../leads.css';
import { useCallback } from 'react';
import { useNavigate, useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import type { LeadStage } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useLeads } from '../api/get-leads';
import { useSalespeople } from '../api/get-salespeople';
import { PipelineFilters } from '../components/pipeline-filters';
import { PipelineTable } from '../components/pipeline-table';
import { StageStrip } from '../components/stage-strip';
import { TransferredOut } from '../components/transferred-out';
import { STALE_AFTER_DAYS } from '../lead-format';
import {
  DEFAULT_VIEW,
  isFiltered,
  paramsFromView,
  toQuery,
  viewFromParams,
  type PipelineView,
} from '../pipeline-query';

export default function PipelineRoute() {
  const ability = useAppAbility();
  const user = useCurrentUser();
  const navigate = useNavigate();
  const { branchId, branch, showSwitcher } = useCurrentBranch();
  const [params, setParams] = useSearchParams();
  const view = viewFromParams(params);
  const leads = useLeads(toQuery(view, branchId));

  // Managers and the owner look across salespeople; a salesperson's list is their own.
  const choosesSalesperson = user.role === 'owner' || user.role === 'branch_manager';
  const salespeople = useSalespeople(branchId, { enabled: choosesSalesperson });

  const setView = useCallback(
    (patch: Partial<PipelineView>) => {
      setParams(
        (current) => {
          const now = viewFromParams(current);
          // Any change of filter starts again at the first page.
          const resetsPage = !('page' in patch);
          return paramsFromView({ ...now, ...patch, ...(resetsPage ? { page: 1 } : {}) });
        },
        { replace: true },
      );
    },
    [setParams],
  );

  const toggleStage = (stage: LeadStage) =>
    setView({
      stages: view.stages.includes(stage) ? view.stages.filter((s) => s !== stage) : [...view.stages, stage],
    });
  const clearFilters = () =>
    setParams(
      paramsFromView({ ...DEFAULT_VIEW, sort: view.sort, order: view.order, pageSize: view.pageSize }),
      {
        replace: true,
      },
    );

  const canCreate = ability.can('create', 'Lead');
  const filtered = isFiltered(view);

  return (
    <div className="page page--wide">
      <PageHeader
        title="Leads"
        description={
          <>
            Every homeowner from first call to paid in full. Leads with no move in over {STALE_AFTER_DAYS}{' '}
            days are marked.{' '}
            <span className="scope-note">
              {user.role === 'salesperson'
                ? 'Your leads.'
                : branch
                  ? `Showing ${branch.code} · ${branch.name}.`
                  : 'Showing all branches.'}
            </span>
          </>
        }
        actions={
          canCreate ? (
            <Button
              type="button"
              label="New lead"
              icon="pi pi-plus"
              onClick={() => void navigate(paths.newLead.href())}
            />
          ) : null
        }
      />

      <StageStrip
        stages={leads.data?.stages}
        selected={view.stages}
        onToggle={toggleStage}
        onClear={() => setView({ stages: [] })}
      />

      <Card className="content-card">
        <PipelineFilters
          view={view}
          onChange={setView}
          onClear={clearFilters}
          salespeople={choosesSalesperson ? (salespeople.data ?? []) : null}
          salespeopleLoading={salespeople.isFetching}
        />
        {leads.isPending ? (
          <TableSkeleton label="Loading leads" rows={8} />
        ) : leads.isError ? (
          <ApiErrorMessage error={leads.error} />
        ) : leads.data.total === 0 ? (
          filtered ? (
            <EmptyState icon="pi-filter-slash" title="No leads match these filters">
              <Button type="button" label="Clear filters" text onClick={clearFilters} />
            </EmptyState>
          ) : (
            <EmptyState icon="pi-map-marker" title="No leads yet">
              {canCreate
                ? 'When a homeowner calls about cracks, sticking doors or a sloping floor, enter them with New lead.'
                : 'Leads entered by the sales team will show here.'}
            </EmptyState>
          )
        ) : (
          <PipelineTable
            leads={leads.data.items}
            total={leads.data.total}
            page={view.page}
            pageSize={view.pageSize}
            sort={view.sort}
            order={view.order}
            loading={leads.isPlaceholderData && leads.isFetching}
            showBranch={branchId === null && showSwitcher}
            showSalesperson={user.role !== 'salesperson'}
            onPage={(page, pageSize) => setView({ page, pageSize })}
            onSort={(sort, order) => setView({ sort, order })}
          />
        )}
        {user.role === 'branch_manager' ? <TransferredOut branchCode={branch?.code ?? null} /> : null}
      </Card>
    </div>
  );
}
