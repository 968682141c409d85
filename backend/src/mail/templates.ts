/** Plain, readable e-mails. Each has a text part; the HTML part carries the same words. */
const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export function invitationMail(p: {
  name: string;
  invitedBy: string;
  roleLabel: string;
  link: string;
  hours: number;
}) {
  const text = [
    `Hello ${p.name},`,
    '',
    `${p.invitedBy} has invited you to Loambook as ${p.roleLabel}.`,
    'Choose your password with this link (it works once and expires in ' + p.hours + ' hours):',
    '',
    p.link,
    '',
    'If you were not expecting this, you can ignore this e-mail.',
  ].join('\n');
  const html = `<p>Hello ${escape(p.name)},</p>
<p>${escape(p.invitedBy)} has invited you to Loambook as ${escape(p.roleLabel)}.</p>
<p><a href="${escape(p.link)}">Choose your password</a> — the link works once and expires in ${p.hours} hours.</p>
<p style="color:#666">If you were not expecting this, you can ignore this e-mail.</p>`;
  return { subject: 'Your Loambook invitation', text, html };
}
