import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import { Inject, Injectable, Logger } from '@nestjs/common';
import type { Knex } from 'knex';
import {
  checkInstallEntry,
  installLogTotals,
  todayInZone,
  type DayNote,
  type InstallEntry,
  type InstallLogResponse,
  type JobPhoto,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, DomainError, invalid, notFound } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import type { UploadedPhotoFile } from '../inspections/inspection-photos.service';
import { Clock } from '../signing/clock';
import { StorageService, StoredObjectMissingError } from '../storage/storage.service';
import type { DayNoteDto, InstallEntryDto } from './dto/field.dto';
import { FieldAccess, requireInProgress } from './field-access';
import { FieldRepository, toJobPhoto } from './field.repository';
import { checkPhotoFile } from '../inspections/photo-file';

/** A phone's clock may run ahead of the server's; a row "written" more than this ahead is refused. */
const LOGGED_AT_SLACK_MS = 24 * 3600 * 1000;

export interface Written<T> {
  row: T;
  /** false: the row was already stored under its client row id (a resend); the stored row is answered. */
  created: boolean;
}

export interface PhotoContent {
  stream: Readable;
  contentType: string;
  length: number | undefined;
  filename: string;
}

const isUniqueViolation = (e: unknown, constraint?: string) => {
  const err = e as { code?: string; constraint?: string };
  return err?.code === '23505' && (!constraint || err.constraint === constraint);
};

/**
 * The crew's log: injection points and piers, day notes and photos. Every row is written once per
 * client row id (the phone's own id for it), so that a resend after a lost signal never makes a second
 * row: the first write wins and a resend answers the stored row. Rows are never changed afterwards (the
 * database refuses UPDATE and DELETE).
 */
@Injectable()
export class InstallLogService {
  private readonly logger = new Logger('InstallLog');

