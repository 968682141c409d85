import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { money, MoneyDecimal } from '../money';
import { CommissionError } from './errors';
import {
  nextPayPeriod,
  payPeriodFor,
  statementLines,
  statementPeriodForLine,
  type StatementLineInput,
} from './statement';

describe('payPeriodFor (semi-monthly: 1st–15th, 16th–end of month)', () => {
  it.each([
    ['2026-07-01', '2026-07-01', '2026-07-15'],
    ['2026-07-15', '2026-07-01', '2026-07-15'],
    ['2026-07-16', '2026-07-16', '2026-07-31'],
    ['2026-07-31', '2026-07-16', '2026-07-31'],
    ['2026-04-20', '2026-04-16', '2026-04-30'], // 30 days hath September, April, June and November
    ['2026-02-20', '2026-02-16', '2026-02-28'], // 2026 is not a leap year
    ['2028-02-20', '2028-02-16', '2028-02-29'], // 2028 is (divisible by 4; Gregorian rule)
    ['2100-02-20', '2100-02-16', '2100-02-28'], // 2100 is not (a century not divisible by 400)
    ['2026-12-31', '2026-12-16', '2026-12-31'],
  ])('%s → %s … %s', (date, start, end) => {
    expect(payPeriodFor(date)).toEqual({ start, end });
  });

  it.each([
    ['2026-07-01', '2026-07-16'],
    ['2026-07-16', '2026-08-01'],
    ['2026-12-16', '2027-01-01'],
    ['2028-02-16', '2028-03-01'],
  ])('after the period starting %s comes %s', (start, next) => {
    expect(nextPayPeriod(payPeriodFor(start)).start).toBe(next);
  });

  it('refuses a non-date', () => {
    expect(() => payPeriodFor('2026-02-30')).toThrow(CommissionError);
  });
});

const line = (
  salespersonId: string,
  kind: 'earning' | 'clawback',
  amount: string,
  effectiveOn: string,
  periodStart?: string,
): StatementLineInput => ({ salespersonId, kind, amount, effectiveOn, periodStart });
const totals = (s: ReturnType<typeof statementLines>[number]) => [
  s.salespersonId,
  s.period.start,
  s.earned,
  s.clawedBack,
  s.total,
  s.carriedIn,
  s.net,
  s.payable,
  s.carriedOut,
];

