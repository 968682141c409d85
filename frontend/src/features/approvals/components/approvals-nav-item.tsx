import { NavLink } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';
import { useApprovals } from '../api/get-approvals';
import '../approvals.css';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** "Approvals" in the main navigation, for those who decide them, with the number waiting. */
export function ApprovalsNavItem({
  onNavigate,
  idPrefix = '',
}: {
  onNavigate?: () => void;
  idPrefix?: string;
}) {
  const ability = useAppAbility();
  const allowed = ability.can('approve', 'Proposal');
  // The queue is looked at again every minute, so the count stays close to true without a reload.
  const pending = useApprovals('pending', { enabled: allowed, refetchInterval: 60_000 });
  if (!allowed) return null;
  const count = pending.data?.length ?? 0;
  const countId = `${idPrefix}nav-approvals-count`;
  return (
    <li>
      <NavLink
        to={paths.approvals.href()}
        className={linkClass}
        onClick={onNavigate}
        aria-describedby={count ? countId : undefined}
      >
        <i className="pi pi-check-square" aria-hidden="true" />
        <span>Approvals</span>
        {count ? (
          <span className="nav-badge" aria-hidden="true">
            {count > 99 ? '99+' : count}
          </span>
        ) : null}
      </NavLink>
      {count ? (
        <span id={countId} className="visually-hidden">
          {count === 1 ? '1 waiting' : `${count} waiting`}
        </span>
      ) : null}
    </li>
  );
}
