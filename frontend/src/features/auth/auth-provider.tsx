import {
  createContext,
  useCallback,
  useContext,
  useEffect,
  useMemo,
  useState,
  useSyncExternalStore,
} from 'react';
import type { ReactNode } from 'react';
import { AbilityProvider } from '@casl/react';
import { useQueryClient } from '@tanstack/react-query';
import { abilityFromRules, type AppAbility, type AuthUser, type SessionResponse } from '@loambook/common';
import { setTokenGetter, setUnauthorizedHandler } from '@/lib/api-client';
import type { SignInReason } from '@/app/paths';
import { useMe } from './api/get-me';
import { sessionFromResponse, sessionStore, type Session } from './session-store';

export interface AuthContextValue {
  session: Session | null;
  user: AuthUser | null;
  ability: AppAbility;
  /** Why the last session ended, for the sign-in page to say so; null after a fresh sign-in. */
  endedReason: SignInReason | null;
  signIn: (response: SessionResponse) => void;
  signOut: (reason?: SignInReason) => void;
}

const AuthContext = createContext<AuthContextValue | null>(null);

// The API client reads the token from the same store the screens use.
setTokenGetter(() => sessionStore.get()?.accessToken ?? null);

/** setTimeout takes at most a signed 32-bit number of milliseconds (about 24 days). */
const MAX_TIMEOUT = 2 ** 31 - 1;

export function AuthProvider({ children }: { children: ReactNode }) {
  const queryClient = useQueryClient();
  const session = useSyncExternalStore(sessionStore.subscribe, sessionStore.get, () => null);
  const [endedReason, setEndedReason] = useState<SignInReason | null>(null);

  const signIn = useCallback(
    (response: SessionResponse) => {
      queryClient.clear();
      setEndedReason(null);
      sessionStore.set(sessionFromResponse(response));
    },
    [queryClient],
  );

  const signOut = useCallback(
    (reason: SignInReason = 'signed-out') => {
      setEndedReason(reason);
      sessionStore.set(null);
      // Nothing the last person saw stays in memory for the next one.
      queryClient.clear();
    },
    [queryClient],
  );

  // The server says the token no longer works: end the session; the route guard sends the person to sign in.
  useEffect(() => setUnauthorizedHandler(() => signOut('session-ended')), [signOut]);

  // The token's time is up: end the session at that moment rather than at the next failed request.
  const expiresAt = session?.expiresAt;
  useEffect(() => {
    if (!expiresAt) return;
    const ms = Date.parse(expiresAt) - Date.now();
    const timer = window.setTimeout(
      () => {
        if (Date.parse(expiresAt) <= Date.now()) signOut('session-ended');
        else sessionStore.refresh();
      },
      Math.min(Math.max(ms, 0), MAX_TIMEOUT),
    );
    return () => window.clearTimeout(timer);
  }, [expiresAt, signOut]);

  // Role and branches may have changed since sign-in: refresh them from the server once per visit.
  const me = useMe(session?.accessToken ?? null);
  useEffect(() => {
    const current = sessionStore.get();
    if (!me.data || !current) return;
    const changed =
      JSON.stringify(me.data.user) !== JSON.stringify(current.user) ||
      JSON.stringify(me.data.rules) !== JSON.stringify(current.rules);
    if (changed) sessionStore.set({ ...current, user: me.data.user, rules: me.data.rules });
  }, [me.data]);

  const rules = session?.rules;
  const ability = useMemo(() => abilityFromRules(rules ?? []), [rules]);

  const value = useMemo<AuthContextValue>(
    () => ({ session, user: session?.user ?? null, ability, endedReason, signIn, signOut }),
    [session, ability, endedReason, signIn, signOut],
  );

  return (
    <AuthContext.Provider value={value}>
      <AbilityProvider value={ability}>{children}</AbilityProvider>
    </AuthContext.Provider>
  );
}

export function useAuth(): AuthContextValue {
  const value = useContext(AuthContext);
  if (!value) throw new Error('useAuth() needs <AuthProvider> above it.');
  return value;
}

/** For screens behind RequireAuth: the signed-in person, never null there. */
export function useCurrentUser(): AuthUser {
  const { user } = useAuth();
  if (!user) throw new Error('useCurrentUser() is only for screens behind RequireAuth.');
  return user;
}
