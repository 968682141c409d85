import '../payments.css';
import '@/features/signing/signing.css';
import { PublicFrame } from './payment-thank-you';

/** Where the processor sends the homeowner who leaves its payment page without paying (public). */
export default function PaymentCancelledRoute() {
  return (
    <PublicFrame>
      <section className="public-status" aria-labelledby="not-paid-title">
        <i className="pi pi-info-circle public-status__icon" aria-hidden="true" />
        <h1 id="not-paid-title" className="public-status__title">
          No payment was taken
        </h1>
        <p className="public-status__text">
          You left the payment page before paying. The link in your e-mail still works until the time it
          states; you can also pay by cheque or bank transfer: tell the office and they will record it.
        </p>
      </section>
    </PublicFrame>
  );
}
