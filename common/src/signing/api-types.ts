// Wire shapes of sending proposals, the homeowner's signing page and contracts. Money travels as strings
// with two decimals ("3964.35"), calendar dates as 'YYYY-MM-DD' (on the branch's clock), instants as
// ISO-8601 UTC. The server's DTO classes implement the request interfaces.
import type { ContractClock } from '../deadlines/deposit-rules';
import type { OptionDiscount } from '../pricing/price-option';
import type { PersonRef, ProposalDetail } from '../pricing/api-types';
import type { FindingsSummary } from './findings-summary';
import type { RequiredNotice, SigningCaution, TaxForHomeowner } from './signing-rules';

/** POST /api/proposals/:id/send */
export interface SendProposalRequest {
  /** Send to this address instead of the lead's e-mail (the lead's record is not changed). */
  email?: string;
  /** Deposit the contract will ask for, dollars ("1500.00"); at most the lowest option's total. */
  depositAmount?: string;
}

export interface SigningLinkRef {
  id: string;
  sentTo: string;
  expiresAt: string;
  createdAt: string;
  depositAmount: string | null;
}

export interface SendProposalResponse {
  proposal: ProposalDetail;
  signingLink: SigningLinkRef;
  /** Earlier unused links of this proposal that stopped working. */
  revokedLinkCount: number;
}

/** POST /api/signing/:token/sign */
export interface SignContractRequest {
  optionId: string;
  signerName: string;
  /** 'data:image/png;base64,…': a PNG of at most 500 KB with some ink on it. */
  signaturePng: string;
  /** Codes of the notices acknowledged: every one in the chosen option's requiredNotices. */
  acknowledgedNotices: string[];
}

/** POST /api/proposals/:id/sign-in-person */
export interface SignInPersonRequest extends SignContractRequest {
  /** Default: the deposit of the proposal's latest signing link, else none. */
  depositAmount?: string;
}

/** POST /api/signing/:token/cancel */
export interface CancelSigningRequest {
  confirm: true;
}

/** POST /api/contracts/:id/cancel */
export interface CancelContractRequest {
  /** How the homeowner cancelled (mail, phone …) and, after the window, why it is accepted. 1–2000 chars. */
  note: string;
}

export interface SigningBranch {
  name: string;
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
  phone: string | null;
  timezone: string;
}

export interface SigningHomeowner {
  name: string;
  email: string | null;
  phone: string | null;
}

export interface SigningProperty {
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
}

/** A line as the homeowner sees it: no costs. */
export interface SigningLine {
  position: number;
  code: string;
  description: string;
  quantity: string;
  unit: string;
  unitPrice: string;
  /** quantity × unitPrice, rounded to cents for display (the option's totals are rounded once from the exact sums). */
  amount: string;
}

export interface SigningDeposit {
  amount: string;
  /** Of the option's total, 4 decimals. */
  percentOfPrice: string;
  /** A state's large-initial-payment rule applies (Florida: more than 10%); null without a state pack. */
  largeInitialPayment: boolean | null;
  /** The state clocks the deposit starts (F.S. 489.126(2)(a) …). */
  clocks: ContractClock[];
}

export interface SigningOption {
  id: string;
  position: number;
  title: string;
  description: string | null;
  lines: SigningLine[];
  listTotal: string;
  discount: OptionDiscount;
  discountTotal: string;
  netTotal: string;
  tax: TaxForHomeowner;
  /** What the homeowner pays for this option. */
  customerTotal: string;
  /** Notice codes to acknowledge when signing this option. */
  requiredNotices: string[];
  deposit: SigningDeposit | null;
}

export interface SigningNotice extends RequiredNotice {
  /** The options whose contract carries this notice. */
  optionIds: string[];
}

export interface CancellationPreview {
  /** 16 CFR 429.1(a), printed next to the signature. */
  statement: string;
  source: string;
  timezone: string;
  /** Today on the branch's clock: the date a contract signed now would carry. */
  today: string;
  lastDayToCancelIfSignedToday: string;
  lastDayWeekday: string;
  /** The instant the window would close (midnight at the end of that day, branch time). */
  cancellableUntilIfSignedToday: string;
  notes: string[];
}

export interface AcknowledgedNotice {
  code: string;
  title: string;
  source: string;
  acknowledgedAt: string;
}

export type ContractStatus = 'signed' | 'cancelled';

export interface SigningContractStatus {
  id: string;
  status: ContractStatus;
  optionId: string;
  optionTitle: string;
  price: string;
  /** Sales tax included in the price (0.00 when the contractor pays tax on its materials). */
  tax: string;
  depositAmount: string;
  signedByName: string;
  signedAt: string;
  signedOn: string;
  signedInPerson: boolean;
  lastDayToCancel: string;
  cancellableUntil: string;
  /** Inside the window and not cancelled: POST …/cancel is accepted now. */
  canCancel: boolean;
  cancelledAt: string | null;
  notices: AcknowledgedNotice[];
}

/** GET /api/signing/:token — what the homeowner sees. */
export interface SigningView {
  /** 'signed': the contract exists (the page then offers the PDF and, inside the window, cancelling). */
  status: 'awaiting_signature' | 'signed';
  link: { sentTo: string; expiresAt: string };
  branch: SigningBranch;
  homeowner: SigningHomeowner;
  property: SigningProperty;
  salesperson: { name: string; email: string } | null;
  proposal: { version: number; sentAt: string | null };
  findings: FindingsSummary | null;
  options: SigningOption[];
  cautions: SigningCaution[];
  /** Every notice any option needs; each option's requiredNotices names its own. */
  notices: SigningNotice[];
  cancellation: CancellationPreview;
  contract: SigningContractStatus | null;
  /** GET this (no token header needed) for the proposal PDF, or the signed contract once signed. */
  pdfPath: string;
}

export interface CancelSigningResponse {
  status: 'cancelled';
  contractId: string;
  cancelledAt: string;
  message: string;
  refundNote: string;
}

export interface ContractCancellation {
  at: string;
  byKind: 'homeowner' | 'staff';
  by: PersonRef | null;
  note: string | null;
  /** Recorded after the window had closed (only an owner or branch manager can do that). */
  afterWindow: boolean;
}

/** GET /api/contracts/:id, GET /api/leads/:leadId/contract */
export interface ContractView {
  id: string;
  status: ContractStatus;
  proposalId: string;
  proposalVersion: number;
  optionId: string;
  option: { position: number; title: string };
  leadId: string;
  branchId: string;
  salespersonId: string | null;
  homeownerName: string;
  price: string;
  tax: string;
  depositAmount: string;
  signedByName: string;
  signedAt: string;
  signedOn: string;
  signedIp: string | null;
  signedUserAgent: string | null;
  signedInPerson: boolean;
  cancellationStatement: string;
  lastDayToCancel: string;
  cancellableUntil: string;
  /** The homeowner's cancellation window is still open (branch time). */
  windowOpen: boolean;
  notices: AcknowledgedNotice[];
  /** GET with the bearer token. */
  pdfUrl: string;
  /** The signed PDF is in storage (it is made again from the record when it is not). */
  pdfStored: boolean;
  cancellation: ContractCancellation | null;
  /** POST /api/contracts/:id/cancel is accepted now for this person. */
  canCancel: boolean;
  createdAt: string;
}
