import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  asSubject,
  CAUTION_CALL_811,
  CAUTION_ENGINEER,
  CAUTION_ISOCYANATES,
  CAUTION_LIFTING,
  jobClocks,
  jobEndOn,
  jobRisk,
  money,
  plannedCounts,
  scheduleConflicts,
  startBlockers,
  todayInZone,
  type CalendarJob,
  type JobClock,
  type JobDetail,
  type JobSummary,
  type StartBlocker,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';
import { Clock } from '../signing/clock';
import { JobsRepository, jobSubject, type CrewRun, type JobRecord } from './jobs.repository';

/** A contract asking no deposit counts as received. */
export const depositIn = (j: JobRecord) =>
  j.depositReceivedAt !== null || !money(j.depositAmount).greaterThan(0);

/**
 * The job's figures as the screens see them: clocks, start blockers, conflicts, risk, and the wire
 * shapes (JobSummary, JobDetail, CalendarJob). Reads "today" from the Clock, in the branch's zone.
 */
@Injectable()
export class JobViews {
  constructor(
    private readonly repo: JobsRepository,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  today(timezone: string): string {
    return todayInZone(timezone, this.clock.now());
  }

  clocks(j: JobRecord, today = this.today(j.timezone)): JobClock[] {
    return jobClocks({
      today,
      state: j.state,
      contractPrice: j.price,
      depositAmount: j.depositAmount,
      depositReceivedOn: j.depositReceivedAt ? todayInZone(j.timezone, j.depositReceivedAt) : null,
      lastDayToCancel: j.lastDayToCancel,
      windowWaived: j.windowWaivedAt !== null,
      permit: { needed: j.permitNeeded, appliedOn: j.permitAppliedOn, issuedOn: j.permitIssuedOn },
      locate: { ticketNumber: j.locateTicketNumber, expiresOn: j.locateExpiresOn },
      startedOn: j.startedAt ? todayInZone(j.timezone, j.startedAt) : null,
    });
  }

  /** Why the job could not start on `day` (for 'schedule': only what stops a day on the calendar). */
  blockers(j: JobRecord, day: string, purpose: 'schedule' | 'start'): StartBlocker[] {
    return startBlockers({
      day,
      purpose,
      lastDayToCancel: j.lastDayToCancel,
      windowWaived: j.windowWaivedAt !== null,
      locate: {
        ticketNumber: j.locateTicketNumber,
        earliestDigOn: j.locateEarliestDigOn,
        expiresOn: j.locateExpiresOn,
      },
      depositAmount: j.depositAmount,
      depositReceived: depositIn(j),
    });
  }

  /** For each job on a crew, the other live jobs of the crew on overlapping days. */
  async conflicts(jobs: JobRecord[], db: Db = this.knex): Promise<Map<string, CrewRun[]>> {
    const placed = jobs.filter(
      (j) => j.crewId && j.startOn && (j.status === 'scheduled' || j.status === 'in_progress'),
    );
    const out = new Map<string, CrewRun[]>();
    if (!placed.length) return out;
    const from = placed.reduce((m, j) => (j.startOn! < m ? j.startOn! : m), placed[0]!.startOn!);
    const to = placed.reduce((m, j) => {
      const end = jobEndOn(j.startOn!, j.durationDays);
      return end > m ? end : m;
    }, from);
    const runs = await this.repo.crewRuns([...new Set(placed.map((j) => j.crewId!))], from, to, db);
    const byId = new Map(runs.map((r) => [r.id, r]));
    for (const j of placed) {
      if (!byId.has(j.id))
        byId.set(j.id, {
          id: j.id,
          number: j.number,
          crewId: j.crewId!,
          startOn: j.startOn!,
          durationDays: j.durationDays,
        });
    }
    const found = scheduleConflicts([...byId.values()]);
    for (const j of placed) {
      const others = found.get(j.id);
      if (others?.length)
        out.set(
          j.id,
          others.map((id) => byId.get(id)!),
        );
    }
    return out;
  }

  summary(j: JobRecord, clocks: JobClock[], conflict: boolean): JobSummary {
    return {
      id: j.id,
      number: j.number,
      branchId: j.branchId,
      branchCode: j.branchCode,
      leadId: j.leadId,
      contractId: j.contractId,
      homeownerName: j.homeownerName,
      addressLine1: j.addressLine1,
      city: j.city,
      status: j.status,
      crewId: j.crewId,
      crewName: j.crewName,
      crewLeadId: j.crewLeadId,
      salespersonId: j.salespersonId,
      salespersonName: j.salespersonName,
      startOn: j.startOn,
      durationDays: j.durationDays,
      price: j.price,
      estimatedLabourHours: j.estimatedLabourHours,
      risk: j.status === 'completed' || j.status === 'cancelled' ? 'none' : jobRisk(clocks),
      conflict,
    };
  }

  async summaries(jobs: JobRecord[], db: Db = this.knex): Promise<JobSummary[]> {
    const conflicts = await this.conflicts(jobs, db);
    return jobs.map((j) => this.summary(j, this.clocks(j), conflicts.has(j.id)));
  }

  calendarJob(j: JobRecord, conflict: boolean): CalendarJob {
    return {
      jobId: j.id,
      number: j.number,
      homeownerName: j.homeownerName,
      city: j.city,
      status: j.status,
      startOn: j.startOn!,
      durationDays: j.durationDays,
      conflict,
      risk: j.status === 'completed' || j.status === 'cancelled' ? 'none' : jobRisk(this.clocks(j)),
    };
  }

  async detail(user: SessionUser, j: JobRecord, db: Db = this.knex): Promise<JobDetail> {
    const today = this.today(j.timezone);
    const clocks = this.clocks(j, today);
    const conflicts = (await this.conflicts([j], db)).get(j.id) ?? [];
    const plan = await this.repo.planLines(j.id, db);
    const subject = jobSubject(j);
    const office = user.ability.can('manage', subject);
    const mayUpdate = user.ability.can('update', subject);
    const open = j.status !== 'completed' && j.status !== 'cancelled';
    const startDay = j.startOn && j.startOn > today ? j.startOn : today;
    const injection = plan.some((l) => l.category === 'soil_stabilisation');
    // Costs are the office's (whoever may read the contract): a crew lead sees quantities and prices only.
    const seeCosts = user.ability.can(
      'read',
      asSubject('Contract', { branchId: j.branchId, salespersonId: j.salespersonId }),
    );
    return {
      ...this.summary(j, clocks, conflicts.length > 0),
      phonePrimary: j.phonePrimary,
      email: j.email,
      state: j.state,
      postalCode: j.postalCode,
      timezone: j.timezone,
      signedOn: j.signedOn,
      lastDayToCancel: j.lastDayToCancel,
      depositAmount: j.depositAmount,
      depositReceivedAt: j.depositReceivedAt?.toISOString() ?? null,
      windowWaivedAt: j.windowWaivedAt?.toISOString() ?? null,
      windowWaiverNote: j.windowWaiverNote,
      permit: {
        needed: j.permitNeeded,
        appliedOn: j.permitAppliedOn,
        number: j.permitNumber,
        issuedOn: j.permitIssuedOn,
        inspectionPassedOn: j.permitInspectionPassedOn,
      },
      locate: {
        ticketNumber: j.locateTicketNumber,
        filedOn: j.locateFiledOn,
        earliestDigOn: j.locateEarliestDigOn,
        expiresOn: j.locateExpiresOn,
      },
      plan: plan.map((l) => ({
        code: l.code,
        description: l.description,
        category: l.category,
        unit: l.unit,
        quantity: l.quantity,
        unitCost: seeCosts ? l.unitCost : '0.00',
        unitPrice: l.unitPrice,
      })),
      planned: plannedCounts(plan),
      clocks,
      startBlockers:
        j.status === 'unscheduled' || j.status === 'scheduled' ? this.blockers(j, startDay, 'start') : [],
      conflicts: conflicts.map((c) => ({
        jobId: c.id,
        number: c.number,
        startOn: c.startOn,
        durationDays: c.durationDays,
      })),
      startedAt: j.startedAt?.toISOString() ?? null,
      completedAt: j.completedAt?.toISOString() ?? null,
      estimatedLabourHours: j.estimatedLabourHours,
      labourCostPerHour: seeCosts ? j.labourCostPerHour : null,
      cautions: [
        CAUTION_CALL_811,
        ...(injection ? [CAUTION_ISOCYANATES] : []),
        CAUTION_LIFTING,
        CAUTION_ENGINEER,
      ],
      can: {
        schedule: office && (j.status === 'unscheduled' || j.status === 'scheduled'),
        editPermits: office && open,
        // The crew lead of the job's crew or the branch office; the blockers say whether today allows it.
        start: mayUpdate && j.status === 'scheduled',
        log: mayUpdate && j.status === 'in_progress',
        complete: mayUpdate && j.status === 'in_progress',
        seeCosts,
      },
    };
  }
}
