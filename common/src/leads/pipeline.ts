/**
 * The stages a lead moves through, from first call to paid in full, and the rule for each move.
 * Most moves happen as a side effect of the work (booking an inspection, sending a proposal, a signed
 * contract …); a person may also ask for a move, and the server checks the same rule either way.
 */
export const LEAD_STAGES = [
  'new',
  'inspection_booked',
  'inspected',
  'proposal_sent',
  'contract_signed',
  'deposit_received',
  'scheduled',
  'in_progress',
  'completed',
  'paid_in_full',
  'lost',
  'cancelled',
] as const;
export type LeadStage = (typeof LEAD_STAGES)[number];

export const LEAD_STAGE_LABELS: Record<LeadStage, string> = {
  new: 'New',
  inspection_booked: 'Inspection booked',
  inspected: 'Inspected',
  proposal_sent: 'Proposal sent',
  contract_signed: 'Contract signed',
  deposit_received: 'Deposit received',
  scheduled: 'Scheduled',
  in_progress: 'In progress',
  completed: 'Completed',
  paid_in_full: 'Paid in full',
  lost: 'Lost',
  cancelled: 'Cancelled',
};

/** The open stages in their order; lost and cancelled are endings off the main line. */
export const MAIN_LINE: readonly LeadStage[] = LEAD_STAGES.slice(0, 10);

/** What the server knows about a lead when it checks a move. */
export interface LeadFacts {
  hasBookedInspection: boolean;
  hasCompletedInspection: boolean;
  /** A proposal has been sent (it could only be sent once approved or needing no approval). */
  hasSentProposal: boolean;
  hasSignedContract: boolean;
  /** The contract was cancelled (by the homeowner inside the window, or recorded by staff). */
  contractCancelled: boolean;
  depositReceived: boolean;
  jobScheduled: boolean;
  jobStarted: boolean;
  jobCompleted: boolean;
  paidInFull: boolean;
}

export const NO_FACTS: LeadFacts = {
  hasBookedInspection: false,
  hasCompletedInspection: false,
  hasSentProposal: false,
  hasSignedContract: false,
  contractCancelled: false,
  depositReceived: false,
  jobScheduled: false,
  jobStarted: false,
  jobCompleted: false,
  paidInFull: false,
};

export type TransitionCheck = { ok: true } | { ok: false; code: string; message: string };

const refuse = (code: string, message: string): TransitionCheck => ({ ok: false, code, message });
const OK: TransitionCheck = { ok: true };

interface ForwardStep {
  to: LeadStage;
  needs: keyof LeadFacts;
  code: string;
  message: string;
}

/** Each forward move and the fact it needs. */
const FORWARD: Partial<Record<LeadStage, ForwardStep>> = {
  new: {
    to: 'inspection_booked',
    needs: 'hasBookedInspection',
    code: 'LEAD.NO_INSPECTION_BOOKED',
    message: 'Book an inspection first.',
  },
  inspection_booked: {
    to: 'inspected',
    needs: 'hasCompletedInspection',
    code: 'LEAD.INSPECTION_NOT_COMPLETED',
    message: 'Complete the inspection first.',
  },
  inspected: {
    to: 'proposal_sent',
    needs: 'hasSentProposal',
    code: 'LEAD.NO_PROPOSAL_SENT',
    message: 'Send an approved proposal first (one beyond your authority needs the manager’s approval).',
  },
  proposal_sent: {
    to: 'contract_signed',
    needs: 'hasSignedContract',
    code: 'LEAD.NO_SIGNED_CONTRACT',
    message: 'The homeowner has not signed a contract yet.',
  },
  contract_signed: {
    to: 'deposit_received',
    needs: 'depositReceived',
    code: 'LEAD.NO_DEPOSIT',
    message: 'The deposit has not been received.',
  },
  deposit_received: {
    to: 'scheduled',
    needs: 'jobScheduled',
    code: 'LEAD.JOB_NOT_SCHEDULED',
    message: 'Schedule the job first.',
  },
  scheduled: {
    to: 'in_progress',
    needs: 'jobStarted',
    code: 'LEAD.JOB_NOT_STARTED',
    message: 'The crew has not started the job.',
  },
  in_progress: {
    to: 'completed',
    needs: 'jobCompleted',
    code: 'LEAD.JOB_NOT_COMPLETED',
    message: 'The job has not been completed and signed off.',
  },
  completed: {
    to: 'paid_in_full',
    needs: 'paidInFull',
    code: 'LEAD.BALANCE_OPEN',
    message: 'The balance has not been paid.',
  },
};

/** Stages from which the sale can still be lost (nothing signed yet). */
const LOSABLE: readonly LeadStage[] = ['new', 'inspection_booked', 'inspected', 'proposal_sent'];
/** Stages in which a signed contract can be cancelled (before the work starts). */
const CANCELLABLE: readonly LeadStage[] = ['contract_signed', 'deposit_received', 'scheduled'];

export function checkTransition(
  from: LeadStage,
  to: LeadStage,
  facts: LeadFacts,
  extra: { lostReason?: string | null } = {},
): TransitionCheck {
  if (from === to)
    return refuse('LEAD.SAME_STAGE', `The lead is already ${LEAD_STAGE_LABELS[to].toLowerCase()}.`);
  if (to === 'lost') {
    if (!LOSABLE.includes(from)) {
      return refuse(
        'LEAD.CANNOT_LOSE',
        'A signed sale is not lost: record a cancellation of the contract instead.',
      );
    }
    if (!extra.lostReason?.trim()) return refuse('LEAD.LOST_REASON_REQUIRED', 'Say why the sale was lost.');
    return OK;
  }
  if (to === 'cancelled') {
    if (!CANCELLABLE.includes(from)) {
      return refuse(
        'LEAD.CANNOT_CANCEL',
        'Only a signed contract whose work has not started can be cancelled.',
      );
    }
    if (!facts.contractCancelled) {
      return refuse('LEAD.CONTRACT_NOT_CANCELLED', 'Record the contract’s cancellation first.');
    }
    return OK;
  }
  if (from === 'lost') {
    // A lost lead can be reopened, back to where its facts put it.
    const back = stageFromFacts(facts);
    return to === back
      ? OK
      : refuse('LEAD.REOPEN_STAGE', `A reopened lead goes back to ${LEAD_STAGE_LABELS[back].toLowerCase()}.`);
  }
  if (from === 'cancelled')
    return refuse('LEAD.CANCELLED', 'A cancelled contract stays cancelled; enter a new lead.');
  const step = FORWARD[from];
  if (!step || step.to !== to) {
    return refuse(
      'LEAD.INVALID_TRANSITION',
      `A lead cannot go from ${LEAD_STAGE_LABELS[from].toLowerCase()} to ${LEAD_STAGE_LABELS[to].toLowerCase()}.`,
    );
  }
  return facts[step.needs] ? OK : refuse(step.code, step.message);
}

/** The furthest main-line stage the facts support: where a reopened lead belongs. */
export function stageFromFacts(facts: LeadFacts): LeadStage {
  let stage: LeadStage = 'new';
  for (;;) {
    const step: ForwardStep | undefined = FORWARD[stage];
    if (!step || !facts[step.needs]) return stage;
    stage = step.to;
  }
}

/** Whole days between two instants (floor), for "days in stage" and "age". */
export function wholeDaysBetween(fromIso: string, to: Date): number {
  return Math.max(0, Math.floor((to.getTime() - Date.parse(fromIso)) / 86_400_000));
}
