import { CommissionError, type CommissionIssue } from '@loambook/common';
import { DomainError } from '../common/domain-error';

/** The commission rules' issues as a 422 with each field at fault (the first issue names the code). */
export function commissionRule(issues: readonly CommissionIssue[]): DomainError {
  const first = issues[0];
  return new DomainError(
    'rule',
    first?.code ?? 'COMMISSION.PLAN_INVALID',
    first?.message ?? 'Invalid commission input.',
    issues.map(({ field, message }) => ({ field, message })),
  );
}

/** Re-throws a CommissionError as a 422; anything else as it is. */
export function rethrowCommissionError(e: unknown): never {
  if (e instanceof CommissionError) throw commissionRule(e.details);
  throw e;
}

/** The PostgreSQL error code and constraint of a failed query, when it is one. */
export function pgError(e: unknown): { code?: string; constraint?: string } {
  return typeof e === 'object' && e !== null ? (e as { code?: string; constraint?: string }) : {};
}
