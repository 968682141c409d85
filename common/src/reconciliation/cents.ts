// Integer cents for matching and summing: bigint or a string of digits, never a JavaScript number.
// Card processors give amounts as integers in the smallest currency unit, 100 meaning $1.00 (Stripe API
// reference, published; REFERENCE-VALUES.md).

/** Integer cents: a bigint, or a string such as "123456" or "-1200". */
export type CentsInput = bigint | string;

const CANONICAL = /^-?(?:0|[1-9]\d*)$/;
const INTEGER = /^[+-]?\d+$/;

/** The canonical decimal string of integer cents ("-0" → "0", "007" → "7"), or null when not an integer. */
export function centsKey(value: CentsInput): string | null {
  if (typeof value === 'bigint') return value.toString();
  if (typeof value !== 'string') return null;
  if (CANONICAL.test(value) && value !== '-0') return value;
  return INTEGER.test(value) ? BigInt(value).toString() : null;
}

export function centsToBigInt(value: CentsInput): bigint | null {
  const key = centsKey(value);
  return key === null ? null : BigInt(key);
}

/** Integer cents → dollars with two decimals, the wire format: -123456n → "-1234.56". */
export function centsToMoneyString(cents: bigint): string {
  const negative = cents < 0n;
  const digits = (negative ? -cents : cents).toString().padStart(3, '0');
  return `${negative ? '-' : ''}${digits.slice(0, -2)}.${digits.slice(-2)}`;
}
