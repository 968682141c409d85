import { describe, expect, it } from 'vitest';
import {
  cancellationDeadline,
  depositRules,
  type DepositRulesResult,
  type LeadDetail,
} from '@loambook/common';
import { makeBranch } from '@/testing/render';
import { inPersonDocument, noticePrice } from './in-person-document';
import { makeOption, makeProposal } from './testing/fixtures';

const lead = {
  homeownerName: 'Marisol Ebbing',
  email: 'marisol@example.test',
  phonePrimary: '555-0134',
  addressLine1: '18 Wicklow Bend',
  city: 'Marrowfield',
  state: 'FL',
  postalCode: '32901',
  salespersonName: 'Caleb Ferro',
} as LeadDetail;

describe('the in-person signing page', () => {
  it('carries, per option, the notices the server’s rules give at that option’s price', () => {
    const small = makeOption({
      id: 'small',
      position: 1,
      totals: { ...makeOption().totals, customerTotal: '2400.00' },
    });
    const large = makeOption({ id: 'large', position: 2 });
    const proposal = makeProposal({ options: [large, small] });
    // The same rules the calculators endpoint runs (common/src/deadlines/deposit-rules.ts).
    const rules = new Map<string, DepositRulesResult>(
      proposal.options.map((o) => [
        o.id,
        depositRules({ state: 'FL', contractPrice: noticePrice(o), deposit: '0' }),
      ]),
    );
    const doc = inPersonDocument({
      proposal,
      lead,
      branch: makeBranch(),
      inspection: null,
      today: '2026-12-01',
      deadline: cancellationDeadline({ signedOn: '2026-12-01' }),
      rules,
    });
    expect(doc.options.map((o) => o.id)).toEqual(['small', 'large']);
    // Florida's lien-law and recovery-fund notices apply over $2,500 only (F.S. 713.015, 489.1425).
    expect(doc.options[0]!.requiredNotices).toEqual(['FTC_429']);
    expect(doc.options[1]!.requiredNotices).toEqual(['FTC_429', 'FL_713_015', 'FL_489_1425']);
    expect(doc.notices.find((n) => n.code === 'FTC_429')?.optionIds).toEqual(['small', 'large']);
    expect(doc.notices.find((n) => n.code === 'FL_713_015')).toMatchObject({
      wordingIncluded: false,
      optionIds: ['large'],
    });
    // Signed Tuesday 2026-12-01: Wed, Thu, Fri are the three business days (16 CFR 429.1(a)).
    expect(doc.cancellation.lastDayToCancelIfSignedToday).toBe('2026-12-04');
    expect(doc.options[1]!.tax.chargedToHomeowner).toBe('0.00');
  });
});