  constructor(
    private readonly access: FieldAccess,
    private readonly repo: FieldRepository,
    private readonly storage: StorageService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  async log(user: SessionUser, jobId: string): Promise<InstallLogResponse> {
    await this.access.readable(user, jobId);
    const [entries, dayNotes, photos] = await Promise.all([
      this.repo.listEntries(jobId),
      this.repo.listDayNotes(jobId),
      this.repo.listPhotos(jobId),
    ]);
    return { entries, dayNotes, photos: photos.map(toJobPhoto), totals: installLogTotals(entries) };
  }

  async addEntry(user: SessionUser, jobId: string, dto: InstallEntryDto): Promise<Written<InstallEntry>> {
    const job = await this.access.writable(user, jobId);
    const resent = await this.resentEntry(dto.clientRowId, jobId);
    if (resent) return { row: resent, created: false };
    requireInProgress(job.status);

    const checked = checkInstallEntry(dto);
    if (!checked.ok) {
      throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', checked.errors);
    }
    this.checkLoggedAt(dto.loggedAt);
    let created: boolean;
    try {
      created = await inTransaction(this.knex, async (trx) => {
        requireInProgress((await this.repo.shareLockJob(jobId, trx)) ?? 'cancelled');
        return this.repo.insertEntry(
          {
            ...checked.entry,
            jobId,
            branchId: job.branchId,
            clientRowId: dto.clientRowId,
            loggedBy: user.id,
            loggedAt: dto.loggedAt,
          },
          trx,
        );
      });
    } catch (e) {
      if (isUniqueViolation(e, 'install_entries_job_id_kind_number_key')) {
        const what = checked.entry.kind === 'injection' ? 'point' : 'pier';
        throw new DomainError(
          'conflict',
          'INSTALL.NUMBER_TAKEN',
          `This job's log already has ${what} ${checked.entry.number} of this kind: give the row its own number.`,
          [{ field: 'number', message: `Number ${checked.entry.number} is already logged.` }],
        );
      }
      throw e;
    }
    const stored = await this.resentEntry(dto.clientRowId, jobId);
    return { row: stored!, created };
  }

  async addDayNote(user: SessionUser, jobId: string, dto: DayNoteDto): Promise<Written<DayNote>> {
    const job = await this.access.writable(user, jobId);
    const resent = await this.resentDayNote(dto.clientRowId, jobId);
    if (resent) return { row: resent, created: false };
    requireInProgress(job.status);
    const today = todayInZone(job.timezone, this.clock.now());
    if (dto.workDate > today) throw invalid('workDate', `The work date cannot be after today (${today}).`);
    if (job.startOn && dto.workDate < job.startOn) {
      throw invalid('workDate', `The job started on ${job.startOn}: a day note is for a day of the work.`);
    }
    const note = dto.note?.trim() || null;
    const created = await inTransaction(this.knex, async (trx) => {
      requireInProgress((await this.repo.shareLockJob(jobId, trx)) ?? 'cancelled');
      return this.repo.insertDayNote(
        {
          jobId,
          branchId: job.branchId,
          clientRowId: dto.clientRowId,
          workDate: dto.workDate,
          note,
          crewSize: dto.crewSize ?? null,
          labourHours: dto.labourHours,
          writtenBy: user.id,
        },
        trx,
      );
    });
    const stored = await this.resentDayNote(dto.clientRowId, jobId);
    return { row: stored!, created };
  }

  // ---- photos -------------------------------------------------------------------------------------

  /**
   * Keeps a photo of the job (of one log row, when installEntryId names it). With a clientPhotoId, the
   * photo is written once: a resend (the answer to the first upload was lost with the signal) finds the
   * photo already stored and answers it (created false), whatever the job's state since.
   */
  async uploadPhoto(
    user: SessionUser,
    jobId: string,
    file: UploadedPhotoFile | undefined,
    fields: { caption: string | null; installEntryId: string | null; clientPhotoId: string | null },
  ): Promise<Written<JobPhoto>> {
    const { caption, installEntryId, clientPhotoId } = fields;
    const job = await this.access.writable(user, jobId);
    const resent = clientPhotoId ? await this.resentPhoto(clientPhotoId, jobId) : undefined;
    if (resent) return { row: resent, created: false };
    requireInProgress(job.status);
    if (installEntryId && !(await this.repo.entryBelongsToJob(installEntryId, jobId))) {
      throw invalid('installEntryId', 'That row is not in this job’s log.');
    }
    const photo = await checkPhotoFile(file);
    const id = randomUUID();
    const prefix = `branches/${job.branchId}/jobs/${jobId}/${id}`;
    const storageKey = `${prefix}.${photo.ext}`;
    const thumbnailKey = photo.thumbnail ? `${prefix}.thumb.jpg` : null;
    await this.storage.put(storageKey, photo.buffer, photo.contentType);
    try {
      if (photo.thumbnail && thumbnailKey)
        await this.storage.put(thumbnailKey, photo.thumbnail, 'image/jpeg');
      await this.repo.insertPhoto({
        id,
        jobId,
        branchId: job.branchId,
        clientPhotoId,
        installEntryId,
        storageKey,
        thumbnailKey,
        contentType: photo.contentType,
        sizeBytes: photo.size,
        caption,
        uploadedBy: user.id,
      });
    } catch (e) {
      for (const key of [storageKey, thumbnailKey]) {
        if (key) await this.storage.delete(key).catch((err) => this.logger.warn({ err, key }, 'Left a file'));
      }
      // Two sends of the same photo at once: the first one written wins, the other answers it.
      if (clientPhotoId && isUniqueViolation(e, 'job_photos_client_photo_id_key')) {
        const stored = await this.resentPhoto(clientPhotoId, jobId);
        if (stored) return { row: stored, created: false };
      }
      throw e;
    }
    return { row: toJobPhoto((await this.repo.findPhoto(jobId, id))!), created: true };
  }

  async photoContent(
    user: SessionUser,
    jobId: string,
    photoId: string,
    which: 'original' | 'thumbnail',
  ): Promise<PhotoContent> {
    await this.access.readable(user, jobId);
    const photo = await this.repo.findPhoto(jobId, photoId);
    if (!photo) throw notFound('photo');
    const key = which === 'original' ? photo.storageKey : photo.thumbnailKey;
    if (!key) {
      throw new DomainError(
        'not_found',
        'PHOTO.NO_THUMBNAIL',
        'No thumbnail: this server cannot convert HEIC photos. Open the full photo.',
      );
    }
    try {
      const stored = await this.storage.get(key);
      return {
        stream: stored.stream,
        contentType: which === 'original' ? photo.contentType : 'image/jpeg',
        length: stored.contentLength,
        filename: `job-photo-${photo.id}${which === 'thumbnail' ? '-thumbnail' : ''}.${key.slice(key.lastIndexOf('.') + 1)}`,
      };
    } catch (e) {
      if (e instanceof StoredObjectMissingError) {
        this.logger.error({ key }, 'Stored file of a job photo is missing');
        throw new DomainError('not_found', 'PHOTO.FILE_MISSING', 'The stored file of this photo is missing.');
      }
      throw e;
    }
  }

  // ---- helpers ------------------------------------------------------------------------------------

  /** The row already stored under this client row id; 409 when it belongs to another job. */
  private async resentEntry(clientRowId: string, jobId: string): Promise<InstallEntry | undefined> {
    const stored = await this.repo.entryByClientRowId(clientRowId);
    if (!stored) return undefined;
    if (stored.jobId !== jobId) throw otherJob();
    const { jobId: _jobId, ...row } = stored;
    return row;
  }

  private async resentDayNote(clientRowId: string, jobId: string): Promise<DayNote | undefined> {
    const stored = await this.repo.dayNoteByClientRowId(clientRowId);
    if (!stored) return undefined;
    if (stored.jobId !== jobId) throw otherJob();
    const { jobId: _jobId, ...row } = stored;
    return row;
  }

  /** The photo already stored under this client id; 409 when it belongs to another job. */
  private async resentPhoto(clientPhotoId: string, jobId: string): Promise<JobPhoto | undefined> {
    const stored = await this.repo.photoByClientId(clientPhotoId);
    if (!stored) return undefined;
    if (stored.jobId !== jobId) {
      throw conflict(
        'PHOTO.CLIENT_ID_OTHER_JOB',
        'A photo with this client id is already stored on another job: the phone must make a new id per photo.',
      );
    }
    return toJobPhoto(stored);
  }

  private checkLoggedAt(loggedAt: string): void {
    const at = new Date(loggedAt).getTime();
    if (Number.isNaN(at)) throw invalid('loggedAt', 'loggedAt is an ISO-8601 instant.');
    if (at > this.clock.now().getTime() + LOGGED_AT_SLACK_MS) {
      throw invalid('loggedAt', 'This row is dated more than a day ahead: check the phone’s clock.');
    }
  }
}

const otherJob = () =>
  conflict(
    'INSTALL.CLIENT_ROW_OTHER_JOB',
    'A row with this client row id is already stored on another job: the phone must make a new id per row.',
  );
