import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  branchScope,
  checkTransition,
  LEAD_STAGE_LABELS,
  LEAD_STAGES,
  type CreateLeadResponse,
  type DuplicateCheckResponse,
  type LeadDetail,
  type LeadInput,
  type LeadJobLink,
  type LeadStage,
  type PipelineResponse,
  type StageMove,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { DomainError, invalid, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { BranchesRepository } from '../branches/branches.repository';
import type {
  ChangeStageDto,
  DuplicateCheckDto,
  LeadActivityDto,
  PipelineQueryDto,
  TransferLeadDto,
} from './dto/lead.dto';
import { duplicateKeys, LeadsRepository, type LeadRow, type LeadScope } from './leads.repository';

/** Until a proposal has gone out, a lead can still move to another branch. */
const TRANSFERABLE: readonly LeadStage[] = ['new', 'inspection_booked', 'inspected'];

/** Moves a person may ask for by hand; the others follow from the work itself. */
const MANUAL_MOVES: readonly LeadStage[] = ['lost'];

@Injectable()
export class LeadsService {
  constructor(
    private readonly repo: LeadsRepository,
    private readonly branches: BranchesRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  private scope(user: SessionUser): LeadScope {
    return {
      branchIds: branchScope(user, 'sales'),
      salespersonId: user.role === 'salesperson' ? user.id : null,
    };
  }

  async pipeline(user: SessionUser, q: PipelineQueryDto): Promise<PipelineResponse> {
    const stages = q.stage?.split(',') as LeadStage[] | undefined;
    if (stages?.some((s) => !LEAD_STAGES.includes(s))) throw invalid('stage', 'Unknown stage.');
    const pageSize = Number(q.pageSize ?? 25);
    const page = Math.max(1, Number(q.page ?? 1));
    const result = await this.repo.pipeline(this.scope(user), {
      branchId: q.branchId,
      stages,
      salespersonId: q.salespersonId,
      minAgeDays: q.minAgeDays === undefined ? undefined : Number(q.minAgeDays),
      maxAgeDays: q.maxAgeDays === undefined ? undefined : Number(q.maxAgeDays),
      minValue: q.minValue,
      maxValue: q.maxValue,
      q: q.q?.trim() || undefined,
      approvalPending: q.approvalPending === undefined ? undefined : q.approvalPending === 'true',
      sort: q.sort ?? 'daysInStage',
      order: q.order ?? 'asc',
      limit: pageSize,
      offset: (page - 1) * pageSize,
    });
    return { ...result, page, pageSize };
  }

  /** A lead the user may read, or 404 — also for a manager whose branch transferred it away (read-only). */
  private async readable(
    user: SessionUser,
    id: string,
    db: Db = this.knex,
  ): Promise<{ row: LeadRow; readOnly: boolean }> {
    const row = await this.repo.findById(id, db);
    if (!row) throw notFound('lead');
    if (user.ability.can('read', asSubject('Lead', row))) return { row, readOnly: false };
    if (user.role === 'branch_manager') {
      const from = await this.repo.transferredFrom(id, db);
      if (from.some((b) => user.branchIds.includes(b))) return { row, readOnly: true };
    }
    throw notFound('lead');
  }

  private async writable(user: SessionUser, id: string, db: Db): Promise<LeadRow> {
    const { row, readOnly } = await this.readable(user, id, db);
    if (readOnly)
      throw new DomainError('forbidden', 'LEAD.TRANSFERRED', 'This lead now belongs to another branch.');
    ForbiddenError.from(user.ability).throwUnlessCan('update', asSubject('Lead', row));
    return row;
  }

  async get(user: SessionUser, id: string, db: Db = this.knex): Promise<LeadDetail> {
    const { row, readOnly } = await this.readable(user, id, db);
    const [activities, transfers, facts, job] = await Promise.all([
      this.repo.activities(id, db),
      this.repo.transfers(id, db),
      this.repo.facts(id, db),
      readOnly ? undefined : this.repo.jobOf(id, db),
    ]);
    const moves: StageMove[] = readOnly
      ? []
      : MANUAL_MOVES.map((to) => {
          const check = checkTransition(row.stage, to, facts, { lostReason: 'checked when asked' });
          return check.ok
            ? { to, allowed: true }
            : { to, allowed: false, code: check.code, message: check.message };
        });
    // The job only for whom its own rule lets open it (a salesperson their own, a crew lead their crew's).
    const jobLink: LeadJobLink | null =
      job &&
      user.ability.can(
        'read',
        asSubject('Job', {
          branchId: job.branchId,
          salespersonId: job.salespersonId,
          crewLeadId: job.crewLeadId,
        }),
      )
        ? { id: job.id, number: job.number, status: job.status }
        : null;
    return { ...row, activities, transfers, moves, readOnly, job: jobLink };
  }

  async create(user: SessionUser, input: LeadInput): Promise<CreateLeadResponse> {
    const salespersonId = input.salespersonId ?? (user.role === 'salesperson' ? user.id : null);
    ForbiddenError.from(user.ability)
      .setMessage('You cannot enter leads for that branch.')
      .throwUnlessCan('create', asSubject('Lead', { branchId: input.branchId, salespersonId }));
    if (
      !user.ability.can('read', asSubject('Branch', { id: input.branchId })) ||
      !(await this.branches.findById(input.branchId))
    ) {
      throw invalid('branchId', 'Unknown branch.');
    }
    if (!input.phonePrimary && !input.email) {
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Give a phone number or an e-mail address.', [
        { field: 'phonePrimary', message: 'Give a phone number or an e-mail address.' },
      ]);
    }
    if (user.role === 'salesperson' && salespersonId !== user.id) {
      throw invalid('salespersonId', 'A salesperson enters leads for themselves.');
    }
    return inTransaction(this.knex, async (trx) => {
      if (salespersonId && !(await this.repo.isSalespersonOf(salespersonId, input.branchId, trx))) {
        throw invalid('salespersonId', 'That person does not sell in this branch.');
      }
      const possibleDuplicates = await this.duplicates(
        user,
        {
          addressLine1: input.addressLine1,
          postalCode: input.postalCode,
          phone: input.phonePrimary ?? undefined,
          email: input.email ?? undefined,
        },
        trx,
      );
      const id = await this.repo.insert({ ...input, salespersonId, createdBy: user.id }, trx);
      await this.repo.addActivity(
        {
          leadId: id,
          branchId: input.branchId,
          kind: 'note',
          body: 'Lead entered.',
          data:
            possibleDuplicates.matches.length || possibleDuplicates.otherBranchMatches
              ? {
                  possibleDuplicates: possibleDuplicates.matches.map((m) => m.id),
                  otherBranchMatches: possibleDuplicates.otherBranchMatches,
                }
              : {},
          actorId: user.id,
        },
        trx,
      );
      return { lead: await this.get(user, id, trx), possibleDuplicates };
    });
  }

  async update(user: SessionUser, id: string, patch: Partial<LeadInput>): Promise<LeadDetail> {
    return inTransaction(this.knex, async (trx) => {
      const row = await this.writable(user, id, trx);
      if (patch.salespersonId !== undefined && patch.salespersonId !== row.salespersonId) {
        if (user.role === 'salesperson') {
          throw new DomainError('forbidden', 'LEAD.ASSIGN_FORBIDDEN', 'Only a manager can reassign a lead.');
        }
        if (
          patch.salespersonId &&
          !(await this.repo.isSalespersonOf(patch.salespersonId, row.branchId, trx))
        ) {
          throw invalid('salespersonId', 'That person does not sell in this branch.');
        }
        await this.repo.addActivity(
          {
            leadId: id,
            branchId: row.branchId,
            kind: 'assignment',
            data: { from: row.salespersonId, to: patch.salespersonId },
            actorId: user.id,
          },
          trx,
        );
      }
      await this.repo.update(id, patch, trx);
      if (patch.salespersonId !== undefined && patch.salespersonId !== row.salespersonId) {
        await this.repo.reassignOpenProposals(id, patch.salespersonId ?? null, trx);
      }
      return this.get(user, id, trx);
    });
  }

  async duplicates(
    user: SessionUser,
    dto: DuplicateCheckDto,
    db: Db = this.knex,
  ): Promise<DuplicateCheckResponse> {
    const found = await this.repo.duplicates({ ...duplicateKeys(dto), excludeId: dto.excludeId }, db);
    const visible = found.filter((m) => user.ability.can('read', asSubject('Lead', m)));
    return {
      matches: visible.map(({ branchId: _b, salespersonId: _s, ...m }) => m),
      otherBranchMatches: found.length - visible.length,
    };
  }

  async addActivity(user: SessionUser, id: string, dto: LeadActivityDto): Promise<LeadDetail> {
    return inTransaction(this.knex, async (trx) => {
      const row = await this.writable(user, id, trx);
      await this.repo.addActivity(
        { leadId: id, branchId: row.branchId, kind: dto.kind, body: dto.body, actorId: user.id },
        trx,
      );
      return this.get(user, id, trx);
    });
  }

  /** A move asked for by a person: the same rule as the automatic ones, refused with 409 and a code. */
  async changeStage(user: SessionUser, id: string, dto: ChangeStageDto): Promise<LeadDetail> {
    return inTransaction(this.knex, async (trx) => {
      const row = await this.writable(user, id, trx);
      await trx('leads').where({ id }).forUpdate().first('id');
      const facts = await this.repo.facts(id, trx);
      const check = checkTransition(row.stage, dto.to, facts, { lostReason: dto.reason });
      if (!check.ok)
        throw new DomainError('conflict', check.code, check.message, { from: row.stage, to: dto.to });
      await this.moveStage(
        {
          leadId: id,
          branchId: row.branchId,
          from: row.stage,
          to: dto.to,
          reason: dto.reason ?? null,
          actorId: user.id,
        },
        trx,
      );
      return this.get(user, id, trx);
    });
  }

  /**
   * The last step of the main line, the money's (issue #5): completed → paid in full, once the live
   * contract's job is completed and its payments less refunds cover its price (LeadsRepository.facts).
   * Called after a payment is recorded and at completion, inside their transaction; does nothing in any
   * other stage or while the facts do not allow it. Returns whether the lead moved.
   */
  async settleIfPaid(leadId: string, actorId: string | null, trx: Knex.Transaction): Promise<boolean> {
    const lead = await this.repo.lockStage(leadId, trx);
    if (!lead || lead.stage !== 'completed') return false;
    const facts = await this.repo.facts(leadId, trx);
    if (!checkTransition('completed', 'paid_in_full', facts).ok) return false;
    await this.moveStage(
      { leadId, branchId: lead.branchId, from: 'completed', to: 'paid_in_full', reason: null, actorId },
      trx,
    );
    return true;
  }

  /** Records a stage change and its timeline row; used by the other features for their automatic moves. */
  async moveStage(
    m: {
      leadId: string;
      branchId: string;
      from: LeadStage;
      to: LeadStage;
      reason: string | null;
      actorId: string | null;
    },
    db: Db,
  ): Promise<void> {
    await this.repo.setStage(m.leadId, m.to, m.to === 'lost' ? m.reason : null, db);
    await this.repo.addActivity(
      {
        leadId: m.leadId,
        branchId: m.branchId,
        kind: 'stage_change',
        body: `${LEAD_STAGE_LABELS[m.from]} → ${LEAD_STAGE_LABELS[m.to]}${m.reason ? `: ${m.reason}` : ''}`,
        data: { from: m.from, to: m.to },
        actorId: m.actorId,
      },
      db,
    );
  }

  async transfer(user: SessionUser, id: string, dto: TransferLeadDto): Promise<LeadDetail> {
    return inTransaction(this.knex, async (trx) => {
      const row = await this.writable(user, id, trx);
      if (user.role !== 'owner' && user.role !== 'branch_manager') {
        throw new DomainError(
          'forbidden',
          'LEAD.TRANSFER_FORBIDDEN',
          'Only a branch manager can transfer a lead.',
        );
      }
      if (dto.branchId === row.branchId) throw invalid('branchId', 'The lead is already in this branch.');
      if (!TRANSFERABLE.includes(row.stage)) {
        throw new DomainError(
          'conflict',
          'LEAD.TRANSFER_TOO_LATE',
          'A lead can move to another branch only before a proposal has been sent to the homeowner.',
          { stage: row.stage },
        );
      }
      const target = await this.branches.findById(dto.branchId, trx);
      if (!target) throw invalid('branchId', 'Unknown branch.');
      await this.repo.addTransfer(
        { leadId: id, from: row.branchId, to: dto.branchId, note: dto.note ?? null, by: user.id },
        trx,
      );
      await this.repo.setBranch(id, dto.branchId, trx);
      // Its inspections, photos and draft proposals go with it, so the new branch can work on them.
      await this.repo.moveRecordsToBranch(id, dto.branchId, trx);
      const data = { fromBranch: row.branchCode, toBranch: target.code };
      const body = `Transferred from ${row.branchCode} to ${target.code}${dto.note ? `: ${dto.note}` : ''}`;
      // One row in each branch's timeline, so both managers see it.
      await this.repo.addActivity(
        { leadId: id, branchId: row.branchId, kind: 'transfer', body, data, actorId: user.id },
        trx,
      );
      await this.repo.addActivity(
        { leadId: id, branchId: dto.branchId, kind: 'transfer', body, data, actorId: user.id },
        trx,
      );
      return this.get(user, id, trx);
    });
  }

  transferredOut(user: SessionUser) {
    return this.repo.transferredOut(branchScope(user, 'sales'));
  }
}
