import { describe, expect, it } from 'vitest';
import { FTC_429_BUYER_STATEMENT } from '../deadlines/deposit-rules';
import { checkAcknowledgements, contractRules, SIGNING_CAUTIONS, taxForHomeowner } from './signing-rules';
import { cancellationForm, weekdayDate } from './cancellation-form';

describe('contractRules', () => {
  it.each([
    // F.S. 713.015 and 489.1425 apply to contracts over $2,500 (published); exactly $2,500 is not over.
    ['FL', '2500.00', ['FTC_429']],
    ['FL', '2500.01', ['FTC_429', 'FL_713_015', 'FL_489_1425']],
    ['FL', '18500.00', ['FTC_429', 'FL_713_015', 'FL_489_1425']],
    // No pack for Texas: only the federal notice (16 CFR 429.1), which applies everywhere.
    ['TX', '18500.00', ['FTC_429']],
  ])('%s at %s needs %j', (state, contractPrice, codes) => {
    const r = contractRules({ state, contractPrice });
    expect(r.notices.map((n) => n.code)).toEqual(codes);
    expect(r.notices.every((n) => n.ackRequired)).toBe(true);
  });

  it('prints the federal statement word for word and only refers to the state statutes', () => {
    const [ftc, lien, fund] = contractRules({ state: 'FL', contractPrice: '9000.00' }).notices;
    expect(ftc).toMatchObject({
      wordingIncluded: true,
      text: FTC_429_BUYER_STATEMENT,
      wordingStatement: null,
    });
    expect(lien).toMatchObject({ code: 'FL_713_015', wordingIncluded: false, source: 'F.S. 713.015' });
    expect(lien!.text).toBeUndefined();
    expect(lien!.wordingStatement).toContain('F.S. 713.015');
    expect(lien!.wordingStatement).toContain('not reproduced');
    expect(fund!.wordingStatement).toContain('F.S. 489.1425');
  });

  it.each([
    // F.S. 489.126(2)(a): more than 10% of the price starts the permit clock (published); exactly 10% does not.
    ['1000.00', false, 0],
    ['1000.01', true, 2],
    ['0', false, 0],
  ])('a deposit of %s on $10,000 in FL: large %s, %i state clocks', (deposit, large, clocks) => {
    const r = contractRules({ state: 'FL', contractPrice: '10000.00', deposit });
    expect(r.largeInitialPayment).toBe(large);
    expect(r.depositClocks).toHaveLength(clocks);
    expect(r.depositClocks.every((c) => c.code !== 'FTC_429_CANCEL')).toBe(true);
  });

  it('treats a zero price as the smallest amount (federal notice only) instead of throwing', () => {
    expect(contractRules({ state: 'FL', contractPrice: '0.00' }).notices.map((n) => n.code)).toEqual([
      'FTC_429',
    ]);
  });
});

describe('checkAcknowledgements', () => {
  const required = [{ code: 'FTC_429' }, { code: 'FL_713_015' }];
  it.each([
    [['FTC_429', 'FL_713_015'], [], []],
    [['FL_713_015'], ['FTC_429'], []],
    [[], ['FTC_429', 'FL_713_015'], []],
    [['FTC_429', 'FL_713_015', 'XX_1'], [], ['XX_1']],
  ])('given %j: missing %j, unknown %j', (given, missing, unknown) => {
    expect(checkAcknowledgements(required, given)).toEqual({ missing, unknown });
  });
});

describe('taxForHomeowner', () => {
  it('adds invoice tax to the price and none under the materials-cost treatment', () => {
    expect(taxForHomeowner({ treatment: 'invoice', ratePct: '7', taxTotal: '259.35' })).toMatchObject({
      chargedToHomeowner: '259.35',
      label: 'Sales tax at 7%',
    });
    const m = taxForHomeowner({ treatment: 'materials_cost', ratePct: '6', taxTotal: '74.88' });
    expect(m.chargedToHomeowner).toBe('0.00');
    expect(m.label).toContain('contractor pays');
  });
});

describe('cautions and the cancellation form', () => {
  it('carries the four safety cautions', () => {
    const text = SIGNING_CAUTIONS.map((c) => c.text).join(' ');
    expect(SIGNING_CAUTIONS.map((c) => c.code)).toEqual(['CALL_811', 'ISOCYANATES', 'LIFTING', 'ENGINEER']);
    expect(text).toContain('811');
    expect(text).toContain('safety data sheet');
    expect(text).toContain('plumbing');
    expect(text).toContain('engineer of record');
  });

  it('completes the form with the dates, the seller and the buyer', () => {
    const f = cancellationForm({
      buyerName: 'Dana Example',
      sellerName: 'Gulf Branch',
      sellerAddress: '1 Clayfield Row, Testerton, FL 32000',
      transactionDate: '2026-07-02',
      lastDayToCancel: '2026-07-08',
    });
    expect(f.caption).toBe('NOTICE OF CANCELLATION');
    expect(f.marking).toContain('16 CFR 429.1(b)');
    expect(f.fields).toContainEqual({ label: 'Date of the transaction', value: 'Thursday, 2026-07-02' });
    expect(f.fields).toContainEqual({
      label: 'Cancel not later than',
      value: 'midnight at the end of Wednesday, 2026-07-08',
    });
    // The regulation's statements, blanks filled (16 CFR 429.1(b); wording from memory, checked against the
    // Wisconsin DFI's quotation of the federal notice, secondary).
    expect(f.paragraphs[0]).toBe(
      'You may CANCEL this transaction, without any penalty or obligation, within THREE BUSINESS DAYS from the above date.',
    );
    expect(f.paragraphs.join(' ')).toContain('within TEN BUSINESS DAYS following receipt by the seller');
    expect(f.paragraphs.join(' ')).toContain('within 20 days of the date of your notice of cancellation');
    expect(f.paragraphs[4]).toBe(
      'To cancel this transaction, mail or deliver a signed and dated copy of this cancellation notice, or any ' +
        'other written notice, or send a telegram, to Gulf Branch, at 1 Clayfield Row, Testerton, FL 32000, not later than ' +
        'midnight of Wednesday, 2026-07-08.',
    );
    expect(f.cancelLine).toBe('I HEREBY CANCEL THIS TRANSACTION.');
    expect(weekdayDate('2026-11-21')).toBe('Saturday, 2026-11-21');
  });
});
