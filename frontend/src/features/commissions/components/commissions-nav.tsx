import { NavLink } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/**
 * The "Commissions" group of the navigation: statements for the bookkeeper, the owner and managers; a
 * salesperson's own statements; the plans for those who may read them.
 */
export function CommissionsNav({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  const user = useCurrentUser();
  const statements = ability.can('read', 'CommissionStatement');
  const plans = ability.can('read', 'CommissionPlan');
  if (!statements && !plans) return null;
  const mine = user.role === 'salesperson';
  const labelId = `${onNavigate ? 'm-' : ''}nav-commissions`;
  return (
    <div className="app-nav__group" role="group" aria-labelledby={labelId}>
      <p className="app-nav__group-label" id={labelId}>
        Commissions
      </p>
      <ul className="app-nav__list">
        {statements ? (
          <li>
            <NavLink
              to={mine ? paths.myCommissions.href() : paths.commissionStatements.href()}
              className={linkClass}
              onClick={onNavigate}
            >
              <i className="pi pi-wallet" aria-hidden="true" />
              <span>{mine ? 'My commissions' : 'Statements'}</span>
            </NavLink>
          </li>
        ) : null}
        {plans ? (
          <li>
            <NavLink to={paths.commissionPlans.href()} className={linkClass} onClick={onNavigate}>
              <i className="pi pi-percentage" aria-hidden="true" />
              <span>Plans</span>
            </NavLink>
          </li>
        ) : null}
      </ul>
    </div>
  );
}
