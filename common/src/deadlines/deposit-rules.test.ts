import { describe, expect, it } from 'vitest';
import { depositRules, FTC_429_BUYER_STATEMENT } from './deposit-rules';
import { CalculatorInputError } from '../calculators/errors';

const codes = (items: { code: string }[]) => items.map((i) => i.code);

describe('depositRules, Florida pack', () => {
  it.each([
    // contractPrice, deposit, large initial payment?
    ['10000.00', '1000.00', false], // exactly 10%: F.S. 489.126(2)(a) says "more than", so not triggered
    ['10000.00', '1000.01', true], // a cent more triggers it
    ['10000.00', '0', false],
    ['18500.00', '5000.00', true],
    ['333.33', '33.33', false], // 9.9991%
  ])('price %s, deposit %s → 489.126 clocks: %s', (contractPrice, deposit, large) => {
    const result = depositRules({ state: 'FL', contractPrice, deposit });
    expect(result.largeInitialPayment).toBe(large);
    const clockCodes = codes(result.clocks);
    expect(clockCodes.includes('FL_489_126_PERMIT')).toBe(large);
    expect(clockCodes.includes('FL_489_126_START')).toBe(large);
  });

  it('dates the permit clock 30 days after payment and the start clock 90 days after the permits (F.S. 489.126(2)(a))', () => {
    const result = depositRules({
      state: 'FL',
      contractPrice: '12000.00',
      deposit: '3000.00',
      paidOn: '2026-03-02',
      permitIssuedOn: '2026-04-10',
    });
    const permit = result.clocks.find((c) => c.code === 'FL_489_126_PERMIT');
    const start = result.clocks.find((c) => c.code === 'FL_489_126_START');
    expect(permit?.dueOn).toBe('2026-04-01'); // 2026-03-02 + 30 calendar days
    expect(start?.dueOn).toBe('2026-07-09'); // 2026-04-10 + 90 calendar days
    expect(permit?.source).toBe('F.S. 489.126(2)(a)');
    expect(start?.rule).toContain('owner agrees in writing');
    expect(result.depositPercent).toBe('25.0000');
  });

  it('leaves dueOn out and asks for the date when it is not known', () => {
    const result = depositRules({ state: 'FL', contractPrice: '12000.00', deposit: '3000.00' });
    const permit = result.clocks.find((c) => c.code === 'FL_489_126_PERMIT');
    expect(permit).toBeDefined();
    expect(permit?.dueOn).toBeUndefined();
    expect(result.warnings.join(' ')).toContain('date the deposit was received');
  });

  it.each([
    // contractPrice, notice codes; "over $2,500": exactly 2500.00 is not over
    ['2500.00', ['FTC_429']], // F.S. 713.015 and 489.1425 say over $2,500
    ['2500.01', ['FTC_429', 'FL_713_015', 'FL_489_1425']],
    ['18500.00', ['FTC_429', 'FL_713_015', 'FL_489_1425']],
  ])('price %s → notices %j', (contractPrice, expected) => {
    expect(codes(depositRules({ state: 'FL', contractPrice, deposit: '0' }).notices)).toEqual(expected);
  });

  it.each([
    ['dwelling-1-to-4-units', ['FTC_429', 'FL_713_015', 'FL_489_1425']],
    ['other-residential', ['FTC_429', 'FL_489_1425']], // 713.015 is for dwellings of up to four units
    ['non-residential', ['FTC_429']],
  ] as const)('property %s → notices %j', (property, expected) => {
    const result = depositRules({ state: 'FL', contractPrice: '9000.00', deposit: '0', property });
    expect(codes(result.notices)).toEqual(expected);
    expect(result.warnings.join(' ')).not.toContain('was not given');
  });

  it('assumes a dwelling when the property is not given, and says so', () => {
    const result = depositRules({ state: 'FL', contractPrice: '9000.00', deposit: '0' });
    expect(result.warnings.join(' ')).toContain('assumed a dwelling of 1 to 4 units');
  });

  it('does not reproduce statute wording it cannot vouch for: 713.015 and 489.1425 point to the statute', () => {
    const result = depositRules({ state: 'FL', contractPrice: '9000.00', deposit: '0' });
    const lien = result.notices.find((n) => n.code === 'FL_713_015');
    const fund = result.notices.find((n) => n.code === 'FL_489_1425');
    expect(lien?.text).toBeUndefined();
    expect(lien?.wordingFrom).toContain('F.S. 713.015');
    expect(lien?.format).toContain('12-point');
    expect(lien?.appliesBecause).toContain('over $2,500.00');
    expect(fund?.text).toBeUndefined();
    expect(fund?.wordingFrom).toContain('F.S. 489.1425');
  });
});

