import { NavLink } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** The "Books" group of the navigation, for those who may read the ledger (bookkeeper, owner). */
export function LedgerNav({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  if (!ability.can('read', 'JournalEntry')) return null;
  const labelId = `${onNavigate ? 'm-' : ''}nav-books`;
  return (
    <div className="app-nav__group" role="group" aria-labelledby={labelId}>
      <p className="app-nav__group-label" id={labelId}>
        Books
      </p>
      <ul className="app-nav__list">
        <li>
          <NavLink to={paths.ledgerJournal.href()} className={linkClass} onClick={onNavigate}>
            <i className="pi pi-book" aria-hidden="true" />
            <span>Journal</span>
          </NavLink>
        </li>
        <li>
          <NavLink to={paths.ledgerAccount.href()} className={linkClass} onClick={onNavigate}>
            <i className="pi pi-list" aria-hidden="true" />
            <span>Account ledger</span>
          </NavLink>
        </li>
        <li>
          <NavLink to={paths.trialBalance.href()} className={linkClass} onClick={onNavigate}>
            <i className="pi pi-calculator" aria-hidden="true" />
            <span>Trial balance</span>
          </NavLink>
        </li>
      </ul>
    </div>
  );
}
