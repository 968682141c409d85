import { useEffect, useRef, useState } from 'react';
import { Card } from 'primereact/card';
import { TabPanel, TabView } from 'primereact/tabview';
import type { ApprovalRequestStatus, ApprovalRequestView } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { isApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { useApproveRequest } from '../api/approve-request';
import { useApprovals } from '../api/get-approvals';
import { useRefuseRequest } from '../api/refuse-request';
import { ApprovalDetail } from '../components/approval-detail';
import { ApprovalList } from '../components/approval-list';
import '../approvals.css';

const TABS: { status: ApprovalRequestStatus; label: string; empty: string }[] = [
  { status: 'pending', label: 'Waiting', empty: 'Nothing is waiting for a decision.' },
  { status: 'approved', label: 'Approved', empty: 'No approved requests yet.' },
  { status: 'refused', label: 'Refused', empty: 'No refused requests.' },
  { status: 'withdrawn', label: 'Withdrawn', empty: 'No withdrawn requests.' },
];

export default function ApprovalsRoute() {
  const [tab, setTab] = useState(0);
  const { branchId } = useCurrentBranch();
  const pending = useApprovals('pending');
  // As the list below: the branch chosen in the switcher, or every branch.
  const pendingCount = (pending.data ?? []).filter((r) => !branchId || r.branchId === branchId).length;
  return (
    <div className="page approvals-page">
      <PageHeader
        title="Approvals"
        description="Proposals below a branch’s margin floor, or with a discount beyond the salesperson’s authority, wait here before they can go to the homeowner."
      />
      <TabView activeIndex={tab} onTabChange={(e) => setTab(e.index)} className="approvals-tabs" scrollable>
        {TABS.map((t) => (
          <TabPanel
            key={t.status}
            header={t.status === 'pending' && pendingCount ? `${t.label} (${pendingCount})` : t.label}
          >
            <ApprovalsPanel status={t.status} empty={t.empty} />
          </TabPanel>
        ))}
      </TabView>
    </div>
  );
}

function ApprovalsPanel({ status, empty }: { status: ApprovalRequestStatus; empty: string }) {
  const user = useCurrentUser();
  const notify = useNotify();
  const { branchId, branch } = useCurrentBranch();
  const list = useApprovals(status);
  const approve = useApproveRequest();
  const refuse = useRefuseRequest();
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const detailRef = useRef<HTMLDivElement>(null);

  const requests = (list.data ?? []).filter((r) => !branchId || r.branchId === branchId);
  const selected = requests.find((r) => r.id === selectedId) ?? requests[0] ?? null;

  // On a phone the detail sits below the list: bring it into view when a request is picked.
  const [picked, setPicked] = useState(0);
  useEffect(() => {
    if (picked && window.matchMedia?.('(max-width: 960px)').matches)
      detailRef.current?.scrollIntoView?.({ block: 'start' });
  }, [picked]);

  const decide = async (kind: 'approve' | 'refuse', request: ApprovalRequestView, note: string) => {
    try {
      if (kind === 'approve') await approve.mutateAsync({ id: request.id, note });
      else await refuse.mutateAsync({ id: request.id, note });
      notify.success(
        kind === 'approve' ? 'Approved' : 'Refused',
        kind === 'approve'
          ? `${request.requestedBy.name} can now send it to ${request.homeownerName}.`
          : `${request.requestedBy.name} gets it back with your note.`,
      );
      setSelectedId(null);
    } catch (error) {
      notify.error(
        kind === 'approve' ? 'Not approved' : 'Not refused',
        isApiError(error) ? error.message : 'Try again in a moment.',
      );
      if (isApiError(error) && error.code === 'APPROVAL.ALREADY_DECIDED') await list.refetch();
    }
  };

  if (list.isPending) return <TableSkeleton rows={4} label="Loading requests" />;
  if (list.isError) return <ApiErrorMessage error={list.error} />;
  if (requests.length === 0) {
    return (
      <Card className="content-card">
        <EmptyState icon="pi-check-square" title={empty}>
          {branch ? `Showing ${branch.code} only: choose “All branches” to see the others.` : null}
        </EmptyState>
      </Card>
    );
  }

  return (
    <div className="approvals-layout">
      <div className="approvals-layout__list">
        <ApprovalList
          requests={requests}
          selectedId={selected?.id ?? null}
          onSelect={(r) => {
            setSelectedId(r.id);
            setPicked((n) => n + 1);
          }}
        />
      </div>
      <div className="approvals-layout__detail" ref={detailRef}>
        {selected ? (
          <Card className="content-card">
            <ApprovalDetail
              key={selected.id}
              request={selected}
              isOwnRequest={selected.requestedBy.id === user.id}
              pending={approve.isPending ? 'approve' : refuse.isPending ? 'refuse' : null}
              onApprove={(note) => decide('approve', selected, note)}
              onRefuse={(note) => decide('refuse', selected, note)}
            />
          </Card>
        ) : null}
      </div>
    </div>
  );
}
