import { isApiError } from './api-client';

export type FieldErrors<K extends string> = Partial<Record<K, string>>;

export interface ServerFormErrors<K extends string> {
  /** Server faults that belong to a field on the form, keyed by that field. */
  fields: FieldErrors<K>;
  /** What to say above the form: the server's message when no field took it, or null. */
  form: string | null;
}

/**
 * Puts the server's field errors (`[{field, message}]`, nested as "discountAuthority.salesperson") onto
 * the form's fields. Anything no field shows goes in the form-level message so that nothing is lost.
 */
export function serverFormErrors<K extends string>(
  error: unknown,
  fields: readonly K[],
): ServerFormErrors<K> {
  if (!isApiError(error)) {
    return { fields: {}, form: 'Something went wrong. Try again.' };
  }
  const known = new Set<string>(fields);
  const mapped: FieldErrors<K> = {};
  const unplaced: string[] = [];
  for (const { field, message } of error.fieldErrors) {
    if (known.has(field)) {
      const key = field as K;
      mapped[key] = mapped[key] ? `${mapped[key]} ${message}` : message;
    } else {
      unplaced.push(message);
    }
  }
  const anyMapped = Object.keys(mapped).length > 0;
  let form: string | null = null;
  if (unplaced.length > 0) form = [error.message, ...unplaced].join(' ');
  else if (!anyMapped) form = error.message;
  return { fields: mapped, form };
}

export function hasErrors<K extends string>(errors: FieldErrors<K>): boolean {
  return Object.values(errors).some(Boolean);
}
