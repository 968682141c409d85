// Pure rules of the payments feature: amounts between the processor's integer minor units and our decimal
// strings, what a contract still owes, what a payment link may ask for, and the state pack's warning on a
// deposit. No I/O; tested in payment-rules.test.ts.
import { depositRules } from '../deadlines/deposit-rules';
import { formatUsd, money, MoneyDecimal, toMinorUnits, type Money } from '../money';
import type { DepositWarning, PaymentKind } from './api-types';

/**
 * Processors take and give amounts as integers in the smallest currency unit: 100 means $1.00 (Stripe API
 * reference, published). The SDK returns them as JSON numbers; an integer below 2^53 is exact, so this is
 * the one place where one is turned into money.
 */
export function fromMinorUnits(value: number): string {
  if (!Number.isSafeInteger(value)) throw new TypeError(`Not an integer amount in minor units: ${value}`);
  return new MoneyDecimal(String(value)).dividedBy(100).toFixed(2);
}

/**
 * The amount for the SDK's integer parameters (unit_amount, amount), in minor units. The SDK form-encodes
 * it, so the exact integer text is handed over as it is; the money never becomes a float.
 */
export function sdkMinorUnits(amount: string): number {
  return toMinorUnits(amount) as unknown as number;
}

/** Stripe's smallest USD charge is $0.50 (Stripe docs "Minimum and maximum charge amounts", published). */
export const MINIMUM_CARD_CHARGE = '0.50';

export interface MoneyMovements {
  /** Each payment received: its kind and gross amount. */
  payments: readonly { kind: PaymentKind; amount: string }[];
  /** Each refund that went through, with the kind of the payment it gave back. */
  refunds: readonly { kind: PaymentKind; amount: string }[];
}

export interface ContractBalance {
  paid: string;
  refunded: string;
  depositHeld: string;
  balanceDue: string;
}

const sum = (xs: readonly { amount: string }[]): Money =>
  xs.reduce((acc, x) => acc.plus(money(x.amount)), new MoneyDecimal(0));

/** What has come in, what was given back, the deposit still held and what is left to pay on `price`. */
export function contractBalance(price: string, m: MoneyMovements): ContractBalance {
  const paid = sum(m.payments).minus(sum(m.refunds));
  const depositHeld = sum(m.payments.filter((p) => p.kind === 'deposit')).minus(
    sum(m.refunds.filter((r) => r.kind === 'deposit')),
  );
  const due = money(price).minus(paid);
  return {
    paid: paid.toFixed(2),
    refunded: sum(m.refunds).toFixed(2),
    depositHeld: depositHeld.toFixed(2),
    balanceDue: (due.isNegative() ? new MoneyDecimal(0) : due).toFixed(2),
  };
}

export type LinkAmountProblem =
  | { code: 'PAYMENT.AMOUNT_REQUIRED'; message: string }
  | { code: 'PAYMENT.AMOUNT_TOO_SMALL'; message: string }
  | { code: 'PAYMENT.AMOUNT_TOO_LARGE'; message: string }
  | { code: 'PAYMENT.NOTHING_DUE'; message: string };

/**
 * The amount a payment link asks for: the one typed, else the contract's deposit (for a deposit) or the
 * balance due (for the balance). Never more than the balance due, never below the processor's minimum.
 */
export function linkAmount(input: {
  kind: PaymentKind;
  typed?: string | null;
  contractDeposit: string;
  balanceDue: string;
}): { ok: true; amount: string } | { ok: false; problem: LinkAmountProblem } {
  const due = money(input.balanceDue);
  if (!due.greaterThan(0)) {
    return {
      ok: false,
      problem: { code: 'PAYMENT.NOTHING_DUE', message: 'Nothing is left to pay on this contract.' },
    };
  }
  const chosen = input.typed
    ? money(input.typed)
    : input.kind === 'deposit'
      ? money(input.contractDeposit)
      : due;
  if (chosen.isZero()) {
    return {
      ok: false,
      problem: {
        code: 'PAYMENT.AMOUNT_REQUIRED',
        message: 'The contract asks for no deposit: enter the amount to request.',
      },
    };
  }
  if (chosen.lessThan(MINIMUM_CARD_CHARGE)) {
    return {
      ok: false,
      problem: {
        code: 'PAYMENT.AMOUNT_TOO_SMALL',
        message: `A card payment must be at least ${formatUsd(MINIMUM_CARD_CHARGE)}.`,
      },
    };
  }
  if (chosen.greaterThan(due)) {
    return {
      ok: false,
      problem: {
        code: 'PAYMENT.AMOUNT_TOO_LARGE',
        message: `That is more than the ${formatUsd(due)} left to pay on the contract.`,
      },
    };
  }
  return { ok: true, amount: chosen.toFixed(2) };
}

