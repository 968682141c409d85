import { NavLink } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** "Price book" in the Admin group, for those who may read a branch's price book there. */
export function PriceBookNavItem({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  if (!ability.can('read', 'PriceBook')) return null;
  return (
    <li>
      <NavLink to={paths.priceBook.href()} className={linkClass} onClick={onNavigate}>
        <i className="pi pi-list" aria-hidden="true" />
        <span>Price book</span>
      </NavLink>
    </li>
  );
}
