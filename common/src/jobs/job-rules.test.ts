import { describe, expect, it } from 'vitest';
import { earliestDigDate } from '../deadlines/earliest-dig-date';
import { cancellationDeadline } from '../deadlines/cancellation-deadline';
import type { JobClock } from './api-types';
import {
  clockState,
  defaultLocateExpiry,
  jobClocks,
  jobEndOn,
  jobRisk,
  scheduleConflicts,
  startBlockers,
  type JobClocksInput,
  type StartBlockersInput,
} from './job-rules';

const codes = (xs: { code: string }[]) => xs.map((x) => x.code);

describe('startBlockers', () => {
  // Signed Thu 2026-07-02: last day to cancel Wed 2026-07-08 (REFERENCE-VALUES.md worked example, 16 CFR 429.1(a)).
  const lastDayToCancel = cancellationDeadline({ signedOn: '2026-07-02' }).lastDayToCancel;
  // Ticket filed Wed 2026-11-25 → earliest dig Wed 2026-12-02 (F.S. 556.105(1)(a) with F.S. 556.102's
  // holidays: Thanksgiving and the Friday after; REFERENCE-VALUES.md).
  const dig = earliestDigDate({ state: 'FL', filedOn: '2026-11-25' }).earliestDigDate;
  const base: StartBlockersInput = {
    day: '2026-12-03',
    purpose: 'start',
    lastDayToCancel,
    windowWaived: false,
    locate: { ticketNumber: '326110001', earliestDigOn: dig, expiresOn: '2026-12-25' },
    depositAmount: '1000.00',
    depositReceived: true,
  };

  it('reads the worked examples', () => {
    expect(lastDayToCancel).toBe('2026-07-08');
    expect(dig).toBe('2026-12-02');
  });

  it.each<[string, Partial<StartBlockersInput>, string[]]>([
    ['everything in order', {}, []],
    // 16 CFR 429.1(a): the buyer may cancel through the whole of the last day; work from the day after.
    [
      'on the last day to cancel',
      { day: '2026-07-08', locate: { ticketNumber: 'T1', earliestDigOn: '2026-07-01', expiresOn: null } },
      ['JOB.INSIDE_CANCELLATION_WINDOW'],
    ],
    [
      'the day after the last day to cancel',
      { day: '2026-07-09', locate: { ticketNumber: 'T1', earliestDigOn: '2026-07-01', expiresOn: null } },
      [],
    ],
    // 16 CFR 429.1(e): a bona fide emergency waiver lets work start inside the window.
    [
      'inside the window, waived',
      {
        day: '2026-07-06',
        windowWaived: true,
        locate: { ticketNumber: 'T1', earliestDigOn: '2026-07-01', expiresOn: null },
      },
      [],
    ],
    // F.S. 556.105(1)(a): not before the earliest dig date (12-02 in the worked example).
    ['the day before the dig date', { day: '2026-12-01' }, ['JOB.BEFORE_DIG_DATE']],
    ['on the dig date', { day: '2026-12-02' }, []],
    [
      'no ticket on file',
      { locate: { ticketNumber: null, earliestDigOn: null, expiresOn: null } },
      ['JOB.NO_LOCATE_TICKET'],
    ],
    [
      'a blank ticket number',
      { locate: { ticketNumber: '  ', earliestDigOn: null, expiresOn: null } },
      ['JOB.NO_LOCATE_TICKET'],
    ],
    ['on the expiry day', { day: '2026-12-25' }, []],
    ['the day after the expiry', { day: '2026-12-26' }, ['JOB.LOCATE_EXPIRED']],
    ['deposit asked, not received', { depositReceived: false }, ['JOB.DEPOSIT_NOT_RECEIVED']],
    ['no deposit asked', { depositAmount: '0.00', depositReceived: false }, []],
    [
      'everything wrong at once',
      {
        day: '2026-07-07',
        locate: { ticketNumber: null, earliestDigOn: null, expiresOn: null },
        depositReceived: false,
      },
      ['JOB.INSIDE_CANCELLATION_WINDOW', 'JOB.NO_LOCATE_TICKET', 'JOB.DEPOSIT_NOT_RECEIVED'],
    ],
  ])('start: %s', (_label, over, expected) => {
    expect(codes(startBlockers({ ...base, ...over }))).toEqual(expected);
  });

  it.each<[string, Partial<StartBlockersInput>, string[]]>([
    [
      'no ticket yet: may be put on the calendar',
      { locate: { ticketNumber: null, earliestDigOn: null, expiresOn: null } },
      [],
    ],
    ['deposit not in: may be put on the calendar', { depositReceived: false }, []],
    ['before the dig date: not', { day: '2026-12-01' }, ['JOB.BEFORE_DIG_DATE']],
    [
      'inside the window: not',
      { day: '2026-07-08', locate: { ticketNumber: null, earliestDigOn: null, expiresOn: null } },
      ['JOB.INSIDE_CANCELLATION_WINDOW'],
    ],
    ['after the expiry: a new ticket can be filed first', { day: '2026-12-28' }, []],
  ])('schedule: %s', (_label, over, expected) => {
    expect(codes(startBlockers({ ...base, purpose: 'schedule', ...over }))).toEqual(expected);
  });

  it('says when work may start and names the rule', () => {
    const [b] = startBlockers({ ...base, day: '2026-07-08' });
    expect(b!.message).toContain('2026-07-09');
    expect(b!.message).toContain('16 CFR 429.1(e)');
  });
});