/**
 * The state pack's warning on an initial payment. Florida: more than 10% of the contract price as the
 * initial payment starts the permit (30 days) and start-of-work (90 days) clocks of F.S. 489.126(2)(a)
 * (published); exactly 10% does not. Null when the state has no such rule or the amount does not trigger it.
 */
/**
 * A percent for people: two decimals at most, rounded UP so that a payment just over a threshold never
 * reads as the threshold itself (10.0001% shows as 10.01%, not 10%); trailing zeros dropped (15%).
 */
export function shownPercent(value: string): string {
  return money(value).toDecimalPlaces(2, MoneyDecimal.ROUND_UP).toString();
}

export function depositWarning(input: {
  state: string;
  contractPrice: string;
  /** Everything paid as the initial payment, this link included. */
  initialPayment: string;
  signedOn?: string;
}): DepositWarning | null {
  const r = depositRules({
    state: input.state,
    contractPrice: input.contractPrice,
    deposit: input.initialPayment,
    ...(input.signedOn ? { signedOn: input.signedOn } : {}),
  });
  if (!r.largeInitialPayment) return null;
  const clocks = r.clocks
    // the state's own clocks; the federal cancellation window is shown with the contract already
    .filter((c) => r.statePack !== null && c.code.startsWith(`${r.statePack}_`))
    .map((c) => ({ code: c.code, title: c.title, source: c.source, startsWhen: c.startsWhen, rule: c.rule }));
  const titles = clocks.map((c) => `${c.title.toLowerCase()} (${c.startsWhen})`).join('; ');
  return {
    largeInitialPayment: true,
    depositPercent: r.depositPercent,
    message:
      `An initial payment of ${formatUsd(input.initialPayment)} is ${shownPercent(r.depositPercent)}% of the contract price. ` +
      `Once it is received, ${clocks[0]?.source ?? 'the state rule'} starts these clocks: ${titles}.`,
    clocks,
  };
}

/**
 * Whether a cancelled contract still owes the homeowner money back: something was received under it and
 * not all of it has been refunded yet (16 CFR 429: after a valid cancellation every payment is returned —
 * FTC guidance, within 10 business days, secondary). `paid` is what came in less what went back, as the
 * payments panel reports it. A live contract owes nothing back; neither does a cancelled one that never
 * received anything, or whose payments have all been refunded.
 */
export function refundOwed(c: { cancelled: boolean; paid: string }): boolean {
  return c.cancelled && money(c.paid).greaterThan(0);
}

/**
 * The card network's name as people write it, from the processor's brand code (Stripe API reference,
 * `payment_method_details.card.brand`: amex, diners, discover, eftpos_au, jcb, link, mastercard, unionpay,
 * visa, unknown — from memory). A code not in the list is shown with its first letter in capitals.
 */
const CARD_BRANDS: Record<string, string> = {
  amex: 'American Express',
  diners: 'Diners Club',
  discover: 'Discover',
  eftpos_au: 'eftpos Australia',
  jcb: 'JCB',
  link: 'Link',
  mastercard: 'Mastercard',
  unionpay: 'UnionPay',
  visa: 'Visa',
};

export function cardBrandName(brand: string | null | undefined): string {
  if (!brand || brand === 'unknown') return 'Card';
  return CARD_BRANDS[brand] ?? brand.charAt(0).toUpperCase() + brand.slice(1).replace(/_/g, ' ');
}
