import { NavLink } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** "Payments" in the main navigation, for those who may read payments (bookkeeper, owner, branch manager). */
export function PaymentsNavItem({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  if (!ability.can('read', 'Payment')) return null;
  return (
    <li>
      <NavLink to={paths.payments.href()} className={linkClass} onClick={onNavigate}>
        <i className="pi pi-wallet" aria-hidden="true" />
        <span>Payments</span>
      </NavLink>
    </li>
  );
}
