import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type {
  CheckedInstallEntry,
  ComparedPoint,
  DayNote,
  HelicalShaft,
  InstallEntry,
  InstallKind,
  JobPhoto,
  PhotoContentType,
  StopReason,
  Warranty,
} from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

/** What the field log needs of a job beyond JobsRepository's record. */
export interface JobExtras {
  /** Sales tax inside the contract price (charged on the invoice), 0.00 otherwise. */
  tax: string;
  /** The inspection the proposal was written from, if any. */
  inspectionId: string | null;
  branchName: string;
  branchAddressLine1: string;
  branchCity: string;
  branchState: string;
  branchPostalCode: string;
  branchPhone: string | null;
}

export interface PhotoRecord {
  id: string;
  jobId: string;
  clientPhotoId: string | null;
  installEntryId: string | null;
  storageKey: string;
  thumbnailKey: string | null;
  contentType: PhotoContentType;
  caption: string | null;
  createdAt: Date;
}

export interface WarrantyRecord {
  id: string;
  jobId: string;
  branchId: string;
  number: string;
  termYears: number;
  covers: string;
  exclusions: string | null;
  transferable: boolean;
  issuedOn: string;
  pdfKey: string | null;
  issuedByName: string;
}

export interface CompletionRecord {
  checklist: Record<string, boolean>;
  homeownerName: string;
  signedAt: Date;
  note: string | null;
}

/** A completed job's figures for the actuals summary. */
export interface CompletedJobFigures {
  jobId: string;
  branchId: string;
  branchName: string;
  salespersonId: string | null;
  salespersonName: string | null;
  price: string;
  tax: string;
  estimatedLabourHours: string | null;
  labourCostPerHour: string | null;
}

export interface LogTotalsRow {
  injectionPoints: number;
  pounds: string;
  pushPiers: number;
  helicalPiles: number;
  labourHours: string;
}

const ENTRY_COLUMNS = [
  'e.id',
  'e.job_id',
  'e.client_row_id',
  'e.kind',
  'e.number',
  'e.location',
  'e.location_ft',
  'e.depth_ft',
  'e.pounds',
  'e.stop_reason',
  'e.final_pressure_psi',
  'e.torque_ft_lb',
  'e.shaft',
  'e.capacity_ultimate_lb',
  'e.capacity_allowable_lb',
  'e.design_load_lb',
  'e.below_design_load',
  'e.note',
  'e.logged_at',
  'u.name as logged_by_name',
];

interface EntryRow {
  id: string;
  job_id: string;
  client_row_id: string;
  kind: InstallKind;
  number: number;
  location: string | null;
  location_ft: string | null;
  depth_ft: string | null;
  pounds: string | null;
  stop_reason: StopReason | null;
  final_pressure_psi: string | null;
  torque_ft_lb: string | null;
  shaft: HelicalShaft | null;
  capacity_ultimate_lb: string | null;
  capacity_allowable_lb: string | null;
  design_load_lb: string | null;
  below_design_load: boolean | null;
  note: string | null;
  logged_at: Date;
  logged_by_name: string;
  photo_count?: string | number;
}

const toEntry = (r: EntryRow): InstallEntry & { jobId: string } => ({
  id: r.id,
  jobId: r.job_id,
  clientRowId: r.client_row_id,
  kind: r.kind,
  number: r.number,
  location: r.location,
  locationFt: r.location_ft,
  depthFt: r.depth_ft,
  pounds: r.pounds,
  stopReason: r.stop_reason,
  finalPressurePsi: r.final_pressure_psi,
  torqueFtLb: r.torque_ft_lb,
  shaft: r.shaft,
  designLoadLb: r.design_load_lb,
  capacityUltimateLb: r.capacity_ultimate_lb,
  capacityAllowableLb: r.capacity_allowable_lb,
  belowDesignLoad: r.below_design_load,
  note: r.note,
  loggedAt: r.logged_at.toISOString(),
  loggedByName: r.logged_by_name,
  photoCount: Number(r.photo_count ?? 0),
});

interface DayNoteRow {
  id: string;
  job_id: string;
  client_row_id: string;
  work_date: string;
  note: string | null;
  crew_size: number | null;
  labour_hours: string;
  written_by_name: string;
  created_at: Date;
}

