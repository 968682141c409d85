import { lazy, Suspense } from 'react';
import type { ReactNode } from 'react';
import { createBrowserRouter, type RouteObject } from 'react-router';
import type { AppAbility } from '@loambook/common';
import { PageLoading } from '@/components/loading';
import { adminAccess } from '@/features/auth/ability';
import { RequireAccess } from '@/features/auth/components/require-access';
import { RequireAuth } from '@/features/auth/components/require-auth';
import { AppLayout } from './layout/app-layout';
import { paths } from './paths';
import { RouteError } from './routes/route-error';

// One chunk per screen: the sign-in page does not carry the admin tables.
const SignInRoute = lazy(() => import('@/features/auth/routes/sign-in'));
const SetPasswordRoute = lazy(() => import('@/features/auth/routes/set-password'));
const HomeRoute = lazy(() => import('@/features/home/routes/home'));
const BranchesRoute = lazy(() => import('@/features/branches/routes/branches'));
const BranchNewRoute = lazy(() => import('@/features/branches/routes/branch-new'));
const BranchEditRoute = lazy(() => import('@/features/branches/routes/branch-edit'));
const UsersRoute = lazy(() => import('@/features/users/routes/users'));
const PipelineRoute = lazy(() => import('@/features/leads/routes/pipeline'));
const LeadNewRoute = lazy(() => import('@/features/leads/routes/lead-new'));
const LeadRoute = lazy(() => import('@/features/leads/routes/lead'));
const InspectionRoute = lazy(() => import('@/features/inspections/routes/inspection'));
const PriceBookRoute = lazy(() => import('@/features/price-book/routes/price-book'));
const ProposalNewRoute = lazy(() => import('@/features/proposals/routes/proposal-new'));
const ProposalRoute = lazy(() => import('@/features/proposals/routes/proposal'));
const ApprovalsRoute = lazy(() => import('@/features/approvals/routes/approvals'));
const SignRoute = lazy(() => import('@/features/signing/routes/sign'));
const JobsRoute = lazy(() => import('@/features/jobs/routes/jobs'));
const JobCalendarRoute = lazy(() => import('@/features/jobs/routes/job-calendar'));
const JobRoute = lazy(() => import('@/features/jobs/routes/job'));
const JobFieldRoute = lazy(() => import('@/features/jobs/routes/job-field'));
const JobCompleteRoute = lazy(() => import('@/features/jobs/routes/job-complete'));
const JobSheetRoute = lazy(() => import('@/features/jobs/routes/job-sheet'));
const JobActualsSummaryRoute = lazy(() => import('@/features/jobs/routes/actuals-summary'));
const TodayRoute = lazy(() => import('@/features/jobs/routes/today'));
const CrewsRoute = lazy(() => import('@/features/jobs/routes/crews'));
const JournalRoute = lazy(() => import('@/features/ledger/routes/journal'));
const AccountLedgerRoute = lazy(() => import('@/features/ledger/routes/account-ledger'));
const TrialBalanceRoute = lazy(() => import('@/features/ledger/routes/trial-balance'));
const ReconciliationRoute = lazy(() => import('@/features/reconciliation/routes/reconciliation'));
const BankAccountsRoute = lazy(() => import('@/features/reconciliation/routes/bank-accounts'));
const UploadStatementRoute = lazy(() => import('@/features/reconciliation/routes/upload-statement'));
const PayoutBreakdownRoute = lazy(() => import('@/features/reconciliation/routes/payout-breakdown'));
const CommissionPlansRoute = lazy(() => import('@/features/commissions/routes/commission-plans'));
const CommissionStatementsRoute = lazy(() => import('@/features/commissions/routes/commission-statements'));
const CommissionStatementRoute = lazy(() => import('@/features/commissions/routes/commission-statement'));
const MyCommissionsRoute = lazy(() => import('@/features/commissions/routes/my-commissions'));
const PaymentsListRoute = lazy(() => import('@/features/payments/routes/payments-list'));
const PaymentThankYouRoute = lazy(() => import('@/features/payments/routes/payment-thank-you'));
const PaymentCancelledRoute = lazy(() => import('@/features/payments/routes/payment-cancelled'));
const NotFoundRoute = lazy(() => import('./routes/not-found'));

const publicPage = (page: ReactNode) => <Suspense fallback={<PageLoading />}>{page}</Suspense>;
const guarded = (allow: (ability: AppAbility) => boolean, page: ReactNode) => (
  <RequireAccess allow={allow}>{page}</RequireAccess>
);

