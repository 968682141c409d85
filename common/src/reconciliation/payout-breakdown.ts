// What a processor payout is made of, and whether it adds up.
//
// A payout moves the settled balance to the bank. The processor lists the balance transactions it paid
// out; each has a gross `amount`, a `fee` and a `net` (= amount − fee), all integers in the smallest
// currency unit (Stripe API reference, balance transaction object, secondary: seen in the SDK's types).
// A refund's amount is negative. The payout's own balance transaction (type 'payout', the money leaving
// the balance) is not part of what it is made of; it is left out of the sums and counted apart.
//   charges      Σ amount of 'charge' and 'payment'                        (gross, ≥ 0 normally)
//   refunds      Σ amount of 'refund', 'payment_refund'                    (≤ 0 normally)
//   fees         Σ fee of every transaction − Σ amount of 'stripe_fee'     (fees billed as their own line
//                                                                           have a negative amount)
//   other        Σ amount of every other type (adjustment, dispute, …)
//   net          charges + refunds + other − fees  (= Σ (amount − fee))
//   balanced     net = the payout's amount, to the cent, and every net the processor gave = amount − fee
// Sums are exact integer arithmetic (bigint); nothing passes through a JavaScript number.
import { centsToMoneyString, centsToBigInt, type CentsInput } from './cents';
import { ReconciliationError } from './errors';

export interface PayoutTransaction {
  id: string;
  /** The processor's balance transaction type: 'charge', 'refund', 'stripe_fee', 'adjustment', 'payout', … */
  type: string;
  /** Gross amount, integer cents, signed. */
  amountCents: CentsInput;
  /** Fee taken on it, integer cents (default 0). */
  feeCents?: CentsInput;
  /** The processor's own net, if given: checked against amount − fee. */
  netCents?: CentsInput;
}

export interface PayoutBreakdown {
  chargeCount: number;
  refundCount: number;
  otherCount: number;
  /** Dollars, two decimals, signed. */
  charges: string;
  refunds: string;
  fees: string;
  other: string;
  net: string;
  payoutAmount: string;
  /** payoutAmount − net: "0.00" when balanced. */
  difference: string;
  balanced: boolean;
  /** Integer cents of the same figures, for storing and matching. */
  cents: { charges: string; refunds: string; fees: string; other: string; net: string; difference: string };
  /** Ids of transactions whose given net is not amount − fee. */
  inconsistentIds: string[];
  /** The payout's own balance transactions, left out of the sums. */
  payoutTransactionIds: string[];
}

const CHARGE_TYPES = new Set(['charge', 'payment']);
const REFUND_TYPES = new Set(['refund', 'payment_refund']);
const FEE_TYPES = new Set(['stripe_fee']);

function cents(value: CentsInput | undefined, field: string, fallback?: bigint): bigint {
  if (value === undefined && fallback !== undefined) return fallback;
  const c = value === undefined ? null : centsToBigInt(value);
  if (c === null) {
    throw new ReconciliationError('RECONCILIATION.INVALID_LINE', field, `${field} must be integer cents.`);
  }
  return c;
}

/** Sum the transactions inside a payout and say whether they make the payout's amount. */
export function payoutBreakdown(
  transactions: readonly PayoutTransaction[],
  payoutAmountCents: CentsInput,
): PayoutBreakdown {
  const payout = cents(payoutAmountCents, 'payoutAmountCents');
  let charges = 0n;
  let refunds = 0n;
  let fees = 0n;
  let other = 0n;
  let chargeCount = 0;
  let refundCount = 0;
  let otherCount = 0;
  const inconsistentIds: string[] = [];
  const payoutTransactionIds: string[] = [];
  transactions.forEach((t, i) => {
    const amount = cents(t.amountCents, `transactions[${i}].amountCents`);
    const fee = cents(t.feeCents, `transactions[${i}].feeCents`, 0n);
    if (t.netCents !== undefined && cents(t.netCents, `transactions[${i}].netCents`) !== amount - fee) {
      inconsistentIds.push(t.id);
    }
    if (t.type === 'payout') {
      payoutTransactionIds.push(t.id);
      return;
    }
    fees += fee;
    if (CHARGE_TYPES.has(t.type)) {
      charges += amount;
      chargeCount++;
    } else if (REFUND_TYPES.has(t.type)) {
      refunds += amount;
      refundCount++;
    } else if (FEE_TYPES.has(t.type)) {
      fees -= amount;
      otherCount++;
    } else {
      other += amount;
      otherCount++;
    }
  });
  const net = charges + refunds + other - fees;
  const difference = payout - net;
  return {
    chargeCount,
    refundCount,
    otherCount,
    charges: centsToMoneyString(charges),
    refunds: centsToMoneyString(refunds),
    fees: centsToMoneyString(fees),
    other: centsToMoneyString(other),
    net: centsToMoneyString(net),
    payoutAmount: centsToMoneyString(payout),
    difference: centsToMoneyString(difference),
    balanced: difference === 0n && inconsistentIds.length === 0,
    cents: {
      charges: charges.toString(),
      refunds: refunds.toString(),
      fees: fees.toString(),
      other: other.toString(),
      net: net.toString(),
      difference: difference.toString(),
    },
    inconsistentIds,
    payoutTransactionIds,
  };
}
