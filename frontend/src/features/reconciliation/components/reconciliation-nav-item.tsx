import { NavLink } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** "Reconciliation" for those who reconcile the bank (bookkeeper, owner). */
export function ReconciliationNavItem({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  if (!ability.can('read', 'Reconciliation')) return null;
  return (
    <li>
      <NavLink to={paths.reconciliation.href()} className={linkClass} onClick={onNavigate}>
        <i className="pi pi-wallet" aria-hidden="true" />
        <span>Reconciliation</span>
      </NavLink>
    </li>
  );
}
