import { generatePath } from 'react-router';

/** Why the sign-in page is shown, when it was not the person's own choice. */
export type SignInReason = 'session-ended' | 'signed-out';

/**
 * Every screen's address in one place: `pattern` for the router, `href()` for links. Nothing else in the
 * code writes a path by hand.
 */
export const paths = {
  home: {
    pattern: '/',
    href: () => '/',
  },
  signIn: {
    pattern: '/sign-in',
    href: (options: { returnTo?: string; reason?: SignInReason } = {}) => {
      const params = new URLSearchParams();
      if (options.returnTo && options.returnTo !== '/') params.set('returnTo', options.returnTo);
      if (options.reason) params.set('reason', options.reason);
      const qs = params.toString();
      return qs ? `/sign-in?${qs}` : '/sign-in';
    },
  },
  setPassword: {
    pattern: '/set-password',
    href: (token: string) => `/set-password?token=${encodeURIComponent(token)}`,
  },
  branches: {
    pattern: '/admin/branches',
    href: () => '/admin/branches',
  },
  newBranch: {
    pattern: '/admin/branches/new',
    href: () => '/admin/branches/new',
  },
  editBranch: {
    pattern: '/admin/branches/:branchId/edit',
    href: (branchId: string) => generatePath('/admin/branches/:branchId/edit', { branchId }),
  },
  people: {
    pattern: '/admin/users',
    href: () => '/admin/users',
  },
  leads: {
    pattern: '/leads',
    href: () => '/leads',
  },
  newLead: {
    pattern: '/leads/new',
    href: () => '/leads/new',
  },
  lead: {
    pattern: '/leads/:leadId',
    href: (leadId: string) => generatePath('/leads/:leadId', { leadId }),
  },
  inspection: {
    pattern: '/inspections/:inspectionId',
    href: (inspectionId: string) => generatePath('/inspections/:inspectionId', { inspectionId }),
  },
  priceBook: {
    pattern: '/admin/price-book',
    href: () => '/admin/price-book',
  },
  newProposal: {
    pattern: '/leads/:leadId/proposals/new',
    href: (leadId: string) => generatePath('/leads/:leadId/proposals/new', { leadId }),
  },
  /** The e-mails link here: keep the path. */
  proposal: {
    pattern: '/proposals/:proposalId',
    href: (proposalId: string) => generatePath('/proposals/:proposalId', { proposalId }),
  },
  /** The e-mails link here: keep the path. */
  approvals: {
    pattern: '/approvals',
    href: () => '/approvals',
  },
  /** The homeowner's signing page: public, outside the signed-in frame. */
  sign: {
    pattern: '/sign/:token',
    href: (token: string) => generatePath('/sign/:token', { token }),
  },
  /** Field jobs (issue #4). */
  jobs: {
    pattern: '/jobs',
    href: () => '/jobs',
  },
  jobCalendar: {
    pattern: '/jobs/calendar',
    href: (week?: string) => (week ? `/jobs/calendar?week=${encodeURIComponent(week)}` : '/jobs/calendar'),
  },
  jobActualsSummary: {
    pattern: '/jobs/actuals',
    href: () => '/jobs/actuals',
  },
  job: {
    pattern: '/jobs/:jobId',
    href: (jobId: string) => generatePath('/jobs/:jobId', { jobId }),
  },
  jobField: {
    pattern: '/jobs/:jobId/field',
    href: (jobId: string) => generatePath('/jobs/:jobId/field', { jobId }),
  },
  jobComplete: {
    pattern: '/jobs/:jobId/complete',
    href: (jobId: string) => generatePath('/jobs/:jobId/complete', { jobId }),
  },
  jobSheet: {
    pattern: '/jobs/:jobId/sheet',
    href: (jobId: string) => generatePath('/jobs/:jobId/sheet', { jobId }),
  },
  today: {
    pattern: '/today',
    href: () => '/today',
  },
  crews: {
    pattern: '/admin/crews',
    href: () => '/admin/crews',
  },
  /** The bookkeeper's ledger (issue #5): filters travel in the query string. */
  ledgerJournal: {
    pattern: '/ledger/journal',
    href: () => '/ledger/journal',
  },
  ledgerAccount: {
    pattern: '/ledger/accounts',
    href: (o: { accountId?: string; from?: string; to?: string } = {}) => {
      const p = new URLSearchParams();
      if (o.accountId) p.set('account', o.accountId);
      if (o.from) p.set('from', o.from);
      if (o.to) p.set('to', o.to);
      const qs = p.toString();
      return qs ? `/ledger/accounts?${qs}` : '/ledger/accounts';
    },
  },
  trialBalance: {
    pattern: '/ledger/trial-balance',
    href: () => '/ledger/trial-balance',
  },
  /** Reconciliation (issue #5): the workspace takes the account and the period in the query string. */
  reconciliation: {
    pattern: '/reconciliation',
    href: (o: { bankAccountId?: string | null; from?: string; to?: string } = {}) => {
      const p = new URLSearchParams();
      if (o.bankAccountId) p.set('account', o.bankAccountId);
      if (o.from) p.set('from', o.from);
      if (o.to) p.set('to', o.to);
      const qs = p.toString();
      return qs ? `/reconciliation?${qs}` : '/reconciliation';
    },
  },
  bankAccounts: {
    pattern: '/reconciliation/accounts',
    href: () => '/reconciliation/accounts',
  },
  uploadStatement: {
    pattern: '/reconciliation/upload',
    href: (bankAccountId?: string | null) =>
      bankAccountId
        ? `/reconciliation/upload?account=${encodeURIComponent(bankAccountId)}`
        : '/reconciliation/upload',
  },
  payoutBreakdown: {
    pattern: '/payouts/:payoutId',
    href: (payoutId: string) => generatePath('/payouts/:payoutId', { payoutId }),
  },
  /** Commissions (issue #5): plans, statements, a salesperson's own. */
  commissionPlans: {
    pattern: '/commissions/plans',
    href: () => '/commissions/plans',
  },
  commissionStatements: {
    pattern: '/commissions/statements',
    href: () => '/commissions/statements',
  },
  commissionStatement: {
    pattern: '/commissions/statements/:statementId',
    href: (statementId: string) => generatePath('/commissions/statements/:statementId', { statementId }),
  },
  myCommissions: {
    pattern: '/commissions/mine',
    href: () => '/commissions/mine',
  },
  /** Payments (issue #5): the bookkeeper's list of money received. */
  payments: {
    pattern: '/payments',
    href: () => '/payments',
  },
  /** The card processor sends the homeowner here after paying (backend THANK_YOU_PATH): keep the path. */
  paymentThankYou: {
    pattern: '/payment/thank-you',
    href: (sessionId: string) => `/payment/thank-you?session_id=${encodeURIComponent(sessionId)}`,
  },
  /** ... and here when they leave the payment page without paying (backend CANCELLED_PATH). */
  paymentCancelled: {
    pattern: '/payment/cancelled',
    href: () => '/payment/cancelled',
  },
} as const;

/**
 * A return path from the address bar is only followed when it stays inside Loambook
 * ("/admin/users", never "//elsewhere.example" or "https://…").
 */
export function safeReturnPath(value: string | null | undefined): string {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) {
    return paths.home.href();
  }
  if (value.startsWith(paths.signIn.pattern) || value.startsWith(paths.setPassword.pattern)) {
    return paths.home.href();
  }
  return value;
}
