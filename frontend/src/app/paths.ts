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
