import { describe, expect, it } from 'vitest';
import { checkTransition, NO_FACTS, stageFromFacts, type LeadFacts, type LeadStage } from './pipeline';

const facts = (f: Partial<LeadFacts> = {}): LeadFacts => ({ ...NO_FACTS, ...f });

describe('checkTransition', () => {
  it.each<[LeadStage, LeadStage, Partial<LeadFacts>, string | true]>([
    ['new', 'inspection_booked', { hasBookedInspection: true }, true],
    ['new', 'inspection_booked', {}, 'LEAD.NO_INSPECTION_BOOKED'],
    [
      'new',
      'inspected',
      { hasBookedInspection: true, hasCompletedInspection: true },
      'LEAD.INVALID_TRANSITION',
    ],
    ['inspection_booked', 'inspected', { hasCompletedInspection: true }, true],
    ['inspected', 'proposal_sent', {}, 'LEAD.NO_PROPOSAL_SENT'],
    ['inspected', 'proposal_sent', { hasSentProposal: true }, true],
    ['proposal_sent', 'contract_signed', {}, 'LEAD.NO_SIGNED_CONTRACT'],
    ['contract_signed', 'deposit_received', {}, 'LEAD.NO_DEPOSIT'],
    ['deposit_received', 'scheduled', { jobScheduled: true }, true],
    ['completed', 'paid_in_full', {}, 'LEAD.BALANCE_OPEN'],
    ['paid_in_full', 'completed', {}, 'LEAD.INVALID_TRANSITION'],
    ['proposal_sent', 'cancelled', {}, 'LEAD.CANNOT_CANCEL'],
    ['contract_signed', 'cancelled', {}, 'LEAD.CONTRACT_NOT_CANCELLED'],
    ['contract_signed', 'cancelled', { contractCancelled: true }, true],
    ['in_progress', 'cancelled', { contractCancelled: true }, 'LEAD.CANNOT_CANCEL'],
    ['contract_signed', 'lost', {}, 'LEAD.CANNOT_LOSE'],
    ['cancelled', 'new', {}, 'LEAD.CANCELLED'],
    ['new', 'new', {}, 'LEAD.SAME_STAGE'],
  ])('%s → %s with %j: %s', (from, to, f, expected) => {
    const r = checkTransition(from, to, facts(f));
    expect(r.ok ? true : r.code).toBe(expected);
  });

  it('needs a reason to mark a lead lost', () => {
    expect(checkTransition('inspected', 'lost', NO_FACTS, { lostReason: '  ' })).toMatchObject({
      code: 'LEAD.LOST_REASON_REQUIRED',
    });
    expect(
      checkTransition('inspected', 'lost', NO_FACTS, { lostReason: 'Chose another contractor' }).ok,
    ).toBe(true);
  });

  it('reopens a lost lead only to the stage its facts support', () => {
    const f = facts({ hasBookedInspection: true, hasCompletedInspection: true });
    expect(stageFromFacts(f)).toBe('inspected');
    expect(checkTransition('lost', 'inspected', f).ok).toBe(true);
    expect(checkTransition('lost', 'new', f)).toMatchObject({ code: 'LEAD.REOPEN_STAGE' });
  });
});