describe('jobClocks: Florida, F.S. 489.126(2)(a)', () => {
  // "more than 10 percent of the contract price" → apply for permits "within 30 days after the initial
  // payment" and start the work "within 90 days after the date all necessary permits ... are issued"
  // (F.S. 489.126(2)(a), published; REFERENCE-VALUES.md).
  const base: JobClocksInput = {
    today: '2026-07-20',
    state: 'FL',
    contractPrice: '10000.00',
    depositAmount: '1000.01',
    depositReceivedOn: '2026-07-01',
    lastDayToCancel: '2026-07-08',
    windowWaived: false,
    permit: { needed: true, appliedOn: null, issuedOn: null },
    locate: { ticketNumber: null, expiresOn: null },
    startedOn: null,
  };
  const clock = (cs: JobClock[], code: string) => cs.find((c) => c.code === code);

  it.each<[string, string, boolean]>([
    // deposit on a $10,000 price, clocks?
    ['1000.00', 'exactly 10%: "more than 10 percent" is not met (F.S. 489.126(2)(a))', false],
    ['1000.01', 'a cent over 10% (F.S. 489.126(2)(a))', true],
    ['0.00', 'no deposit', false],
    ['2500.00', '25% (F.S. 489.126(2)(a))', true],
  ])('deposit %s — %s', (depositAmount, _why, listed) => {
    const cs = jobClocks({ ...base, depositAmount });
    expect(!!clock(cs, 'FL_489_126_PERMIT')).toBe(listed);
    expect(!!clock(cs, 'FL_489_126_START')).toBe(listed);
  });

  it('dates the permit application 30 days after the payment (F.S. 489.126(2)(a))', () => {
    const permit = clock(jobClocks(base), 'FL_489_126_PERMIT')!;
    expect(permit.dueOn).toBe('2026-07-31'); // 2026-07-01 + 30 calendar days
    expect(permit.source).toBe('F.S. 489.126(2)(a)');
    expect(permit).toMatchObject({ state: 'running', daysLeft: 11 });
  });

  it('dates the start 90 days after the permits are issued (F.S. 489.126(2)(a))', () => {
    const cs = jobClocks({
      ...base,
      permit: { needed: true, appliedOn: '2026-07-15', issuedOn: '2026-08-03' },
    });
    // 2026-08-03 + 90 calendar days = 2026-11-01 (28 days to 08-31, 30 in September, 31 in October, 1).
    expect(clock(cs, 'FL_489_126_START')).toMatchObject({
      dueOn: '2026-11-01',
      source: 'F.S. 489.126(2)(a)',
    });
    expect(clock(cs, 'FL_489_126_PERMIT')).toMatchObject({ state: 'met', doneOn: '2026-07-15' });
  });

  it.each<[string, Partial<JobClocksInput>, JobClock['state'], number | null]>([
    // the permit clock, due 2026-07-31; due soon from 7 days before (common practice)
    ['8 days left', { today: '2026-07-23' }, 'running', 8],
    ['7 days left (common practice: due soon)', { today: '2026-07-24' }, 'due_soon', 7],
    ['the last day itself, still in time', { today: '2026-07-31' }, 'due_soon', 0],
    ['the day after', { today: '2026-08-01' }, 'overdue', -1],
    [
      'applied on the last day',
      { today: '2026-08-10', permit: { needed: true, appliedOn: '2026-07-31', issuedOn: null } },
      'met',
      0,
    ],
    [
      'applied a day late',
      { today: '2026-08-10', permit: { needed: true, appliedOn: '2026-08-01', issuedOn: null } },
      'overdue',
      -1,
    ],
    ['deposit not yet received: not started', { depositReceivedOn: null }, 'not_started', null],
    [
      'needed or not still unknown: the clock runs',
      { permit: { needed: null, appliedOn: null, issuedOn: null } },
      'running',
      11,
    ],
  ])('permit clock: %s', (_label, over, state, daysLeft) => {
    expect(clock(jobClocks({ ...base, ...over }), 'FL_489_126_PERMIT')).toMatchObject({ state, daysLeft });
  });

  it('lists no 489.126 clock for a job that needs no permit', () => {
    const cs = jobClocks({ ...base, permit: { needed: false, appliedOn: null, issuedOn: null } });
    expect(codes(cs)).toEqual(['FTC_429_WINDOW']);
  });

  it('start clock: not started until the permits are issued, met when work starts in time', () => {
    expect(clock(jobClocks(base), 'FL_489_126_START')).toMatchObject({ state: 'not_started', dueOn: null });
    const issued = { needed: true, appliedOn: '2026-07-02', issuedOn: '2026-07-10' }; // due 2026-10-08
    expect(
      clock(jobClocks({ ...base, permit: issued, today: '2026-10-02' }), 'FL_489_126_START'),
    ).toMatchObject({
      dueOn: '2026-10-08',
      state: 'due_soon',
      daysLeft: 6,
    });
    expect(
      clock(
        jobClocks({ ...base, permit: issued, today: '2026-10-20', startedOn: '2026-10-08' }),
        'FL_489_126_START',
      ),
    ).toMatchObject({ state: 'met' });
  });

  it('a state without a pack: only the federal window (and the ticket)', () => {
    const cs = jobClocks({ ...base, state: 'TX', locate: { ticketNumber: 'T9', expiresOn: '2026-07-25' } });
    expect(codes(cs)).toEqual(['FTC_429_WINDOW', 'LOCATE_EXPIRY']);
  });

  it.each<[string, Partial<JobClocksInput>, JobClock['state'], number | null]>([
    ['open: running, days to the last day', { today: '2026-07-06' }, 'running', 2],
    ['closed', { today: '2026-07-09' }, 'met', null],
    ['waived (16 CFR 429.1(e))', { today: '2026-07-06', windowWaived: true }, 'met', null],
  ])('federal window: %s', (_label, over, state, daysLeft) => {
    expect(clock(jobClocks({ ...base, ...over }), 'FTC_429_WINDOW')).toMatchObject({
      state,
      daysLeft,
      dueOn: '2026-07-08',
    });
  });

  it('the locate ticket expires: due soon, overdue, met once work started', () => {
    const locate = { ticketNumber: 'T1', expiresOn: '2026-07-25' };
    expect(clock(jobClocks({ ...base, locate }), 'LOCATE_EXPIRY')).toMatchObject({
      state: 'due_soon',
      daysLeft: 5,
    });
    expect(clock(jobClocks({ ...base, locate, today: '2026-07-26' }), 'LOCATE_EXPIRY')!.state).toBe(
      'overdue',
    );
    expect(clock(jobClocks({ ...base, locate, startedOn: '2026-07-22' }), 'LOCATE_EXPIRY')!.state).toBe(
      'met',
    );
  });
});

