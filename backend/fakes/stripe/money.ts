// Amounts in the fake are what the processor's API carries: integers in the smallest currency unit
// (100 means $1.00 — Stripe API reference, published). They are never divided into fractions here: the
// fee uses BigInt arithmetic and display formatting works on the digits.

/** Currencies without a minor unit (Stripe's zero-decimal currency list, memory). */
const ZERO_DECIMAL = new Set([
  'bif',
  'clp',
  'djf',
  'gnf',
  'jpy',
  'kmf',
  'krw',
  'mga',
  'pyg',
  'rwf',
  'vnd',
  'vuv',
  'xaf',
  'xof',
  'xpf',
]);

/**
 * The processing fee on one successful card charge: 2.9% + 30¢, Stripe's standard US card pricing
 * (published pricing page, memory). The percentage is rounded half up to a whole cent (memory), with
 * integer arithmetic: (amount × 29 + 500) div 1000.
 */
export function cardFee(amount: number): number {
  const percentage = (BigInt(amount) * 29n + 500n) / 1000n;
  return Number(percentage) + 30;
}

/** "$1,000.00" from 100000 and "usd"; other currencies as "1,000.00 EUR". */
export function formatMinor(amount: number, currency: string): string {
  const negative = amount < 0;
  const digits = String(Math.abs(amount));
  let whole = digits;
  let fraction = '';
  if (!ZERO_DECIMAL.has(currency)) {
    const padded = digits.padStart(3, '0');
    whole = padded.slice(0, -2);
    fraction = `.${padded.slice(-2)}`;
  }
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',') + fraction;
  const sign = negative ? '−' : '';
  return currency === 'usd' ? `${sign}$${grouped}` : `${sign}${grouped} ${currency.toUpperCase()}`;
}
