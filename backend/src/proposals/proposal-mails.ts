import {
  APPROVAL_REASON_LABELS,
  APPROVER_LABELS,
  formatUsd,
  type ApprovalFigures,
  type ApprovalReason,
} from '@loambook/common';

/** Plain e-mails about the approval queue. Each has a text part; the HTML part carries the same words. */
const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const optionLine = (o: ApprovalFigures['options'][number]) =>
  `${o.title}: list ${formatUsd(o.listTotal)}, discount ${formatUsd(o.discountTotal)} (${o.discountPct}%), ` +
  `net ${formatUsd(o.netTotal)}, cost ${formatUsd(o.costTotal)}, gross margin ` +
  `${o.grossMarginPct === null ? 'none' : `${o.grossMarginPct}%`}`;

export function approvalRequestedMail(p: {
  recipientName: string;
  requestedBy: string;
  homeownerName: string;
  version: number;
  branchName: string;
  approver: 'branch_manager' | 'owner';
  reasons: ApprovalReason[];
  figures: ApprovalFigures;
  link: string;
}) {
  const reasons = p.reasons.map((r) => APPROVAL_REASON_LABELS[r]);
  const who =
    p.approver === 'owner'
      ? 'It is beyond a branch manager’s authority: only the owner can approve it.'
      : `A ${APPROVER_LABELS.branch_manager.toLowerCase()} of ${p.branchName} can approve it.`;
  const text = [
    `Hello ${p.recipientName},`,
    '',
    `${p.requestedBy} asks for approval of proposal version ${p.version} for ${p.homeownerName} (${p.branchName}).`,
    `Why: ${reasons.join('; ')}.`,
    `Margin floor ${p.figures.marginFloorPct}%, discount authority: salesperson ` +
      `${p.figures.discountAuthority.salesperson}%, branch manager ${p.figures.discountAuthority.branch_manager}%.`,
    '',
    ...p.figures.options.map(optionLine),
    '',
    who,
    `Open the approval queue: ${p.link}`,
  ].join('\n');
  const html = `<p>Hello ${escape(p.recipientName)},</p>
<p>${escape(p.requestedBy)} asks for approval of proposal version ${p.version} for ${escape(p.homeownerName)}
(${escape(p.branchName)}).</p>
<p>Why: ${escape(reasons.join('; '))}.</p>
<ul>${p.figures.options.map((o) => `<li>${escape(optionLine(o))}</li>`).join('')}</ul>
<p>${escape(who)}</p>
<p><a href="${escape(p.link)}">Open the approval queue</a></p>`;
  return { subject: `Approval needed: proposal for ${p.homeownerName}`, text, html };
}

export function approvalDecidedMail(p: {
  recipientName: string;
  decidedBy: string;
  decision: 'approved' | 'refused';
  homeownerName: string;
  version: number;
  note: string | null;
  link: string;
}) {
  const outcome =
    p.decision === 'approved'
      ? 'approved it: it may now be sent to the homeowner.'
      : 'refused it. Change the proposal and submit it again.';
  const text = [
    `Hello ${p.recipientName},`,
    '',
    `${p.decidedBy} has ${outcome}`,
    `Proposal version ${p.version} for ${p.homeownerName}.`,
    ...(p.note ? ['', `Note: ${p.note}`] : []),
    '',
    `Open the proposal: ${p.link}`,
  ].join('\n');
  const html = `<p>Hello ${escape(p.recipientName)},</p>
<p>${escape(p.decidedBy)} has ${escape(outcome)}</p>
<p>Proposal version ${p.version} for ${escape(p.homeownerName)}.</p>
${p.note ? `<p>Note: ${escape(p.note)}</p>` : ''}
<p><a href="${escape(p.link)}">Open the proposal</a></p>`;
  return {
    subject: `Proposal ${p.decision === 'approved' ? 'approved' : 'refused'}: ${p.homeownerName}`,
    text,
    html,
  };
}
