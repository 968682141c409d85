import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  computeCommission,
  validateSplits,
  type CommissionBreakdown,
  type CommissionDeal,
  type ContractCommissionSplitsView,
  type SetCommissionSplitsInput,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import { commissionRule, pgError } from './commission-errors';
import {
  CommissionsRepository,
  type CommissionContract,
  type PlanRow,
  type SplitRow,
} from './commissions.repository';

const contractNotFound = () => notFound('contract');
const alreadyEarned = () =>
  conflict(
    'COMMISSION.ALREADY_EARNED',
    'A commission has already been earned on this contract: its split can no longer change.',
  );

export type EnsuredSplits = { plan: PlanRow; splits: SplitRow[] } | { skipped: 'no_plan' | 'no_salesperson' };

/** The deal the commission rules compute: net price, cost and the split in contract order. */
export function dealOf(c: CommissionContract, splits: readonly SplitRow[]): CommissionDeal {
  return {
    netPrice: c.netPrice,
    cost: c.cost,
    splits: splits.map((s) => ({
      salespersonId: s.salespersonId,
      sharePct: s.sharePct,
      monthVolumeBefore: s.monthVolumeBefore,
    })),
  };
}

/**
 * Who shares a contract's commission. Until someone sets it, the split is 100% to the contract's
 * salesperson; it is stored (with the plan and the salesperson's month volume frozen) the first time the
 * earning check looks at the contract, or when a manager sets it. Once a line is earned it never changes.
 */
@Injectable()
export class CommissionSplitsService {
  constructor(
    private readonly repo: CommissionsRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  private readable(user: SessionUser, c: CommissionContract | null): CommissionContract {
    if (
      !c ||
      !user.ability.can(
        'read',
        asSubject('Contract', { branchId: c.branchId, salespersonId: c.salespersonId }),
      )
    ) {
      throw contractNotFound();
    }
    return c;
  }

  async view(user: SessionUser, contractId: string): Promise<ContractCommissionSplitsView> {
    const c = this.readable(user, await this.repo.contract(contractId));
    return this.viewOf(c, this.knex);
  }

  private async viewOf(c: CommissionContract, db: Knex | Knex.Transaction) {
    const stored = await this.repo.splits(c.id, db);
    let plan: PlanRow | null;
    let splits: SplitRow[];
    if (stored.length) {
      plan = await this.repo.plan(stored[0]!.planId, db);
      splits = stored;
    } else {
      plan = await this.repo.applicablePlan(c.branchId, c.signedOn, db);
      splits = c.salespersonId ? [await this.defaultSplit(c, c.salespersonId, db)] : [];
    }
    let preview: CommissionBreakdown | null = null;
    if (plan && splits.length) {
      try {
        preview = computeCommission(plan, dealOf(c, splits));
      } catch {
        preview = null;
      }
    }
    return {
      contractId: c.id,
      leadId: c.leadId,
      branchId: c.branchId,
      plan: plan ? { id: plan.id, name: plan.name } : null,
      stored: stored.length > 0,
      earned: await this.repo.hasLines(c.id, db),
      cancelled: c.cancelledAt !== null,
      splits: splits.map((s) => ({
        salespersonId: s.salespersonId,
        salespersonName: s.salespersonName,
        sharePct: s.sharePct,
        monthVolumeBefore: s.monthVolumeBefore,
      })),
      preview,
      eligible: await this.repo.eligibleSalespeople(c.branchId, db),
    };
  }

  private async defaultSplit(
    c: CommissionContract,
    salespersonId: string,
    db: Knex | Knex.Transaction,
  ): Promise<SplitRow> {
    const names = await this.repo.userNames([salespersonId], db);
    return {
      salespersonId,
      salespersonName: names.get(salespersonId) ?? '',
      sharePct: '100',
      monthVolumeBefore: await this.repo.monthVolumeBefore(c, salespersonId, db),
      planId: '',
      position: 0,
    };
  }

  /** The stored split, storing the default (100% to the salesperson) when there is none yet. */
  async ensure(c: CommissionContract, trx: Knex.Transaction): Promise<EnsuredSplits> {
    const stored = await this.repo.splits(c.id, trx);
    if (stored.length) {
      const plan = await this.repo.plan(stored[0]!.planId, trx);
      return { plan: plan!, splits: stored };
    }
    if (!c.salespersonId) return { skipped: 'no_salesperson' };
    const plan = await this.repo.applicablePlan(c.branchId, c.signedOn, trx);
    if (!plan) return { skipped: 'no_plan' };
    const volume = await this.repo.monthVolumeBefore(c, c.salespersonId, trx);
    await this.repo.replaceSplits(
      c,
      plan.id,
      [{ salespersonId: c.salespersonId, sharePct: '100', monthVolumeBefore: volume, position: 0 }],
      null,
      trx,
    );
    return { plan, splits: await this.repo.splits(c.id, trx) };
  }

  /** The manager (or owner) sets who shares the commission, before any of it is earned. */
  async set(
    user: SessionUser,
    contractId: string,
    input: SetCommissionSplitsInput,
  ): Promise<ContractCommissionSplitsView> {
    try {
      return await inTransaction(this.knex, async (trx) => {
        const c = this.readable(user, await this.repo.lockedContract(contractId, trx));
        ForbiddenError.from(user.ability).throwUnlessCan(
          'manage',
          asSubject('Contract', { branchId: c.branchId, salespersonId: c.salespersonId }),
        );
        if (c.cancelledAt) {
          throw conflict('COMMISSION.CONTRACT_CANCELLED', 'This contract was cancelled: it earns nothing.');
        }
        if (await this.repo.hasLines(c.id, trx)) throw alreadyEarned();
        const issues = validateSplits(input.splits);
        if (issues.length) throw commissionRule(issues);
        const eligible = new Set((await this.repo.eligibleSalespeople(c.branchId, trx)).map((p) => p.id));
        const strangers = input.splits
          .map((s, i) => ({ s, i }))
          .filter(({ s }) => !eligible.has(s.salespersonId))
          .map(({ i }) => ({
            field: `splits[${i}].salespersonId`,
            message: 'That person does not sell in this branch.',
          }));
        if (strangers.length) {
          throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', strangers);
        }
        const stored = await this.repo.splits(c.id, trx);
        const plan = stored.length
          ? await this.repo.plan(stored[0]!.planId, trx)
          : await this.repo.applicablePlan(c.branchId, c.signedOn, trx);
        if (!plan) {
          throw new DomainError(
            'rule',
            'COMMISSION.NO_PLAN',
            'No commission plan applies to this contract yet: the owner sets one up first.',
          );
        }
        const rows = [];
        for (const [position, s] of input.splits.entries()) {
          rows.push({
            salespersonId: s.salespersonId,
            sharePct: s.sharePct,
            monthVolumeBefore: await this.repo.monthVolumeBefore(c, s.salespersonId, trx),
            position,
          });
        }
        await this.repo.replaceSplits(c, plan.id, rows, user.id, trx);
        return this.viewOf(c, trx);
      });
    } catch (e) {
      const pg = pgError(e);
      if (pg.constraint === 'contract_commission_splits_earned') throw alreadyEarned();
      if (pg.constraint === 'contract_commission_splits_sum_100') {
        throw new DomainError('rule', 'COMMISSION.SPLIT_SUM_NOT_100', 'The shares do not add up to 100%.', [
          { field: 'splits', message: 'The shares do not add up to 100%.' },
        ]);
      }
      throw e;
    }
  }
}
