import {
  validateCommissionPlan,
  type CommissionPlanBasis,
  type CommissionPlanInput,
  type CommissionPlanView,
  type CommissionRate,
  type CommissionTierMeasure,
  type CommissionTierMode,
} from '@loambook/common';

export interface TierValues {
  from: string;
  ratePct: string;
}

/** What the plan editor holds: every field as typed. branchId '' is the company-wide default. */
export interface PlanFormValues {
  name: string;
  branchId: string;
  basis: CommissionPlanBasis;
  rateKind: 'flat' | 'tiered';
  ratePct: string;
  measure: CommissionTierMeasure;
  mode: CommissionTierMode;
  tiers: TierValues[];
  firstMilestonePct: string;
  effectiveFrom: string;
  active: boolean;
}

export const EMPTY_PLAN: PlanFormValues = {
  name: '',
  branchId: '',
  basis: 'net_price',
  rateKind: 'flat',
  ratePct: '',
  measure: 'monthly_volume',
  mode: 'step',
  tiers: [{ from: '0', ratePct: '' }],
  firstMilestonePct: '50',
  effectiveFrom: '',
  active: true,
};

export function valuesFromPlan(p: CommissionPlanView): PlanFormValues {
  return {
    name: p.name,
    branchId: p.branchId ?? '',
    basis: p.basis,
    rateKind: p.rate.kind,
    ratePct: p.rate.kind === 'flat' ? p.rate.ratePct : '',
    measure: p.rate.kind === 'tiered' ? p.rate.measure : 'monthly_volume',
    mode: p.rate.kind === 'tiered' ? p.rate.mode : 'step',
    tiers:
      p.rate.kind === 'tiered'
        ? p.rate.tiers.map((t) => ({ from: t.from, ratePct: t.ratePct }))
        : [{ from: '0', ratePct: '' }],
    firstMilestonePct: p.firstMilestonePct,
    effectiveFrom: p.effectiveFrom,
    active: p.active,
  };
}

const trimmed = (s: string) => s.trim();

export function rateFromValues(v: PlanFormValues): CommissionRate {
  return v.rateKind === 'flat'
    ? { kind: 'flat', ratePct: trimmed(v.ratePct) }
    : {
        kind: 'tiered',
        measure: v.measure,
        mode: v.mode,
        tiers: v.tiers.map((t) => ({ from: trimmed(t.from).replace(/,/g, ''), ratePct: trimmed(t.ratePct) })),
      };
}

export function toPlanInput(v: PlanFormValues): CommissionPlanInput {
  return {
    branchId: v.branchId || null,
    name: v.name.trim(),
    basis: v.basis,
    rate: rateFromValues(v),
    firstMilestonePct: trimmed(v.firstMilestonePct),
    effectiveFrom: v.effectiveFrom,
    active: v.active,
  };
}

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/**
 * The faults the server would answer, keyed as it keys them ("rate.tiers[1].from"): the commission rules'
 * own check (common/src/commissions) plus the name and the start date.
 */
export function validatePlanValues(v: PlanFormValues): Record<string, string> {
  const errors: Record<string, string> = {};
  if (!v.name.trim()) errors.name = 'Give the plan a name.';
  if (!DAY.test(v.effectiveFrom)) errors.effectiveFrom = 'Choose the day the plan starts.';
  const input = toPlanInput(v);
  for (const issue of validateCommissionPlan({
    basis: input.basis,
    rate: input.rate,
    firstMilestonePct: input.firstMilestonePct,
  })) {
    errors[issue.field] ??= issue.message;
  }
  return errors;
}
