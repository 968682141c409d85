import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router';
import { paths } from '@/app/paths';
import { useAuth } from '../auth-provider';

/** Screens behind this need a signed-in person; anyone else goes to sign in and comes back afterwards. */
export function RequireAuth({ children }: { children: ReactNode }) {
  const { session, endedReason } = useAuth();
  const location = useLocation();
  if (!session) {
    const here = `${location.pathname}${location.search}`;
    const target =
      endedReason === 'signed-out'
        ? paths.signIn.href({ reason: 'signed-out' })
        : paths.signIn.href({ returnTo: here, reason: endedReason ?? undefined });
    return <Navigate to={target} replace />;
  }
  return <>{children}</>;
}
