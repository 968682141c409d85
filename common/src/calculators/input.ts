// Collects every problem with an input before throwing, so that a form can show them all at once.
import { CalculatorInputError, CalculatorIssue } from './errors';
import { CalcDecimal, CalcDecimalValue, StrictDecimalOptions, parseStrictDecimal } from './decimal';

export interface DecimalFieldOptions extends StrictDecimalOptions {
  /** Refuse zero and below. */
  positive?: boolean;
  /** Refuse values above this (inclusive bound), with a message that says why. */
  max?: { value: string; why: string };
}

export class InputCollector {
  readonly issues: CalculatorIssue[] = [];

  add(field: string, message: string): void {
    this.issues.push({ field, message });
  }

  /** A required decimal string. Returns undefined (after recording the problem) when invalid. */
  decimal(
    field: string,
    label: string,
    value: unknown,
    options: DecimalFieldOptions = {},
  ): CalcDecimalValue | undefined {
    if (value === undefined || value === null) {
      this.add(field, `${label} is required.`);
      return undefined;
    }
    const parsed = parseStrictDecimal(value, options);
    if (!parsed.ok) {
      this.add(field, `${label} ${parsed.message}.`);
      return undefined;
    }
    if (options.positive && parsed.value.lte(0)) {
      this.add(field, `${label} must be greater than 0.`);
      return undefined;
    }
    if (options.max && parsed.value.gt(new CalcDecimal(options.max.value))) {
      this.add(field, `${label} must not be more than ${options.max.value} (${options.max.why}).`);
      return undefined;
    }
    return parsed.value;
  }

  /** An optional decimal string with a default written as a string. */
  decimalOr(
    field: string,
    label: string,
    value: unknown,
    fallback: string,
    options: DecimalFieldOptions = {},
  ): CalcDecimalValue | undefined {
    return this.decimal(field, label, value === undefined ? fallback : value, options);
  }

  /** An optional decimal string; undefined stays undefined. */
  optionalDecimal(
    field: string,
    label: string,
    value: unknown,
    options: DecimalFieldOptions = {},
  ): CalcDecimalValue | undefined {
    return value === undefined ? undefined : this.decimal(field, label, value, options);
  }

  booleanOr(field: string, label: string, value: unknown, fallback: boolean): boolean {
    if (value === undefined) return fallback;
    if (typeof value !== 'boolean') {
      this.add(field, `${label} must be true or false.`);
      return fallback;
    }
    return value;
  }

  throwIfAny(): void {
    if (this.issues.length > 0) throw new CalculatorInputError([...this.issues]);
  }
}

/** Refuse anything that is not a plain object, before reading its fields. */
export function requireInputObject(input: unknown, what: string): Record<string, unknown> {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    throw new CalculatorInputError([
      { field: '(input)', message: `${what} needs an object of named fields.` },
    ]);
  }
  return input as Record<string, unknown>;
}
