// Wire shapes of the inspection routes. Decimals travel as strings, instants as ISO-8601 in UTC,
// wall-clock times as 'YYYY-MM-DDTHH:mm' in the branch's zone. The server's DTOs implement these.
import type { SettlementResult } from '../calculators/settlement';
import type { FindingsItemKey, InspectionFindings } from './findings';

export const INSPECTION_STATUSES = ['booked', 'completed', 'cancelled'] as const;
export type InspectionStatus = (typeof INSPECTION_STATUSES)[number];

export const INSPECTION_DEFAULT_DURATION_MINUTES = 90;
export const INSPECTION_MIN_DURATION_MINUTES = 15;
export const INSPECTION_MAX_DURATION_MINUTES = 600;

export interface BookInspectionRequest {
  /** Wall-clock time in the branch's zone: '2026-12-03T09:00'. */
  scheduledAt: string;
  durationMinutes?: number;
  /** Defaults to the lead's salesperson, or the person booking when the lead has none. */
  inspectorId?: string;
}

/** Items given replace the stored ones whole; null clears one; items left out stay as they are. */
export type FindingsPatch = { [K in keyof InspectionFindings]?: InspectionFindings[K] | null };

export interface UpdateInspectionRequest {
  findings?: FindingsPatch;
  summary?: string | null;
  /** Reschedule: wall-clock time in the branch's zone. */
  scheduledAt?: string;
  durationMinutes?: number;
  /** null: nobody assigned. */
  inspectorId?: string | null;
}

export interface CompleteInspectionRequest {
  summary?: string;
}

export interface CancelInspectionRequest {
  reason?: string;
}

export interface Inspection {
  id: string;
  leadId: string;
  branchId: string;
  /** The lead's salesperson (whose inspection it is, for permissions). */
  salespersonId: string | null;
  inspector: { id: string; name: string } | null;
  status: InspectionStatus;
  /** The instant, ISO-8601 UTC. */
  scheduledAt: string;
  /** The same instant on the branch's clock. */
  scheduledLocal: string;
  /** The branch zone's offset at that instant ('-06:00'); tells apart the two 01:30s of a fall-back night. */
  scheduledUtcOffset: string;
  timezone: string;
  durationMinutes: number;
  findings: Partial<InspectionFindings>;
  /** Checklist items still unanswered; completing needs none. */
  missingFindings: FindingsItemKey[];
  summary: string | null;
  completedAt: string | null;
  photoCount: number;
  surveyPointCounts: Record<SurveyKind, number>;
  lead: {
    id: string;
    homeownerName: string;
    addressLine1: string;
    city: string;
    state: string;
    postalCode: string;
    stage: string;
  };
  createdAt: string;
  updatedAt: string;
}

export const SURVEY_KINDS = ['inspection', 'completion'] as const;
export type SurveyKind = (typeof SURVEY_KINDS)[number];

/** A survey reading: feet on a plan, inches relative to the reference point. Decimal strings, 2 decimals at most. */
export interface SurveyPoint {
  label: string;
  xFt: string;
  yFt: string;
  elevationIn: string;
}

export const SURVEY_LABEL_MAX_LENGTH = 16;
/** numeric(8,2): up to 6 digits before the point, 2 after, optionally negative. */
export const SURVEY_DECIMAL_PATTERN = /^-?\d{1,6}(\.\d{1,2})?$/;

export interface PutSurveyRequest {
  points: SurveyPoint[];
  /** The label of the point every elevation is measured from; its elevation must be 0. */
  referenceLabel: string;
}

export interface Survey {
  inspectionId: string;
  kind: SurveyKind;
  referenceLabel: string | null;
  points: SurveyPoint[];
  /** The settlement screening of these points; null while fewer than two are stored. */
  result: SettlementResult | null;
  caution: string;
}

export const PHOTO_CONTENT_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/heic'] as const;
export type PhotoContentType = (typeof PHOTO_CONTENT_TYPES)[number];
/** 15 MiB, the largest photo accepted (the database holds the same limit). */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;
export const PHOTO_THUMBNAIL_MAX_PX = 320;
export const PHOTO_CAPTION_MAX_LENGTH = 300;

export interface InspectionPhoto {
  id: string;
  inspectionId: string;
  contentType: PhotoContentType;
  sizeBytes: number;
  caption: string | null;
  storageKey: string;
  /** null when no thumbnail could be made (HEIC: this server cannot decode it). */
  thumbnailKey: string | null;
  /** Why there is no thumbnail, in words to show; null when there is one. */
  thumbnailNote: string | null;
  /** GET these with the bearer token. */
  contentUrl: string;
  thumbnailUrl: string | null;
  uploadedBy: { id: string; name: string };
  createdAt: string;
}

export interface UpdatePhotoRequest {
  caption: string | null;
}
