// The test card numbers the hosted page and the pay control endpoint accept.
import type { CardForm, FieldErrors } from './page';

export interface TestCard {
  brand: string;
  outcome: 'succeeded' | 'declined';
  declineCode?: string;
  message?: string;
}

export const TEST_CARDS: Record<string, TestCard> = {
  // Stripe testing docs (published): Visa, approved.
  '4242424242424242': { brand: 'visa', outcome: 'succeeded' },
  // Stripe testing docs (published): declined with card_declined / generic_decline.
  '4000000000000002': {
    brand: 'visa',
    outcome: 'declined',
    declineCode: 'generic_decline',
    message: 'Your card was declined.',
  },
  // Stripe testing docs (memory): Mastercard, approved.
  '5555555555554444': { brand: 'mastercard', outcome: 'succeeded' },
  // Stripe testing docs (memory): declined with card_declined / insufficient_funds.
  '4000000000009995': {
    brand: 'visa',
    outcome: 'declined',
    declineCode: 'insufficient_funds',
    message: 'Your card has insufficient funds.',
  },
};

export interface ValidCard {
  number: string;
  last4: string;
  expMonth: number;
  expYear: number;
  name: string;
  test: TestCard;
}

/** The Luhn check digit test every card number passes (ISO/IEC 7812-1, published). */
export function luhnValid(digits: string): boolean {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = digits.charCodeAt(digits.length - 1 - i) - 48;
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return sum % 10 === 0;
}

/** Checks the form as the hosted page would: per-field messages, or the card ready to charge. */
export function validateCard(
  form: Partial<CardForm>,
  now: Date,
): { ok: true; card: ValidCard } | { ok: false; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const number = (form.number ?? '').replace(/[\s-]/g, '');
  let test: TestCard | undefined;
  if (!number) errors.number = 'Enter the card number.';
  else if (!/^\d{12,19}$/.test(number) || !luhnValid(number))
    errors.number = 'This card number is not valid.';
  else {
    test = TEST_CARDS[number];
    if (!test) errors.number = 'This is a test stand-in: use one of the test card numbers listed below.';
  }
  const expiry = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(form.expiry ?? '');
  let expMonth = 0;
  let expYear = 0;
  if (!(form.expiry ?? '').trim()) errors.expiry = 'Enter the expiry date.';
  else if (!expiry) errors.expiry = 'Write the expiry date as MM / YY.';
  else {
    expMonth = Number(expiry[1]);
    expYear = expiry[2].length === 2 ? 2000 + Number(expiry[2]) : Number(expiry[2]);
    const thisMonth = now.getUTCFullYear() * 12 + now.getUTCMonth() + 1;
    if (expMonth < 1 || expMonth > 12) errors.expiry = 'The month must be 01 to 12.';
    else if (expYear * 12 + expMonth < thisMonth) errors.expiry = 'This card has expired.';
  }
  const cvc = (form.cvc ?? '').trim();
  if (!cvc) errors.cvc = 'Enter the security code.';
  else if (!/^\d{3,4}$/.test(cvc)) errors.cvc = 'The security code is 3 or 4 digits.';
  const name = (form.name ?? '').trim();
  if (!name) errors.name = 'Enter the name on the card.';
  if (Object.keys(errors).length > 0 || !test) return { ok: false, errors };
  return { ok: true, card: { number, last4: number.slice(-4), expMonth, expYear, name, test } };
}
