import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { money, MoneyDecimal } from '../money';
import { cancellationDeadline } from '../deadlines/cancellation-deadline';
import { CommissionError } from './errors';
import {
  commissionEvents,
  type CommissionContractFacts,
  type CommissionEvent,
  type CommissionLedgerLine,
} from './earning';
import { computeCommission, type CommissionPlan, type CommissionRate } from './plan';

// Signed Thu 2026-07-02 → last day to cancel Wed 2026-07-08 (REFERENCE-VALUES.md worked example,
// 16 CFR 429.1(a): Fri 07-03 observed Independence Day, Sat 07-04 the holiday, Sun skipped). Branch in
// New York: EDT = UTC−4 in July, so the window closes at 2026-07-09T04:00:00Z.
const LAST_DAY = cancellationDeadline({ signedOn: '2026-07-02' }).lastDayToCancel;

const plan: CommissionPlan = {
  basis: 'net_price',
  rate: { kind: 'flat', ratePct: '8' },
  firstMilestonePct: '50',
};
// 3,705.00 × 8% = 296.40 → 148.20 at each milestone.
const facts = (over: Partial<CommissionContractFacts> = {}): CommissionContractFacts => ({
  contractId: 'c1',
  netPrice: '3705.00',
  cost: '1764.00',
  splits: [{ salespersonId: 'ana', sharePct: '100' }],
  lastDayToCancel: LAST_DAY,
  timeZone: 'America/New_York',
  depositClearedAt: '2026-07-02T18:00:00Z',
  completedAt: null,
  cancelledAt: null,
  refundedAt: null,
  ...over,
});
const earning = (
  milestone: CommissionLedgerLine['milestone'],
  amount: string,
  salespersonId = 'ana',
): CommissionLedgerLine => ({ salespersonId, milestone, kind: 'earning', amount });
const brief = (events: CommissionEvent[]) =>
  events.map((e) => [e.salespersonId, e.milestone, e.kind, e.amount, e.effectiveOn]);

