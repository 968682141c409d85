import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { calendarDayNumber } from '../deadlines/calendar-date';
import { ReconciliationError } from './errors';
import { matchLines, type MatchableLine } from './match-lines';

const L = (id: string, amountCents: bigint | string, date: string): MatchableLine => ({
  id,
  amountCents,
  date,
});
const ids = (r: ReturnType<typeof matchLines>) => ({
  matches: r.matches.map((m) => [m.ledger.id, m.bank.id, m.daysApart]),
  unmatchedLedger: r.unmatchedLedger.map((l) => l.id),
  unmatchedBank: r.unmatchedBank.map((l) => l.id),
});

describe('matchLines', () => {
  it.each([
    {
      name: 'exact amount and date',
      ledger: [L('p1', 123456n, '2026-07-09')],
      bank: [L('b1', '123456', '2026-07-09')],
      windowDays: 3,
      expected: { matches: [['p1', 'b1', 0]], unmatchedLedger: [], unmatchedBank: [] },
    },
    {
      name: 'a cent apart never matches',
      ledger: [L('p1', 123456n, '2026-07-09')],
      bank: [L('b1', '123457', '2026-07-09')],
      windowDays: 3,
      expected: { matches: [], unmatchedLedger: ['p1'], unmatchedBank: ['b1'] },
    },
    {
      name: 'inside the window (3 days), and just outside (4)',
      ledger: [L('p1', 100n, '2026-07-09'), L('p2', 200n, '2026-07-09')],
      bank: [L('b1', '100', '2026-07-12'), L('b2', '200', '2026-07-13')],
      windowDays: 3,
      expected: { matches: [['p1', 'b1', 3]], unmatchedLedger: ['p2'], unmatchedBank: ['b2'] },
    },
    {
      name: 'across a month end: 30 June → 2 July is 2 days',
      ledger: [L('p1', 100n, '2026-06-30')],
      bank: [L('b1', '100', '2026-07-02')],
      windowDays: 2,
      expected: { matches: [['p1', 'b1', 2]], unmatchedLedger: [], unmatchedBank: [] },
    },
    {
      name: 'closest date first: 0-day pairs are settled before 1-day pairs',
      // p1 (9th) could take b1 (9th, 0 days) or b2 (10th); p2 (11th) could take b2 (1 day) or b1 (2 days).
      // 0-day pairs first: p1–b1; then p2–b2.
      ledger: [L('p1', 500n, '2026-07-09'), L('p2', 500n, '2026-07-11')],
      bank: [L('b2', '500', '2026-07-10'), L('b1', '500', '2026-07-09')],
      windowDays: 3,
      expected: {
        matches: [
          ['p1', 'b1', 0],
          ['p2', 'b2', -1],
        ],
        unmatchedLedger: [],
        unmatchedBank: [],
      },
    },
    {
      name: 'equal distance: the bank line after the ledger line is preferred',
      // p1 on the 10th; b-before on the 9th and b-after on the 11th are both 1 day away.
      ledger: [L('p1', 700n, '2026-07-10')],
      bank: [L('b-before', '700', '2026-07-09'), L('b-after', '700', '2026-07-11')],
      windowDays: 3,
      expected: { matches: [['p1', 'b-after', 1]], unmatchedLedger: [], unmatchedBank: ['b-before'] },
    },
    {
      name: 'same amount and date on both sides: first given with first given',
      ledger: [L('p1', 900n, '2026-07-09'), L('p2', 900n, '2026-07-09'), L('p3', 900n, '2026-07-09')],
      bank: [L('b1', '900', '2026-07-09'), L('b2', '900', '2026-07-09')],
      windowDays: 0,
      expected: {
        matches: [
          ['p1', 'b1', 0],
          ['p2', 'b2', 0],
        ],
        unmatchedLedger: ['p3'],
        unmatchedBank: [],
      },
    },
    {
      name: 'one-to-one: a bank line is used once even if two ledger lines want it',
      ledger: [L('p1', 300n, '2026-07-08'), L('p2', 300n, '2026-07-10')],
      bank: [L('b1', '300', '2026-07-09')],
      windowDays: 5,
      // both 1 day away; p1 → b1 is "bank after ledger" (+1), p2 → b1 is before (−1): p1 wins
      expected: { matches: [['p1', 'b1', 1]], unmatchedLedger: ['p2'], unmatchedBank: [] },
    },
    {
      name: 'negative amounts (money out: commission payments) match negative bank lines only',
      ledger: [L('pay1', -29640n, '2026-07-20')],
      bank: [L('b1', '29640', '2026-07-20'), L('b2', '-29640', '2026-07-21')],
      windowDays: 2,
      expected: { matches: [['pay1', 'b2', 1]], unmatchedLedger: [], unmatchedBank: ['b1'] },
    },
    {
      name: 'amount keys are canonical: "007", 7n and "+7" are the same cents',
      ledger: [L('p1', '007', '2026-07-09'), L('p2', '-0', '2026-07-09')],
      bank: [L('b1', '+7', '2026-07-09'), L('b2', 0n, '2026-07-09')],
      windowDays: 0,
      expected: {
        matches: [
          ['p1', 'b1', 0],
          ['p2', 'b2', 0],
        ],
        unmatchedLedger: [],
        unmatchedBank: [],
      },
    },
    {
      name: 'empty sides',
      ledger: [],
      bank: [L('b1', '1', '2026-07-09')],
      windowDays: 3,
      expected: { matches: [], unmatchedLedger: [], unmatchedBank: ['b1'] },
    },
  ])('$name', ({ ledger, bank, windowDays, expected }) => {
    expect(ids(matchLines(ledger, bank, { windowDays }))).toEqual(expected);
  });

  it('returns the caller’s own objects and the canonical amount', () => {
    const ledger = [{ id: 'p1', amountCents: '00123', date: '2026-07-09', payoutId: 'po_1' }];
    const bank = [{ id: 'b1', amountCents: 123n, date: '2026-07-10', rowNumber: 7 }];
    const r = matchLines(ledger, bank, { windowDays: 1 });
    expect(r.matches[0]?.ledger.payoutId).toBe('po_1');
    expect(r.matches[0]?.bank.rowNumber).toBe(7);
    expect(r.matches[0]?.amountCents).toBe('123');
  });

  it.each([
    [{ windowDays: -1 }, [], [], 'RECONCILIATION.INVALID_WINDOW', 'windowDays'],
    [{ windowDays: 1.5 }, [], [], 'RECONCILIATION.INVALID_WINDOW', 'windowDays'],
    [{ windowDays: 400 }, [], [], 'RECONCILIATION.INVALID_WINDOW', 'windowDays'],
    [
      { windowDays: 3 },
      [L('p', '12.34', '2026-07-09')],
      [],
      'RECONCILIATION.INVALID_LINE',
      'ledgerSide[0].amountCents',
    ],
    [{ windowDays: 3 }, [], [L('b', '1', '2026-02-30')], 'RECONCILIATION.INVALID_LINE', 'bankSide[0].date'],
    [
      { windowDays: 3 },
      [{ id: 'p', amountCents: 1234 as unknown as string, date: '2026-07-09' }], // a number is refused
      [],
      'RECONCILIATION.INVALID_LINE',
      'ledgerSide[0].amountCents',
    ],
  ])('refuses %j', (options, ledger, bank, code, field) => {
    try {
      matchLines(ledger, bank, options);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ReconciliationError);
      expect((e as ReconciliationError).code).toBe(code);
      expect((e as ReconciliationError).field).toBe(field);
    }
  });
});

