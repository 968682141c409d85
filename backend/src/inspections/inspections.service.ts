import { Inject, Injectable } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  branchScope,
  CalcDecimal,
  CalculatorInputError,
  FINDINGS_ITEMS,
  LEAD_STAGE_LABELS,
  settlement,
  SETTLEMENT_CAUTION,
  zonedLocalToUtc,
  type Inspection,
  type InspectionFindings,
  type LeadStage,
  type Survey,
  type SurveyKind,
  type SurveyPoint,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import { inTransaction, type Db } from '../database/transaction';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { InspectionsRepository, type LeadForInspection } from './inspections.repository';
import type {
  BookInspectionDto,
  CancelInspectionDto,
  CompleteInspectionDto,
  UpdateInspectionDto,
} from './dto/inspection.dto';
import type { FindingsDto } from './dto/findings.dto';
import type { PutSurveyDto } from './dto/survey.dto';

/** A lead in one of these stages takes no new inspection: the sale is over. */
const CLOSED_LEAD_STAGES: readonly LeadStage[] = ['lost', 'cancelled'];
/** Who can be named as the inspector: people who visit houses for a branch. */
const INSPECTOR_ROLES = ['salesperson', 'branch_manager', 'owner'];

type Access = 'read' | 'update';

const subjectOf = (i: { branchId: string; salespersonId: string | null }) =>
  asSubject('Inspection', { branchId: i.branchId, salespersonId: i.salespersonId });

