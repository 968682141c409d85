import type { AppRule, AuthUser, SessionResponse } from '@loambook/common';

/** What the browser keeps between visits: the token, when it stops working, who it is for and their rules. */
export interface Session {
  accessToken: string;
  expiresAt: string;
  user: AuthUser;
  rules: AppRule[];
}

export const SESSION_KEY = 'loambook.session';

export function sessionFromResponse(response: SessionResponse): Session {
  return {
    accessToken: response.accessToken,
    expiresAt: response.expiresAt,
    user: response.user,
    rules: response.rules,
  };
}

export function isExpired(session: Session, now: number = Date.now()): boolean {
  const end = Date.parse(session.expiresAt);
  return Number.isNaN(end) || end <= now;
}

function isSession(value: unknown): value is Session {
  const s = value as Session | null;
  return (
    typeof s === 'object' &&
    s !== null &&
    typeof s.accessToken === 'string' &&
    typeof s.expiresAt === 'string' &&
    typeof s.user === 'object' &&
    s.user !== null &&
    typeof s.user.id === 'string' &&
    Array.isArray(s.user.branchIds) &&
    Array.isArray(s.rules)
  );
}

/** The stored session, or null when there is none, it is unreadable or it has expired. */
export function loadSession(): Session | null {
  try {
    const raw = window.localStorage.getItem(SESSION_KEY);
    if (!raw) return null;
    const parsed: unknown = JSON.parse(raw);
    if (!isSession(parsed) || isExpired(parsed)) {
      window.localStorage.removeItem(SESSION_KEY);
      return null;
    }
    return parsed;
  } catch {
    return null;
  }
}

export function saveSession(session: Session | null): void {
  try {
    if (session) window.localStorage.setItem(SESSION_KEY, JSON.stringify(session));
    else window.localStorage.removeItem(SESSION_KEY);
  } catch {
    // Private browsing may refuse storage: the session then lasts as long as the tab.
  }
}

type Listener = () => void;

/**
 * The session as an external store over localStorage, so that the API client (outside React) and the
 * screens (through useSyncExternalStore) always read the same token, and another tab signing out is seen.
 */
function createSessionStore() {
  const listeners = new Set<Listener>();
  let cachedRaw: string | null | undefined;
  let cached: Session | null = null;

  const notify = () => listeners.forEach((l) => l());

  const readRaw = (): string | null => {
    try {
      return window.localStorage.getItem(SESSION_KEY);
    } catch {
      return null;
    }
  };

  return {
    /** The current session; null when signed out or once the token has expired. */
    get(): Session | null {
      const raw = readRaw();
      if (raw !== cachedRaw) {
        cachedRaw = raw;
        cached = raw === null ? null : loadSession();
      }
      if (cached && isExpired(cached)) return null;
      return cached;
    },
    set(session: Session | null): void {
      saveSession(session);
      notify();
    },
    subscribe(listener: Listener): () => void {
      listeners.add(listener);
      const onStorage = (event: StorageEvent) => {
        if (event.key === SESSION_KEY || event.key === null) listener();
      };
      window.addEventListener('storage', onStorage);
      return () => {
        listeners.delete(listener);
        window.removeEventListener('storage', onStorage);
      };
    },
    /** Tells subscribers to read again (used when the token's time is up). */
    refresh: notify,
  };
}

export const sessionStore = createSessionStore();
