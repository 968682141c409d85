import { NavLink } from 'react-router';
import { useAppAbility, adminAccess } from '@/features/auth/ability';
import { ApprovalsNavItem } from '@/features/approvals/components/approvals-nav-item';
import { PriceBookNavItem } from '@/features/price-book/components/price-book-nav-item';
import { CrewsNavItem, JobsNavItems } from '@/features/jobs/components/jobs-nav-items';
import { LedgerNav } from '@/features/ledger/components/ledger-nav';
import { CommissionsNav } from '@/features/commissions/components/commissions-nav';
import { ReconciliationNavItem } from '@/features/reconciliation/components/reconciliation-nav-item';
import { PaymentsNavItem } from '@/features/payments/components/payments-nav-item';
import { paths } from '../paths';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** The main navigation: only what the person's role includes. */
export function AppNav({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  const access = adminAccess(ability);
  return (
    <nav aria-label="Main" className="app-nav">
      <ul className="app-nav__list">
        <li>
          <NavLink to={paths.home.href()} end className={linkClass} onClick={onNavigate}>
            <i className="pi pi-home" aria-hidden="true" />
            <span>Home</span>
          </NavLink>
        </li>
        {ability.can('read', 'Lead') ? (
          <li>
            <NavLink to={paths.leads.href()} className={linkClass} onClick={onNavigate}>
              <i className="pi pi-map-marker" aria-hidden="true" />
              <span>Leads</span>
            </NavLink>
          </li>
        ) : null}
        <ApprovalsNavItem onNavigate={onNavigate} idPrefix={onNavigate ? 'm-' : ''} />
        <JobsNavItems onNavigate={onNavigate} />
        <ReconciliationNavItem onNavigate={onNavigate} />
        <PaymentsNavItem onNavigate={onNavigate} />
      </ul>
      <LedgerNav onNavigate={onNavigate} />
      <CommissionsNav onNavigate={onNavigate} />
      {access.branches || access.people ? (
        <div className="app-nav__group" role="group" aria-labelledby={`${onNavigate ? 'm-' : ''}nav-admin`}>
          <p className="app-nav__group-label" id={`${onNavigate ? 'm-' : ''}nav-admin`}>
            Admin
          </p>
          <ul className="app-nav__list">
            {access.branches ? (
              <li>
                <NavLink to={paths.branches.href()} className={linkClass} onClick={onNavigate}>
                  <i className="pi pi-building" aria-hidden="true" />
                  <span>Branches</span>
                </NavLink>
              </li>
            ) : null}
            {access.people ? (
              <li>
                <NavLink to={paths.people.href()} className={linkClass} onClick={onNavigate}>
                  <i className="pi pi-users" aria-hidden="true" />
                  <span>People</span>
                </NavLink>
              </li>
            ) : null}
            <PriceBookNavItem onNavigate={onNavigate} />
            <CrewsNavItem onNavigate={onNavigate} />
          </ul>
        </div>
      ) : null}
    </nav>
  );
}
