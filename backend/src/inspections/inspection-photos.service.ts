import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import { asSubject, type InspectionPhoto } from '@loambook/common';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import { conflict, DomainError, notFound } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { StorageService, StoredObjectMissingError } from '../storage/storage.service';
import { InspectionPhotosRepository, type PhotoRecord } from './inspection-photos.repository';
import { InspectionsRepository } from './inspections.repository';
import { InspectionsService } from './inspections.service';
import { checkPhotoFile, type UploadedPhotoFile } from './photo-file';
export type { UploadedPhotoFile } from './photo-file';

export interface PhotoContent {
  stream: Readable;
  contentType: string;
  length: number | undefined;
  filename: string;
}

@Injectable()
export class InspectionPhotosService {
  private readonly logger = new Logger('InspectionPhotos');

  constructor(
    private readonly repo: InspectionPhotosRepository,
    private readonly inspectionsRepo: InspectionsRepository,
    private readonly inspections: InspectionsService,
    private readonly storage: StorageService,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  async list(user: SessionUser, inspectionId: string): Promise<InspectionPhoto[]> {
    await this.inspections.accessible(user, inspectionId, 'read');
    return this.repo.listForInspection(inspectionId);
  }

  async upload(
    user: SessionUser,
    inspectionId: string,
    file: UploadedPhotoFile | undefined,
    caption: string | null,
  ): Promise<InspectionPhoto> {
    const inspection = await this.inspections.accessible(user, inspectionId, 'update');
    if (inspection.status === 'cancelled') {
      throw conflict('INSPECTION.CANCELLED', 'This inspection is cancelled: photos can no longer be added.');
    }
    const kind = await checkPhotoFile(file);
    const { thumbnail } = kind;

    const id = randomUUID();
    // Branch first, so a branch's files can be listed, moved or removed together.
    const prefix = `branches/${inspection.branchId}/inspections/${inspectionId}/${id}`;
    const storageKey = `${prefix}.${kind.ext}`;
    const thumbnailKey = thumbnail ? `${prefix}.thumb.jpg` : null;
    await this.storage.put(storageKey, kind.buffer, kind.contentType);
    try {
      if (thumbnail && thumbnailKey) await this.storage.put(thumbnailKey, thumbnail, 'image/jpeg');
      await this.repo.insert({
        id,
        inspectionId,
        branchId: inspection.branchId,
        storageKey,
        thumbnailKey,
        contentType: kind.contentType,
        sizeBytes: kind.size,
        caption,
        uploadedBy: user.id,
      });
    } catch (e) {
      await this.removeFiles([storageKey, thumbnailKey]);
      throw e;
    }
    return (await this.repo.findById(id))!.photo;
  }

  async content(user: SessionUser, photoId: string, which: 'original' | 'thumbnail'): Promise<PhotoContent> {
    const { photo } = await this.readable(user, photoId);
    const key = which === 'original' ? photo.storageKey : photo.thumbnailKey;
    if (!key) {
      throw new DomainError(
        'not_found',
        'PHOTO.NO_THUMBNAIL',
        photo.thumbnailNote ?? 'This photo has no thumbnail.',
      );
    }
    try {
      const stored = await this.storage.get(key);
      const ext = key.slice(key.lastIndexOf('.') + 1);
      return {
        stream: stored.stream,
        contentType: which === 'original' ? photo.contentType : 'image/jpeg',
        length: stored.contentLength,
        filename: `photo-${photo.id}${which === 'thumbnail' ? '-thumbnail' : ''}.${ext}`,
      };
    } catch (e) {
      if (e instanceof StoredObjectMissingError) {
        this.logger.error({ key }, 'Stored file of a photo is missing');
        throw new DomainError('not_found', 'PHOTO.FILE_MISSING', 'The stored file of this photo is missing.');
      }
      throw e;
    }
  }

  async updateCaption(user: SessionUser, photoId: string, caption: string | null): Promise<InspectionPhoto> {
    await this.writable(user, photoId);
    await this.repo.updateCaption(photoId, caption);
    return (await this.repo.findById(photoId))!.photo;
  }

  /** Photos of a completed inspection are part of its record and stay. */
  async delete(user: SessionUser, photoId: string): Promise<void> {
    const removed = await inTransaction(this.knex, async (trx) => {
      const before = await this.writable(user, photoId, trx);
      await this.inspectionsRepo.lock(before.photo.inspectionId, trx);
      const rec = (await this.repo.findById(photoId, trx))!;
      if (rec.inspectionStatus === 'completed') {
        throw conflict(
          'PHOTO.INSPECTION_COMPLETED',
          'This inspection is completed: its photos are kept as part of the record.',
        );
      }
      await this.repo.delete(photoId, trx);
      return rec.photo;
    });
    await this.removeFiles([removed.storageKey, removed.thumbnailKey]);
  }

  private async readable(user: SessionUser, photoId: string, db: Knex | Knex.Transaction = this.knex) {
    const rec = await this.repo.findById(photoId, db);
    if (!rec || !user.ability.can('read', subjectOf(rec))) throw notFound('photo');
    return rec;
  }

  private async writable(user: SessionUser, photoId: string, db: Knex | Knex.Transaction = this.knex) {
    const rec = await this.readable(user, photoId, db);
    ForbiddenError.from(user.ability).throwUnlessCan('update', subjectOf(rec));
    return rec;
  }

  /** Best effort: a file left behind is logged for clean-up, never shown to the user as a failure. */
  private async removeFiles(keys: (string | null)[]): Promise<void> {
    for (const key of keys) {
      if (!key) continue;
      try {
        await this.storage.delete(key);
      } catch (err) {
        this.logger.warn({ err, key }, 'Could not delete a stored photo file');
      }
    }
  }
}

function subjectOf(rec: PhotoRecord) {
  return asSubject('Inspection', { branchId: rec.branchId, salespersonId: rec.salespersonId });
}
