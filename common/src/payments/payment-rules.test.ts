import { describe, expect, it } from 'vitest';
import {
  cardBrandName,
  contractBalance,
  depositWarning,
  fromMinorUnits,
  linkAmount,
  refundOwed,
  sdkMinorUnits,
  shownPercent,
} from './payment-rules';

describe('amounts to and from the processor’s minor units', () => {
  // Stripe API reference (published): amounts are integers in the smallest currency unit, 100 = $1.00.
  it.each([
    [100, '1.00'],
    [100_000, '1000.00'],
    [2_930, '29.30'],
    [1, '0.01'],
    [-5_000, '-50.00'],
    [0, '0.00'],
  ])('%i minor units → %s', (minor, dollars) => {
    expect(fromMinorUnits(minor)).toBe(dollars);
  });

  it('refuses what is not an exact integer', () => {
    expect(() => fromMinorUnits(10.5)).toThrow();
    expect(() => fromMinorUnits(2 ** 60)).toThrow();
  });

  it.each([
    ['1000.00', '100000'],
    ['0.50', '50'],
    ['1234.5', '123450'],
  ])('%s → %s minor units for the SDK (exact text, no float)', (dollars, minor) => {
    expect(String(sdkMinorUnits(dollars))).toBe(minor);
  });
});

describe('what a contract still owes', () => {
  it.each([
    // price, payments, refunds → paid, depositHeld, balanceDue (hand-checked sums)
    ['5420.00', [], [], '0.00', '0.00', '5420.00'],
    ['5420.00', [['deposit', '1000.00']], [], '1000.00', '1000.00', '4420.00'],
    [
      '5420.00',
      [
        ['deposit', '1000.00'],
        ['balance', '4420.00'],
      ],
      [],
      '5420.00',
      '1000.00',
      '0.00',
    ],
    ['5420.00', [['deposit', '1000.00']], [['deposit', '1000.00']], '0.00', '0.00', '5420.00'],
    [
      '5420.00',
      [
        ['deposit', '600.10'],
        ['deposit', '400.20'],
      ],
      [['deposit', '0.30']],
      '1000.00',
      '1000.00',
      '4420.00',
    ],
    // an overpayment leaves nothing due, never a negative balance
    ['100.00', [['balance', '150.00']], [], '150.00', '0.00', '0.00'],
  ] as const)('price %s', (price, payments, refunds, paid, held, due) => {
    const b = contractBalance(price, {
      payments: payments.map(([kind, amount]) => ({ kind, amount })),
      refunds: refunds.map(([kind, amount]) => ({ kind, amount })),
    });
    expect(b).toMatchObject({ paid, depositHeld: held, balanceDue: due });
  });
});

describe('the amount a payment link asks for', () => {
  it.each([
    // kind, typed, contract deposit, balance due → amount or refusal code
    ['deposit', null, '1000.00', '5420.00', '1000.00'],
    ['deposit', '750', '1000.00', '5420.00', '750.00'],
    ['balance', null, '1000.00', '4420.00', '4420.00'],
    ['deposit', null, '0.00', '5420.00', 'PAYMENT.AMOUNT_REQUIRED'],
    ['balance', '4420.01', '1000.00', '4420.00', 'PAYMENT.AMOUNT_TOO_LARGE'],
    // Stripe's US minimum charge is $0.50 (Stripe docs, published)
    ['balance', '0.49', '0.00', '4420.00', 'PAYMENT.AMOUNT_TOO_SMALL'],
    ['balance', '0.50', '0.00', '4420.00', '0.50'],
    ['balance', null, '0.00', '0.00', 'PAYMENT.NOTHING_DUE'],
  ] as const)('%s typed %s', (kind, typed, contractDeposit, balanceDue, expected) => {
    const r = linkAmount({ kind, typed, contractDeposit, balanceDue });
    expect(r.ok ? r.amount : r.problem.code).toBe(expected);
  });
});

describe('the Florida pack’s warning on an initial payment', () => {
  // F.S. 489.126(2)(a) (published): more than 10% of the contract price as the initial payment starts the
  // permit (30 days) and start-of-work (90 days) clocks; exactly 10% does not.
  it.each([
    ['FL', '5420.00', '542.00', false],
    ['FL', '5420.00', '542.01', true],
    ['FL', '5420.00', '1000.00', true],
    ['FL', '10000.00', '1000.00', false],
    // no state pack: no state clocks to warn about
    ['OH', '5420.00', '5000.00', false],
  ] as const)(
    '%s price %s, initial payment %s → warns: %s',
    (state, contractPrice, initialPayment, warns) => {
      const w = depositWarning({ state, contractPrice, initialPayment });
      expect(w !== null).toBe(warns);
      if (w) {
        expect(w.clocks.map((c) => c.code)).toEqual(['FL_489_126_PERMIT', 'FL_489_126_START']);
        expect(w.message).toContain('F.S. 489.126(2)(a)');
      }
    },
  );
});

describe('whether a cancelled contract still owes money back', () => {
  // 16 CFR 429 / FTC guidance (secondary): after a valid cancellation every payment received is returned.
  // `paid` is received less refunded (contractBalance above).
  it.each([
    [true, '0.00', false], // cancelled, nothing ever received: nothing to give back
    [true, '1000.00', true], // the card deposit still held
    [true, '0.01', true], // a cent is still owed
    [true, '0', false], // everything received has been refunded
    [false, '1000.00', false], // a live contract owes nothing back
    [false, '0.00', false],
  ] as const)('cancelled %s, paid %s → owed back: %s', (cancelled, paid, owed) => {
    expect(refundOwed({ cancelled, paid })).toBe(owed);
  });
});

describe('shownPercent', () => {
  it.each([
    ['15.0000', '15'],
    ['18.4502', '18.46'],
    // just over F.S. 489.126(2)(a)'s 10% must not read as exactly 10%
    ['10.0001', '10.01'],
    ['10.0000', '10'],
  ])('%s → %s', (value, shown) => {
    expect(shownPercent(value)).toBe(shown);
  });
});

describe('card brand names', () => {
  // Brand codes from the Stripe API reference (payment_method_details.card.brand; from memory), names as
  // the networks write them.
  it.each([
    ['visa', 'Visa'],
    ['mastercard', 'Mastercard'],
    ['amex', 'American Express'],
    ['diners', 'Diners Club'],
    ['jcb', 'JCB'],
    ['unionpay', 'UnionPay'],
    ['unknown', 'Card'],
    [null, 'Card'],
    ['', 'Card'],
    ['cartes_bancaires', 'Cartes bancaires'],
  ])('%s → %s', (code, name) => {
    expect(cardBrandName(code)).toBe(name);
  });
});
