import { formatUsd, weekdayDate } from '@loambook/common';

/** Plain e-mails to the homeowner and the salesperson. Each has a text part; the HTML part carries the same words. */
const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const html = (paragraphs: string[]) =>
  paragraphs
    .filter((p) => p !== '')
    .map((p) =>
      p.startsWith('http') ? `<p><a href="${escape(p)}">${escape(p)}</a></p>` : `<p>${escape(p)}</p>`,
    )
    .join('\n');

const mail = (subject: string, paragraphs: string[]) => ({
  subject,
  text: paragraphs.join('\n\n'),
  html: html(paragraphs),
});

export function proposalSentMail(p: {
  homeownerName: string;
  branchName: string;
  branchPhone: string | null;
  salespersonName: string | null;
  version: number;
  options: { position: number; title: string; customerTotal: string }[];
  link: string;
  expiresOn: string;
}) {
  return mail(`Your foundation repair proposal from ${p.branchName}`, [
    `Hello ${p.homeownerName},`,
    `${p.salespersonName ?? p.branchName} has sent you proposal version ${p.version}. The proposal is attached as a PDF.`,
    ...p.options.map((o) => `Option ${o.position}: ${o.title}, ${formatUsd(o.customerTotal)}`),
    'To read it online and, if you choose, sign it, open this link (it works until ' +
      `${weekdayDate(p.expiresOn)}; please do not forward it):`,
    p.link,
    'If you sign, you may cancel until midnight of the third business day after the day you sign; the signed ' +
      'contract states the exact day and comes with the cancellation forms.',
    p.branchPhone ? `Questions? Call ${p.branchName} at ${p.branchPhone}.` : '',
  ]);
}

export function contractSignedMail(p: {
  homeownerName: string;
  branchName: string;
  optionTitle: string;
  price: string;
  signedOn: string;
  lastDayToCancel: string;
  timezone: string;
  link: string | null;
}) {
  return mail(`Your signed contract with ${p.branchName}`, [
    `Hello ${p.homeownerName},`,
    `Thank you. Your signed contract for "${p.optionTitle}" (${formatUsd(p.price)}), dated ${weekdayDate(p.signedOn)}, ` +
      'is attached as a PDF, with two notice-of-cancellation forms.',
    `You may cancel until midnight at the end of ${weekdayDate(p.lastDayToCancel)} (${p.timezone} time), without ` +
      'any penalty: sign and send one of the forms, or use this link:',
    p.link ?? '',
    'Keep this e-mail and the PDF for your records.',
  ]);
}

export function cancellationConfirmedMail(p: {
  homeownerName: string;
  branchName: string;
  branchPhone: string | null;
  cancelledOn: string;
  paidSomething: boolean;
}) {
  return mail(`Your contract with ${p.branchName} is cancelled`, [
    `Hello ${p.homeownerName},`,
    `Your contract with ${p.branchName} was cancelled on ${weekdayDate(p.cancelledOn)}. You owe nothing under it.`,
    p.paidSomething
      ? 'Any payment you made under the contract, the deposit included, will be refunded within 10 business days.'
      : 'If you made any payment under the contract, it will be refunded within 10 business days.',
    p.branchPhone ? `Questions? Call ${p.branchName} at ${p.branchPhone}.` : '',
  ]);
}

export function cancellationNoticeMail(p: {
  recipientName: string;
  homeownerName: string;
  branchName: string;
  how: string;
  depositAmount: string;
  link: string;
}) {
  return mail(`Contract cancelled: ${p.homeownerName}`, [
    `Hello ${p.recipientName},`,
    `The contract of ${p.homeownerName} (${p.branchName}) has been cancelled: ${p.how}`,
    'Refund every payment made under the contract, the deposit included, within 10 business days of the ' +
      `cancellation (FTC guidance). Deposit on the contract: ${formatUsd(p.depositAmount)}.`,
    `The lead: ${p.link}`,
  ]);
}
