import { formatUsd } from '@loambook/common';

/** The homeowner's e-mail with a payment link. A text part; the HTML part carries the same words. */
const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export function paymentLinkMail(p: {
  homeownerName: string;
  branchName: string;
  branchPhone: string | null;
  kind: 'deposit' | 'balance';
  amount: string;
  optionTitle: string;
  link: string;
  /** When the link stops working, already worded ("Tuesday 8 December 2026, 3:00 PM"). */
  expires: string | null;
}) {
  const what = p.kind === 'deposit' ? 'the deposit' : 'the balance';
  const subject =
    p.kind === 'deposit'
      ? `Deposit for your foundation repair with ${p.branchName}`
      : `Balance for your completed foundation repair with ${p.branchName}`;
  const paragraphs = [
    `Hello ${p.homeownerName},`,
    `This is the link to pay ${what} of ${formatUsd(p.amount)} for "${p.optionTitle}" by card:`,
    p.link,
    p.expires ? `The link works until ${p.expires}. After that, ask us for a new one.` : '',
    'You can also pay by cheque or bank transfer: tell us and we will record it.',
    p.branchPhone ? `Questions? Call ${p.branchName} at ${p.branchPhone}.` : '',
  ].filter((x) => x !== '');
  const html = paragraphs
    .map((x) =>
      x === p.link
        ? `<p><a href="${escape(x)}">Pay ${escape(formatUsd(p.amount))} by card</a></p>`
        : `<p>${escape(x)}</p>`,
    )
    .join('\n');
  return { subject, text: paragraphs.join('\n\n'), html };
}
