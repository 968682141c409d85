import { useAbility } from '@casl/react';
import type { AppAbility } from '@loambook/common';

/** The signed-in person's ability (from the rules the server sent at sign-in). */
export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}

export interface AdminAccess {
  /** The branch list (read-only unless the person may also change branches). */
  branches: boolean;
  /** The people list: for those who may invite someone. */
  people: boolean;
}

/**
 * Which parts of Admin the person may open. People needs `create User` (owner, branch manager).
 * Branches needs `read Branch` and is part of the Admin area, which is for people who look after the
 * company's set-up: those who may invite people, or who may read every branch (owner, bookkeeper).
 * A salesperson or crew lead reads their own branch's settings where their work needs them, not here.
 */
export function adminAccess(ability: AppAbility): AdminAccess {
  const people = ability.can('create', 'User');
  const readsEveryBranch = ability
    .rulesFor('read', 'Branch')
    .some((rule) => !rule.inverted && rule.conditions === undefined);
  const branches = ability.can('read', 'Branch') && (people || readsEveryBranch);
  return { branches, people };
}