describe('commissionEvents', () => {
  it('uses the worked example’s last day to cancel', () => {
    expect(LAST_DAY).toBe('2026-07-08');
  });

  it.each([
    // [case, facts override, already earned, asOf, expected [salesperson, milestone, kind, amount, effectiveOn]]
    ['inside the window, deposit cleared: nothing', {}, [], '2026-07-05T12:00:00Z', []],
    ['23:59:59 EDT on the last day: still nothing', {}, [], '2026-07-09T03:59:59Z', []],
    [
      'midnight at the end of the last day: the first part (296.40 × 50%)',
      {},
      [],
      '2026-07-09T04:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'earning', '148.20', '2026-07-09']],
    ],
    [
      'window closed, deposit not cleared: nothing',
      { depositClearedAt: null },
      [],
      '2026-07-20T12:00:00Z',
      [],
    ],
    [
      'deposit cleared after the window: dated the day it cleared',
      { depositClearedAt: '2026-07-12T15:00:00Z' },
      [],
      '2026-07-13T12:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'earning', '148.20', '2026-07-12']],
    ],
    [
      'cleared at 22:00 EDT on 15 July (02:00Z on the 16th): the branch clock’s date',
      { depositClearedAt: '2026-07-16T02:00:00Z' },
      [],
      '2026-07-16T12:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'earning', '148.20', '2026-07-15']],
    ],
    [
      'a clearing in the future of asOf has not happened',
      { depositClearedAt: '2026-07-12T15:00:00Z' },
      [],
      '2026-07-11T12:00:00Z',
      [],
    ],
    [
      'already earned: never twice',
      {},
      [earning('deposit_cleared_window_closed', '148.20')],
      '2026-07-15T12:00:00Z',
      [],
    ],
    [
      'completed: the rest, once',
      { completedAt: '2026-07-20T15:00:00Z' },
      [earning('deposit_cleared_window_closed', '148.20')],
      '2026-07-21T12:00:00Z',
      [['ana', 'job_completed', 'earning', '148.20', '2026-07-20']],
    ],
    [
      'a late run catches up both, each on its own day',
      { completedAt: '2026-07-20T15:00:00Z' },
      [],
      '2026-08-30T12:00:00Z',
      [
        ['ana', 'deposit_cleared_window_closed', 'earning', '148.20', '2026-07-09'],
        ['ana', 'job_completed', 'earning', '148.20', '2026-07-20'],
      ],
    ],
    [
      'completed but the deposit never cleared: only the completion part',
      { depositClearedAt: null, completedAt: '2026-07-20T15:00:00Z' },
      [],
      '2026-07-21T12:00:00Z',
      [['ana', 'job_completed', 'earning', '148.20', '2026-07-20']],
    ],
    [
      'cancelled inside the window: nothing earned, nothing to claw back, ever',
      { cancelledAt: '2026-07-06T14:00:00Z', completedAt: null },
      [],
      '2026-07-20T12:00:00Z',
      [],
    ],
    [
      'cancelled after the first part: equal and opposite, dated the cancellation',
      { cancelledAt: '2026-08-03T14:00:00Z' },
      [earning('deposit_cleared_window_closed', '148.20')],
      '2026-08-04T12:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'clawback', '-148.20', '2026-08-03']],
    ],
    [
      'refunded after both parts: both clawed back, no new earning',
      { completedAt: '2026-07-20T15:00:00Z', refundedAt: '2026-08-05T14:00:00Z' },
      [earning('deposit_cleared_window_closed', '148.20'), earning('job_completed', '148.20')],
      '2026-08-06T12:00:00Z',
      [
        ['ana', 'deposit_cleared_window_closed', 'clawback', '-148.20', '2026-08-05'],
        ['ana', 'job_completed', 'clawback', '-148.20', '2026-08-05'],
      ],
    ],
    [
      'refunded after the first part, completed before: the completion part is not earned any more',
      { completedAt: '2026-07-20T15:00:00Z', refundedAt: '2026-07-21T14:00:00Z' },
      [earning('deposit_cleared_window_closed', '148.20')],
      '2026-07-22T12:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'clawback', '-148.20', '2026-07-21']],
    ],
    [
      'the clawback is of what was earned, not a recomputation',
      { netPrice: '5000.00', cancelledAt: '2026-08-03T14:00:00Z' },
      [earning('deposit_cleared_window_closed', '148.20')],
      '2026-08-04T12:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'clawback', '-148.20', '2026-08-03']],
    ],
    [
      'already clawed back: never twice',
      { cancelledAt: '2026-08-03T14:00:00Z' },
      [
        earning('deposit_cleared_window_closed', '148.20'),
        {
          salespersonId: 'ana',
          milestone: 'deposit_cleared_window_closed',
          kind: 'clawback',
          amount: '-148.20',
        },
      ],
      '2026-08-10T12:00:00Z',
      [],
    ],
    [
      'a cancellation after asOf has not happened yet',
      { cancelledAt: '2026-08-03T14:00:00Z' },
      [],
      '2026-07-10T12:00:00Z',
      [['ana', 'deposit_cleared_window_closed', 'earning', '148.20', '2026-07-09']],
    ],
    [
      'split 60/40: 296.40 → 177.84 / 118.56, each halved (88.92 / 59.28)',
      {
        splits: [
          { salespersonId: 'ana', sharePct: '60' },
          { salespersonId: 'ben', sharePct: '40' },
        ],
        completedAt: '2026-07-20T15:00:00Z',
      },
      [],
      '2026-07-21T12:00:00Z',
      [
        ['ana', 'deposit_cleared_window_closed', 'earning', '88.92', '2026-07-09'],
        ['ana', 'job_completed', 'earning', '88.92', '2026-07-20'],
        ['ben', 'deposit_cleared_window_closed', 'earning', '59.28', '2026-07-09'],
        ['ben', 'job_completed', 'earning', '59.28', '2026-07-20'],
      ],
    ],
    [
      'a zero commission produces no line',
      { netPrice: '0.00', cost: '0.00', completedAt: '2026-07-20T15:00:00Z' },
      [],
      '2026-07-21T12:00:00Z',
      [],
    ],
  ] as const)('%s', (_case, over, already, asOf, expected) => {
    const events = commissionEvents(
      plan,
      facts(over as Partial<CommissionContractFacts>),
      already,
      new Date(asOf),
    );
    expect(brief(events)).toEqual(expected);
    for (const e of events) {
      expect(e.contractId).toBe('c1');
      expect(e.idempotencyKey).toBe(`c1:${e.salespersonId}:${e.milestone}:${e.kind}`);
    }
  });

  it('reads the window on the branch’s clock: Honolulu (UTC−10) closes ten hours after UTC midnight', () => {
    const hawaii = facts({ timeZone: 'Pacific/Honolulu' });
    expect(commissionEvents(plan, hawaii, [], new Date('2026-07-09T09:59:59Z'))).toEqual([]);
    expect(brief(commissionEvents(plan, hawaii, [], new Date('2026-07-09T10:00:00Z')))).toEqual([
      ['ana', 'deposit_cleared_window_closed', 'earning', '148.20', '2026-07-09'],
    ]);
  });

  it.each([
    [{ depositClearedAt: 'yesterday' }, 'depositClearedAt'],
    [{ lastDayToCancel: '2026-02-30' }, 'lastDayToCancel'],
    [{ timeZone: 'Mars/Olympus_Mons' }, 'timeZone'],
    [{ contractId: '' }, 'contractId'],
  ] as const)('refuses malformed facts %j', (over, field) => {
    try {
      commissionEvents(plan, facts(over), [], new Date('2026-07-20T12:00:00Z'));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CommissionError);
      expect((e as CommissionError).code).toBe('COMMISSION.FACTS_INVALID');
      expect((e as CommissionError).field).toBe(field);
    }
  });
});

