import { createContext, useCallback, useContext, useMemo, useState } from 'react';
import type { ReactNode } from 'react';
import type { Branch } from '@loambook/common';
import { useCurrentUser } from '@/features/auth/auth-provider';
import { useBranches } from './api/get-branches';

export const ALL_BRANCHES = 'all';

export interface CurrentBranchValue {
  /** The chosen branch's id, or null for "All branches". */
  branchId: string | null;
  branch: Branch | null;
  setBranchId: (id: string | null) => void;
  /** The branches the person may pick from, by code. */
  branches: Branch[];
  /** Owners and bookkeepers may look at every branch at once. */
  allowAll: boolean;
  /** Whether there is anything to choose: more than one branch, or the company-wide view. */
  showSwitcher: boolean;
}

const CurrentBranchContext = createContext<CurrentBranchValue | null>(null);

const storageKey = (userId: string) => `loambook.branch.${userId}`;

function readStored(userId: string): string | null {
  try {
    return window.localStorage.getItem(storageKey(userId));
  } catch {
    return null;
  }
}

/** The branch the person is working in, kept per person in localStorage; the branch switcher sets it. */
export function CurrentBranchProvider({ children }: { children: ReactNode }) {
  const user = useCurrentUser();
  const branchesQuery = useBranches();
  const [picked, setPicked] = useState<Record<string, string>>({});

  const allowAll = user.role === 'owner' || user.role === 'bookkeeper';
  const branches = useMemo(() => {
    const list = branchesQuery.data ?? [];
    const mine = allowAll ? list : list.filter((b) => user.branchIds.includes(b.id));
    return [...mine].sort((a, b) => a.code.localeCompare(b.code));
  }, [branchesQuery.data, allowAll, user.branchIds]);

  const stored = picked[user.id] ?? readStored(user.id);
  const loaded = branchesQuery.isSuccess;
  let branchId: string | null;
  if (stored === ALL_BRANCHES && allowAll) {
    branchId = null;
  } else if (
    stored &&
    (loaded ? branches.some((b) => b.id === stored) : allowAll || user.branchIds.includes(stored))
  ) {
    branchId = stored;
  } else {
    branchId = allowAll
      ? null
      : (user.branchIds.find((id) => !loaded || branches.some((b) => b.id === id)) ?? null);
  }

  const setBranchId = useCallback(
    (id: string | null) => {
      const value = id ?? ALL_BRANCHES;
      try {
        window.localStorage.setItem(storageKey(user.id), value);
      } catch {
        // Without storage the choice lasts for this visit only.
      }
      setPicked((p) => ({ ...p, [user.id]: value }));
    },
    [user.id],
  );

  const value = useMemo<CurrentBranchValue>(
    () => ({
      branchId,
      branch: branches.find((b) => b.id === branchId) ?? null,
      setBranchId,
      branches,
      allowAll,
      showSwitcher: allowAll || user.branchIds.length > 1,
    }),
    [branchId, branches, setBranchId, allowAll, user.branchIds.length],
  );

  return <CurrentBranchContext.Provider value={value}>{children}</CurrentBranchContext.Provider>;
}

export function useCurrentBranch(): CurrentBranchValue {
  const value = useContext(CurrentBranchContext);
  if (!value) throw new Error('useCurrentBranch() needs <CurrentBranchProvider> above it.');
  return value;
}
