import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { InspectionPhoto, InspectionStatus, PhotoContentType } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

interface PhotoRow {
  id: string;
  inspection_id: string;
  branch_id: string;
  storage_key: string;
  thumbnail_key: string | null;
  content_type: PhotoContentType;
  size_bytes: number;
  caption: string | null;
  uploaded_by: string;
  uploader_name: string;
  created_at: Date;
  salesperson_id: string | null;
  inspection_status: InspectionStatus;
}

/** A photo with what its permission check needs: the inspection's branch and the lead's salesperson. */
export interface PhotoRecord {
  photo: InspectionPhoto;
  branchId: string;
  salespersonId: string | null;
  inspectionStatus: InspectionStatus;
}

const NO_THUMBNAIL_NOTE =
  'No thumbnail: this server cannot convert HEIC photos. Open the full photo, or upload a JPEG copy.';

function toRecord(r: PhotoRow): PhotoRecord {
  return {
    photo: {
      id: r.id,
      inspectionId: r.inspection_id,
      contentType: r.content_type,
      sizeBytes: r.size_bytes,
      caption: r.caption,
      storageKey: r.storage_key,
      thumbnailKey: r.thumbnail_key,
      thumbnailNote: r.thumbnail_key ? null : NO_THUMBNAIL_NOTE,
      contentUrl: `/api/photos/${r.id}/content`,
      thumbnailUrl: r.thumbnail_key ? `/api/photos/${r.id}/thumbnail` : null,
      uploadedBy: { id: r.uploaded_by, name: r.uploader_name },
      createdAt: r.created_at.toISOString(),
    },
    branchId: r.branch_id,
    salespersonId: r.salesperson_id,
    inspectionStatus: r.inspection_status,
  };
}

@Injectable()
export class InspectionPhotosRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private base(db: Db) {
    return db('inspection_photos as p')
      .join('inspections as i', 'i.id', 'p.inspection_id')
      .join('leads as l', 'l.id', 'i.lead_id')
      .join('users as u', 'u.id', 'p.uploaded_by')
      .select(
        'p.*',
        'u.name as uploader_name',
        'l.salesperson_id',
        'i.branch_id as branch_id',
        'i.status as inspection_status',
      );
  }

  async findById(id: string, db: Db = this.knex): Promise<PhotoRecord | undefined> {
    const row = await this.base(db).where('p.id', id).first();
    return row ? toRecord(row) : undefined;
  }

  async listForInspection(inspectionId: string, db: Db = this.knex): Promise<InspectionPhoto[]> {
    const rows = await this.base(db)
      .where('p.inspection_id', inspectionId)
      .orderBy([
        { column: 'p.created_at', order: 'asc' },
        { column: 'p.id', order: 'asc' },
      ]);
    return rows.map((r: PhotoRow) => toRecord(r).photo);
  }

  async insert(
    p: {
      id: string;
      inspectionId: string;
      branchId: string;
      storageKey: string;
      thumbnailKey: string | null;
      contentType: PhotoContentType;
      sizeBytes: number;
      caption: string | null;
      uploadedBy: string;
    },
    db: Db = this.knex,
  ): Promise<void> {
    await db('inspection_photos').insert({
      id: p.id,
      inspection_id: p.inspectionId,
      branch_id: p.branchId,
      storage_key: p.storageKey,
      thumbnail_key: p.thumbnailKey,
      content_type: p.contentType,
      size_bytes: p.sizeBytes,
      caption: p.caption,
      uploaded_by: p.uploadedBy,
    });
  }

  async updateCaption(id: string, caption: string | null, db: Db = this.knex): Promise<void> {
    await db('inspection_photos').where({ id }).update({ caption });
  }

  async delete(id: string, db: Db = this.knex): Promise<void> {
    await db('inspection_photos').where({ id }).delete();
  }
}