const toDayNote = (r: DayNoteRow): DayNote & { jobId: string } => ({
  id: r.id,
  jobId: r.job_id,
  clientRowId: r.client_row_id,
  workDate: r.work_date,
  note: r.note,
  crewSize: r.crew_size,
  labourHours: r.labour_hours,
  writtenByName: r.written_by_name,
  createdAt: r.created_at.toISOString(),
});

export const photoUrl = (jobId: string, photoId: string) => `/api/jobs/${jobId}/photos/${photoId}`;

export const toJobPhoto = (p: PhotoRecord): JobPhoto => ({
  id: p.id,
  clientPhotoId: p.clientPhotoId,
  installEntryId: p.installEntryId,
  caption: p.caption,
  contentType: p.contentType,
  url: photoUrl(p.jobId, p.id),
  thumbnailUrl: p.thumbnailKey ? `${photoUrl(p.jobId, p.id)}/thumbnail` : null,
  createdAt: p.createdAt.toISOString(),
});

export const toWarranty = (w: WarrantyRecord): Warranty => ({
  id: w.id,
  jobId: w.jobId,
  number: w.number,
  termYears: w.termYears,
  covers: w.covers,
  exclusions: w.exclusions,
  transferable: w.transferable,
  issuedOn: w.issuedOn,
  pdfUrl: `/api/jobs/${w.jobId}/warranty/certificate.pdf`,
});

