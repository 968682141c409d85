import {
  endOfDayInZone,
  findingsSummary,
  FTC_429_BUYER_STATEMENT,
  money,
  SIGNING_CAUTIONS,
  statutoryWordingStatement,
  taxForHomeowner,
  todayInZone,
  type Branch,
  type CancellationDeadlineResult,
  type DepositRulesResult,
  type Inspection,
  type LeadDetail,
  type ProposalDetail,
  type ProposalOption,
  type RequiredNotice,
  type SigningNotice,
  type SigningOption,
} from '@loambook/common';
import type { SigningDocumentData } from '@/features/signing/components/signing-document';

/**
 * The price a contract's notices are worked out for: the option's total, or the smallest amount when it has
 * none (as contractRules in common/ does), which leaves only the federal notice.
 */
export function noticePrice(option: Pick<ProposalOption, 'totals'>): string {
  return money(option.totals.customerTotal).greaterThan(0) ? option.totals.customerTotal : '0.01';
}

/** A notice as the signing page shows it (contractRules in common/src/signing/signing-rules.ts). */
function required(n: DepositRulesResult['notices'][number]): RequiredNotice {
  return {
    ...n,
    ackRequired: true,
    wordingIncluded: n.text !== undefined,
    wordingStatement: n.text === undefined ? statutoryWordingStatement(n) : null,
  };
}

/**
 * What the homeowner reads before signing on the salesperson's device: the same page as the e-mailed link,
 * built from the proposal, the lead and the branch, with the notices and the last day to cancel from the
 * server's calculators (the rules it signs with; it checks them all again when the contract is signed).
 */
export function inPersonDocument(p: {
  proposal: ProposalDetail;
  lead: LeadDetail;
  branch: Branch;
  inspection: Inspection | null;
  /** Today on the branch's clock. */
  today: string;
  deadline: CancellationDeadlineResult;
  /** Per option id: the deposit rules at the option's price. */
  rules: Map<string, DepositRulesResult>;
}): SigningDocumentData {
  const { proposal, lead, branch, inspection, deadline } = p;
  const tz = branch.timezone;
  const notices = new Map<string, SigningNotice>();
  const options: SigningOption[] = [...proposal.options]
    .sort((a, b) => a.position - b.position)
    .map((o) => {
      const own = (p.rules.get(o.id)?.notices ?? []).map(required);
      for (const n of own) {
        const seen = notices.get(n.code);
        if (seen) seen.optionIds.push(o.id);
        else notices.set(n.code, { ...n, optionIds: [o.id] });
      }
      return {
        id: o.id,
        position: o.position,
        title: o.title,
        description: o.description,
        lines: [...o.lines]
          .sort((a, b) => a.position - b.position)
          .map((l) => ({
            position: l.position,
            code: l.code,
            description: l.description,
            quantity: l.quantity,
            unit: l.unit,
            unitPrice: l.unitPrice,
            amount: l.lineList,
          })),
        listTotal: o.totals.listTotal,
        discount: o.discount,
        discountTotal: o.totals.discountTotal,
        netTotal: o.totals.netTotal,
        tax: taxForHomeowner({
          treatment: proposal.tax.treatment,
          ratePct: proposal.tax.ratePct,
          taxTotal: o.totals.taxTotal,
        }),
        customerTotal: o.totals.customerTotal,
        requiredNotices: own.map((n) => n.code),
        deposit: null,
      };
    });

  return {
    branch: {
      name: branch.name,
      addressLine1: branch.addressLine1,
      city: branch.city,
      state: branch.state,
      postalCode: branch.postalCode,
      phone: branch.phone,
      timezone: tz,
    },
    homeowner: { name: lead.homeownerName, email: lead.email ?? null, phone: lead.phonePrimary ?? null },
    property: {
      addressLine1: lead.addressLine1,
      city: lead.city,
      state: lead.state,
      postalCode: lead.postalCode,
    },
    salesperson: lead.salespersonName ? { name: lead.salespersonName, email: '' } : null,
    proposal: { version: proposal.version, sentAt: proposal.sentAt },
    findings: inspection
      ? findingsSummary({
          inspectionId: inspection.id,
          inspectedOn: inspection.completedAt ? todayInZone(tz, new Date(inspection.completedAt)) : null,
          summary: inspection.summary,
          findings: inspection.findings,
          survey: null,
        })
      : null,
    options,
    cautions: [...SIGNING_CAUTIONS],
    notices: [...notices.values()],
    cancellation: {
      statement: FTC_429_BUYER_STATEMENT,
      source: deadline.source,
      timezone: tz,
      today: p.today,
      lastDayToCancelIfSignedToday: deadline.lastDayToCancel,
      lastDayWeekday: deadline.lastDayWeekday,
      cancellableUntilIfSignedToday: endOfDayInZone(deadline.lastDayToCancel, tz),
      notes: deadline.notes,
    },
  };
}
