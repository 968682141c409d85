import '../payments.css';
import '@/features/signing/signing.css';
import type { ReactNode } from 'react';
import { useSearchParams } from 'react-router';
import type { CheckoutStatus } from '@loambook/common';
import { PageLoading } from '@/components/loading';
import { isApiError } from '@/lib/api-client';
import { useCheckoutStatus } from '../api/get-checkout-status';
import { usd } from '../payments-format';

/**
 * Where the card processor sends the homeowner after paying (public, no account). The processor confirms the
 * payment to us separately (a signed webhook); until it has, the page says the payment is being confirmed and
 * asks again every few seconds.
 */
export default function PaymentThankYouRoute() {
  const [params] = useSearchParams();
  const sessionId = params.get('session_id') ?? '';
  const status = useCheckoutStatus(sessionId);

  let body;
  if (!sessionId) body = <Unknown />;
  else if (status.isPending) body = <PageLoading label="Checking your payment…" />;
  else if (status.isError)
    body = isApiError(status.error) && status.error.status === 404 ? <Unknown /> : <Trouble />;
  else body = <Status status={status.data} />;
  return <PublicFrame>{body}</PublicFrame>;
}

export function PublicFrame({ children }: { children: ReactNode }) {
  return (
    <div className="public-page">
      <main className="public-page__main" id="main">
        {children}
      </main>
      <footer className="public-page__footer">
        <span className="wordmark wordmark--dark wordmark--small">
          <span className="wordmark__mark" aria-hidden="true" />
          <span className="wordmark__text">Loambook</span>
        </span>
        <span className="muted">Payments for foundation repair.</span>
      </footer>
    </div>
  );
}

function Status({ status: s }: { status: CheckoutStatus }) {
  const what = s.kind === 'deposit' ? 'deposit' : 'payment';
  const call = s.branchPhone ? ` Questions? Call ${s.branchName} at ${s.branchPhone}.` : '';
  if (s.status === 'received') {
    return (
      <section className="public-status" aria-labelledby="paid-title" role="status">
        <i className="pi pi-check-circle public-status__icon" aria-hidden="true" />
        <h1 id="paid-title" className="public-status__title">
          Thank you: payment received
        </h1>
        <p className="public-status__text">
          {s.branchName} has received your {what} of {usd(s.amount)}. Your card statement shows the charge; no
          further step is needed.{call}
        </p>
      </section>
    );
  }
  if (s.status === 'processing') {
    return (
      <section className="public-status" aria-labelledby="processing-title" role="status" aria-live="polite">
        <i className="pi pi-spin pi-spinner public-status__icon" aria-hidden="true" />
        <h1 id="processing-title" className="public-status__title">
          Your payment is being confirmed
        </h1>
        <p className="public-status__text">
          The card processor is confirming your {what} of {usd(s.amount)} to {s.branchName}. This usually
          takes a few seconds; this page updates by itself. Please do not pay again.{call}
        </p>
      </section>
    );
  }
  return (
    <section className="public-status" aria-labelledby="closed-title">
      <i className="pi pi-link public-status__icon" aria-hidden="true" />
      <h1 id="closed-title" className="public-status__title">
        This payment link is no longer active
      </h1>
      <p className="public-status__text">
        It expired or was replaced by a newer link, and no payment was recorded through it. Ask {s.branchName}{' '}
        for a new link.{call}
      </p>
    </section>
  );
}

function Unknown() {
  return (
    <section className="public-status" aria-labelledby="unknown-title">
      <i className="pi pi-question-circle public-status__icon" aria-hidden="true" />
      <h1 id="unknown-title" className="public-status__title">
        We could not find this payment
      </h1>
      <p className="public-status__text">
        Open the link from your e-mail again, or call the office that sent it. If your card was charged, the
        office will see the payment.
      </p>
    </section>
  );
}

function Trouble() {
  return (
    <section className="public-status" aria-labelledby="trouble-title">
      <i className="pi pi-exclamation-triangle public-status__icon" aria-hidden="true" />
      <h1 id="trouble-title" className="public-status__title">
        We could not check your payment just now
      </h1>
      <p className="public-status__text">
        Please reload this page in a minute. If your card was charged, the payment still reaches the office:
        do not pay again.
      </p>
    </section>
  );
}
