import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import { routes } from '@/app/router';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { renderApp } from '@/testing/render';

const SESSION = 'cs_test_thankyou_0001';

function open(answer: { status?: number; body: unknown }) {
  const { calls } = fakeApi({ [`GET /api/payments/checkout/${SESSION}`]: answer });
  renderApp(null, { routes, initialEntry: `/payment/thank-you?session_id=${SESSION}` });
  return calls;
}

const status = (s: 'received' | 'processing' | 'closed') => ({
  body: { status: s, kind: 'deposit', amount: '1000.00', branchName: 'Marrowfield', branchPhone: '555-0100' },
});

describe('the homeowner’s page after paying (public)', () => {
  it('thanks them once the payment is recorded, without signing in', async () => {
    const calls = open(status('received'));
    expect(await screen.findByRole('heading', { name: 'Thank you: payment received' })).toBeInTheDocument();
    expect(screen.getByText(/Marrowfield has received your deposit of \$1,000\.00/)).toBeInTheDocument();
    expect(calls.every((c) => !c.headers.Authorization)).toBe(true);
    expect(calls.some((c) => c.path === '/api/auth/me')).toBe(false);
  });

  it('says the payment is being confirmed while the processor’s webhook is on its way', async () => {
    open(status('processing'));
    expect(
      await screen.findByRole('heading', { name: 'Your payment is being confirmed' }),
    ).toBeInTheDocument();
    expect(screen.getByText(/Please do not pay again/)).toBeInTheDocument();
  });

  it('says a replaced or expired link took no payment', async () => {
    open(status('closed'));
    expect(
      await screen.findByRole('heading', { name: 'This payment link is no longer active' }),
    ).toBeInTheDocument();
  });

  it('says so when the session is unknown', async () => {
    open({ status: 404, body: errorBody('PAYMENT.CHECKOUT_UNKNOWN', 'No such checkout.') });
    expect(
      await screen.findByRole('heading', { name: 'We could not find this payment' }),
    ).toBeInTheDocument();
  });
});

describe('the page for a homeowner who left without paying', () => {
  it('says no payment was taken', async () => {
    fakeApi({});
    renderApp(null, { routes, initialEntry: '/payment/cancelled' });
    expect(await screen.findByRole('heading', { name: 'No payment was taken' })).toBeInTheDocument();
  });
});