describe('clockState and jobRisk', () => {
  it.each<[string | null, string | null, JobClock['state']]>([
    [null, null, 'not_started'],
    ['2026-07-31', null, 'running'],
    ['2026-07-24', null, 'due_soon'],
    ['2026-07-16', null, 'overdue'],
    ['2026-07-16', '2026-07-15', 'met'],
  ])('due %s, done %s → %s (today 2026-07-17)', (dueOn, doneOn, state) => {
    expect(clockState('2026-07-17', dueOn, doneOn).state).toBe(state);
  });

  const c = (state: JobClock['state'], doneOn: string | null = null): JobClock => ({
    code: 'X',
    title: 'x',
    dueOn: '2026-07-01',
    state,
    daysLeft: 0,
    source: 's',
    doneOn,
  });
  it.each<[JobClock[], string]>([
    [[], 'none'],
    [[c('running'), c('met')], 'none'],
    [[c('running'), c('due_soon')], 'due_soon'],
    [[c('due_soon'), c('overdue')], 'overdue'],
    [[c('overdue', '2026-07-02')], 'none'], // done late: nothing left to do about it
  ])('risk of %j is %s', (clocks, risk) => {
    expect(jobRisk(clocks)).toBe(risk);
  });
});

describe('scheduleConflicts', () => {
  it.each<
    [
      string,
      { id: string; crewId: string | null; startOn: string | null; durationDays: number }[],
      Record<string, string[]>,
    ]
  >([
    [
      'two crews the same day: none',
      [
        { id: 'a', crewId: 'c1', startOn: '2026-07-13', durationDays: 1 },
        { id: 'b', crewId: 'c2', startOn: '2026-07-13', durationDays: 1 },
      ],
      {},
    ],
    [
      'one crew, the same day',
      [
        { id: 'a', crewId: 'c1', startOn: '2026-07-13', durationDays: 1 },
        { id: 'b', crewId: 'c1', startOn: '2026-07-13', durationDays: 1 },
      ],
      { a: ['b'], b: ['a'] },
    ],
    [
      'back to back: none (13–14, then 15)',
      [
        { id: 'a', crewId: 'c1', startOn: '2026-07-13', durationDays: 2 },
        { id: 'b', crewId: 'c1', startOn: '2026-07-15', durationDays: 1 },
      ],
      {},
    ],
    [
      'a three-day run covers the third day',
      [
        { id: 'a', crewId: 'c1', startOn: '2026-07-13', durationDays: 3 },
        { id: 'b', crewId: 'c1', startOn: '2026-07-15', durationDays: 2 },
        { id: 'c', crewId: 'c1', startOn: '2026-07-16', durationDays: 1 },
      ],
      { a: ['b'], b: ['a', 'c'], c: ['b'] },
    ],
    [
      'across a month end',
      [
        { id: 'a', crewId: 'c1', startOn: '2026-07-30', durationDays: 4 },
        { id: 'b', crewId: 'c1', startOn: '2026-08-02', durationDays: 1 },
      ],
      { a: ['b'], b: ['a'] },
    ],
    [
      'unscheduled jobs never conflict',
      [
        { id: 'a', crewId: null, startOn: '2026-07-13', durationDays: 1 },
        { id: 'b', crewId: 'c1', startOn: null, durationDays: 1 },
        { id: 'c', crewId: 'c1', startOn: '2026-07-13', durationDays: 1 },
      ],
      {},
    ],
  ])('%s', (_label, runs, expected) => {
    expect(Object.fromEntries(scheduleConflicts(runs))).toEqual(expected);
  });

  it('jobEndOn counts the start day', () => {
    expect(jobEndOn('2026-07-30', 4)).toBe('2026-08-02');
    expect(jobEndOn('2026-07-30', 1)).toBe('2026-07-30');
  });
});

describe('defaultLocateExpiry', () => {
  it('Florida: 30 calendar days from filing (F.S. 556.105, memory)', () => {
    expect(defaultLocateExpiry('FL', '2026-07-14')).toMatchObject({ expiresOn: '2026-08-13' });
  });
  it('no rule for a state without one: the expiry must be typed', () => {
    expect(defaultLocateExpiry('TX', '2026-07-14')).toBeNull();
  });
});
