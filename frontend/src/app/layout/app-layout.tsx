import { Suspense, useEffect, useState } from 'react';
import { Link, Outlet } from 'react-router';
import { Button } from 'primereact/button';
import { Sidebar } from 'primereact/sidebar';
import { PageLoading } from '@/components/loading';
import { BranchSwitcher } from '@/features/branches/components/branch-switcher';
import { CurrentBranchProvider } from '@/features/branches/current-branch';
import { paths } from '../paths';
import { AppNav } from './app-nav';
import { UserMenu } from './user-menu';

/** The frame around every signed-in screen: top bar, navigation, branch switcher, account menu. */
export function AppLayout() {
  const [navOpen, setNavOpen] = useState(false);
  // Fetch the sign-in screen ahead of time, so that signing out (or a session ending) shows it at once.
  useEffect(() => {
    void import('@/features/auth/routes/sign-in');
  }, []);
  return (
    <CurrentBranchProvider>
      <div className="app-shell">
        <a href="#main" className="skip-link">
          Skip to content
        </a>
        <header className="topbar">
          <Button
            type="button"
            className="topbar__menu-button"
            icon="pi pi-bars"
            label="Menu"
            text
            aria-expanded={navOpen}
            aria-controls="mobile-nav"
            onClick={() => setNavOpen(true)}
          />
          <Link to={paths.home.href()} className="wordmark">
            <span className="wordmark__mark" aria-hidden="true" />
            <span className="wordmark__text">Loambook</span>
          </Link>
          <div className="topbar__spacer" />
          <div className="topbar__switcher">
            <BranchSwitcher />
          </div>
          <UserMenu />
        </header>
        <div className="app-body">
          <aside className="sidenav">
            <AppNav />
          </aside>
          <main id="main" className="app-main" tabIndex={-1}>
            <Suspense fallback={<PageLoading />}>
              <Outlet />
            </Suspense>
          </main>
        </div>
        <Sidebar
          id="mobile-nav"
          visible={navOpen}
          onHide={() => setNavOpen(false)}
          position="left"
          className="mobile-nav"
          header={<span className="wordmark wordmark--dark">Loambook</span>}
          blockScroll
        >
          <AppNav onNavigate={() => setNavOpen(false)} />
          <div className="mobile-nav__switcher">
            <BranchSwitcher id="branch-switcher-mobile" />
          </div>
        </Sidebar>
      </div>
    </CurrentBranchProvider>
  );
}
