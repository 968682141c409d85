import { Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import {
  asSubject,
  validateCommissionPlan,
  type CommissionIssue,
  type CommissionPlan,
  type CommissionPlanInput,
  type CommissionPlanPatch,
  type CommissionPlanView,
  type CommissionRate,
  type CommissionTier,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound } from '../common/domain-error';
import { commissionRule, pgError } from './commission-errors';
import { CommissionsRepository, type NewPlan } from './commissions.repository';

const MAX_TIERS = 20;
const planNotFound = () => notFound('commission plan');

/**
 * The rate as it came over JSON, reduced to the fields of a CommissionRate (anything else is dropped) so
 * that validateCommissionPlan sees exactly what will be stored. Shape faults are issues too.
 */
export function rateFromInput(raw: unknown): { rate: CommissionRate | null; issues: CommissionIssue[] } {
  const issue = (field: string, message: string): CommissionIssue => ({
    code: 'COMMISSION.PLAN_INVALID',
    field,
    message,
  });
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    return { rate: null, issues: [issue('rate.kind', 'The rate is flat or tiered.')] };
  }
  const r = raw as Record<string, unknown>;
  if (r.kind === 'flat') return { rate: { kind: 'flat', ratePct: r.ratePct as string }, issues: [] };
  if (r.kind !== 'tiered') return { rate: null, issues: [issue('rate.kind', 'The rate is flat or tiered.')] };
  if (!Array.isArray(r.tiers)) {
    return { rate: null, issues: [issue('rate.tiers', 'Add at least one tier.')] };
  }
  if (r.tiers.length > MAX_TIERS) {
    return { rate: null, issues: [issue('rate.tiers', `At most ${MAX_TIERS} tiers.`)] };
  }
  const issues: CommissionIssue[] = [];
  const tiers: CommissionTier[] = r.tiers.map((t: unknown, i) => {
    if (typeof t !== 'object' || t === null) {
      issues.push(issue(`rate.tiers[${i}]`, 'A tier has a start and a rate.'));
      return { from: '', ratePct: '' };
    }
    const tier = t as Record<string, unknown>;
    return { from: tier.from as string, ratePct: tier.ratePct as string };
  });
  return {
    rate: {
      kind: 'tiered',
      measure: r.measure as 'monthly_volume',
      mode: r.mode as 'step',
      tiers,
    },
    issues,
  };
}

/** The owner's commission plans: which rate applies to which contracts, from which day. */
@Injectable()
export class CommissionPlansService {
  constructor(private readonly repo: CommissionsRepository) {}

  async list(user: SessionUser): Promise<CommissionPlanView[]> {
    const plans = await this.repo.plans();
    return plans.filter((p) =>
      user.ability.can('read', asSubject('CommissionPlan', { branchId: p.branchId })),
    );
  }

  async get(user: SessionUser, id: string): Promise<CommissionPlanView> {
    const plan = await this.repo.planViewById(id);
    if (!plan || !user.ability.can('read', asSubject('CommissionPlan', { branchId: plan.branchId }))) {
      throw planNotFound();
    }
    return plan;
  }

  async create(user: SessionUser, input: CommissionPlanInput): Promise<CommissionPlanView> {
    const branchId = input.branchId ?? null;
    ForbiddenError.from(user.ability).throwUnlessCan('create', asSubject('CommissionPlan', { branchId }));
    const plan = await this.checked({
      branchId,
      name: input.name,
      basis: input.basis,
      rate: input.rate,
      firstMilestonePct: input.firstMilestonePct,
      effectiveFrom: input.effectiveFrom,
      active: input.active ?? true,
    });
    const id = await this.write(() => this.repo.insertPlan({ ...plan, createdBy: user.id }));
    return (await this.repo.planViewById(id))!;
  }

  /**
   * Changes a plan. Once a contract's split names it, only its name and whether it is offered for new
   * contracts may change (COMMISSION.PLAN_IN_USE): a new rate is a new plan with a later start.
   */
  async update(user: SessionUser, id: string, patch: CommissionPlanPatch): Promise<CommissionPlanView> {
    const current = await this.get(user, id);
    ForbiddenError.from(user.ability).throwUnlessCan(
      'update',
      asSubject('CommissionPlan', { branchId: current.branchId }),
    );
    const next = {
      branchId: patch.branchId === undefined ? current.branchId : patch.branchId,
      name: patch.name ?? current.name,
      basis: patch.basis ?? current.basis,
      rate: patch.rate ?? current.rate,
      firstMilestonePct: patch.firstMilestonePct ?? current.firstMilestonePct,
      effectiveFrom: patch.effectiveFrom ?? current.effectiveFrom,
      active: patch.active ?? current.active,
    };
    if (next.branchId !== current.branchId) {
      ForbiddenError.from(user.ability).throwUnlessCan(
        'update',
        asSubject('CommissionPlan', { branchId: next.branchId }),
      );
    }
    const plan = await this.checked(next);
    const termsChanged =
      plan.branchId !== current.branchId ||
      plan.basis !== current.basis ||
      JSON.stringify(plan.rate) !== JSON.stringify(current.rate) ||
      plan.firstMilestonePct !== current.firstMilestonePct ||
      plan.effectiveFrom !== current.effectiveFrom;
    if (termsChanged && (await this.repo.planInUse(id))) {
      throw conflict(
        'COMMISSION.PLAN_IN_USE',
        'Contracts are already computed under this plan: only its name and whether it is offered may change. Make a new plan with a later start date.',
      );
    }
    await this.write(() => this.repo.updatePlan(id, plan));
    return (await this.repo.planViewById(id))!;
  }

  /** The plan's values checked by the commission rules (422 with the field at fault). */
  private async checked(p: Omit<NewPlan, 'createdBy'>): Promise<Omit<NewPlan, 'createdBy'>> {
    const { rate, issues } = rateFromInput(p.rate);
    if (p.branchId && !(await this.repo.branchExists(p.branchId))) {
      issues.unshift({ code: 'COMMISSION.PLAN_INVALID', field: 'branchId', message: 'Unknown branch.' });
    }
    if (issues.length || !rate) throw commissionRule(issues);
    const plan: CommissionPlan = { basis: p.basis, rate, firstMilestonePct: p.firstMilestonePct };
    const problems = validateCommissionPlan(plan);
    if (problems.length) throw commissionRule(problems);
    return { ...p, rate };
  }

  private async write<T>(work: () => Promise<T>): Promise<T> {
    try {
      return await work();
    } catch (e) {
      const pg = pgError(e);
      if (pg.code === '23505' && pg.constraint === 'commission_plans_scope_from_unique') {
        throw conflict(
          'COMMISSION.PLAN_DATE_TAKEN',
          'Another active plan for the same branch (or the company default) starts that day.',
        );
      }
      if (pg.code === '23001' || pg.constraint === 'commission_plans_in_use') {
        throw conflict('COMMISSION.PLAN_IN_USE', 'Contracts are already computed under this plan.');
      }
      throw e;
    }
  }
}
