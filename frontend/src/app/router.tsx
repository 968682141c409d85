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
          { path: '*', element: <NotFoundRoute /> },
        ],
      },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
