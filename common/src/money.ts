import Decimal from 'decimal.js';

/**
 * Money inside Loambook is a Decimal; it leaves as a string with two decimals. Rounding to cents
 * happens once, at a named boundary (toCents), half away from zero (ROUND_HALF_UP in decimal.js),
 * the usual commercial rounding.
 */
export const MoneyDecimal = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });
export type Money = InstanceType<typeof MoneyDecimal>;

const DECIMAL_STRING = /^-?\d{1,12}(\.\d{1,10})?$/;

export function isDecimalString(value: unknown): value is string {
  return typeof value === 'string' && DECIMAL_STRING.test(value);
}

/** Strict parse: refuses numbers (which may already have lost a cent), exponents and blanks. */
export function money(value: string | Money): Money {
  if (value instanceof MoneyDecimal) return value;
  if (!isDecimalString(value)) throw new TypeError(`Not a decimal amount: ${JSON.stringify(value)}`);
  return new MoneyDecimal(value);
}

export function toCents(value: Money): Money {
  return value.toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}

/** "1234.5" → "1234.50": the wire format. */
export function toMoneyString(value: Money | string): string {
  return toCents(money(value)).toFixed(2);
}

/** Integer cents, as a string, for processors that take the smallest currency unit (Stripe API reference). */
export function toMinorUnits(value: Money | string): string {
  return toCents(money(value)).times(100).toFixed(0);
}

export function formatUsd(value: Money | string): string {
  const [whole = '0', cents = '00'] = toMoneyString(value).replace('-', '').split('.');
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return `${money(value).isNegative() && !money(value).isZero() ? '−' : ''}$${grouped}.${cents}`;
}
