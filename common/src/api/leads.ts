import type { FoundationType, PreferredContact } from '../leads/lead-fields';
import type { DuplicateReason } from '../leads/duplicates';
import type { LeadStage } from '../leads/pipeline';
import type { JobStatus } from '../jobs/api-types';

export interface LeadInput {
  branchId: string;
  salespersonId?: string | null;
  homeownerName: string;
  phonePrimary?: string | null;
  phoneSecondary?: string | null;
  email?: string | null;
  preferredContact: PreferredContact;
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
  yearBuilt?: number | null;
  foundationType?: FoundationType | null;
  source?: string | null;
  notes?: string | null;
}

/** One row of the pipeline. */
export interface LeadSummary {
  id: string;
  branchId: string;
  branchCode: string;
  homeownerName: string;
  addressLine1: string;
  city: string;
  stage: LeadStage;
  stageChangedAt: string;
  createdAt: string;
  daysInStage: number;
  ageDays: number;
  /** Latest proposal or contract value, "0.00" before any. */
  value: string;
  salespersonId: string | null;
  salespersonName: string | null;
  /** A discount or margin approval is waiting for a manager. */
  approvalPending: boolean;
  /** While a signed contract can still be cancelled: its last day (16 CFR 429). */
  lastDayToCancel: string | null;
}

export interface StageTotal {
  stage: LeadStage;
  count: number;
  value: string;
}

export interface PipelineResponse {
  items: LeadSummary[];
  total: number;
  page: number;
  pageSize: number;
  /** Counts and value per stage for the same filters, all stages (the stage filter aside). */
  stages: StageTotal[];
}

export interface DuplicateMatch {
  id: string;
  homeownerName: string;
  addressLine1: string;
  city: string;
  stage: LeadStage;
  branchCode: string;
  reasons: DuplicateReason[];
}

export interface DuplicateCheckResponse {
  matches: DuplicateMatch[];
  /** Matches in branches the user cannot see: only the count is told. */
  otherBranchMatches: number;
}

export interface LeadActivity {
  id: string;
  kind: string;
  body: string | null;
  data: Record<string, unknown>;
  actorName: string | null;
  branchCode: string;
  createdAt: string;
}

export interface LeadTransfer {
  id: string;
  fromBranchCode: string;
  toBranchCode: string;
  note: string | null;
  transferredByName: string;
  createdAt: string;
}

export interface StageMove {
  to: LeadStage;
  allowed: boolean;
  code?: string;
  message?: string;
}

export interface LeadDetail extends LeadSummary, Omit<LeadInput, 'branchId' | 'salespersonId'> {
  phoneSecondary: string | null;
  lostReason: string | null;
  activities: LeadActivity[];
  transfers: LeadTransfer[];
  /** Manual moves and whether the rules allow them now. */
  moves: StageMove[];
  /** True for a manager looking at a lead their branch transferred away. */
  readOnly: boolean;
  /**
   * The IANA time zone of the lead's branch ('America/New_York'): the screens show the lead's times on the
   * branch's clock. Always sent by the server; optional only so that older fixtures still compile.
   */
  timezone?: string;
  /** The field job of the lead's latest contract, when there is one and the person may open it. */
  job?: LeadJobLink | null;
}

/** Enough of a lead's job to link to it from the lead page. */
export interface LeadJobLink {
  id: string;
  number: string;
  status: JobStatus;
}

export interface CreateLeadResponse {
  lead: LeadDetail;
  possibleDuplicates: DuplicateCheckResponse;
}
