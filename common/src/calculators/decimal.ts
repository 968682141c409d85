// Decimal helpers for the calculators and deadline rules.
//
// Every decimal quantity (lengths, weights, elevations, money) enters as a string such as "12.50",
// is held as a decimal.js value and leaves as a string. A JavaScript number never carries one.
// Counts (points, piers, drum sets) are whole numbers and travel as numbers.
//
// We use our own clone of Decimal so that a configuration change elsewhere (money.ts, for one)
// cannot change how these rules round.
import Decimal from 'decimal.js';

export const CalcDecimal = Decimal.clone({
  precision: 50,
  rounding: Decimal.ROUND_HALF_UP,
  toExpNeg: -60,
  toExpPos: 60,
});
export type CalcDecimalValue = InstanceType<typeof CalcDecimal>;

export interface StrictDecimalOptions {
  /** Allow a leading '-'. Off by default: most quantities here cannot be negative. */
  allowNegative?: boolean;
  /** Most digits after the point. Default 6. */
  maxDecimals?: number;
  /** Most digits before the point. Default 12. */
  maxIntegerDigits?: number;
}

export type StrictDecimalResult = { ok: true; value: CalcDecimalValue } | { ok: false; message: string };

const STRICT_DECIMAL = /^(-?)(\d+)(?:\.(\d+))?$/;

/**
 * Parse a decimal written as a string: digits, at most one '.', with digits on both sides of it,
 * and a leading '-' only when `allowNegative` is set. Refuses numbers (they may already have lost
 * digits), exponent notation ("1e3"), spaces, '+', empty strings, "Infinity" and "NaN".
 */
export function parseStrictDecimal(value: unknown, options: StrictDecimalOptions = {}): StrictDecimalResult {
  const maxDecimals = options.maxDecimals ?? 6;
  const maxIntegerDigits = options.maxIntegerDigits ?? 12;
  if (typeof value === 'number') {
    return { ok: false, message: 'must be written as a string such as "12.50", not as a number' };
  }
  if (typeof value !== 'string') {
    return { ok: false, message: 'must be a decimal written as a string, such as "12.50"' };
  }
  if (value === '') {
    return { ok: false, message: 'is empty' };
  }
  const match = STRICT_DECIMAL.exec(value);
  if (!match) {
    return {
      ok: false,
      message: `"${truncate(value)}" is not a plain decimal: use digits with at most one '.', such as "12.50" (no spaces, no '+', no exponent)`,
    };
  }
  const [, sign = '', integerDigits = '', decimals = ''] = match;
  if (sign === '-' && !options.allowNegative) {
    return { ok: false, message: 'cannot be negative' };
  }
  if (integerDigits.replace(/^0+(?=\d)/, '').length > maxIntegerDigits) {
    return { ok: false, message: `has more than ${maxIntegerDigits} digits before the decimal point` };
  }
  if (decimals.length > maxDecimals) {
    return { ok: false, message: `has more than ${maxDecimals} digits after the decimal point` };
  }
  return { ok: true, value: new CalcDecimal(value) };
}

/**
 * Write a decimal as a plain string. With `decimalPlaces`, round half up to that many places and
 * always show them ("12.50"); without, show the exact value with no exponent and no trailing zeros.
 * Never writes "-0".
 */
export function formatCalcDecimal(value: CalcDecimalValue, decimalPlaces?: number): string {
  const rounded =
    decimalPlaces === undefined ? value : value.toDecimalPlaces(decimalPlaces, CalcDecimal.ROUND_HALF_UP);
  const nonNegativeZero = rounded.isZero() ? rounded.abs() : rounded;
  return decimalPlaces === undefined ? nonNegativeZero.toFixed() : nonNegativeZero.toFixed(decimalPlaces);
}

/**
 * floor(a / b) for a ≥ 0, b > 0, exact: the quotient from division is corrected by multiplication,
 * so a quotient a hair below a whole number can never be rounded up to it.
 */
export function floorDivide(a: CalcDecimalValue, b: CalcDecimalValue): CalcDecimalValue {
  let q = a.div(b).floor();
  while (q.gt(0) && q.mul(b).gt(a)) q = q.minus(1);
  while (q.plus(1).mul(b).lte(a)) q = q.plus(1);
  return q;
}

/** ceil(a / b) for a ≥ 0, b > 0, exact (see floorDivide). */
export function ceilDivide(a: CalcDecimalValue, b: CalcDecimalValue): CalcDecimalValue {
  const q = floorDivide(a, b);
  return q.mul(b).eq(a) ? q : q.plus(1);
}

function truncate(text: string): string {
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}