describe('statementLines', () => {
  it('totals per salesperson per period, with a clawback carried forward as a deduction', () => {
    // ana: 148.20 first part on 9 July, 148.20 at completion on 20 July, the contract cancelled on 3 August
    //   (both clawed back, −296.40), then 500.00 earned on 18 August on another contract.
    // ben: 75.00 on 10 July.
    const lines = [
      line('ana', 'earning', '148.20', '2026-07-09'),
      line('ben', 'earning', '75.00', '2026-07-10'),
      line('ana', 'earning', '148.20', '2026-07-20'),
      line('ana', 'clawback', '-148.20', '2026-08-03'),
      line('ana', 'clawback', '-148.20', '2026-08-03'),
      line('ana', 'earning', '500.00', '2026-08-18'),
    ];
    expect(statementLines(lines).map(totals)).toEqual([
      // [salesperson, period, earned, clawed back, total, carried in, net, payable, carried out]
      ['ana', '2026-07-01', '148.20', '0.00', '148.20', '0.00', '148.20', '148.20', '0.00'],
      ['ana', '2026-07-16', '148.20', '0.00', '148.20', '0.00', '148.20', '148.20', '0.00'],
      // 0 − 296.40 = −296.40: nothing paid, −296.40 carried
      ['ana', '2026-08-01', '0.00', '296.40', '-296.40', '0.00', '-296.40', '0.00', '-296.40'],
      // −296.40 + 500.00 = 203.60 paid
      ['ana', '2026-08-16', '500.00', '0.00', '500.00', '-296.40', '203.60', '203.60', '0.00'],
      ['ben', '2026-07-01', '75.00', '0.00', '75.00', '0.00', '75.00', '75.00', '0.00'],
    ]);
  });

  it('a line dated in a closed statement goes to the next open one; a placed line stays put', () => {
    const lines = [
      line('ana', 'earning', '100.00', '2026-07-05', '2026-07-01'), // already on the approved statement
      line('ana', 'clawback', '-100.00', '2026-07-10'), // cancelled on 10 July, after approval
      line('ana', 'earning', '40.00', '2026-07-12'), // earned late in the closed period too
      line('ben', 'earning', '10.00', '2026-07-12'), // ben's July 1–15 is still open
    ];
    const closedPeriods = [
      { salespersonId: 'ana', periodStart: '2026-07-01' },
      { salespersonId: 'ana', periodStart: '2026-07-16' }, // even the next one is closed: skip it too
    ];
    const out = statementLines(lines, { closedPeriods });
    expect(out.map(totals)).toEqual([
      ['ana', '2026-07-01', '100.00', '0.00', '100.00', '0.00', '100.00', '100.00', '0.00'],
      // −100.00 + 40.00 = −60.00 → carried
      ['ana', '2026-08-01', '40.00', '100.00', '-60.00', '0.00', '-60.00', '0.00', '-60.00'],
      ['ben', '2026-07-01', '10.00', '0.00', '10.00', '0.00', '10.00', '10.00', '0.00'],
    ]);
    expect(out[1]?.lines).toEqual([lines[1], lines[2]]);
    expect(statementPeriodForLine(lines[1] as StatementLineInput, closedPeriods).start).toBe('2026-08-01');
  });

  it('starts from an opening carry', () => {
    // −50.00 carried in + 30.00 = −20.00 → nothing paid
    expect(
      statementLines([line('ana', 'earning', '30.00', '2026-09-02')], {
        openingCarry: { ana: '-50.00' },
      }).map(totals),
    ).toEqual([['ana', '2026-09-01', '30.00', '0.00', '30.00', '-50.00', '-20.00', '0.00', '-20.00']]);
  });

  it.each([
    [[line('ana', 'earning', '-5.00', '2026-07-01')]],
    [[line('ana', 'clawback', '5.00', '2026-07-01')]],
    [[line('ana', 'earning', 'five', '2026-07-01')]],
    [[line('ana', 'earning', '5.00', '2026-07-01', '2026-07-02')]], // not the start of a period
  ])('refuses a malformed line %j', (lines) => {
    expect(() => statementLines(lines)).toThrow(CommissionError);
  });

  it('refuses a positive opening carry', () => {
    expect(() => statementLines([], { openingCarry: { ana: '5.00' } })).toThrow(CommissionError);
  });
});

describe('properties', () => {
  const lineArb = fc.record({
    salespersonId: fc.constantFrom('ana', 'ben'),
    kind: fc.constantFrom('earning' as const, 'clawback' as const),
    cents: fc.integer({ min: 0, max: 500_000 }),
    day: fc.integer({ min: 0, max: 120 }),
  });

  it('Σ payable + last carry = Σ earned − Σ clawed back, per salesperson; nothing is lost', () => {
    fc.assert(
      fc.property(fc.array(lineArb, { maxLength: 40 }), (raw) => {
        const lines = raw.map((r) => {
          const value = new MoneyDecimal(r.cents).dividedBy(100);
          const effectiveOn = new Date(Date.UTC(2026, 0, 1 + r.day)).toISOString().slice(0, 10);
          return line(
            r.salespersonId,
            r.kind,
            (r.kind === 'earning' ? value : value.negated()).toFixed(2),
            effectiveOn,
          );
        });
        const statements = statementLines(lines);
        expect(statements.reduce((n, s) => n + s.lines.length, 0)).toBe(lines.length);
        for (const sp of ['ana', 'ben']) {
          const mine = statements.filter((s) => s.salespersonId === sp);
          const lineSum = lines
            .filter((l) => l.salespersonId === sp)
            .reduce((a, l) => a.plus(money(l.amount)), new MoneyDecimal(0));
          const paid = mine.reduce((a, s) => a.plus(money(s.payable)), new MoneyDecimal(0));
          const lastCarry = mine.length
            ? money((mine[mine.length - 1] as (typeof mine)[number]).carriedOut)
            : money('0');
          expect(paid.plus(lastCarry).toFixed(2)).toBe(lineSum.toFixed(2));
          mine.forEach((s) => expect(money(s.payable).isNegative()).toBe(false));
        }
      }),
      { numRuns: 200 },
    );
  });
});
