import { describe, expect, it } from 'vitest';
import { centsKey, centsToMoneyString } from './cents';
import { ReconciliationError } from './errors';
import { payoutBreakdown, type PayoutTransaction } from './payout-breakdown';

// Amounts in integer cents, 100 = $1.00 (Stripe API reference, published). The fee figures are invented
// (no processor's price list is asserted here); only the arithmetic is checked.
const charge = (id: string, amount: string, fee: string): PayoutTransaction => ({
  id,
  type: 'charge',
  amountCents: amount,
  feeCents: fee,
  netCents: (BigInt(amount) - BigInt(fee)).toString(),
});

describe('payoutBreakdown', () => {
  it.each([
    {
      name: 'two deposits, one refund: 1,500.00 + 900.00 − 200.00 − fees 43.80 − 26.40 = 2,129.80',
      transactions: [
        charge('txn_1', '150000', '4380'),
        charge('txn_2', '90000', '2640'),
        { id: 'txn_3', type: 'refund', amountCents: '-20000', feeCents: '0', netCents: '-20000' },
      ],
      payout: '212980',
      expected: {
        chargeCount: 2,
        refundCount: 1,
        charges: '2400.00',
        refunds: '-200.00',
        fees: '70.20',
        other: '0.00',
        net: '2129.80',
        difference: '0.00',
        balanced: true,
      },
    },
    {
      name: 'a cent short is not balanced: the difference says so',
      transactions: [charge('txn_1', '150000', '4380')],
      payout: '145619',
      expected: { net: '1456.20', payoutAmount: '1456.19', difference: '-0.01', balanced: false },
    },
    {
      name: 'a fee billed as its own line (negative amount) and an adjustment',
      // 1,000.00 − fee 29.30 − separate fee 5.00 + adjustment −15.00 = 950.70
      transactions: [
        charge('txn_1', '100000', '2930'),
        { id: 'txn_f', type: 'stripe_fee', amountCents: -500n },
        { id: 'txn_a', type: 'adjustment', amountCents: -1500n },
      ],
      payout: 95070n,
      expected: { fees: '34.30', other: '-15.00', net: '950.70', otherCount: 2, balanced: true },
    },
    {
      name: "the payout's own transaction is left out of the sums",
      transactions: [
        charge('txn_1', '100000', '2930'),
        { id: 'txn_po', type: 'payout', amountCents: '-97070', feeCents: '0' },
      ],
      payout: '97070',
      expected: { net: '970.70', balanced: true, payoutTransactionIds: ['txn_po'] },
    },
    {
      name: 'a transaction whose net is not amount − fee makes it unbalanced even when the sums agree',
      transactions: [
        { id: 'txn_1', type: 'charge', amountCents: '10000', feeCents: '320', netCents: '9700' },
      ],
      payout: '9680',
      expected: { difference: '0.00', balanced: false, inconsistentIds: ['txn_1'] },
    },
    {
      name: 'an empty payout of 0.00 balances',
      transactions: [],
      payout: '0',
      expected: { net: '0.00', balanced: true },
    },
  ])('$name', ({ transactions, payout, expected }) => {
    expect(payoutBreakdown(transactions, payout)).toMatchObject(expected);
  });

  it('refuses amounts that are not integer cents', () => {
    expect(() => payoutBreakdown([{ id: 't', type: 'charge', amountCents: '12.34' }], '0')).toThrow(
      ReconciliationError,
    );
    expect(() => payoutBreakdown([], 12 as unknown as string)).toThrow(/integer cents/);
  });
});

describe('cents helpers', () => {
  it.each([
    [0n, '0.00'],
    [5n, '0.05'],
    [-5n, '-0.05'],
    [123456n, '1234.56'],
    [-100n, '-1.00'],
    [12345678901234n, '123456789012.34'],
  ])('%s cents → %s', (cents, text) => {
    expect(centsToMoneyString(cents)).toBe(text);
  });

  it.each([
    ['0', '0'],
    ['-0', '0'],
    ['007', '7'],
    ['+7', '7'],
    ['-0012', '-12'],
    ['12.0', null],
    ['', null],
    [' 1', null],
  ])('centsKey(%j) = %j', (value, key) => {
    expect(centsKey(value)).toBe(key);
  });
});
