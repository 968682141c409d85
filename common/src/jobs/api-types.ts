import type { HelicalShaft } from '../calculators/helical-capacity';

// Wire types of field jobs (issue #4). Dates are 'YYYY-MM-DD' in the branch's timezone, instants ISO
// strings, money and measured quantities decimal strings.

export type JobStatus = 'unscheduled' | 'scheduled' | 'in_progress' | 'completed' | 'cancelled';
export type InstallKind = 'injection' | 'push_pier' | 'helical_pile';
export type StopReason = 'surface_return' | 'lift_observed' | 'planned_quantity' | 'other';

export interface CrewMember {
  id?: string;
  name: string;
  phone?: string | null;
}

export interface Crew {
  id: string;
  branchId: string;
  name: string;
  leadUserId: string;
  leadName: string;
  active: boolean;
  members: CrewMember[];
}

export interface CrewInput {
  branchId: string;
  name: string;
  leadUserId: string;
  active?: boolean;
  members: CrewMember[];
}

/** A due date from the state pack or the federal rule, and how close it is. */
export interface JobClock {
  code: string;
  title: string;
  /** Last day, or null while the clock has not started (e.g. no permit issued yet). */
  dueOn: string | null;
  /** Met: the thing was done in time. */
  state: 'not_started' | 'running' | 'due_soon' | 'overdue' | 'met';
  daysLeft: number | null;
  source: string;
  /** The day the thing was done (permit applied for, work started), when it has been. */
  doneOn?: string | null;
}

/** Why a job cannot start yet on a given day (each with a code, as the 409 answers). */
export interface StartBlocker {
  code: string;
  message: string;
}

export interface JobPlanLine {
  code: string;
  description: string;
  category: string;
  unit: string;
  quantity: string;
  unitCost: string;
  unitPrice: string;
}

export interface JobSummary {
  id: string;
  number: string;
  branchId: string;
  branchCode: string;
  leadId: string;
  contractId: string;
  homeownerName: string;
  addressLine1: string;
  city: string;
  status: JobStatus;
  crewId: string | null;
  crewName: string | null;
  crewLeadId: string | null;
  salespersonId: string | null;
  salespersonName: string | null;
  startOn: string | null;
  durationDays: number;
  /** Contract price (net, tax inside only where charged on the invoice). */
  price: string;
  /** The worst clock's state, for lists. */
  risk: 'none' | 'due_soon' | 'overdue';
  /** Another job on the same crew overlaps these days. */
  conflict: boolean;
  /**
   * The labour the plan carries, in person-hours (one person working one hour; 3 people × 8 h = 24), or
   * null when the plan has no 'hour' line. Lists show it where the days are not known yet.
   */
  estimatedLabourHours?: string | null;
}

export interface JobDetail extends JobSummary {
  phonePrimary: string | null;
  email: string | null;
  state: string;
  postalCode: string;
  timezone: string;
  signedOn: string;
  lastDayToCancel: string;
  depositAmount: string;
  depositReceivedAt: string | null;
  windowWaivedAt: string | null;
  windowWaiverNote: string | null;
  permit: {
    needed: boolean | null;
    appliedOn: string | null;
    number: string | null;
    issuedOn: string | null;
    inspectionPassedOn: string | null;
  };
  locate: {
    ticketNumber: string | null;
    filedOn: string | null;
    earliestDigOn: string | null;
    expiresOn: string | null;
  };
  plan: JobPlanLine[];
  /** Planned counts from the plan: injection points, push piers, helical piles, pounds of material. */
  planned: { injectionPoints: string; pushPiers: string; helicalPiles: string; materialLb: string };
  clocks: JobClock[];
  /** Empty when the job may start on its start day (or today when unscheduled). */
  startBlockers: StartBlocker[];
  conflicts: { jobId: string; number: string; startOn: string; durationDays: number }[];
  startedAt: string | null;
  completedAt: string | null;
  /** Person-hours (see JobSummary). */
  estimatedLabourHours: string | null;
  /** The cost of one person-hour. */
  labourCostPerHour: string | null;
  cautions: string[];
  /** What the signed-in user may do here. */
  can: {
    schedule: boolean;
    editPermits: boolean;
    log: boolean;
    complete: boolean;
    /** The person may start the job (scheduled; its crew lead or the branch office); startBlockers say
     *  whether the day's rules let it start now. */
    start: boolean;
    /** Costs are shown (plan unit costs, labour cost per hour); false for a crew lead, whose are "0.00"/null. */
    seeCosts?: boolean;
  };
}