// ---- properties ------------------------------------------------------------------------------------

const pctArb = fc.integer({ min: 0, max: 2000 }).map((n) => new MoneyDecimal(n).dividedBy(100).toString()); // 0–20%
const centsArb = (max: number) =>
  fc.integer({ min: 0, max }).map((n) => new MoneyDecimal(n).dividedBy(100).toFixed(2));
const rateArb: fc.Arbitrary<CommissionRate> = fc.oneof(
  pctArb.map((ratePct) => ({ kind: 'flat' as const, ratePct })),
  fc
    .record({
      measure: fc.constantFrom('monthly_volume' as const, 'margin_band' as const),
      mode: fc.constantFrom('step' as const, 'bracket' as const),
      froms: fc.uniqueArray(fc.integer({ min: 0, max: 90 }), { minLength: 1, maxLength: 4 }),
      rates: fc.array(pctArb, { minLength: 4, maxLength: 4 }),
    })
    .map(({ measure, mode, froms, rates }) => ({
      kind: 'tiered' as const,
      measure,
      mode,
      tiers: [...froms]
        .sort((a, b) => a - b)
        .map((f, i) => ({
          from: measure === 'margin_band' ? String(f) : String(f * 1000),
          ratePct: rates[i] as string,
        })),
    })),
);
const planArb: fc.Arbitrary<CommissionPlan> = fc.record({
  basis: fc.constantFrom('net_price' as const, 'gross_margin' as const),
  rate: rateArb,
  firstMilestonePct: fc.integer({ min: 0, max: 100 }).map(String),
});
const splitsArb = fc.uniqueArray(fc.integer({ min: 1, max: 99 }), { maxLength: 3 }).chain((cuts) => {
  const points = [0, ...[...cuts].sort((a, b) => a - b), 100];
  const shares = points.slice(1).map((p, i) => String(p - (points[i] as number)));
  return fc.tuple(...shares.map(() => centsArb(9_000_000))).map((volumes) =>
    shares.map((sharePct, i) => ({
      salespersonId: `sp${i}`,
      sharePct,
      monthVolumeBefore: volumes[i] as string,
    })),
  );
});
const dealArb = fc.record({ netPrice: centsArb(20_000_000), cost: centsArb(20_000_000), splits: splitsArb });

const sum = (lines: readonly { amount: string }[]) =>
  lines.reduce((a, l) => a.plus(money(l.amount)), new MoneyDecimal(0)).toFixed(2);

describe('properties', () => {
  it('the milestones add up to the full commission, and each is earned once', () => {
    fc.assert(
      fc.property(planArb, dealArb, (p, deal) => {
        const f = facts({ ...deal, completedAt: '2026-07-20T15:00:00Z' });
        const first = commissionEvents(p, f, [], new Date('2026-07-10T12:00:00Z'));
        const second = commissionEvents(p, f, first, new Date('2026-07-21T12:00:00Z'));
        const again = commissionEvents(p, f, [...first, ...second], new Date('2026-09-01T12:00:00Z'));
        expect(again).toEqual([]);
        expect(first.every((e) => e.milestone === 'deposit_cleared_window_closed')).toBe(true);
        expect(second.every((e) => e.milestone === 'job_completed')).toBe(true);
        const breakdown = computeCommission(p, f);
        expect(sum([...first, ...second])).toBe(breakdown.total);
        expect(sum(breakdown.parts)).toBe(breakdown.total);
      }),
      { numRuns: 200 },
    );
  });

  it('earning and clawback net to zero per salesperson and milestone', () => {
    fc.assert(
      fc.property(planArb, dealArb, fc.boolean(), (p, deal, completed) => {
        const f = facts({ ...deal, completedAt: completed ? '2026-07-20T15:00:00Z' : null });
        const earned = commissionEvents(p, f, [], new Date('2026-07-25T12:00:00Z'));
        const cancelled = { ...f, cancelledAt: '2026-08-03T14:00:00Z' };
        const clawed = commissionEvents(p, cancelled, earned, new Date('2026-08-04T12:00:00Z'));
        expect(clawed.every((e) => e.kind === 'clawback' && money(e.amount).lt(0))).toBe(true);
        expect(clawed).toHaveLength(earned.length);
        for (const e of earned) {
          const back = clawed.filter(
            (c) => c.salespersonId === e.salespersonId && c.milestone === e.milestone,
          );
          expect(sum([e, ...back])).toBe('0.00');
        }
        expect(
          commissionEvents(p, cancelled, [...earned, ...clawed], new Date('2026-09-01T12:00:00Z')),
        ).toEqual([]);
      }),
      { numRuns: 200 },
    );
  });
});
