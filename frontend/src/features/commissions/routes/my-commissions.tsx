import '../commissions.css';
import { Card } from 'primereact/card';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useStatements } from '../api/get-statements';
import { StatementsTable } from '../components/statements-table';

/** A salesperson's own statements, read only. */
export default function MyCommissionsRoute() {
  const user = useCurrentUser();
  const statements = useStatements({ branchId: null, salespersonId: user.id, period: '', status: null });
  return (
    <div className="page commissions-page">
      <PageHeader
        title="My commissions"
        description="Part of each commission is earned once the homeowner’s deposit has cleared and the three-day cancellation window has closed; the rest when the job is completed. If a contract is cancelled or refunded afterwards, what was earned comes off your next statement."
      />
      <Card className="content-card">
        {statements.isPending ? (
          <TableSkeleton label="Loading your statements" />
        ) : statements.isError ? (
          <ApiErrorMessage error={statements.error} />
        ) : statements.data.length === 0 ? (
          <EmptyState icon="pi-wallet" title="No statements yet">
            Statements appear twice a month once the bookkeeper builds them.
          </EmptyState>
        ) : (
          <StatementsTable
            statements={statements.data}
            showSalesperson={false}
            showBranch={new Set(statements.data.map((s) => s.branchId)).size > 1}
          />
        )}
      </Card>
    </div>
  );
}
