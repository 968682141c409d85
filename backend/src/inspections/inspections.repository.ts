import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  missingFindings,
  utcToZonedLocal,
  type Inspection,
  type InspectionFindings,
  type InspectionStatus,
  type LeadStage,
  type SurveyKind,
  type SurveyPoint,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

interface InspectionRow {
  id: string;
  lead_id: string;
  branch_id: string;
  inspector_id: string | null;
  inspector_name: string | null;
  scheduled_at: Date;
  duration_minutes: number;
  status: InspectionStatus;
  findings: Partial<InspectionFindings>;
  summary: string | null;
  completed_at: Date | null;
  created_at: Date;
  updated_at: Date;
  salesperson_id: string | null;
  timezone: string;
  homeowner_name: string;
  address_line1: string;
  city: string;
  state: string;
  postal_code: string;
  lead_stage: LeadStage;
  photo_count: string;
  survey_inspection_count: string;
  survey_completion_count: string;
}

function toInspection(r: InspectionRow): Inspection {
  const local = utcToZonedLocal(r.scheduled_at, r.timezone);
  const findings = r.findings ?? {};
  return {
    id: r.id,
    leadId: r.lead_id,
    branchId: r.branch_id,
    salespersonId: r.salesperson_id,
    inspector: r.inspector_id ? { id: r.inspector_id, name: r.inspector_name ?? '' } : null,
    status: r.status,
    scheduledAt: r.scheduled_at.toISOString(),
    scheduledLocal: local.local,
    scheduledUtcOffset: local.utcOffset,
    timezone: r.timezone,
    durationMinutes: r.duration_minutes,
    findings,
    missingFindings: missingFindings(findings),
    summary: r.summary,
    completedAt: r.completed_at?.toISOString() ?? null,
    photoCount: Number(r.photo_count),
    surveyPointCounts: {
      inspection: Number(r.survey_inspection_count),
      completion: Number(r.survey_completion_count),
    },
    lead: {
      id: r.lead_id,
      homeownerName: r.homeowner_name,
      addressLine1: r.address_line1,
      city: r.city,
      state: r.state,
      postalCode: r.postal_code,
      stage: r.lead_stage,
    },
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

/** What booking needs to know about a lead. */
export interface LeadForInspection {
  id: string;
  branchId: string;
  salespersonId: string | null;
  stage: LeadStage;
  timezone: string;
}

export interface InspectorCandidate {
  id: string;
  role: string;
  active: boolean;
  inBranch: boolean;
}

/** Who may read the record: the inspection's branch and its lead's salesperson (SQL filter for lists). */
export interface InspectionScope {
  /** null: every branch. */
  branchIds: string[] | null;
  /** Set for a salesperson: only leads assigned to them. */
  salespersonId: string | null;
}

@Injectable()
export class InspectionsRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private base(db: Db) {
    return db('inspections as i')
      .join('leads as l', 'l.id', 'i.lead_id')
      .join('branches as b', 'b.id', 'i.branch_id')
      .leftJoin('users as u', 'u.id', 'i.inspector_id')
      .select(
        'i.*',
        'u.name as inspector_name',
        'l.salesperson_id',
        'b.timezone',
        'l.homeowner_name',
        'l.address_line1',
        'l.city',
        'l.state',
        'l.postal_code',
        'l.stage as lead_stage',
        db.raw('(select count(*) from inspection_photos p where p.inspection_id = i.id) as photo_count'),
        db.raw(
          `(select count(*) from survey_points s where s.inspection_id = i.id and s.kind = 'inspection') as survey_inspection_count`,
        ),
        db.raw(
          `(select count(*) from survey_points s where s.inspection_id = i.id and s.kind = 'completion') as survey_completion_count`,
        ),
      );
  }

  async findById(id: string, db: Db = this.knex): Promise<Inspection | undefined> {
    const row = await this.base(db).where('i.id', id).first();
    return row ? toInspection(row) : undefined;
  }

  /** Holds the inspection row until the transaction ends, so two edits cannot interleave. */
  async lock(id: string, db: Db): Promise<void> {
    await db('inspections').select('id').where({ id }).forUpdate();
  }

  async listForLead(leadId: string, scope: InspectionScope, db: Db = this.knex): Promise<Inspection[]> {
    const q = this.base(db).where('i.lead_id', leadId).orderBy('i.scheduled_at', 'desc');
    if (scope.branchIds) q.whereIn('i.branch_id', scope.branchIds);
    if (scope.salespersonId) q.where('l.salesperson_id', scope.salespersonId);
    return (await q).map(toInspection);
  }

  async insert(
    i: {
      leadId: string;
      branchId: string;
      inspectorId: string | null;
      scheduledAt: string;
      durationMinutes: number | undefined;
    },
    db: Db,
  ): Promise<string> {
    const row: Record<string, unknown> = {
      lead_id: i.leadId,
      branch_id: i.branchId,
      inspector_id: i.inspectorId,
      scheduled_at: i.scheduledAt,
    };
    if (i.durationMinutes !== undefined) row.duration_minutes = i.durationMinutes;
    const [inserted] = await db('inspections').insert(row).returning('id');
    return inserted.id;
  }

  async update(
    id: string,
    patch: {
      findings?: Partial<InspectionFindings>;
      summary?: string | null;
      scheduledAt?: string;
      durationMinutes?: number;
      inspectorId?: string | null;
      status?: InspectionStatus;
      completedAt?: 'now';
    },
    db: Db,
  ): Promise<void> {
    const row: Record<string, unknown> = { updated_at: db.fn.now() };
    if (patch.findings !== undefined) row.findings = JSON.stringify(patch.findings);
    if (patch.summary !== undefined) row.summary = patch.summary;
    if (patch.scheduledAt !== undefined) row.scheduled_at = patch.scheduledAt;
    if (patch.durationMinutes !== undefined) row.duration_minutes = patch.durationMinutes;
    if (patch.inspectorId !== undefined) row.inspector_id = patch.inspectorId;
    if (patch.status !== undefined) row.status = patch.status;
    if (patch.completedAt === 'now') row.completed_at = db.fn.now();
    await db('inspections').where({ id }).update(row);
  }

  async findBookedForLead(leadId: string, db: Db): Promise<string | undefined> {
    const row = await db('inspections').select('id').where({ lead_id: leadId, status: 'booked' }).first();
    return row?.id;
  }

  // ---- the lead, for booking and the stage moves this feature causes ----------------------------

  /** The lead with its branch's zone; `lock` holds the row for the stage change. */
  async findLead(leadId: string, db: Db, lock = false): Promise<LeadForInspection | undefined> {
    const q = db('leads as l')
      .join('branches as b', 'b.id', 'l.branch_id')
      .select('l.id', 'l.branch_id', 'l.salesperson_id', 'l.stage', 'b.timezone')
      .where('l.id', leadId)
      .first();
    if (lock) q.forUpdate('l');
    const row = await q;
    return row
      ? {
          id: row.id,
          branchId: row.branch_id,
          salespersonId: row.salesperson_id,
          stage: row.stage,
          timezone: row.timezone,
        }
      : undefined;
  }

  /** Moves the lead from `from` to `to` only if it is still in `from`; true when it moved. */
  async moveLeadStage(leadId: string, from: LeadStage, to: LeadStage, db: Db): Promise<boolean> {
    const moved = await db('leads')
      .where({ id: leadId, stage: from })
      .update({ stage: to, stage_changed_at: db.fn.now(), updated_at: db.fn.now() })
      .returning('id');
    return moved.length > 0;
  }

  async addLeadActivity(
    a: {
      leadId: string;
      branchId: string;
      kind: 'inspection' | 'stage_change';
      body: string;
      data: Record<string, unknown>;
      actorId: string;
    },
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

  async findInspectorCandidate(
    userId: string,
    branchId: string,
    db: Db = this.knex,
  ): Promise<InspectorCandidate | undefined> {
    const row = await db('users as u')
      .select(
        'u.id',
        'u.role',
        'u.active',
        db.raw(
          'exists (select 1 from user_branches ub where ub.user_id = u.id and ub.branch_id = ?) as in_branch',
          [branchId],
        ),
      )
      .where('u.id', userId)
      .first();
    return row ? { id: row.id, role: row.role, active: row.active, inBranch: row.in_branch } : undefined;
  }

  // ---- the floor-elevation survey -----------------------------------------------------------------

  async surveyPoints(
    inspectionId: string,
    kind: SurveyKind,
    db: Db = this.knex,
  ): Promise<{ points: SurveyPoint[]; referenceLabel: string | null }> {
    const rows: {
      label: string;
      x_ft: string;
      y_ft: string;
      elevation_in: string;
      is_reference: boolean;
    }[] = await db('survey_points')
      .select('label', 'x_ft', 'y_ft', 'elevation_in', 'is_reference')
      .where({ inspection_id: inspectionId, kind })
      .orderBy('position');
    return {
      points: rows.map((r) => ({ label: r.label, xFt: r.x_ft, yFt: r.y_ft, elevationIn: r.elevation_in })),
      referenceLabel: rows.find((r) => r.is_reference)?.label ?? null,
    };
  }

  async replaceSurvey(
    s: {
      inspectionId: string;
      branchId: string;
      kind: SurveyKind;
      points: SurveyPoint[];
      referenceLabel: string;
    },
    db: Db,
  ): Promise<void> {
    await db('survey_points').where({ inspection_id: s.inspectionId, kind: s.kind }).delete();
    await db('survey_points').insert(
      s.points.map((p, position) => ({
        inspection_id: s.inspectionId,
        branch_id: s.branchId,
        kind: s.kind,
        position,
        label: p.label,
        x_ft: p.xFt,
        y_ft: p.yFt,
        elevation_in: p.elevationIn,
        is_reference: p.label === s.referenceLabel,
      })),
    );
    await db('inspections').where({ id: s.inspectionId }).update({ updated_at: db.fn.now() });
  }
}
