import {
  cancellationDeadline,
  cancellationWindowOpen,
  contractRules,
  endOfDayInZone,
  findingsSummary,
  FTC_429_BUYER_STATEMENT,
  FTC_COOLING_OFF_SOURCE,
  money,
  taxForHomeowner,
  todayInZone,
  toMoneyString,
  type CancellationPreview,
  type ContractRules,
  type FindingsSummary,
  type OptionTax,
  type SettlementResult,
  type SigningBranch,
  type SigningContractStatus,
  type SigningNotice,
  type SigningOption,
} from '@loambook/common';
import type { OptionRecord, ProposalRecord } from '../proposals/proposals.repository';
import type {
  ContractRecord,
  InspectionForDocument,
  Person,
  SigningBranchRecord,
  SigningLead,
} from './signing.repository';

/** Everything a proposal's documents and the signing page are made from. */
export interface ProposalContext {
  proposal: ProposalRecord;
  options: OptionRecord[];
  lead: SigningLead;
  branch: SigningBranchRecord;
  salesperson: Person | null;
  inspection: InspectionForDocument | null;
  survey: SettlementResult | null;
  /** The sales-tax treatment the totals were computed with. */
  tax: OptionTax;
}

export interface PricedOption {
  option: SigningOption;
  rules: ContractRules;
}

export function branchView(b: SigningBranchRecord): SigningBranch {
  return {
    name: b.name,
    addressLine1: b.addressLine1,
    city: b.city,
    state: b.state,
    postalCode: b.postalCode,
    phone: b.phone,
    timezone: b.timezone,
  };
}

export const branchAddressLine = (b: SigningBranchRecord) =>
  `${b.addressLine1}, ${b.city}, ${b.state} ${b.postalCode}`;

/**
 * The options as the homeowner sees them (prices, no costs), each with the notices its contract carries:
 * which notices apply depends on the option's price (Florida's apply over $2,500) and the property's state.
 */
export function pricedOptions(ctx: ProposalContext, deposit: string | null): PricedOption[] {
  return ctx.options.map((o) => {
    const rules = contractRules({
      state: ctx.lead.state,
      contractPrice: o.totals.customerTotal,
      deposit: deposit ?? '0',
    });
    const hasDeposit = deposit !== null && money(deposit).greaterThan(0);
    const option: SigningOption = {
      id: o.id,
      position: o.position,
      title: o.title,
      description: o.description,
      lines: o.lines.map((l) => ({
        position: l.position,
        code: l.code,
        description: l.description,
        quantity: l.quantity,
        unit: l.unit,
        unitPrice: l.unitPrice,
        amount: toMoneyString(money(l.quantity).times(l.unitPrice)),
      })),
      listTotal: o.totals.listTotal,
      discount: { kind: o.discountKind, value: o.discountKind === 'none' ? '0' : o.discountValue },
      discountTotal: o.totals.discountTotal,
      netTotal: o.totals.netTotal,
      tax: taxForHomeowner({
        treatment: ctx.tax.treatment,
        ratePct: ctx.tax.ratePct,
        taxTotal: o.totals.taxTotal,
      }),
      customerTotal: o.totals.customerTotal,
      requiredNotices: rules.notices.filter((n) => n.ackRequired).map((n) => n.code),
      deposit: hasDeposit
        ? {
            amount: toMoneyString(deposit),
            percentOfPrice: rules.depositPercent,
            largeInitialPayment: rules.largeInitialPayment,
            clocks: rules.depositClocks,
          }
        : null,
    };
    return { option, rules };
  });
}

/** Every notice any option needs, once, naming the options that need it. */
export function unionNotices(priced: PricedOption[]): SigningNotice[] {
  const byCode = new Map<string, SigningNotice>();
  for (const { option, rules } of priced) {
    for (const n of rules.notices) {
      const seen = byCode.get(n.code);
      if (seen) seen.optionIds.push(option.id);
      else byCode.set(n.code, { ...n, optionIds: [option.id] });
    }
  }
  return [...byCode.values()];
}

export function findingsOf(ctx: ProposalContext): FindingsSummary | null {
  if (!ctx.inspection) return null;
  return findingsSummary({
    inspectionId: ctx.inspection.id,
    inspectedOn: ctx.inspection.completedAt
      ? todayInZone(ctx.branch.timezone, ctx.inspection.completedAt)
      : null,
    summary: ctx.inspection.summary,
    findings: ctx.inspection.findings,
    survey: ctx.survey,
  });
}

/** What signing today would give: the date on the branch's clock and the last day to cancel (16 CFR 429.1(a)). */
export function cancellationPreview(timezone: string, now: Date): CancellationPreview {
  const today = todayInZone(timezone, now);
  const d = cancellationDeadline({ signedOn: today });
  return {
    statement: FTC_429_BUYER_STATEMENT,
    source: FTC_COOLING_OFF_SOURCE,
    timezone,
    today,
    lastDayToCancelIfSignedToday: d.lastDayToCancel,
    lastDayWeekday: d.lastDayWeekday,
    cancellableUntilIfSignedToday: endOfDayInZone(d.lastDayToCancel, timezone),
    notes: d.notes,
  };
}

export function windowOpen(c: ContractRecord, timezone: string, now: Date): boolean {
  return (
    c.cancelledAt === null &&
    cancellationWindowOpen({ lastDayToCancel: c.lastDayToCancel, timeZone: timezone, now })
  );
}

export function contractStatus(c: ContractRecord, timezone: string, now: Date): SigningContractStatus {
  return {
    id: c.id,
    status: c.cancelledAt ? 'cancelled' : 'signed',
    optionId: c.optionId,
    optionTitle: c.optionTitle,
    price: c.price,
    tax: c.tax,
    depositAmount: c.depositAmount,
    signedByName: c.signedByName,
    signedAt: c.signedAt.toISOString(),
    signedOn: c.signedOn,
    signedInPerson: c.signedInPerson,
    lastDayToCancel: c.lastDayToCancel,
    cancellableUntil: endOfDayInZone(c.lastDayToCancel, timezone),
    canCancel: windowOpen(c, timezone, now),
    cancelledAt: c.cancelledAt?.toISOString() ?? null,
    notices: c.notices,
  };
}
