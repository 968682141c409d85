import { Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import {
  branchScope,
  jobActuals,
  money,
  summariseActuals,
  type ActualsSummaryRow,
  type JobActuals,
  toMoneyString,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { notFound } from '../common/domain-error';
import type { ActualsSummaryQueryDto } from './dto/field.dto';
import { FieldAccess } from './field-access';
import { FieldRepository, type CompletedJobFigures } from './field.repository';

/** Revenue of a job: the contract's price without the sales tax charged on the invoice. */
const revenue = (price: string, tax: string) => toMoneyString(money(price).minus(money(tax)));

/**
 * What the job actually cost against the plan (common/src/jobs/actuals.ts has the rule), per job and
 * summed per salesperson or branch over completed jobs.
 */
@Injectable()
export class ActualsService {
  constructor(
    private readonly access: FieldAccess,
    private readonly repo: FieldRepository,
  ) {}

  async forJob(user: SessionUser, jobId: string): Promise<JobActuals> {
    const job = await this.access.moneyReadable(user, jobId);
    const extras = await this.repo.extras(jobId);
    const [lines, totals] = await Promise.all([this.repo.planLinesOf([jobId]), this.repo.logTotals([jobId])]);
    return jobActuals({
      jobId,
      price: revenue(job.price, extras.tax),
      plan: lines,
      log: totals.get(jobId)!,
      estimatedLabourHours: job.estimatedLabourHours,
      labourCostPerHour: job.labourCostPerHour,
    });
  }

  /**
   * Completed jobs summed per salesperson or per branch. The manager sees their branches, the owner and
   * the bookkeeper every branch, a salesperson their own jobs only; the crew lead no money figures.
   */
  async summary(user: SessionUser, q: ActualsSummaryQueryDto): Promise<ActualsSummaryRow[]> {
    ForbiddenError.from(user.ability).throwUnlessCan('read', 'Contract');
    let branchIds = branchScope(user, 'sales');
    if (q.branchId) {
      if (branchIds && !branchIds.includes(q.branchId)) throw notFound('branch');
      branchIds = [q.branchId];
    }
    const salespersonId = user.role === 'salesperson' ? user.id : null;
    const jobs = await this.repo.completedJobs({ branchIds, salespersonId }, { from: q.from, to: q.to });
    const ids = jobs.map((j) => j.jobId);
    const [lines, totals] = await Promise.all([this.repo.planLinesOf(ids), this.repo.logTotals(ids)]);
    const linesOf = new Map<string, typeof lines>();
    for (const l of lines) linesOf.set(l.jobId, [...(linesOf.get(l.jobId) ?? []), l]);
    const by = q.by ?? 'salesperson';
    const keyOf = (j: CompletedJobFigures) =>
      by === 'branch'
        ? { key: j.branchId, name: j.branchName }
        : { key: j.salespersonId ?? 'none', name: j.salespersonName ?? 'No salesperson' };
    return summariseActuals(
      jobs.map((j) => {
        const a = jobActuals({
          jobId: j.jobId,
          price: revenue(j.price, j.tax),
          plan: linesOf.get(j.jobId) ?? [],
          log: totals.get(j.jobId)!,
          estimatedLabourHours: j.estimatedLabourHours,
          labourCostPerHour: j.labourCostPerHour,
        });
        return { ...keyOf(j), price: a.price, estimatedCost: a.estimatedCost, actualCost: a.actualCost };
      }),
    );
  }
}
