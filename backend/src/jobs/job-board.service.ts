import { Inject, Injectable, Logger } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  branchScope,
  CalculatorInputError,
  daysBetween,
  defaultLocateExpiry,
  earliestDigDate,
  jobEndOn,
  StatePackMissingError,
  weekdayDate,
  type AtRiskJob,
  type CalendarResponse,
  type JobDetail,
  type JobListResponse,
  type JobStatus,
  type JobSummary,
  type StartBlocker,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { MailService } from '../mail/mail.service';
import { Clock } from '../signing/clock';
import { CrewsRepository } from './crews.repository';
import type {
  CalendarQueryDto,
  JobListQueryDto,
  LocateDto,
  PermitDto,
  ScheduleJobDto,
  WaiveWindowDto,
} from './dto/jobs.dto';
import { JOB_STATUSES } from './dto/jobs.dto';
import { jobMovedMail, jobScheduledMail, jobUnscheduledMail, type JobMailFacts } from './job-mails';
import { JobViews } from './job-views';
import { JobsRepository, jobSubject, type JobRecord, type JobScope } from './jobs.repository';
import { JobsService } from './jobs.service';

const jobNotFound = () => notFound('job');
const RISK_ORDER = { overdue: 0, due_soon: 1, none: 2 } as const;
/** The calendar shows at most this many days at once (two months). */
const CALENDAR_MAX_DAYS = 62;

/** The 409 for a job that is past the state the request needs. */
function stateConflict(status: JobStatus): DomainError | null {
  switch (status) {
    case 'in_progress':
      return conflict('JOB.ALREADY_STARTED', 'The crew has started this job: its days can no longer change.');
    case 'completed':
      return conflict('JOB.ALREADY_COMPLETED', 'This job is completed.');
    case 'cancelled':
      return conflict('JOB.CANCELLED', 'This job is cancelled: its contract was cancelled.');
    default:
      return null;
  }
}

/** The first blocker as the 409, with every blocker in the details (the screen lists them). */
const blocked = (blockers: StartBlocker[]) => conflict(blockers[0]!.code, blockers[0]!.message, { blockers });

/**
 * The jobs' routes: lists, calendar, at-risk, today, one job; scheduling on a crew with the homeowner's
 * e-mail, the window waiver, permit and 811 ticket, starting the work. The lead's stage follows each
 * event (JobsService.advanceLead); the lead's timeline gets a 'job' row for each.
 */
@Injectable()
export class JobBoardService {
  private readonly logger = new Logger(JobBoardService.name);

