// The hosted payment page the homeowner sees: plain server-rendered HTML, no script, one form.
import { formatMinor } from './money';
import type { CheckoutSession, LineItem } from './types';

export interface CardForm {
  number: string;
  expiry: string;
  cvc: string;
  name: string;
}

export type FieldErrors = Partial<Record<keyof CardForm, string>>;

const esc = (s: string) =>
  s.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c,
  );

const STYLE = `
  body { margin: 0; font: 16px/1.5 system-ui, sans-serif; color: #1f2a24; background: #eef1ec; overflow-wrap: anywhere; }
  .notice { background: #2f4a3a; color: #fff; padding: .6rem 1rem; font-size: .9rem; text-align: center; }
  main { max-width: 30rem; margin: 2rem auto; background: #fff; border: 1px solid #cfd6cc; border-radius: 6px; padding: 1.5rem; }
  h1 { font-size: 1.25rem; margin: 0 0 1rem; }
  table { width: 100%; border-collapse: collapse; margin-bottom: 1.25rem; }
  td { padding: .35rem 0; border-bottom: 1px solid #e3e7e0; vertical-align: top; }
  td.amount { text-align: right; white-space: nowrap; padding-left: 1rem; }
  tr.total td { font-weight: 700; border-bottom: 0; }
  label { display: block; font-weight: 600; margin-top: .9rem; }
  input { box-sizing: border-box; width: 100%; padding: .5rem; font: inherit; border: 1px solid #9aa597; border-radius: 4px; }
  input[aria-invalid="true"] { border-color: #a4262c; }
  .row { display: flex; gap: 1rem; } .row > div { flex: 1; }
  .field-error { color: #a4262c; font-size: .9rem; margin: .2rem 0 0; }
  .alert { border: 1px solid #a4262c; background: #fbeeee; color: #6e1a1e; padding: .6rem .8rem; border-radius: 4px; }
  button { margin-top: 1.25rem; width: 100%; padding: .7rem; font: inherit; font-weight: 700; color: #fff;
    background: #3c6e4f; border: 0; border-radius: 4px; cursor: pointer; }
  .hint { font-size: .85rem; color: #56625a; }
  a { color: #2f5f8a; }
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>${STYLE}</style>
</head>
<body>
<p class="notice" role="note">Local test stand-in for the card processor. No real card is charged and nothing leaves this computer.</p>
<main>
${body}
</main>
</body>
</html>`;
}

function summary(session: CheckoutSession, items: LineItem[]): string {
  const rows = items
    .map(
      (i) =>
        `<tr><td>${esc(i.description)}${i.quantity > 1 ? ` × ${i.quantity}` : ''}</td><td class="amount">${formatMinor(i.amount_total, i.currency)}</td></tr>`,
    )
    .join('\n');
  return `<table aria-label="What you are paying for">
${rows}
<tr class="total"><td>Total due</td><td class="amount" data-testid="amount-total">${formatMinor(session.amount_total, session.currency)}</td></tr>
</table>`;
}

function field(
  id: keyof CardForm,
  label: string,
  values: Partial<CardForm>,
  errors: FieldErrors,
  attrs: string,
): string {
  const error = errors[id];
  return `<div>
<label for="${id}">${label}</label>
<input id="${id}" name="${id}" value="${esc(values[id] ?? '')}" ${attrs} required${error ? ` aria-invalid="true" aria-describedby="${id}-error"` : ''}>
${error ? `<p class="field-error" id="${id}-error">${esc(error)}</p>` : ''}
</div>`;
}

export function paymentPage(
  session: CheckoutSession,
  items: LineItem[],
  options: { values?: Partial<CardForm>; errors?: FieldErrors; declined?: string } = {},
): string {
  const values = { ...options.values, number: options.declined ? '' : options.values?.number, cvc: '' };
  const errors = options.errors ?? {};
  const to = session.customer_email
    ? `<p>Receipt to <strong>${esc(session.customer_email)}</strong></p>`
    : '';
  return layout(
    `Pay ${formatMinor(session.amount_total, session.currency)}`,
    `<h1>Card payment</h1>
${to}
${summary(session, items)}
${options.declined ? `<p class="alert" role="alert" data-testid="payment-error">${esc(options.declined)}</p>` : ''}
<form method="post" action="/pay/${esc(session.id)}" novalidate>
${field('number', 'Card number', values, errors, 'inputmode="numeric" autocomplete="cc-number" placeholder="1234 1234 1234 1234" maxlength="23"')}
<div class="row">
${field('expiry', 'Expiry date (MM / YY)', values, errors, 'inputmode="numeric" autocomplete="cc-exp" placeholder="MM / YY" maxlength="7"')}
${field('cvc', 'Security code (CVC)', values, errors, 'inputmode="numeric" autocomplete="cc-csc" placeholder="123" maxlength="4"')}
</div>
${field('name', 'Name on card', values, errors, 'autocomplete="cc-name" maxlength="100"')}
<button type="submit">Pay ${formatMinor(session.amount_total, session.currency)}</button>
</form>
<p class="hint">Test cards: 4242 4242 4242 4242 is approved; 4000 0000 0000 0002 is declined. Any future expiry date and any three-digit code.</p>
${session.cancel_url ? `<p><a href="${esc(session.cancel_url)}">Cancel and go back</a></p>` : ''}`,
  );
}

export function messagePage(title: string, message: string, link?: { href: string; text: string }): string {
  return layout(
    title,
    `<h1>${esc(title)}</h1>
<p>${esc(message)}</p>
${link ? `<p><a href="${esc(link.href)}">${esc(link.text)}</a></p>` : ''}`,
  );
}
