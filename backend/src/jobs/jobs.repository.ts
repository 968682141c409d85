import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import { asSubject, type JobStatus } from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

/** A job row with what its screens and rules need from the contract, the lead and the branch. */
export interface JobRecord {
  id: string;
  number: string;
  contractId: string;
  leadId: string;
  branchId: string;
  branchCode: string;
  timezone: string;
  salespersonId: string | null;
  salespersonName: string | null;
  status: JobStatus;
  crewId: string | null;
  crewName: string | null;
  crewLeadId: string | null;
  startOn: string | null;
  durationDays: number;
  windowWaivedAt: Date | null;
  windowWaiverNote: string | null;
  permitNeeded: boolean | null;
  permitAppliedOn: string | null;
  permitNumber: string | null;
  permitIssuedOn: string | null;
  permitInspectionPassedOn: string | null;
  locateTicketNumber: string | null;
  locateFiledOn: string | null;
  locateEarliestDigOn: string | null;
  locateExpiresOn: string | null;
  estimatedLabourHours: string | null;
  labourCostPerHour: string | null;
  startedAt: Date | null;
  completedAt: Date | null;
  cancelledAt: Date | null;
  // The contract.
  price: string;
  depositAmount: string;
  depositReceivedAt: Date | null;
  signedAt: Date;
  signedOn: string;
  lastDayToCancel: string;
  // The lead.
  homeownerName: string;
  phonePrimary: string | null;
  email: string | null;
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
}

export interface PlanLineRecord {
  position: number;
  code: string;
  description: string;
  category: string;
  unit: string;
  quantity: string;
  unitCost: string;
  unitPrice: string;
}

/** The CASL subject of a job row. */
export const jobSubject = (j: {
  branchId: string;
  salespersonId: string | null;
  crewLeadId: string | null;
}) => asSubject('Job', { branchId: j.branchId, salespersonId: j.salespersonId, crewLeadId: j.crewLeadId });

const JOB_COLUMNS: string[] = [
  'j.id',
  'j.number',
  'j.contract_id as contractId',
  'j.lead_id as leadId',
  'j.branch_id as branchId',
  'b.code as branchCode',
  'b.timezone',
  'j.salesperson_id as salespersonId',
  'sp.name as salespersonName',
  'j.status',
  'j.crew_id as crewId',
  'cr.name as crewName',
  'j.crew_lead_id as crewLeadId',
  'j.duration_days as durationDays',
  'j.window_waived_at as windowWaivedAt',
  'j.window_waiver_note as windowWaiverNote',
  'j.permit_needed as permitNeeded',
  'j.permit_number as permitNumber',
  'j.locate_ticket_number as locateTicketNumber',
  'j.estimated_labour_hours as estimatedLabourHours',
  'j.labour_cost_per_hour as labourCostPerHour',
  'j.started_at as startedAt',
  'j.completed_at as completedAt',
  'j.cancelled_at as cancelledAt',
  'c.price',
  'c.deposit_amount as depositAmount',
  'c.deposit_received_at as depositReceivedAt',
  'c.signed_at as signedAt',
  'l.homeowner_name as homeownerName',
  'l.phone_primary as phonePrimary',
  'l.email',
  'l.address_line1 as addressLine1',
  'l.city',
  'l.state',
  'l.postal_code as postalCode',
];

/** Date columns, as 'YYYY-MM-DD' text (pg would make them Dates at the server's midnight). */
export const JOB_DATE_COLUMNS: [string, string][] = [
  ['j.start_on', 'startOn'],
  ['j.permit_applied_on', 'permitAppliedOn'],
  ['j.permit_issued_on', 'permitIssuedOn'],
  ['j.permit_inspection_passed_on', 'permitInspectionPassedOn'],
  ['j.locate_filed_on', 'locateFiledOn'],
  ['j.locate_earliest_dig_on', 'locateEarliestDigOn'],
  ['j.locate_expires_on', 'locateExpiresOn'],
  ['c.signed_on', 'signedOn'],
  ['c.last_day_to_cancel', 'lastDayToCancel'],
];

