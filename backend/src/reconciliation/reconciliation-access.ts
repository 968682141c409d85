import { asSubject, branchScope, ReconciliationError, type Action } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, DomainError } from '../common/domain-error';
import type { BranchIds } from './reconciliation.repository';

/** The bank accounts' branches a person may see (null: all); company-wide accounts are seen by anyone who may reconcile. */
export function reconciliationScope(user: SessionUser): BranchIds {
  return branchScope(user, 'money');
}

/** May the person do this on a record of this branch (null: company-wide)? Outside their reach is a 404. */
export function mayReconcile(user: SessionUser, action: Action, branchId: string | null): boolean {
  const scope = reconciliationScope(user);
  return (
    (scope === null || branchId === null || scope.includes(branchId)) &&
    user.ability.can(action, asSubject('Reconciliation', { branchId }))
  );
}

interface PgError {
  code?: string;
  constraint?: string;
}

export const isPgError = (e: unknown, code: string, constraint?: string): boolean => {
  const err = e as PgError | null;
  return err?.code === code && (!constraint || err.constraint === constraint);
};

export const PERIOD_LOCKED_MESSAGE =
  'This is inside a reconciled period, which is locked: nothing in it changes any more.';

/**
 * The database's refusals turned into the API's codes: a change inside a locked period (the trigger's
 * restrict_violation) → 409 RECONCILIATION.PERIOD_LOCKED; a malformed mapping, window or line from the rules
 * in common → 400 on the field. Anything else is rethrown.
 */
export function translateError(e: unknown): never {
  if (isPgError(e, '23001', 'reconciliation_period_locked')) {
    throw conflict('RECONCILIATION.PERIOD_LOCKED', PERIOD_LOCKED_MESSAGE);
  }
  if (e instanceof ReconciliationError) {
    throw new DomainError('invalid', e.code, e.message, [{ field: e.field, message: e.message }]);
  }
  throw e;
}
