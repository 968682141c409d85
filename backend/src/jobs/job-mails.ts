import { jobEndOn, weekdayDate } from '@loambook/common';

/** The homeowner's e-mails about the job's days. A text part, and an HTML part with the same words. */
const escape = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const mail = (subject: string, paragraphs: string[]) => {
  const kept = paragraphs.filter((p) => p !== '');
  return {
    subject,
    text: kept.join('\n\n'),
    html: kept.map((p) => `<p>${escape(p)}</p>`).join('\n'),
  };
};

const days = (startOn: string, durationDays: number) =>
  durationDays === 1
    ? `on ${weekdayDate(startOn)}`
    : `from ${weekdayDate(startOn)} to ${weekdayDate(jobEndOn(startOn, durationDays))} (${durationDays} days)`;

export interface JobMailFacts {
  homeownerName: string;
  branchName: string;
  branchPhone: string | null;
  jobNumber: string;
  addressLine1: string;
  city: string;
}

const closing = (p: JobMailFacts) => [
  'Before the crew arrives, please keep the area along the foundation clear and make sure pets are inside. ' +
    'The utilities will mark their lines near the house after we call 811; please leave the marks in place.',
  p.branchPhone
    ? `Questions, or does the date not suit you? Call ${p.branchName} at ${p.branchPhone} and quote job ${p.jobNumber}.`
    : `Questions? Reply to this e-mail and quote job ${p.jobNumber}.`,
];

export function jobScheduledMail(p: JobMailFacts & { startOn: string; durationDays: number }) {
  return mail(`Your foundation repair is scheduled: ${weekdayDate(p.startOn)}`, [
    `Hello ${p.homeownerName},`,
    `${p.branchName} has scheduled the work at ${p.addressLine1}, ${p.city} ${days(p.startOn, p.durationDays)}.`,
    ...closing(p),
  ]);
}

export function jobMovedMail(
  p: JobMailFacts & {
    startOn: string;
    durationDays: number;
    previousStartOn: string;
    previousDurationDays: number;
  },
) {
  return mail(`New date for your foundation repair: ${weekdayDate(p.startOn)}`, [
    `Hello ${p.homeownerName},`,
    `${p.branchName} has moved the work at ${p.addressLine1}, ${p.city}. It was planned ` +
      `${days(p.previousStartOn, p.previousDurationDays)}; it is now ${days(p.startOn, p.durationDays)}.`,
    ...closing(p),
  ]);
}

export function jobUnscheduledMail(p: JobMailFacts & { previousStartOn: string }) {
  return mail('Your foundation repair date is on hold', [
    `Hello ${p.homeownerName},`,
    `The work at ${p.addressLine1}, ${p.city} planned for ${weekdayDate(p.previousStartOn)} is on hold: ` +
      `${p.branchName} will contact you with a new date.`,
    p.branchPhone ? `Questions? Call ${p.branchName} at ${p.branchPhone} and quote job ${p.jobNumber}.` : '',
  ]);
}