export interface JobListResponse {
  items: JobSummary[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ScheduleJobInput {
  crewId: string;
  startOn: string;
  durationDays: number;
}

export interface WaiveWindowInput {
  /** The homeowner's own signed and dated statement, in their words (16 CFR 429.1(e)). */
  note: string;
}

export interface PermitInput {
  needed: boolean | null;
  appliedOn?: string | null;
  number?: string | null;
  issuedOn?: string | null;
  inspectionPassedOn?: string | null;
}

export interface LocateInput {
  ticketNumber: string;
  filedOn: string;
  /** Defaults to the state pack's rule; a typed expiry overrides it. */
  expiresOn?: string | null;
}

/** One day of one crew on the calendar. */
export interface CalendarJob {
  jobId: string;
  number: string;
  homeownerName: string;
  city: string;
  status: JobStatus;
  startOn: string;
  durationDays: number;
  conflict: boolean;
  risk: 'none' | 'due_soon' | 'overdue';
}

export interface CalendarResponse {
  branchId: string;
  from: string;
  to: string;
  crews: { id: string; name: string; leadName: string; jobs: CalendarJob[] }[];
  /** Signed jobs not yet on a crew. */
  unscheduled: JobSummary[];
}

export interface AtRiskJob extends JobSummary {
  clocks: JobClock[];
}

// ---- the crew's log ------------------------------------------------------------------------------

export interface InstallEntryInput {
  /** The phone's id for the row (uuid): a resend finds the row already written. */
  clientRowId: string;
  kind: InstallKind;
  number: number;
  location?: string | null;
  locationFt?: string | null;
  depthFt?: string | null;
  pounds?: string | null;
  stopReason?: StopReason | null;
  finalPressurePsi?: string | null;
  torqueFtLb?: string | null;
  shaft?: HelicalShaft | null;
  designLoadLb?: string | null;
  note?: string | null;
  /** When the crew wrote it on the phone (it may arrive later). */
  loggedAt: string;
}

export interface InstallEntry extends Required<Omit<InstallEntryInput, 'shaft' | 'stopReason'>> {
  id: string;
  shaft: HelicalShaft | null;
  stopReason: StopReason | null;
  capacityUltimateLb: string | null;
  capacityAllowableLb: string | null;
  belowDesignLoad: boolean | null;
  loggedByName: string;
  photoCount: number;
}

export interface DayNoteInput {
  clientRowId: string;
  workDate: string;
  note?: string | null;
  crewSize?: number | null;
  /** Person-hours: everyone's hours added up (3 people × 8 h on site = 24). */
  labourHours: string;
}

export interface DayNote extends DayNoteInput {
  id: string;
  writtenByName: string;
  createdAt: string;
}

/** The text fields of POST /jobs/:id/photos (multipart, beside `file`). */
export interface JobPhotoUploadFields {
  caption?: string;
  installEntryId?: string;
  /** The phone's id for the photo (uuid): a resend answers 200 with the photo already stored. */
  clientPhotoId?: string;
}

export interface JobPhoto {
  id: string;
  /** The phone's id for it, when the upload named one. */
  clientPhotoId?: string | null;
  installEntryId: string | null;
  caption: string | null;
  contentType: string;
  url: string;
  thumbnailUrl: string | null;
  createdAt: string;
}

export interface InstallLogResponse {
  entries: InstallEntry[];
  dayNotes: DayNote[];
  photos: JobPhoto[];
  totals: {
    injectionPoints: number;
    pounds: string;
    pushPiers: number;
    helicalPiles: number;
    flagged: number;
  };
}

// ---- completion, actuals, warranty ----------------------------------------------------------------

export interface SurveyPointInput {
  label: string;
  xFt: string;
  yFt: string;
  elevationIn: string;
  isReference?: boolean;
}

export interface CompletionChecklist {
  siteCleaned: boolean;
  injectionHolesPatched: boolean;
  plumbingChecked: boolean;
  doorsWindowsChecked: boolean;
  drainageRestored: boolean;
  homeownerWalkthrough: boolean;
}

export interface CompleteJobInput {
  checklist: CompletionChecklist;
  resurvey: SurveyPointInput[];
  homeownerName: string;
  /** data:image/png;base64,… from the signature pad. */
  signaturePng: string;
  note?: string | null;
}

export interface SurveyComparison {
  before: { label: string; xFt: string; yFt: string; elevationIn: string }[];
  after: { label: string; xFt: string; yFt: string; elevationIn: string }[];
  beforeMaxDifferentialIn: string | null;
  afterMaxDifferentialIn: string | null;
  beforeWorstRatio: string | null;
  afterWorstRatio: string | null;
  /** Per label found in both: the change in inches. */
  changes: { label: string; beforeIn: string; afterIn: string; changeIn: string }[];
  /** The screening band of each side's worst pair (settlement calculator), null without a survey. */
  beforeBand?: string | null;
  afterBand?: string | null;
  /** Both surveys measure from the same reference point, so the per-label changes compare like with like. */
  sameReference?: boolean;
  /** A screening comparison, not an engineering determination. */
  caution?: string;
}

export interface JobActuals {
  jobId: string;
  price: string;
  estimatedCost: string;
  actualCost: string;
  estimatedMarginPct: string | null;
  actualMarginPct: string | null;
  estimatedGrossProfit: string;
  actualGrossProfit: string;
  material: { plannedLb: string; usedLb: string; unitCost: string | null };
  piers: { planned: string; installed: number };
  /** Person-hours on both sides: the plan's 'hour' lines and the day notes' labour hours. */
  labour: { estimatedHours: string | null; actualHours: string; costPerHour: string | null };
  /** Injection points logged against the plan's soil-stabilisation 'point' lines. */
  injectionPoints?: { planned: string; installed: number };
  lines: {
    code: string;
    description: string;
    plannedQty: string;
    actualQty: string;
    unitCost: string;
    plannedCost: string;
    actualCost: string;
    /** What in the log gave the actual quantity; null: not measured, the planned quantity stands. */
    measuredBy?: 'lb' | 'injection_points' | 'push_piers' | 'helical_piles' | 'labour_hours' | null;
  }[];
}

export interface ActualsSummaryRow {
  key: string;
  name: string;
  jobs: number;
  price: string;
  estimatedCost: string;
  actualCost: string;
  estimatedMarginPct: string | null;
  actualMarginPct: string | null;
  /** actual − estimated margin, percentage points: negative means under-estimated cost. */
  marginDriftPts: string | null;
}

export interface WarrantyInput {
  termYears: number;
  covers: string;
  exclusions?: string | null;
  transferable: boolean;
}

export interface Warranty extends WarrantyInput {
  id: string;
  jobId: string;
  number: string;
  issuedOn: string;
  pdfUrl: string;
}