// The rule written the slow way: every candidate pair, sorted (distance, bank-before-ledger, ledger index,
// bank index), taken greedily.
function bruteForce(ledger: MatchableLine[], bank: MatchableLine[], windowDays: number) {
  const day = (d: string) => calendarDayNumber(d) as number;
  const pairs: [number, number, number, number][] = [];
  ledger.forEach((l, i) =>
    bank.forEach((b, j) => {
      const delta = day(b.date) - day(l.date);
      if (BigInt(l.amountCents) === BigInt(b.amountCents) && Math.abs(delta) <= windowDays)
        pairs.push([Math.abs(delta), delta < 0 ? 1 : 0, i, j]);
    }),
  );
  pairs.sort((a, b) => a[0] - b[0] || a[1] - b[1] || a[2] - b[2] || a[3] - b[3]);
  const usedL = new Set<number>();
  const usedB = new Set<number>();
  const out: [string, string][] = [];
  for (const [, , i, j] of pairs) {
    if (usedL.has(i) || usedB.has(j)) continue;
    usedL.add(i);
    usedB.add(j);
    out.push([(ledger[i] as MatchableLine).id, (bank[j] as MatchableLine).id]);
  }
  return out.sort();
}

describe('properties', () => {
  // Few amounts and few dates, so that collisions are the rule.
  const lineArb = fc.record({
    cents: fc.integer({ min: -3, max: 3 }),
    day: fc.integer({ min: 1, max: 12 }),
  });
  const toLines = (prefix: string, raw: { cents: number; day: number }[]) =>
    raw.map((r, i) => L(`${prefix}${i}`, BigInt(r.cents * 100), `2026-07-${String(r.day).padStart(2, '0')}`));

  it('equals the brute-force greedy, is one-to-one and respects amount and window', () => {
    fc.assert(
      fc.property(
        fc.array(lineArb, { maxLength: 25 }),
        fc.array(lineArb, { maxLength: 25 }),
        fc.integer({ min: 0, max: 4 }),
        (rawL, rawB, windowDays) => {
          const ledger = toLines('p', rawL);
          const bank = toLines('b', rawB);
          const r = matchLines(ledger, bank, { windowDays });
          expect(r.matches.map((m) => [m.ledger.id, m.bank.id]).sort()).toEqual(
            bruteForce(ledger, bank, windowDays),
          );
          expect(r.matches.length + r.unmatchedLedger.length).toBe(ledger.length);
          expect(r.matches.length + r.unmatchedBank.length).toBe(bank.length);
          expect(new Set(r.matches.map((m) => m.bank.id)).size).toBe(r.matches.length);
          for (const m of r.matches) {
            expect(BigInt(m.ledger.amountCents)).toBe(BigInt(m.bank.amountCents));
            expect(Math.abs(m.daysApart)).toBeLessThanOrEqual(windowDays);
          }
        },
      ),
      { numRuns: 400 },
    );
  });

  it('input order only decides which of interchangeable lines is taken: same amounts and dates matched', () => {
    const shape = (r: ReturnType<typeof matchLines>) =>
      r.matches.map((m) => `${String(m.ledger.amountCents)}|${m.ledger.date}|${m.bank.date}`).sort();
    fc.assert(
      fc.property(
        fc.array(lineArb, { maxLength: 20 }),
        fc.array(lineArb, { maxLength: 20 }),
        (rawL, rawB) => {
          const ledger = toLines('p', rawL);
          const bank = toLines('b', rawB);
          const forward = matchLines(ledger, bank, { windowDays: 2 });
          const reversed = matchLines([...ledger].reverse(), [...bank].reverse(), { windowDays: 2 });
          expect(shape(reversed)).toEqual(shape(forward));
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('scale', () => {
  it('matches 50,000 × 50,000 lines well under a second', () => {
    let seed = 7;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const n = 50_000;
    const ledger: MatchableLine[] = [];
    const bank: MatchableLine[] = [];
    for (let i = 0; i < n; i++) {
      // every tenth line shares one of 100 amounts (collisions); the rest are spread over $0–$50,000
      const cents = BigInt(i % 10 === 0 ? 100 + (i % 1000) : Math.floor(rnd() * 5_000_000));
      const day = 1 + Math.floor(rnd() * 25);
      ledger.push(L(`p${i}`, cents, `2026-07-${String(day).padStart(2, '0')}`));
      const bankDay = day + Math.floor(rnd() * 4); // 0–3 days later
      bank.push(L(`b${i}`, cents.toString(), `2026-07-${String(bankDay).padStart(2, '0')}`));
    }
    const t0 = performance.now();
    const r = matchLines(ledger, bank, { windowDays: 3 });
    const ms = performance.now() - t0;
    expect(r.matches.length).toBeGreaterThan(49_000);
    expect(ms).toBeLessThan(1000);
  });
});