/** Every screen, in one place. Patterns come from `paths`; links use `paths.x.href()`. */
export const routes: RouteObject[] = [
  {
    errorElement: <RouteError />,
    children: [
      { path: paths.signIn.pattern, element: publicPage(<SignInRoute />) },
      { path: paths.setPassword.pattern, element: publicPage(<SetPasswordRoute />) },
      { path: paths.sign.pattern, element: publicPage(<SignRoute />) },
      { path: paths.paymentThankYou.pattern, element: publicPage(<PaymentThankYouRoute />) },
      { path: paths.paymentCancelled.pattern, element: publicPage(<PaymentCancelledRoute />) },
      {
        element: (
          <RequireAuth>
            <AppLayout />
          </RequireAuth>
        ),
        children: [
          { index: true, element: <HomeRoute /> },
          {
            path: paths.branches.pattern,
            element: guarded((a) => adminAccess(a).branches, <BranchesRoute />),
          },
          {
            path: paths.newBranch.pattern,
            element: guarded((a) => a.can('create', 'Branch'), <BranchNewRoute />),
          },
          {
            path: paths.editBranch.pattern,
            element: guarded((a) => a.can('update', 'Branch'), <BranchEditRoute />),
          },
          { path: paths.people.pattern, element: guarded((a) => adminAccess(a).people, <UsersRoute />) },
          { path: paths.leads.pattern, element: guarded((a) => a.can('read', 'Lead'), <PipelineRoute />) },
          {
            path: paths.newLead.pattern,
            element: guarded((a) => a.can('create', 'Lead'), <LeadNewRoute />),
          },
          { path: paths.lead.pattern, element: guarded((a) => a.can('read', 'Lead'), <LeadRoute />) },
          {
            path: paths.inspection.pattern,
            element: guarded((a) => a.can('read', 'Inspection'), <InspectionRoute />),
          },
          {
            path: paths.priceBook.pattern,
            element: guarded((a) => a.can('read', 'PriceBook'), <PriceBookRoute />),
          },
          {
            path: paths.newProposal.pattern,
            element: guarded((a) => a.can('create', 'Proposal'), <ProposalNewRoute />),
          },
          {
            path: paths.proposal.pattern,
            element: guarded((a) => a.can('read', 'Proposal'), <ProposalRoute />),
          },
          {
            path: paths.approvals.pattern,
            element: guarded((a) => a.can('approve', 'Proposal'), <ApprovalsRoute />),
          },
          { path: paths.jobs.pattern, element: guarded((a) => a.can('read', 'Job'), <JobsRoute />) },
          {
            path: paths.jobCalendar.pattern,
            element: guarded((a) => a.can('manage', 'Job'), <JobCalendarRoute />),
          },
          {
            path: paths.jobActualsSummary.pattern,
            element: guarded((a) => a.can('manage', 'Job'), <JobActualsSummaryRoute />),
          },
          { path: paths.job.pattern, element: guarded((a) => a.can('read', 'Job'), <JobRoute />) },
          { path: paths.jobField.pattern, element: guarded((a) => a.can('read', 'Job'), <JobFieldRoute />) },
          {
            path: paths.jobComplete.pattern,
            element: guarded((a) => a.can('update', 'Job'), <JobCompleteRoute />),
          },
          { path: paths.jobSheet.pattern, element: guarded((a) => a.can('read', 'Job'), <JobSheetRoute />) },
          { path: paths.today.pattern, element: guarded((a) => a.can('update', 'Job'), <TodayRoute />) },
          { path: paths.crews.pattern, element: guarded((a) => a.can('manage', 'Job'), <CrewsRoute />) },
          {
            path: paths.ledgerJournal.pattern,
            element: guarded((a) => a.can('read', 'JournalEntry'), <JournalRoute />),
          },
          {
            path: paths.ledgerAccount.pattern,
            element: guarded((a) => a.can('read', 'JournalEntry'), <AccountLedgerRoute />),
          },
          {
            path: paths.trialBalance.pattern,
            element: guarded((a) => a.can('read', 'JournalEntry'), <TrialBalanceRoute />),
          },
          {
            path: paths.reconciliation.pattern,
            element: guarded((a) => a.can('read', 'Reconciliation'), <ReconciliationRoute />),
          },
          {
            path: paths.bankAccounts.pattern,
            element: guarded((a) => a.can('read', 'Reconciliation'), <BankAccountsRoute />),
          },
          {
            path: paths.uploadStatement.pattern,
            element: guarded((a) => a.can('create', 'Reconciliation'), <UploadStatementRoute />),
          },
          {
            path: paths.payoutBreakdown.pattern,
            element: guarded((a) => a.can('read', 'Reconciliation'), <PayoutBreakdownRoute />),
          },
          {
            path: paths.commissionPlans.pattern,
            element: guarded((a) => a.can('read', 'CommissionPlan'), <CommissionPlansRoute />),
          },
          {
            path: paths.commissionStatements.pattern,
            element: guarded((a) => a.can('read', 'CommissionStatement'), <CommissionStatementsRoute />),
          },
          {
            path: paths.commissionStatement.pattern,
            element: guarded((a) => a.can('read', 'CommissionStatement'), <CommissionStatementRoute />),
          },
          {
            path: paths.myCommissions.pattern,
            element: guarded((a) => a.can('read', 'CommissionStatement'), <MyCommissionsRoute />),
          },
          {
            path: paths.payments.pattern,
            element: guarded((a) => a.can('read', 'Payment'), <PaymentsListRoute />),
          },
          { path: '*', element: <NotFoundRoute /> },
        ],
      },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