/** The only file of the field log that touches Knex. */
@Injectable()
export class FieldRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  async extras(jobId: string, db: Db = this.knex): Promise<JobExtras> {
    const r = await db('jobs as j')
      .join('contracts as c', 'c.id', 'j.contract_id')
      .join('proposals as p', 'p.id', 'c.proposal_id')
      .join('branches as b', 'b.id', 'j.branch_id')
      .where('j.id', jobId)
      .first(
        'c.tax',
        'p.inspection_id as inspectionId',
        'b.name as branchName',
        'b.address_line1 as branchAddressLine1',
        'b.city as branchCity',
        'b.state as branchState',
        'b.postal_code as branchPostalCode',
        'b.phone as branchPhone',
      );
    return r as JobExtras;
  }

  /** Locks the job row against completion while a row is written (completion takes it FOR UPDATE). */
  async shareLockJob(jobId: string, trx: Knex.Transaction): Promise<string | undefined> {
    const r = await trx('jobs').where({ id: jobId }).forShare().first('status');
    return r?.status;
  }

  // ---- install entries ----------------------------------------------------------------------------

  private entries(db: Db) {
    return db('install_entries as e')
      .join('users as u', 'u.id', 'e.logged_by')
      .select(
        ...ENTRY_COLUMNS,
        db.raw('(select count(*) from job_photos ph where ph.install_entry_id = e.id) as photo_count'),
      );
  }

  async entryByClientRowId(clientRowId: string, db: Db = this.knex) {
    const r = await this.entries(db).where('e.client_row_id', clientRowId).first();
    return r ? toEntry(r) : undefined;
  }

  async listEntries(jobId: string, db: Db = this.knex): Promise<InstallEntry[]> {
    const rows: EntryRow[] = await this.entries(db)
      .where('e.job_id', jobId)
      .orderBy([
        { column: 'e.kind', order: 'asc' },
        { column: 'e.number', order: 'asc' },
      ]);
    return rows.map((r) => {
      const { jobId: _jobId, ...entry } = toEntry(r);
      return entry;
    });
  }

  async entryBelongsToJob(entryId: string, jobId: string, db: Db = this.knex): Promise<boolean> {
    return !!(await db('install_entries').where({ id: entryId, job_id: jobId }).first('id'));
  }

  /** Inserts the row unless its client row id is already stored; true when this call wrote it. */
  async insertEntry(
    e: CheckedInstallEntry & {
      jobId: string;
      branchId: string;
      clientRowId: string;
      loggedBy: string;
      loggedAt: string;
    },
    db: Db,
  ): Promise<boolean> {
    const rows = await db('install_entries')
      .insert({
        job_id: e.jobId,
        branch_id: e.branchId,
        client_row_id: e.clientRowId,
        kind: e.kind,
        number: e.number,
        location: e.location,
        location_ft: e.locationFt,
        depth_ft: e.depthFt,
        pounds: e.pounds,
        stop_reason: e.stopReason,
        final_pressure_psi: e.finalPressurePsi,
        torque_ft_lb: e.torqueFtLb,
        shaft: e.shaft,
        capacity_ultimate_lb: e.capacityUltimateLb,
        capacity_allowable_lb: e.capacityAllowableLb,
        design_load_lb: e.designLoadLb,
        below_design_load: e.belowDesignLoad,
        note: e.note,
        logged_by: e.loggedBy,
        logged_at: e.loggedAt,
      })
      .onConflict('client_row_id')
      .ignore()
      .returning('id');
    return rows.length === 1;
  }

  // ---- day notes ----------------------------------------------------------------------------------

  private dayNotes(db: Db) {
    return db('job_day_notes as n')
      .join('users as u', 'u.id', 'n.written_by')
      .select(
        'n.id',
        'n.job_id',
        'n.client_row_id',
        db.raw(`to_char(n.work_date, 'YYYY-MM-DD') as work_date`),
        'n.note',
        'n.crew_size',
        'n.labour_hours',
        'n.created_at',
        'u.name as written_by_name',
      );
  }

  async dayNoteByClientRowId(clientRowId: string, db: Db = this.knex) {
    const r = await this.dayNotes(db).where('n.client_row_id', clientRowId).first();
    return r ? toDayNote(r) : undefined;
  }

  async listDayNotes(jobId: string, db: Db = this.knex): Promise<DayNote[]> {
    const rows: DayNoteRow[] = await this.dayNotes(db)
      .where('n.job_id', jobId)
      .orderBy([
        { column: 'n.work_date', order: 'asc' },
        { column: 'n.created_at', order: 'asc' },
      ]);
    return rows.map((r) => {
      const { jobId: _jobId, ...note } = toDayNote(r);
      return note;
    });
  }

  async insertDayNote(
    n: {
      jobId: string;
      branchId: string;
      clientRowId: string;
      workDate: string;
      note: string | null;
      crewSize: number | null;
      labourHours: string;
      writtenBy: string;
    },
    db: Db,
  ): Promise<boolean> {
    const rows = await db('job_day_notes')
      .insert({
        job_id: n.jobId,
        branch_id: n.branchId,
        client_row_id: n.clientRowId,
        work_date: n.workDate,
        note: n.note,
        crew_size: n.crewSize,
        labour_hours: n.labourHours,
        written_by: n.writtenBy,
      })
      .onConflict('client_row_id')
      .ignore()
      .returning('id');
    return rows.length === 1;
  }

  // ---- photos -------------------------------------------------------------------------------------

  private photos(db: Db) {
    return db('job_photos').select(
      'id',
      'job_id as jobId',
      'client_photo_id as clientPhotoId',
      'install_entry_id as installEntryId',
      'storage_key as storageKey',
      'thumbnail_key as thumbnailKey',
      'content_type as contentType',
      'caption',
      'created_at as createdAt',
    );
  }

  async listPhotos(jobId: string, db: Db = this.knex): Promise<PhotoRecord[]> {
    return this.photos(db)
      .where({ job_id: jobId })
      .orderBy([
        { column: 'created_at', order: 'asc' },
        { column: 'id', order: 'asc' },
      ]);
  }

  async findPhoto(jobId: string, photoId: string, db: Db = this.knex): Promise<PhotoRecord | undefined> {
    return this.photos(db).where({ job_id: jobId, id: photoId }).first();
  }

  /** The photo stored under the phone's id for it, on whichever job (the service checks which). */
  async photoByClientId(clientPhotoId: string, db: Db = this.knex): Promise<PhotoRecord | undefined> {
    return this.photos(db).where({ client_photo_id: clientPhotoId }).first();
  }

  async insertPhoto(
    p: {
      id: string;
      jobId: string;
      branchId: string;
      clientPhotoId: string | null;
      installEntryId: string | null;
      storageKey: string;
      thumbnailKey: string | null;
      contentType: PhotoContentType;
      sizeBytes: number;
      caption: string | null;
      uploadedBy: string;
    },
    db: Db = this.knex,
  ): Promise<void> {
    await db('job_photos').insert({
      id: p.id,
      job_id: p.jobId,
      branch_id: p.branchId,
      client_photo_id: p.clientPhotoId,
      install_entry_id: p.installEntryId,
      storage_key: p.storageKey,
      thumbnail_key: p.thumbnailKey,
      content_type: p.contentType,
      size_bytes: p.sizeBytes,
      caption: p.caption,
      uploaded_by: p.uploadedBy,
    });
  }

  // ---- totals -------------------------------------------------------------------------------------

  /** Counts and sums of the log and the day notes, per job. */
  async logTotals(jobIds: string[], db: Db = this.knex): Promise<Map<string, LogTotalsRow>> {
    const out = new Map<string, LogTotalsRow>();
    if (jobIds.length === 0) return out;
    const entries = await db('install_entries')
      .whereIn('job_id', jobIds)
      .groupBy('job_id')
      .select(
        'job_id',
        db.raw(`count(*) filter (where kind = 'injection')::int as injection_points`),
        db.raw(`count(*) filter (where kind = 'push_pier')::int as push_piers`),
        db.raw(`count(*) filter (where kind = 'helical_pile')::int as helical_piles`),
        db.raw(`coalesce(sum(pounds), 0)::numeric(14,2)::text as pounds`),
      );
    const hours = await db('job_day_notes')
      .whereIn('job_id', jobIds)
      .groupBy('job_id')
      .select('job_id', db.raw(`coalesce(sum(labour_hours), 0)::numeric(14,2)::text as hours`));
    for (const id of jobIds) {
      out.set(id, { injectionPoints: 0, pounds: '0.00', pushPiers: 0, helicalPiles: 0, labourHours: '0.00' });
    }
    for (const e of entries) {
      Object.assign(out.get(e.job_id)!, {
        injectionPoints: e.injection_points,
        pushPiers: e.push_piers,
        helicalPiles: e.helical_piles,
        pounds: e.pounds,
      });
    }
    for (const h of hours) out.get(h.job_id)!.labourHours = h.hours;
    return out;
  }

  async planLinesOf(jobIds: string[], db: Db = this.knex) {
    if (jobIds.length === 0) return [];
    return db('job_plan_lines')
      .whereIn('job_id', jobIds)
      .orderBy([{ column: 'job_id' }, { column: 'position' }])
      .select(
        'job_id as jobId',
        'code',
        'description',
        'category',
        'unit',
        'quantity',
        'unit_cost as unitCost',
      );
  }

  /** Completed jobs in the scope, completed between from and to (the branch's dates, inclusive). */
  async completedJobs(
    scope: { branchIds: string[] | null; salespersonId: string | null },
    range: { from?: string; to?: string },
    db: Db = this.knex,
  ): Promise<CompletedJobFigures[]> {
    const q = db('jobs as j')
      .join('contracts as c', 'c.id', 'j.contract_id')
      .join('branches as b', 'b.id', 'j.branch_id')
      .leftJoin('users as sp', 'sp.id', 'j.salesperson_id')
      .where('j.status', 'completed')
      .select(
        'j.id as jobId',
        'j.branch_id as branchId',
        'b.name as branchName',
        'j.salesperson_id as salespersonId',
        'sp.name as salespersonName',
        'c.price',
        'c.tax',
        'j.estimated_labour_hours as estimatedLabourHours',
        'j.labour_cost_per_hour as labourCostPerHour',
      );
    if (scope.branchIds) q.whereIn('j.branch_id', scope.branchIds);
    if (scope.salespersonId) q.where('j.salesperson_id', scope.salespersonId);
    if (range.from) q.whereRaw(`(j.completed_at at time zone b.timezone)::date >= ?::date`, [range.from]);
    if (range.to) q.whereRaw(`(j.completed_at at time zone b.timezone)::date <= ?::date`, [range.to]);
    return q;
  }

  // ---- completion ---------------------------------------------------------------------------------

  async inspectionSurvey(
    inspectionId: string | null,
    leadId: string,
    db: Db = this.knex,
  ): Promise<ComparedPoint[]> {
    // The proposal's own inspection when it is completed; else the lead's latest completed one.
    const inspection = await db('inspections')
      .where({ lead_id: leadId, status: 'completed' })
      .orderByRaw('(id = ?) desc, completed_at desc nulls last', [
        inspectionId ?? '00000000-0000-0000-0000-000000000000',
      ])
      .first('id');
    if (!inspection) return [];
    const rows = await db('survey_points')
      .where({ inspection_id: inspection.id, kind: 'inspection' })
      .orderBy('position')
      .select('label', 'x_ft', 'y_ft', 'elevation_in', 'is_reference');
    return rows.map((r) => ({
      label: r.label,
      xFt: r.x_ft,
      yFt: r.y_ft,
      elevationIn: r.elevation_in,
      isReference: r.is_reference,
    }));
  }

  async jobSurvey(jobId: string, db: Db = this.knex): Promise<ComparedPoint[]> {
    const rows = await db('job_survey_points')
      .where({ job_id: jobId })
      .orderBy('position')
      .select('label', 'x_ft', 'y_ft', 'elevation_in', 'is_reference');
    return rows.map((r) => ({
      label: r.label,
      xFt: r.x_ft,
      yFt: r.y_ft,
      elevationIn: r.elevation_in,
      isReference: r.is_reference,
    }));
  }

  async insertCompletion(
    c: {
      jobId: string;
      branchId: string;
      checklist: Record<string, boolean>;
      homeownerName: string;
      signaturePng: Buffer;
      signedAt: Date;
      signedIp: string | null;
      completedBy: string;
      note: string | null;
      resurvey: { label: string; xFt: string; yFt: string; elevationIn: string; isReference: boolean }[];
    },
    trx: Knex.Transaction,
  ): Promise<void> {
    await trx('job_completions').insert({
      job_id: c.jobId,
      branch_id: c.branchId,
      checklist: JSON.stringify(c.checklist),
      homeowner_name: c.homeownerName,
      signature_png: c.signaturePng,
      signed_at: c.signedAt,
      signed_ip: c.signedIp,
      completed_by: c.completedBy,
      note: c.note,
    });
    await trx('job_survey_points').insert(
      c.resurvey.map((p, position) => ({
        job_id: c.jobId,
        branch_id: c.branchId,
        position,
        label: p.label,
        x_ft: p.xFt,
        y_ft: p.yFt,
        elevation_in: p.elevationIn,
        is_reference: p.isReference,
      })),
    );
  }

  async markCompleted(jobId: string, at: Date, trx: Knex.Transaction): Promise<void> {
    await trx('jobs')
      .where({ id: jobId })
      .update({ status: 'completed', completed_at: at, updated_at: trx.fn.now() });
  }

  async completion(jobId: string, db: Db = this.knex): Promise<CompletionRecord | undefined> {
    return db('job_completions')
      .where({ job_id: jobId })
      .first('checklist', 'homeowner_name as homeownerName', 'signed_at as signedAt', 'note');
  }

  // ---- warranties ---------------------------------------------------------------------------------

  async warranty(jobId: string, db: Db = this.knex): Promise<WarrantyRecord | undefined> {
    return db('warranties as w')
      .join('users as u', 'u.id', 'w.issued_by')
      .where('w.job_id', jobId)
      .first(
        'w.id',
        'w.job_id as jobId',
        'w.branch_id as branchId',
        'w.number',
        'w.term_years as termYears',
        'w.covers',
        'w.exclusions',
        'w.transferable',
        db.raw(`to_char(w.issued_on, 'YYYY-MM-DD') as "issuedOn"`),
        'w.pdf_key as pdfKey',
        'u.name as issuedByName',
      );
  }

  /** The branch's warranty numbers so far, one at a time per branch (a transaction-scoped lock). */
  async warrantyNumbers(branchId: string, trx: Knex.Transaction): Promise<string[]> {
    await trx.raw(`select pg_advisory_xact_lock(hashtext('warranty-number:' || ?))`, [branchId]);
    const rows = await trx('warranties').where({ branch_id: branchId }).select('number');
    return rows.map((r) => r.number as string);
  }

  async insertWarranty(
    w: {
      jobId: string;
      branchId: string;
      number: string;
      termYears: number;
      covers: string;
      exclusions: string | null;
      transferable: boolean;
      issuedOn: string;
      issuedBy: string;
    },
    trx: Knex.Transaction,
  ): Promise<void> {
    await trx('warranties').insert({
      job_id: w.jobId,
      branch_id: w.branchId,
      number: w.number,
      term_years: w.termYears,
      covers: w.covers,
      exclusions: w.exclusions,
      transferable: w.transferable,
      issued_on: w.issuedOn,
      issued_by: w.issuedBy,
    });
  }

  async setWarrantyPdfKey(id: string, key: string, db: Db = this.knex): Promise<void> {
    await db('warranties').where({ id }).update({ pdf_key: key });
  }
}
