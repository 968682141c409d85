import type { FieldError } from '@loambook/common';

/**
 * A rule the request broke, with a stable code. The exception filter maps the kind to an HTTP status;
 * services never think in status codes.
 */
export type DomainErrorKind =
  'not_found' | 'conflict' | 'rule' | 'forbidden' | 'invalid' | 'unauthorized' | 'gone';

export class DomainError extends Error {
  constructor(
    readonly kind: DomainErrorKind,
    readonly code: string,
    message: string,
    readonly details: FieldError[] | Record<string, unknown> | null = null,
  ) {
    super(message);
  }
}

export const notFound = (what: string, code = `${what.toUpperCase().replace(/\s+/g, '_')}.NOT_FOUND`) =>
  new DomainError('not_found', code, `No such ${what}.`);

export const conflict = (code: string, message: string, details: Record<string, unknown> | null = null) =>
  new DomainError('conflict', code, message, details);

export const invalid = (field: string, message: string) =>
  new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', [{ field, message }]);
