import '../jobs-nav.css';
import { NavLink, useMatch } from 'react-router';
import { paths } from '@/app/paths';
import { useAppAbility } from '@/features/auth/ability';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useOutboxWaiting } from '../offline/field-queue';

const linkClass = ({ isActive }: { isActive: boolean }) =>
  isActive ? 'nav-link nav-link--active' : 'nav-link';

/** "Today" for a crew lead; "Jobs" for whoever reads jobs; the crew calendar for those who schedule them. */
export function JobsNavItems({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  const user = useCurrentUser();
  // "Jobs" is lit on the list and on each job, not on the calendar (which has its own entry).
  const onCalendar = useMatch(paths.jobCalendar.pattern) !== null;
  if (!ability.can('read', 'Job')) return null;
  return (
    <>
      {user.role === 'crew_lead' ? <TodayNavItem onNavigate={onNavigate} /> : null}
      <li>
        <NavLink
          to={paths.jobs.href()}
          className={({ isActive }) => linkClass({ isActive: isActive && !onCalendar })}
          onClick={onNavigate}
        >
          <i className="pi pi-briefcase" aria-hidden="true" />
          <span>Jobs</span>
        </NavLink>
      </li>
      {ability.can('manage', 'Job') ? (
        <li>
          <NavLink to={paths.jobCalendar.href()} className={linkClass} onClick={onNavigate}>
            <i className="pi pi-calendar" aria-hidden="true" />
            <span>Crew calendar</span>
          </NavLink>
        </li>
      ) : null}
    </>
  );
}

/** "Today" for the crew lead, with the rows still waiting on this phone (and the outbox kept sending). */
function TodayNavItem({ onNavigate }: { onNavigate?: () => void }) {
  const waiting = useOutboxWaiting();
  return (
    <li>
      <NavLink to={paths.today.href()} className={linkClass} onClick={onNavigate}>
        <i className="pi pi-sun" aria-hidden="true" />
        <span>Today</span>
        {waiting ? (
          <span className="nav-waiting" title="Rows waiting to send">
            {waiting} waiting
          </span>
        ) : null}
      </NavLink>
    </li>
  );
}

/** "Crews" in the Admin group, for those who run a branch's jobs. */
export function CrewsNavItem({ onNavigate }: { onNavigate?: () => void }) {
  const ability = useAppAbility();
  if (!ability.can('manage', 'Job')) return null;
  return (
    <li>
      <NavLink to={paths.crews.href()} className={linkClass} onClick={onNavigate}>
        <i className="pi pi-users" aria-hidden="true" />
        <span>Crews</span>
      </NavLink>
    </li>
  );
}