@Injectable()
export class InspectionsService {
  constructor(
    private readonly repo: InspectionsRepository,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  /**
   * The inspection if the user may `access` it. One they may not read answers 404 (its existence does
   * not leak); one they may read but not change answers 403.
   */
  async accessible(user: SessionUser, id: string, access: Access, db: Db = this.knex): Promise<Inspection> {
    const found = await this.repo.findById(id, db);
    if (!found || !user.ability.can('read', subjectOf(found))) throw notFound('inspection');
    if (access === 'update') ForbiddenError.from(user.ability).throwUnlessCan('update', subjectOf(found));
    return found;
  }

  get(user: SessionUser, id: string): Promise<Inspection> {
    return this.accessible(user, id, 'read');
  }

  async listForLead(user: SessionUser, leadId: string): Promise<Inspection[]> {
    await this.readableLead(user, leadId, this.knex);
    return this.repo.listForLead(leadId, {
      branchIds: branchScope(user, 'sales'),
      salespersonId: user.role === 'salesperson' ? user.id : null,
    });
  }

  async book(user: SessionUser, leadId: string, dto: BookInspectionDto): Promise<Inspection> {
    return inTransaction(this.knex, async (trx) => {
      const lead = await this.readableLead(user, leadId, trx, true);
      ForbiddenError.from(user.ability).throwUnlessCan('create', subjectOf(lead));
      if (CLOSED_LEAD_STAGES.includes(lead.stage)) {
        throw conflict(
          'INSPECTION.LEAD_CLOSED',
          `This lead is ${LEAD_STAGE_LABELS[lead.stage].toLowerCase()}: reopen it before booking an inspection.`,
        );
      }
      const open = await this.repo.findBookedForLead(leadId, trx);
      if (open) {
        throw conflict(
          'INSPECTION.ALREADY_BOOKED',
          'This lead already has an inspection booked: reschedule that one instead.',
          { inspectionId: open },
        );
      }
      const when = this.toInstant(dto.scheduledAt, lead.timezone);
      const inspectorId = dto.inspectorId
        ? await this.checkInspector(dto.inspectorId, lead.branchId, trx)
        : await this.defaultInspector(user, lead, trx);
      const id = await this.repo.insert(
        {
          leadId,
          branchId: lead.branchId,
          inspectorId,
          scheduledAt: when.utc,
          durationMinutes: dto.durationMinutes,
        },
        trx,
      );
      await this.timeline(
        user,
        lead,
        `Inspection booked for ${dto.scheduledAt.replace('T', ' ')} (${lead.timezone})`,
        { action: 'booked', inspectionId: id, scheduledAt: when.utc, scheduledLocal: dto.scheduledAt },
        trx,
      );
      await this.moveLead(user, lead, 'new', 'inspection_booked', trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  async update(user: SessionUser, id: string, dto: UpdateInspectionDto): Promise<Inspection> {
    return inTransaction(this.knex, async (trx) => {
      await this.repo.lock(id, trx);
      const current = await this.accessible(user, id, 'update', trx);
      this.requireBooked(current);
      const patch: Parameters<InspectionsRepository['update']>[1] = {};
      if (dto.findings) patch.findings = mergeFindings(current.findings, dto.findings);
      if (dto.summary !== undefined) patch.summary = dto.summary;
      if (dto.durationMinutes != null) patch.durationMinutes = dto.durationMinutes;
      if (dto.inspectorId !== undefined) {
        patch.inspectorId =
          dto.inspectorId === null ? null : await this.checkInspector(dto.inspectorId, current.branchId, trx);
      }
      if (dto.scheduledAt != null && dto.scheduledAt !== current.scheduledLocal) {
        const when = this.toInstant(dto.scheduledAt, current.timezone);
        if (when.utc !== current.scheduledAt) {
          patch.scheduledAt = when.utc;
          await this.timeline(
            user,
            { id: current.leadId, branchId: current.branchId },
            `Inspection moved from ${current.scheduledLocal.replace('T', ' ')} to ${dto.scheduledAt.replace('T', ' ')} (${current.timezone})`,
            {
              action: 'rescheduled',
              inspectionId: id,
              from: current.scheduledAt,
              to: when.utc,
              scheduledLocal: dto.scheduledAt,
            },
            trx,
          );
        }
      }
      await this.repo.update(id, patch, trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  /**
   * Completing needs every item of the findings checklist answered (an empty list counts: "none
   * seen"). The survey and photos are not required: not every house gets a survey (a drainage-only
   * visit, a house the homeowner would not let us into) and the findings say what was looked at.
   */
  async complete(user: SessionUser, id: string, dto: CompleteInspectionDto): Promise<Inspection> {
    return inTransaction(this.knex, async (trx) => {
      await this.repo.lock(id, trx);
      const current = await this.accessible(user, id, 'update', trx);
      this.requireBooked(current);
      if (current.missingFindings.length) {
        const labels = current.missingFindings.map(
          (k) => FINDINGS_ITEMS.find((i) => i.key === k)?.label ?? k,
        );
        throw new DomainError(
          'rule',
          'INSPECTION.FINDINGS_INCOMPLETE',
          `Answer every item of the findings checklist before completing: ${labels.join(', ')}.`,
          current.missingFindings.map((key) => ({
            field: `findings.${key}`,
            message: 'Answer this item (an empty list means none seen).',
          })),
        );
      }
      await this.repo.update(
        id,
        { status: 'completed', completedAt: 'now', ...(dto.summary ? { summary: dto.summary } : {}) },
        trx,
      );
      const lead = { id: current.leadId, branchId: current.branchId };
      await this.timeline(user, lead, 'Inspection completed', { action: 'completed', inspectionId: id }, trx);
      await this.moveLead(user, lead, 'inspection_booked', 'inspected', trx);
      return (await this.repo.findById(id, trx))!;
    });
  }

  /**
   * Cancels a booked inspection. When it was the lead's only booking and the lead is still at
   * "inspection booked", the lead goes back to "new": nothing is booked any more.
   */
  async cancel(user: SessionUser, id: string, dto: CancelInspectionDto): Promise<Inspection> {
    return inTransaction(this.knex, async (trx) => {
      await this.repo.lock(id, trx);
      const current = await this.accessible(user, id, 'update', trx);
      this.requireBooked(current);
      await this.repo.update(id, { status: 'cancelled' }, trx);
      const lead = { id: current.leadId, branchId: current.branchId };
      await this.timeline(
        user,
        lead,
        `Inspection of ${current.scheduledLocal.replace('T', ' ')} cancelled${dto.reason ? `: ${dto.reason}` : ''}`,
        { action: 'cancelled', inspectionId: id, reason: dto.reason ?? null },
        trx,
      );
      if (!(await this.repo.findBookedForLead(current.leadId, trx))) {
        await this.moveLead(user, lead, 'inspection_booked', 'new', trx);
      }
      return (await this.repo.findById(id, trx))!;
    });
  }

  // ---- survey ----------------------------------------------------------------------------------

  async getSurvey(user: SessionUser, id: string, kind: SurveyKind): Promise<Survey> {
    await this.accessible(user, id, 'read');
    return this.survey(id, kind, this.knex);
  }

  /**
   * Replaces the survey of `kind`. The inspection survey is taken while the inspection is open; the
   * completion survey (the re-survey when the repair is finished) once it is completed.
   */
  async putSurvey(user: SessionUser, id: string, kind: SurveyKind, dto: PutSurveyDto): Promise<Survey> {
    return inTransaction(this.knex, async (trx) => {
      await this.repo.lock(id, trx);
      const current = await this.accessible(user, id, 'update', trx);
      if (kind === 'inspection') this.requireBooked(current);
      if (kind === 'completion' && current.status !== 'completed') {
        throw conflict(
          'SURVEY.INSPECTION_NOT_COMPLETED',
          'The completion survey is taken after the inspection is completed.',
        );
      }
      const points: SurveyPoint[] = dto.points.map((p) => ({
        label: p.label,
        xFt: p.xFt,
        yFt: p.yFt,
        elevationIn: p.elevationIn,
      }));
      try {
        // Refuses duplicate labels and two points at one spot, with the field at fault.
        settlement({ points });
      } catch (e) {
        if (e instanceof CalculatorInputError) {
          throw new DomainError('invalid', 'VALIDATION.FAILED', e.message, e.details);
        }
        throw e;
      }
      checkReference(points, dto.referenceLabel);
      await this.repo.replaceSurvey(
        { inspectionId: id, branchId: current.branchId, kind, points, referenceLabel: dto.referenceLabel },
        trx,
      );
      return this.survey(id, kind, trx);
    });
  }

  private async survey(id: string, kind: SurveyKind, db: Db): Promise<Survey> {
    const { points, referenceLabel } = await this.repo.surveyPoints(id, kind, db);
    return {
      inspectionId: id,
      kind,
      referenceLabel,
      points,
      result: points.length >= 2 ? settlement({ points }) : null,
      caution: SETTLEMENT_CAUTION,
    };
  }

  // ---- helpers ---------------------------------------------------------------------------------

  private async readableLead(
    user: SessionUser,
    leadId: string,
    db: Db,
    lock = false,
  ): Promise<LeadForInspection> {
    const lead = await this.repo.findLead(leadId, db, lock);
    if (!lead || !user.ability.can('read', asSubject('Lead', lead))) throw notFound('lead');
    return lead;
  }

  private requireBooked(i: Inspection): void {
    if (i.status !== 'booked') {
      throw conflict(
        i.status === 'completed' ? 'INSPECTION.COMPLETED' : 'INSPECTION.CANCELLED',
        `This inspection is ${i.status} and can no longer be changed.`,
      );
    }
  }

  /** The instant of a wall-clock time in the branch's zone, or a field error saying why not. */
  private toInstant(local: string, timezone: string) {
    const result = zonedLocalToUtc(local, timezone);
    if (!result.ok) {
      throw new DomainError(
        'invalid',
        result.reason === 'nonexistent' ? 'INSPECTION.TIME_DOES_NOT_EXIST' : 'VALIDATION.FAILED',
        result.message,
        [{ field: 'scheduledAt', message: result.message }],
      );
    }
    return result;
  }

  private async checkInspector(userId: string, branchId: string, db: Db): Promise<string> {
    const c = await this.repo.findInspectorCandidate(userId, branchId, db);
    const eligible = c && c.active && INSPECTOR_ROLES.includes(c.role) && (c.role === 'owner' || c.inBranch);
    if (!eligible) throw invalid('inspectorId', 'Choose a salesperson or manager of this branch.');
    return userId;
  }

  /** The lead's salesperson, else the person booking, when either may inspect for the branch; else nobody. */
  private async defaultInspector(user: SessionUser, lead: LeadForInspection, db: Db): Promise<string | null> {
    for (const candidate of [lead.salespersonId, user.id]) {
      if (!candidate) continue;
      try {
        return await this.checkInspector(candidate, lead.branchId, db);
      } catch {
        // not eligible: try the next
      }
    }
    return null;
  }

  private timeline(
    user: SessionUser,
    lead: { id: string; branchId: string },
    body: string,
    data: Record<string, unknown>,
    db: Db,
  ): Promise<void> {
    return this.repo.addLeadActivity(
      { leadId: lead.id, branchId: lead.branchId, kind: 'inspection', body, data, actorId: user.id },
      db,
    );
  }

  /** Moves the lead `from` → `to` only when it is in `from` now, with its timeline row. */
  private async moveLead(
    user: SessionUser,
    lead: { id: string; branchId: string },
    from: LeadStage,
    to: LeadStage,
    db: Db,
  ): Promise<void> {
    if (!(await this.repo.moveLeadStage(lead.id, from, to, db))) return;
    await this.repo.addLeadActivity(
      {
        leadId: lead.id,
        branchId: lead.branchId,
        kind: 'stage_change',
        // The same wording as the leads feature's own stage changes.
        body: `${LEAD_STAGE_LABELS[from]} → ${LEAD_STAGE_LABELS[to]}`,
        data: { from, to },
        actorId: user.id,
      },
      db,
    );
  }
}

/** Items given replace the stored ones whole; null clears one; items left out stay. */
function mergeFindings(stored: Partial<InspectionFindings>, given: FindingsDto): Partial<InspectionFindings> {
  const merged: Record<string, unknown> = { ...stored };
  for (const [key, value] of Object.entries(given)) {
    if (value === undefined) continue;
    if (value === null) delete merged[key];
    else merged[key] = JSON.parse(JSON.stringify(value));
  }
  return merged as Partial<InspectionFindings>;
}

/** Elevations are measured from the reference point, so it must be one of the points and read 0. */
function checkReference(points: SurveyPoint[], referenceLabel: string): void {
  const index = points.findIndex((p) => p.label === referenceLabel);
  if (index < 0) {
    throw new DomainError(
      'rule',
      'SURVEY.REFERENCE_UNKNOWN',
      `The reference point "${referenceLabel}" is not one of the survey points.`,
      [{ field: 'referenceLabel', message: 'Choose one of the survey points as the reference.' }],
    );
  }
  const reference = points[index]!;
  if (!new CalcDecimal(reference.elevationIn).isZero()) {
    const message =
      `Elevations are measured from the reference point "${referenceLabel}", so its own elevation must be 0, ` +
      `not ${reference.elevationIn}. Enter 0 for it and every other reading relative to it.`;
    throw new DomainError('rule', 'SURVEY.REFERENCE_NOT_ZERO', message, [
      { field: `points[${index}].elevationIn`, message },
    ]);
  }
}