  constructor(
    private readonly repo: JobsRepository,
    private readonly crews: CrewsRepository,
    private readonly views: JobViews,
    private readonly jobs: JobsService,
    private readonly mail: MailService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  /** Which jobs a list may show: the user's branches; a salesperson's own; a crew lead's crews'. */
  scope(user: SessionUser): JobScope {
    return {
      branchIds: branchScope(user, 'sales'),
      salespersonId: user.role === 'salesperson' ? user.id : null,
      crewLeadId: user.role === 'crew_lead' ? user.id : null,
    };
  }

  // ---- reading --------------------------------------------------------------------------------------

  async list(user: SessionUser, q: JobListQueryDto): Promise<JobListResponse> {
    const statuses = q.status?.split(',') as JobStatus[] | undefined;
    if (statuses?.some((s) => !JOB_STATUSES.includes(s))) throw invalid('status', 'Unknown status.');
    if (q.from && q.to && q.to < q.from) throw invalid('to', 'The end is before the start.');
    const pageSize = Number(q.pageSize ?? 25);
    const page = Math.max(1, Number(q.page ?? 1));
    const { rows, total } = await this.repo.list(this.scope(user), {
      branchId: q.branchId,
      statuses,
      crewId: q.crewId,
      salespersonId: q.salespersonId,
      from: q.from,
      to: q.to,
      q: q.q?.trim() || undefined,
      limit: pageSize,
      offset: (page - 1) * pageSize,
    });
    return { items: await this.views.summaries(rows), total, page, pageSize };
  }

  async calendar(user: SessionUser, q: CalendarQueryDto): Promise<CalendarResponse> {
    if (q.to < q.from) throw invalid('to', 'The end is before the start.');
    if (daysBetween(q.from, q.to) + 1 > CALENDAR_MAX_DAYS) {
      throw invalid('to', `Show at most ${CALENDAR_MAX_DAYS} days at once.`);
    }
    const branchId = this.oneBranch(user, q.branchId);
    const { scheduled, unscheduled } = await this.repo.calendar(this.scope(user), branchId, q.from, q.to);
    const conflicts = await this.views.conflicts(scheduled);
    const crews = await this.crews.list(null, branchId);
    const byCrew = new Map<string, CalendarResponse['crews'][number]>(
      crews
        .filter((c) => c.active || scheduled.some((j) => j.crewId === c.id))
        .map((c) => [c.id, { id: c.id, name: c.name, leadName: c.leadName, jobs: [] }]),
    );
    for (const j of scheduled)
      byCrew.get(j.crewId!)?.jobs.push(this.views.calendarJob(j, conflicts.has(j.id)));
    return {
      branchId,
      from: q.from,
      to: q.to,
      // A crew lead sees their own crews only; the office every crew of the branch.
      crews: [...byCrew.values()].filter(
        (c) => user.role !== 'crew_lead' || crews.find((x) => x.id === c.id)?.leadUserId === user.id,
      ),
      unscheduled: await this.views.summaries(unscheduled),
    };
  }

  /** Open jobs with a clock due soon or overdue, the worst first, then by the nearest last day. */
  async atRisk(user: SessionUser, branchId?: string): Promise<AtRiskJob[]> {
    const jobs = await this.repo.open(this.scope(user), branchId);
    const conflicts = await this.views.conflicts(jobs);
    const out: AtRiskJob[] = [];
    for (const j of jobs) {
      const clocks = this.views.clocks(j);
      const summary = this.views.summary(j, clocks, conflicts.has(j.id));
      if (summary.risk !== 'none') out.push({ ...summary, clocks });
    }
    const nearest = (a: AtRiskJob) =>
      a.clocks
        .filter((c) => !c.doneOn && (c.state === 'due_soon' || c.state === 'overdue'))
        .reduce((m, c) => (c.dueOn! < m ? c.dueOn! : m), '9999-12-31');
    return out.sort(
      (a, b) =>
        RISK_ORDER[a.risk] - RISK_ORDER[b.risk] ||
        nearest(a).localeCompare(nearest(b)) ||
        a.number.localeCompare(b.number),
    );
  }

  /** The jobs running today in scope (a crew lead: their crews'), each on its branch's clock. */
  async today(user: SessionUser): Promise<JobSummary[]> {
    return this.views.summaries(await this.repo.today(this.scope(user), this.clock.now()));
  }

  async get(user: SessionUser, id: string): Promise<JobDetail> {
    const job = await this.repo.findForUser(user, id);
    if (!job) throw jobNotFound();
    return this.views.detail(user, job);
  }

  // ---- scheduling -----------------------------------------------------------------------------------

  /**
   * Puts the job on a crew for a run of days, or moves it. Refused (409) inside the cancellation window
   * unless waived, and before the 811 ticket's earliest dig date when a ticket is on file; a start day
   * in the past is refused (422). A crew already booked on overlapping days is flagged, not refused. The
   * homeowner is e-mailed when the job is scheduled or its days move (not for a change of crew only).
   */
  async schedule(user: SessionUser, id: string, dto: ScheduleJobDto): Promise<JobDetail> {
    const done = await inTransaction(this.knex, async (trx) => {
      const job = await this.office(user, id, trx);
      const past = stateConflict(job.status);
      if (past) throw past;
      const crew = await this.crews.find(dto.crewId, trx);
      if (!crew || crew.branchId !== job.branchId)
        throw invalid('crewId', 'Choose a crew of this job’s branch.');
      if (!crew.active) {
        throw new DomainError('rule', 'CREW.INACTIVE', `The crew "${crew.name}" is not active.`, [
          { field: 'crewId', message: 'This crew is not active: choose another or make it active again.' },
        ]);
      }
      const today = this.views.today(job.timezone);
      if (dto.startOn < today) {
        throw new DomainError('rule', 'JOB.START_IN_PAST', 'The start day has passed.', [
          { field: 'startOn', message: `Choose ${weekdayDate(today)} or later.` },
        ]);
      }
      const blockers = this.views.blockers(job, dto.startOn, 'schedule');
      if (blockers.length) throw blocked(blockers);

      await this.repo.update(
        id,
        {
          status: 'scheduled',
          crew_id: crew.id,
          crew_lead_id: crew.leadUserId,
          start_on: dto.startOn,
          duration_days: dto.durationDays,
        },
        trx,
      );
      const wasOn =
        job.status === 'scheduled' ? { startOn: job.startOn!, durationDays: job.durationDays } : null;
      const daysMoved = !wasOn || wasOn.startOn !== dto.startOn || wasOn.durationDays !== dto.durationDays;
      const event = !wasOn ? 'scheduled' : daysMoved ? 'moved' : 'crew_changed';
      const run = `${weekdayDate(dto.startOn)}${dto.durationDays > 1 ? ` to ${weekdayDate(jobEndOn(dto.startOn, dto.durationDays))}` : ''}`;
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'job',
          body:
            event === 'scheduled'
              ? `Job ${job.number} scheduled on ${crew.name}: ${run}.`
              : event === 'moved'
                ? `Job ${job.number} moved from ${weekdayDate(wasOn!.startOn)} (${wasOn!.durationDays} day${wasOn!.durationDays > 1 ? 's' : ''}) to ${run}, on ${crew.name}.`
                : `Job ${job.number} moved to ${crew.name} (same days: ${run}).`,
          data: {
            event,
            jobId: id,
            crewId: crew.id,
            startOn: dto.startOn,
            durationDays: dto.durationDays,
            ...(wasOn ? { previousStartOn: wasOn.startOn, previousDurationDays: wasOn.durationDays } : {}),
          },
          actorId: user.id,
        },
        trx,
      );
      await this.jobs.advanceLead(job.leadId, user.id, trx);
      return { job, wasOn, daysMoved };
    });
    if (done.daysMoved) {
      const facts = await this.mailFacts(done.job);
      if (facts) {
        const m = done.wasOn
          ? jobMovedMail({
              ...facts.facts,
              startOn: dto.startOn,
              durationDays: dto.durationDays,
              previousStartOn: done.wasOn.startOn,
              previousDurationDays: done.wasOn.durationDays,
            })
          : jobScheduledMail({ ...facts.facts, startOn: dto.startOn, durationDays: dto.durationDays });
        await this.sendToHomeowner(
          done.job,
          facts.to,
          m,
          done.wasOn ? 'job_moved_mail' : 'job_scheduled_mail',
          user,
        );
      }
    }
    return this.get(user, id);
  }

  /** Takes the job off the calendar (before it starts). The homeowner hears that the date is on hold. */
  async unschedule(user: SessionUser, id: string): Promise<JobDetail> {
    const done = await inTransaction(this.knex, async (trx) => {
      const job = await this.office(user, id, trx);
      const past = stateConflict(job.status);
      if (past) throw past;
      if (job.status === 'unscheduled') return null; // nothing to take off, nobody to tell
      await this.repo.update(
        id,
        { status: 'unscheduled', crew_id: null, crew_lead_id: null, start_on: null },
        trx,
      );
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'job',
          body: `Job ${job.number} taken off the calendar (it was on ${job.crewName}, ${weekdayDate(job.startOn!)}).`,
          data: { event: 'unscheduled', jobId: id, previousStartOn: job.startOn, previousCrewId: job.crewId },
          actorId: user.id,
        },
        trx,
      );
      return job;
    });
    if (done) {
      const facts = await this.mailFacts(done);
      if (facts) {
        await this.sendToHomeowner(
          done,
          facts.to,
          jobUnscheduledMail({ ...facts.facts, previousStartOn: done.startOn! }),
          'job_unscheduled_mail',
          user,
        );
      }
    }
    return this.get(user, id);
  }

  // ---- the window, the permit, the ticket ---------------------------------------------------------

  /**
   * Records the homeowner's waiver of the right to cancel for a bona fide emergency (16 CFR 429.1(e)):
   * their own separate statement, signed and dated, copied here. Only while the window is open.
   */
  async waiveWindow(user: SessionUser, id: string, dto: WaiveWindowDto): Promise<JobDetail> {
    await inTransaction(this.knex, async (trx) => {
      const job = await this.office(user, id, trx);
      const past = stateConflict(job.status);
      if (past) throw past;
      if (job.windowWaivedAt) throw conflict('JOB.WINDOW_ALREADY_WAIVED', 'The window was already waived.');
      const today = this.views.today(job.timezone);
      if (today > job.lastDayToCancel) {
        throw conflict(
          'JOB.WINDOW_CLOSED',
          `The cancellation window closed at the end of ${weekdayDate(job.lastDayToCancel)}: there is nothing to waive.`,
        );
      }
      const now = this.clock.now();
      await this.repo.update(
        id,
        { window_waived_at: now, window_waiver_note: dto.note, window_waived_by: user.id },
        trx,
      );
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'job',
          body: (
            `Right to cancel waived by the homeowner for a bona fide emergency (16 CFR 429.1(e)), recorded by ${user.name}. ` +
            `Their statement: ${dto.note}`
          ).slice(0, 3900),
          data: { event: 'window_waived', jobId: id, at: now.toISOString() },
          actorId: user.id,
        },
        trx,
      );
    });
    return this.get(user, id);
  }

  async setPermit(user: SessionUser, id: string, dto: PermitDto): Promise<JobDetail> {
    await inTransaction(this.knex, async (trx) => {
      const job = await this.office(user, id, trx);
      const past = job.status === 'cancelled' ? stateConflict(job.status) : null;
      if (past) throw past;
      const p = {
        appliedOn: dto.appliedOn ?? null,
        number: dto.number ?? null,
        issuedOn: dto.issuedOn ?? null,
        inspectionPassedOn: dto.inspectionPassedOn ?? null,
      };
      const today = this.views.today(job.timezone);
      const fieldErrors: { field: string; message: string }[] = [];
      if (dto.needed === false && (p.appliedOn || p.number || p.issuedOn || p.inspectionPassedOn)) {
        fieldErrors.push({ field: 'needed', message: 'A permit that is not needed has no dates or number.' });
      }
      for (const [field, value] of Object.entries({
        appliedOn: p.appliedOn,
        issuedOn: p.issuedOn,
        inspectionPassedOn: p.inspectionPassedOn,
      })) {
        if (value && value > today) fieldErrors.push({ field, message: 'This day has not come yet.' });
      }
      if (p.issuedOn && !p.appliedOn) {
        fieldErrors.push({ field: 'appliedOn', message: 'Enter the day the permit was applied for.' });
      }
      if (p.issuedOn && p.appliedOn && p.issuedOn < p.appliedOn) {
        fieldErrors.push({
          field: 'issuedOn',
          message: 'Issued before it was applied for: check both days.',
        });
      }
      if (p.inspectionPassedOn && (!p.issuedOn || p.inspectionPassedOn < p.issuedOn)) {
        fieldErrors.push({
          field: 'inspectionPassedOn',
          message: 'The inspection comes after the permit is issued.',
        });
      }
      if (fieldErrors.length) {
        throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', fieldErrors);
      }
      await this.repo.update(
        id,
        {
          permit_needed: dto.needed,
          permit_applied_on: p.appliedOn,
          permit_number: p.number,
          permit_issued_on: p.issuedOn,
          permit_inspection_passed_on: p.inspectionPassedOn,
        },
        trx,
      );
      const parts =
        dto.needed === false
          ? ['not needed']
          : [
              dto.needed === null ? 'need not known yet' : 'needed',
              p.appliedOn ? `applied for on ${p.appliedOn}` : '',
              p.number ? `number ${p.number}` : '',
              p.issuedOn ? `issued on ${p.issuedOn}` : '',
              p.inspectionPassedOn ? `inspection passed on ${p.inspectionPassedOn}` : '',
            ].filter(Boolean);
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'job',
          body: `Permit for job ${job.number}: ${parts.join(', ')}.`,
          data: { event: 'permit', jobId: id, needed: dto.needed, ...p },
          actorId: user.id,
        },
        trx,
      );
    });
    return this.get(user, id);
  }

  /**
   * Records the 811 ticket: its earliest dig date from the state pack (F.S. 556.105(1)(a) in Florida;
   * a state without a pack → 422, as the calculator answers) and its expiry (typed, or the pack's default
   * where Loambook has one; otherwise it must be typed).
   */
  async setLocate(user: SessionUser, id: string, dto: LocateDto): Promise<JobDetail> {
    await inTransaction(this.knex, async (trx) => {
      const job = await this.office(user, id, trx);
      const past = stateConflict(job.status);
      if (past && job.status !== 'in_progress') throw past;
      const today = this.views.today(job.timezone);
      if (dto.filedOn > today) throw invalid('filedOn', 'The ticket cannot be filed on a day still to come.');
      let dig: string;
      try {
        dig = earliestDigDate({ state: job.state, filedOn: dto.filedOn }).earliestDigDate;
      } catch (e) {
        if (e instanceof StatePackMissingError) throw new DomainError('rule', e.code, e.message, e.details);
        if (e instanceof CalculatorInputError) {
          throw new DomainError('invalid', 'VALIDATION.FAILED', e.message, e.details);
        }
        throw e;
      }
      const fallback = defaultLocateExpiry(job.state, dto.filedOn);
      const expiresOn = dto.expiresOn ?? fallback?.expiresOn ?? null;
      if (!expiresOn) {
        throw invalid('expiresOn', `Enter the ticket’s expiry: Loambook has no default for ${job.state}.`);
      }
      if (expiresOn < dig) {
        throw invalid('expiresOn', `The ticket would expire before its earliest dig date (${dig}).`);
      }
      await this.repo.update(
        id,
        {
          locate_ticket_number: dto.ticketNumber,
          locate_filed_on: dto.filedOn,
          locate_earliest_dig_on: dig,
          locate_expires_on: expiresOn,
        },
        trx,
      );
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'job',
          body:
            `811 ticket ${dto.ticketNumber} for job ${job.number}, filed ${weekdayDate(dto.filedOn)}: digging allowed from ` +
            `${weekdayDate(dig)}, ticket good until ${weekdayDate(expiresOn)}` +
            `${dto.expiresOn ? '' : ' (the state’s default)'}.`,
          data: {
            event: 'locate',
            jobId: id,
            ticketNumber: dto.ticketNumber,
            filedOn: dto.filedOn,
            earliestDigOn: dig,
            expiresOn,
          },
          actorId: user.id,
        },
        trx,
      );
    });
    return this.get(user, id);
  }

  // ---- starting -------------------------------------------------------------------------------------

  /**
   * The crew starts the work today (the branch's calendar): the job must be on a crew, outside the
   * cancellation window (or waived), on or after the dig date of a ticket on file and not expired, with
   * the deposit in. Each refusal is a 409 with its code; every blocker is in the details.
   */
  async start(user: SessionUser, id: string): Promise<JobDetail> {
    await inTransaction(this.knex, async (trx) => {
      const job = await this.repo.findForUser(user, id, { db: trx, forUpdate: true });
      if (!job) throw jobNotFound();
      ForbiddenError.from(user.ability).throwUnlessCan('update', jobSubject(job));
      const past = stateConflict(job.status);
      if (past) throw past;
      if (job.status !== 'scheduled') {
        throw conflict('JOB.NOT_SCHEDULED', 'Put the job on a crew and a day before starting it.');
      }
      const today = this.views.today(job.timezone);
      const blockers = this.views.blockers(job, today, 'start');
      if (blockers.length) throw blocked(blockers);
      const now = this.clock.now();
      await this.repo.update(id, { status: 'in_progress', started_at: now }, trx);
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'job',
          body:
            `Work started on job ${job.number} by ${job.crewName ?? 'the crew'} (${user.name})` +
            `${job.startOn && job.startOn !== today ? `; it was planned for ${weekdayDate(job.startOn)}` : ''}.`,
          data: { event: 'started', jobId: id, startedAt: now.toISOString(), plannedStartOn: job.startOn },
          actorId: user.id,
        },
        trx,
      );
      await this.jobs.advanceLead(job.leadId, user.id, trx);
    });
    return this.get(user, id);
  }

  // ---- helpers --------------------------------------------------------------------------------------

  /** The job for an office action (scheduling, waiver, permit, ticket): outside reach 404, not the office's 403. */
  private async office(user: SessionUser, id: string, trx: Knex.Transaction): Promise<JobRecord> {
    const job = await this.repo.findForUser(user, id, { db: trx, forUpdate: true });
    if (!job) throw jobNotFound();
    ForbiddenError.from(user.ability).throwUnlessCan('manage', jobSubject(job));
    return job;
  }

  /** The one branch a calendar shows: the one asked for (within reach), or the user's only branch. */
  private oneBranch(user: SessionUser, branchId?: string): string {
    const scope = branchScope(user, 'sales');
    if (branchId) {
      if (scope && !scope.includes(branchId)) throw notFound('branch');
      return branchId;
    }
    if (scope?.length === 1) return scope[0]!;
    throw invalid('branchId', 'Choose a branch.');
  }

  private async mailFacts(job: JobRecord): Promise<{ to: string; facts: JobMailFacts } | null> {
    if (!job.email) return null;
    const branch = await this.repo.branchContact(job.branchId);
    return {
      to: job.email,
      facts: {
        homeownerName: job.homeownerName,
        branchName: branch.name,
        branchPhone: branch.phone,
        jobNumber: job.number,
        addressLine1: job.addressLine1,
        city: job.city,
      },
    };
  }

  /** After the commit: the e-mail and its timeline row. A failed e-mail is logged, the schedule stands. */
  private async sendToHomeowner(
    job: JobRecord,
    to: string,
    m: { subject: string; text: string; html: string },
    event: string,
    user: SessionUser,
  ): Promise<void> {
    try {
      await this.mail.send({ to, ...m });
      await this.repo.addActivity(
        {
          leadId: job.leadId,
          branchId: job.branchId,
          kind: 'email',
          body: `E-mail "${m.subject}" sent to the homeowner (${to}).`,
          data: { event, jobId: job.id, to },
          actorId: user.id,
        },
        this.knex,
      );
    } catch (err) {
      this.logger.warn({ err, jobId: job.id }, 'Job e-mail to the homeowner not sent');
    }
  }
}
