import { ValidationPipe, type ValidationError } from '@nestjs/common';
import type { FieldError } from '@loambook/common';
import { DomainError } from './domain-error';

function flatten(errors: ValidationError[], prefix = ''): FieldError[] {
  return errors.flatMap((e) => {
    const field = prefix ? `${prefix}.${e.property}` : e.property;
    const own = Object.values(e.constraints ?? {}).map((message) => ({
      field,
      message:
        e.constraints?.whitelistValidation === message
          ? `${field} is not a field this request takes.`
          : message,
    }));
    return [...own, ...flatten(e.children ?? [], field)];
  });
}

/** Validates every body: unknown fields refused, each fault listed by field. */
export function createValidationPipe(): ValidationPipe {
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    transform: true,
    stopAtFirstError: false,
    validationError: { target: false, value: false },
    exceptionFactory: (errors) =>
      new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', flatten(errors)),
  });
}
