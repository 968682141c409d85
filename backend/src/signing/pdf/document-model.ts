import type {
  CancellationForm,
  FindingsSummary,
  SigningBranch,
  SigningCaution,
  SigningHomeowner,
  SigningNotice,
  SigningOption,
  SigningProperty,
} from '@loambook/common';

/** What a proposal or contract PDF prints: assembled by the service, drawn by render.ts. */
export interface PdfDocumentModel {
  kind: 'proposal' | 'contract';
  /** "Proposal version 2" */
  reference: string;
  /** The document's date on the branch's clock. */
  datedOn: string;
  /** Shown at the top of a proposal not yet approved to send. */
  draftNote: string | null;
  branch: SigningBranch;
  homeowner: SigningHomeowner;
  property: SigningProperty;
  salesperson: { name: string; email: string } | null;
  findings: FindingsSummary | null;
  /** Every option on a proposal; only the accepted one on a contract. */
  options: SigningOption[];
  cautions: readonly SigningCaution[];
  notices: (SigningNotice & { acknowledgedAt?: string })[];
  cancellation: {
    statement: string;
    source: string;
    /** The date the window counts from: the day signed, or (on a proposal) the document's date. */
    signedOn: string;
    lastDayToCancel: string;
    lastDayWeekday: string;
    timezone: string;
  };
  /** Contracts only. */
  signature?: {
    png: Buffer;
    signerName: string;
    /** 'YYYY-MM-DD HH:mm' on the branch's clock, with its UTC offset. */
    signedAtLocal: string;
    utcOffset: string;
    signedAtUtc: string;
    ip: string | null;
    userAgent: string | null;
    inPerson: boolean;
  };
  cancellationForm?: CancellationForm;
  /** A contract made again after it was cancelled says so at the top. */
  cancelledNote?: string | null;
  /** For the PDF's metadata. */
  title: string;
}