export const dateText = (db: Db, column: string, alias: string) =>
  db.raw(`to_char(${column}, 'YYYY-MM-DD') as "${alias}"`);

/** Scope of a job list: which branches, and for a salesperson or crew lead whose jobs. */
export interface JobScope {
  branchIds: string[] | null;
  salespersonId: string | null;
  crewLeadId: string | null;
}

export interface JobListFilter {
  branchId?: string;
  statuses?: JobStatus[];
  crewId?: string;
  salespersonId?: string;
  from?: string;
  to?: string;
  q?: string;
  limit: number;
  offset: number;
}

/** A crew's booking: what the conflict rule reads. */
export interface CrewRun {
  id: string;
  number: string;
  crewId: string;
  startOn: string;
  durationDays: number;
}

/** Jobs still to do. */
export const OPEN_STATUSES: JobStatus[] = ['unscheduled', 'scheduled', 'in_progress'];
/** Jobs holding a crew's days. */
export const LIVE_STATUSES: JobStatus[] = ['scheduled', 'in_progress'];

/** The only file of the jobs feature that touches Knex. */
@Injectable()
export class JobsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  /** The base query of job rows with their contract, lead, branch, crew and salesperson. */
  base(db: Db = this.knex): Knex.QueryBuilder {
    return db('jobs as j')
      .join('contracts as c', 'c.id', 'j.contract_id')
      .join('leads as l', 'l.id', 'j.lead_id')
      .join('branches as b', 'b.id', 'j.branch_id')
      .leftJoin('users as sp', 'sp.id', 'j.salesperson_id')
      .leftJoin('crews as cr', 'cr.id', 'j.crew_id')
      .select([...JOB_COLUMNS, ...JOB_DATE_COLUMNS.map(([c, a]) => dateText(db, c, a))]);
  }

  async find(id: string, db: Db = this.knex, forUpdate = false): Promise<JobRecord | undefined> {
    const q = this.base(db).where('j.id', id).first();
    if (forUpdate) q.forUpdate('j');
    return mapJob(await q);
  }

  /**
   * The job when the user may `action` it, else undefined (the caller answers 404: a job outside the
   * user's reach is not found, never forbidden). Shared with the field log (backend/src/field).
   */
  async findForUser(
    user: SessionUser,
    id: string,
    opts: { action?: 'read' | 'update'; db?: Db; forUpdate?: boolean } = {},
  ): Promise<JobRecord | undefined> {
    const job = await this.find(id, opts.db ?? this.knex, opts.forUpdate ?? false);
    if (!job || !user.ability.can('read', jobSubject(job))) return undefined;
    if (opts.action === 'update' && !user.ability.can('update', jobSubject(job))) return undefined;
    return job;
  }

  async findByContract(contractId: string, db: Db = this.knex): Promise<JobRecord | undefined> {
    return mapJob(await this.base(db).where('j.contract_id', contractId).first());
  }

  async planLines(jobId: string, db: Db = this.knex): Promise<PlanLineRecord[]> {
    return db('job_plan_lines')
      .where({ job_id: jobId })
      .orderBy('position')
      .select(
        'position',
        'code',
        'description',
        'category',
        'unit',
        'quantity',
        'unit_cost as unitCost',
        'unit_price as unitPrice',
      );
  }

  // ---- lists ------------------------------------------------------------------------------------

  private scoped(scope: JobScope, db: Db): Knex.QueryBuilder {
    const q = this.base(db);
    if (scope.branchIds) q.whereIn('j.branch_id', scope.branchIds);
    if (scope.salespersonId) q.where('j.salesperson_id', scope.salespersonId);
    if (scope.crewLeadId) q.where('j.crew_lead_id', scope.crewLeadId);
    return q;
  }

  /** Jobs whose run of days overlaps [from, to] (both given), or any (neither). */
  private overlapping(q: Knex.QueryBuilder, from?: string, to?: string): void {
    if (from) q.whereRaw('j.start_on + (j.duration_days - 1) >= ?::date', [from]);
    if (to) q.whereRaw('j.start_on <= ?::date', [to]);
  }

  async list(
    scope: JobScope,
    f: JobListFilter,
    db: Db = this.knex,
  ): Promise<{ rows: JobRecord[]; total: number }> {
    const q = this.scoped(scope, db);
    if (f.branchId) q.where('j.branch_id', f.branchId);
    if (f.statuses?.length) q.whereIn('j.status', f.statuses);
    if (f.crewId) q.where('j.crew_id', f.crewId);
    if (f.salespersonId) q.where('j.salesperson_id', f.salespersonId);
    this.overlapping(q, f.from, f.to);
    if (f.q) {
      const like = `%${f.q.replace(/[\\%_]/g, '\\$&')}%`;
      q.where((w) =>
        w
          .whereILike('l.homeowner_name', like)
          .orWhereILike('j.number', like)
          .orWhereILike('l.address_line1', like)
          .orWhereILike('l.city', like),
      );
    }
    const [{ count }] = await q.clone().clearSelect().clearOrder().count({ count: '*' });
    const rows = await q
      .orderByRaw('j.start_on asc nulls first, j.number asc')
      .limit(f.limit)
      .offset(f.offset);
    return { rows: rows as JobRecord[], total: Number(count) };
  }

  /** Jobs still to do (not completed or cancelled) in scope: for the clocks of the at-risk list. */
  async open(scope: JobScope, branchId: string | undefined, db: Db = this.knex): Promise<JobRecord[]> {
    const q = this.scoped(scope, db).whereIn('j.status', OPEN_STATUSES);
    if (branchId) q.where('j.branch_id', branchId);
    return q.orderBy('j.number');
  }

  /** A branch's jobs on the calendar between two days, and its signed jobs not yet on a crew. */
  async calendar(
    scope: JobScope,
    branchId: string,
    from: string,
    to: string,
    db: Db = this.knex,
  ): Promise<{ scheduled: JobRecord[]; unscheduled: JobRecord[] }> {
    const scheduled = this.scoped(scope, db)
      .where('j.branch_id', branchId)
      .whereIn('j.status', ['scheduled', 'in_progress', 'completed'])
      .whereNotNull('j.crew_id');
    this.overlapping(scheduled, from, to);
    const unscheduled = this.scoped(scope, db)
      .where('j.branch_id', branchId)
      .where('j.status', 'unscheduled')
      .orderBy('c.signed_at');
    return {
      scheduled: await scheduled.orderByRaw('j.start_on, j.number'),
      unscheduled: await unscheduled,
    };
  }

  /**
   * Jobs in scope running on the branch's today at `now`: scheduled with today inside their run, or
   * started and not yet completed (a job running over its days is still today's job).
   */
  async today(scope: JobScope, now: Date, db: Db = this.knex): Promise<JobRecord[]> {
    return this.scoped(scope, db)
      .where((w) =>
        w
          .where('j.status', 'in_progress')
          .orWhere((s) =>
            s
              .where('j.status', 'scheduled')
              .whereRaw('j.start_on <= (?::timestamptz at time zone b.timezone)::date', [now.toISOString()])
              .whereRaw(
                'j.start_on + (j.duration_days - 1) >= (?::timestamptz at time zone b.timezone)::date',
                [now.toISOString()],
              ),
          ),
      )
      .orderByRaw('j.start_on, j.number');
  }

  /** The runs of days of these crews' live jobs (scheduled or started) overlapping [from, to]. */
  async crewRuns(crewIds: string[], from: string, to: string, db: Db = this.knex): Promise<CrewRun[]> {
    if (!crewIds.length) return [];
    return db('jobs as j')
      .whereIn('j.crew_id', crewIds)
      .whereIn('j.status', LIVE_STATUSES)
      .whereRaw('j.start_on + (j.duration_days - 1) >= ?::date', [from])
      .whereRaw('j.start_on <= ?::date', [to])
      .select(
        'j.id',
        'j.number',
        'j.crew_id as crewId',
        dateText(db, 'j.start_on', 'startOn'),
        'j.duration_days as durationDays',
      );
  }

  // ---- creation from the contract ----------------------------------------------------------------

  async contractForJob(contractId: string, db: Db) {
    return db('contracts as c')
      .join('branches as b', 'b.id', 'c.branch_id')
      .where('c.id', contractId)
      .select(
        'c.id',
        'c.option_id as optionId',
        'c.lead_id as leadId',
        'c.branch_id as branchId',
        'c.salesperson_id as salespersonId',
        'b.code as branchCode',
        dateText(db, 'c.signed_on', 'signedOn'),
      )
      .first() as Promise<
      | {
          id: string;
          optionId: string;
          leadId: string;
          branchId: string;
          salespersonId: string | null;
          signedOn: string;
          branchCode: string;
        }
      | undefined
    >;
  }

  async optionLines(optionId: string, db: Db): Promise<PlanLineRecord[]> {
    return db('proposal_lines')
      .where({ option_id: optionId })
      .orderBy('position')
      .select(
        'position',
        'code',
        'description',
        'category',
        'unit',
        'quantity',
        'unit_cost as unitCost',
        'unit_price as unitPrice',
      );
  }

  /** The highest sequence used under a job number prefix, with the prefix locked for the transaction. */
  async lastSequence(prefix: string, trx: Knex.Transaction): Promise<number> {
    await trx.raw('select pg_advisory_xact_lock(hashtext(?))', [`job-number:${prefix}`]);
    const rows: { number: string }[] = await trx('jobs')
      .where('number', 'like', `${prefix.replace(/[\\%_]/g, '\\$&')}%`)
      .select('number');
    return rows.reduce((max, r) => {
      const n = Number.parseInt(r.number.slice(prefix.length), 10);
      return Number.isInteger(n) && n > max ? n : max;
    }, 0);
  }

  async insertJob(
    j: {
      contractId: string;
      leadId: string;
      branchId: string;
      salespersonId: string | null;
      number: string;
      estimatedLabourHours: string | null;
      labourCostPerHour: string | null;
    },
    lines: PlanLineRecord[],
    trx: Knex.Transaction,
  ): Promise<string> {
    const [row] = await trx('jobs')
      .insert({
        contract_id: j.contractId,
        lead_id: j.leadId,
        branch_id: j.branchId,
        salesperson_id: j.salespersonId,
        number: j.number,
        estimated_labour_hours: j.estimatedLabourHours,
        labour_cost_per_hour: j.labourCostPerHour,
      })
      .returning('id');
    if (lines.length) {
      await trx('job_plan_lines').insert(
        lines.map((l, position) => ({
          job_id: row.id,
          branch_id: j.branchId,
          position,
          code: l.code,
          description: l.description,
          category: l.category,
          unit: l.unit,
          quantity: l.quantity,
          unit_cost: l.unitCost,
          unit_price: l.unitPrice,
        })),
      );
    }
    return row.id;
  }

  async update(id: string, patch: Record<string, unknown>, db: Db): Promise<void> {
    await db('jobs')
      .where({ id })
      .update({ ...patch, updated_at: db.fn.now() });
  }

  async addActivity(
    a: { leadId: string; branchId: string; kind: string; body: string; data: object; actorId: string | null },
    db: Db,
  ): Promise<void> {
    await db('lead_activities').insert({
      lead_id: a.leadId,
      branch_id: a.branchId,
      kind: a.kind,
      body: a.body,
      data: JSON.stringify(a.data),
      actor_id: a.actorId,
    });
  }

  async branchContact(branchId: string, db: Db = this.knex): Promise<{ name: string; phone: string | null }> {
    return db('branches').where({ id: branchId }).first('name', 'phone');
  }

  async leadStage(leadId: string, db: Db, forUpdate = false) {
    const q = db('leads').where({ id: leadId }).first('id', 'branch_id as branchId', 'stage');
    if (forUpdate) q.forUpdate();
    return q as Promise<{ id: string; branchId: string; stage: string } | undefined>;
  }
}

// pg returns `date` columns as strings (the pool's type parser), timestamps as Date.
export function mapJob(r: Record<string, unknown> | undefined): JobRecord | undefined {
  if (!r) return undefined;
  return r as unknown as JobRecord;
}
