import { Link } from 'react-router';
import { Card } from 'primereact/card';
import { Skeleton } from 'primereact/skeleton';
import { Tag } from 'primereact/tag';
import { ROLE_LABELS, type Branch, type Role } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { adminAccess, useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useBranches } from '@/features/branches/api/get-branches';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { formatPercent, formatTimezone } from '@/lib/format';

export default function HomeRoute() {
  const user = useCurrentUser();
  const ability = useAppAbility();
  const access = adminAccess(ability);
  const branches = useBranches();
  const { branchId, allowAll } = useCurrentBranch();
  const firstName = user.name.split(/\s+/)[0] ?? user.name;

  const mine = (branches.data ?? []).filter((b) => allowAll || user.branchIds.includes(b.id));
  const shown = [...(branchId ? mine.filter((b) => b.id === branchId) : mine)].sort((a, b) =>
    a.code.localeCompare(b.code),
  );
  const canEditBranches = ability.can('update', 'Branch');

  return (
    <div className="page">
      <header className="welcome">
        <h1 className="welcome__title">Welcome, {firstName}</h1>
        <p className="welcome__meta">
          <span>{user.name}</span>
          <span aria-hidden="true"> · </span>
          <span>{ROLE_LABELS[user.role]}</span>
          <span aria-hidden="true"> · </span>
          <span>
            {allowAll
              ? 'All branches'
              : mine.length
                ? mine.map((b) => `${b.code} ${b.name}`).join(', ')
                : user.branchIds.length
                  ? `${user.branchIds.length === 1 ? '1 branch' : `${user.branchIds.length} branches`}`
                  : 'No branch yet'}
          </span>
        </p>
      </header>

      {access.branches || access.people ? (
        <section aria-labelledby="home-admin" className="home-section">
          <h2 id="home-admin" className="section-title">
            Admin
          </h2>
          <div className="tile-grid">
            {access.branches ? (
              <Link to={paths.branches.href()} className="tile">
                <i className="pi pi-building tile__icon" aria-hidden="true" />
                <span className="tile__title">Branch set-up</span>
                <span className="tile__text">
                  {canEditBranches
                    ? 'Addresses, time zones, margin floors, discount limits and sales tax, branch by branch.'
                    : 'Each branch’s address, time zone, margin floor, discount limits and sales tax.'}
                </span>
              </Link>
            ) : null}
            {access.people ? (
              <Link to={paths.people.href()} className="tile">
                <i className="pi pi-users tile__icon" aria-hidden="true" />
                <span className="tile__title">Team</span>
                <span className="tile__text">
                  {ability.can('manage', 'all')
                    ? 'Invite someone, set their role and branch, resend an invitation, deactivate an account.'
                    : 'Invite sales staff and crew leads to your branch and keep their access up to date.'}
                </span>
              </Link>
            ) : null}
          </div>
        </section>
      ) : null}

      <section aria-labelledby="home-branches" className="home-section">
        <h2 id="home-branches" className="section-title">
          {allowAll && !branchId ? 'The branches' : shown.length === 1 ? 'Your branch' : 'Your branches'}
        </h2>
        {branches.isPending ? (
          <div className="branch-cards">
            <Skeleton height="11rem" />
            <Skeleton height="11rem" />
          </div>
        ) : branches.isError ? (
          <ApiErrorMessage error={branches.error} />
        ) : shown.length === 0 ? (
          <Card className="content-card">
            <p className="muted">
              {allowAll
                ? 'No branches have been set up yet.'
                : 'You are not assigned to a branch yet. An owner or branch manager can add you to one.'}
            </p>
          </Card>
        ) : (
          <div className="branch-cards">
            {shown.map((b) => (
              <BranchCard key={b.id} branch={b} role={user.role} />
            ))}
          </div>
        )}
      </section>
    </div>
  );
}

function localTime(zone: string): string | null {
  try {
    return new Intl.DateTimeFormat('en-US', { timeZone: zone, hour: 'numeric', minute: '2-digit' }).format(
      new Date(),
    );
  } catch {
    return null;
  }
}

/** What the branch's limits mean for this person, in their own terms. */
function limitsFor(branch: Branch, role: Role): string[] {
  const { salesperson, branch_manager } = branch.discountAuthority;
  const floor = formatPercent(branch.marginFloorPct);
  switch (role) {
    case 'salesperson':
      return [
        `You may take up to ${formatPercent(salesperson)} off list price without approval.`,
        `A proposal below ${floor} gross margin needs approval.`,
      ];
    case 'branch_manager':
      return [
        `Salespeople may discount up to ${formatPercent(salesperson)}; you may approve up to ${formatPercent(branch_manager)}.`,
        `Margin floor: ${floor}.`,
      ];
    case 'crew_lead':
      return [];
    default:
      return [
        `Discount limits: salesperson ${formatPercent(salesperson)}, manager ${formatPercent(branch_manager)}.`,
        `Margin floor: ${floor}.`,
      ];
  }
}

function BranchCard({ branch, role }: { branch: Branch; role: Role }) {
  const time = localTime(branch.timezone);
  const limits = limitsFor(branch, role);
  return (
    <Card className="branch-card">
      <div className="branch-card__head">
        <Tag value={branch.code} className="branch-code" />
        <h3 className="branch-card__name">{branch.name}</h3>
      </div>
      <dl className="branch-card__facts">
        <div>
          <dt>Address</dt>
          <dd>
            {branch.addressLine1}, {branch.city}, {branch.state} {branch.postalCode}
          </dd>
        </div>
        {branch.phone ? (
          <div>
            <dt>Phone</dt>
            <dd>
              <a href={`tel:${branch.phone}`}>{branch.phone}</a>
            </dd>
          </div>
        ) : null}
        <div>
          <dt>Time zone</dt>
          <dd>
            {formatTimezone(branch.timezone)}
            {time ? <span className="muted"> · {time} there now</span> : null}
          </dd>
        </div>
      </dl>
      {limits.length ? (
        <ul className="branch-card__limits">
          {limits.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      ) : null}
    </Card>
  );
}