describe('depositRules, federal notice and other states', () => {
  it('always lists the 16 CFR 429 notice with the statement of 16 CFR 429.1(a)', () => {
    const result = depositRules({ state: 'FL', contractPrice: '900.00', deposit: '0' });
    const ftc = result.notices.find((n) => n.code === 'FTC_429');
    expect(ftc?.text).toBe(FTC_429_BUYER_STATEMENT);
    expect(ftc?.text).toContain('prior to midnight of the third business day'); // 16 CFR 429.1(a)
    expect(ftc?.wordingFrom).toContain('429.1(b)');
    expect(ftc?.appliesBecause).toContain('$25 or more'); // 16 CFR 429.0(a)
  });

  it("gives the end of the buyer's cancellation window when the signing date is known", () => {
    const result = depositRules({
      state: 'FL',
      contractPrice: '9000.00',
      deposit: '900.00',
      signedOn: '2026-07-02',
    });
    // 16 CFR 429.1(a); REFERENCE-VALUES.md worked example
    expect(result.clocks.find((c) => c.code === 'FTC_429_CANCEL')?.dueOn).toBe('2026-07-08');
    expect(result.warnings.join(' ')).toContain('refunded within 10 business days');
  });

  it('another state: the federal notice only, with a warning, and no throw (the federal notice still applies)', () => {
    const result = depositRules({
      state: 'tx',
      contractPrice: '18500.00',
      deposit: '5000.00',
      paidOn: '2026-03-02',
    });
    expect(result.state).toBe('TX');
    expect(result.statePack).toBeNull();
    expect(result.largeInitialPayment).toBeNull();
    expect(codes(result.notices)).toEqual(['FTC_429']);
    expect(codes(result.clocks)).toEqual(['FTC_429_CANCEL']);
    expect(result.warnings.join(' ')).toContain('No rule pack exists for TX');
  });

  it('below $25 still lists the notice, and says the rule does not require it', () => {
    const result = depositRules({ state: 'FL', contractPrice: '20.00', deposit: '0' });
    expect(codes(result.notices)).toEqual(['FTC_429']);
    expect(result.warnings.join(' ')).toContain('Below $25');
  });

  it.each([
    [
      { state: 'FL', contractPrice: '1000.00', deposit: '1000.01' },
      'deposit',
      'more than the contract price',
    ],
    [{ state: 'FL', contractPrice: '0', deposit: '0' }, 'contractPrice', 'greater than 0'],
    [{ state: 'FL', contractPrice: '1000.001', deposit: '0' }, 'contractPrice', '2 digits after'],
    [{ state: 'FL', contractPrice: '1000', deposit: '-5' }, 'deposit', 'negative'],
    [{ state: 'FL', contractPrice: 1000, deposit: '0' }, 'contractPrice', 'string'],
    [{ state: 'FL', contractPrice: '1000', deposit: '0', paidOn: '03/02/2026' }, 'paidOn', 'YYYY-MM-DD'],
    [{ state: 'FL', contractPrice: '1000', deposit: '0', property: 'condo' }, 'property', 'one of'],
    [{ state: '', contractPrice: '1000', deposit: '0' }, 'state', 'two-letter'],
  ])('refuses %j', (input, field, message) => {
    try {
      depositRules(input as never);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(CalculatorInputError);
      const detail = (error as CalculatorInputError).details.find((d) => d.field === field);
      expect(detail?.message).toContain(message);
    }
  });
});
