import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cancellationDeadline, earliestDigDate, type JobClock, type Role } from '@loambook/common';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';
import {
  DEFAULT_PLAN_PRICE,
  makeCrew,
  makeSignedJob,
  markDepositReceived,
  type CrewFixture,
  type SignedJob,
  type SignedJobOptions,
} from './support/job-fixtures';
import { seed as seedCompany } from '../../seeds/01-demo-company';
import { seed as seedCrews } from '../../seeds/03-demo-crews';
import demoCrews from '../../seeds/data/demo-crews.json';

const BUCKET = 'loambook-jobs-test';
// Monday 2026-07-13, 10:00 EDT. A contract signed now is dated 07-13; its last day to cancel is Thursday
// 07-16 (three business days: Tue 14, Wed 15, Thu 16 — 16 CFR 429.1(a); no federal holiday in between).
const TEST_NOW = '2026-07-13T14:00:00Z';
const TODAY = '2026-07-13';
// Signed 14 days before (fixture's windowClosed): Mon 06-29 → last day to cancel Thu 07-02.
const CLOSED_LAST_DAY = '2026-07-02';

describe('field jobs: the job from the contract, crews, scheduling, permit and 811, starting', () => {
  let t: TestApp;
  let s3: S3rver;
  let s3Dir: string;
  let gulf: string;
  let other: string;
  let code: string;
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  let crewA: CrewFixture;
  let crewB: CrewFixture;

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
      put: (url: string, body: object = {}) => t.http.put(url).set(auth).send(body),
      patch: (url: string, body: object = {}) => t.http.patch(url).set(auth).send(body),
      del: (url: string) => t.http.delete(url).set(auth),
    };
  };
  const signed = (o: Partial<SignedJobOptions> = {}): Promise<SignedJob> =>
    makeSignedJob(t, { branchId: gulf, seller: people.seller!, ...o });
  /** A job the crew may start today but for what the test takes away: window closed, deposit in. */
  const ready = (o: Partial<SignedJobOptions> = {}) =>
    signed({ windowClosed: true, depositReceived: true, ...o });
  const stage = async (leadId: string) => (await t.db('leads').where({ id: leadId }).first('stage')).stage;
  const mailsTo = (email: string) => t.mail.inbox.filter((m) => m.to === email.toLowerCase());
  const clock = (cs: JobClock[], c: string) => cs.find((x) => x.code === c);
  const schedule = (who: string, jobId: string, body: object) =>
    as(who).put(`/api/jobs/${jobId}/schedule`, body);
  const locate = (jobId: string, body: object) => as('manager').put(`/api/jobs/${jobId}/locate`, body);

  beforeAll(async () => {
    s3Dir = await mkdtemp(path.join(tmpdir(), 'loambook-s3-'));
    s3 = new S3rver({
      port: 0,
      address: '127.0.0.1',
      silent: true,
      directory: s3Dir,
      configureBuckets: [{ name: BUCKET }],
    });
    const { port } = await s3.run();
    t = await startTestApp({
      S3_ENDPOINT: `http://127.0.0.1:${port}`,
      S3_BUCKET: BUCKET,
      NODE_ENV: 'test',
      TEST_NOW,
    });
    gulf = await makeBranch(t.db, { name: 'North Gulf', timezone: 'America/New_York', state: 'FL' });
    other = await makeBranch(t.db, { name: 'Panhandle', timezone: 'America/Chicago', state: 'FL' });
    await t.db('branches').where({ id: gulf }).update({ phone: '555-0142' });
    code = (await t.db('branches').where({ id: gulf }).first('code')).code;
    const roster: [string, Role, string[]][] = [
      ['owner', 'owner', []],
      ['bookkeeper', 'bookkeeper', []],
      ['manager', 'branch_manager', [gulf]],
      ['seller', 'salesperson', [gulf]],
      ['seller2', 'salesperson', [gulf]],
      ['leadA', 'crew_lead', [gulf]],
      ['leadB', 'crew_lead', [gulf]],
      ['otherManager', 'branch_manager', [other]],
      ['otherLead', 'crew_lead', [other]],
    ];
    for (const [key, role, branches] of roster) {
      people[key] = await makeUser(t.db, role, branches, { name: `Test ${key}` });
      tokens[key] = await tokenFor(t, people[key]!);
    }
    crewA = await makeCrew(t, gulf, people.leadA!, { name: 'Crew A' });
    crewB = await makeCrew(t, gulf, people.leadB!, { name: 'Crew B' });
  });
  afterAll(async () => {
    await t?.close();
    await s3?.close();
    await rm(s3Dir, { recursive: true, force: true });
  });

  describe('the job from the contract', () => {
    it('is made in the signing transaction, with the chosen option’s lines as its plan', async () => {
      const j = await signed();
      const res = await as('manager').get(`/api/jobs/${j.jobId}`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const d = res.body;
      expect(d).toMatchObject({
        id: j.jobId,
        number: j.number,
        status: 'unscheduled',
        contractId: j.contractId,
        leadId: j.leadId,
        homeownerName: j.homeownerName,
        salespersonId: people.seller!.id,
        price: DEFAULT_PLAN_PRICE,
        signedOn: TODAY,
        lastDayToCancel: cancellationDeadline({ signedOn: TODAY }).lastDayToCancel,
        crewId: null,
        startOn: null,
        // The 'hour' line: 16 h at a cost of 55.00 (job-fixtures DEFAULT_PLAN).
        estimatedLabourHours: '16.00',
        labourCostPerHour: '55.00',
        planned: { injectionPoints: '12', pushPiers: '0', helicalPiles: '0', materialLb: '240' },
        // Not on a crew yet: nothing to start.
        can: { schedule: true, editPermits: true, start: false, log: false, complete: false, seeCosts: true },
      });
      expect(d.lastDayToCancel).toBe('2026-07-16');
      expect(d.number).toBe(`${code}-J2607-${d.number.slice(-3)}`);
      expect(d.plan.map((l: { unit: string; quantity: string }) => [l.unit, l.quantity])).toEqual([
        ['lb', '240.000'],
        ['point', '12.000'],
        ['hour', '16.000'],
        ['lump_sum', '1.000'],
      ]);
      expect(d.plan[0]).toMatchObject({
        unitCost: '5.20',
        unitPrice: '11.50',
        category: 'soil_stabilisation',
      });
      // Copied, not linked: the price book can change without touching the plan.
      const rows = await t.db('job_plan_lines').where({ job_id: j.jobId });
      expect(rows).toHaveLength(4);
      expect(d.clocks.map((c: JobClock) => c.code)).toEqual(['FTC_429_WINDOW']); // no deposit: no 489.126 clock
      expect(clock(d.clocks, 'FTC_429_WINDOW')).toMatchObject({
        state: 'running',
        daysLeft: 3,
        dueOn: '2026-07-16',
      });
      expect(d.startBlockers.map((b: { code: string }) => b.code)).toEqual([
        'JOB.INSIDE_CANCELLATION_WINDOW',
        'JOB.NO_LOCATE_TICKET',
      ]);
      expect(d.cautions.join(' ')).toContain('811');
      expect(d.cautions.join(' ')).toContain('isocyanates');
    });

    it('numbers a branch’s jobs of a month in sequence', async () => {
      const a = await signed();
      const b = await signed();
      const n = (s: string) => Number(s.slice(-3));
      expect(n(b.number)).toBe(n(a.number) + 1);
      expect(a.number.startsWith(`${code}-J2607-`)).toBe(true);
    });

    it('is cancelled with the contract, and then cannot be scheduled (409)', async () => {
      const j = await signed();
      const res = await as('manager').post(`/api/contracts/${j.contractId}/cancel`, {
        note: 'The homeowner phoned on Monday to cancel.',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const row = await t.db('jobs').where({ id: j.jobId }).first();
      expect(row.status).toBe('cancelled');
      expect(row.cancelled_at).not.toBeNull();
      const again = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-20',
        durationDays: 1,
      });
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('JOB.CANCELLED');
      expect(await stage(j.leadId)).toBe('cancelled');
    });
  });

  describe('the cancellation window and the dig date (409 with a code)', () => {
    it('cannot be scheduled to start inside the window (16 CFR 429.1(a)); the day after is fine', async () => {
      const j = await signed();
      const inside = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-16',
        durationDays: 1,
      });
      expect(inside.status).toBe(409);
      expect(inside.body.code).toBe('JOB.INSIDE_CANCELLATION_WINDOW');
      expect(inside.body.details.blockers[0].message).toContain('2026-07-17');
      expect((await t.db('jobs').where({ id: j.jobId }).first()).status).toBe('unscheduled');
      const after = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-17',
        durationDays: 1,
      });
      expect(after.status, JSON.stringify(after.body)).toBe(200);
      expect(after.body).toMatchObject({ status: 'scheduled', startOn: '2026-07-17', crewId: crewA.id });
    });

    it('cannot start inside the window (409) unless the homeowner waived it (16 CFR 429.1(e))', async () => {
      const j = await signed({ depositReceived: true });
      await locate(j.jobId, { ticketNumber: '326190001', filedOn: '2026-07-08' }); // dig from 07-11
      const early = await schedule('manager', j.jobId, { crewId: crewA.id, startOn: TODAY, durationDays: 1 });
      expect(early.body.code).toBe('JOB.INSIDE_CANCELLATION_WINDOW');

      const short = await as('manager').post(`/api/jobs/${j.jobId}/waive-window`, { note: 'Emergency' });
      expect(short.status).toBe(400);
      expect(short.body.details[0].field).toBe('note');
      const statement =
        'Water is pouring under the slab and the kitchen floor is dropping. I want the work to start now and I ' +
        'give up my right to cancel. — J. Example, 13 July 2026';
      const waived = await as('manager').post(`/api/jobs/${j.jobId}/waive-window`, { note: statement });
      expect(waived.status, JSON.stringify(waived.body)).toBe(200);
      expect(waived.body.windowWaiverNote).toBe(statement);
      expect(clock(waived.body.clocks, 'FTC_429_WINDOW')).toMatchObject({
        state: 'met',
        source: '16 CFR 429.1(e)',
      });
      const twice = await as('manager').post(`/api/jobs/${j.jobId}/waive-window`, { note: statement });
      expect(twice.body.code).toBe('JOB.WINDOW_ALREADY_WAIVED');

      expect(
        (await schedule('manager', j.jobId, { crewId: crewA.id, startOn: TODAY, durationDays: 1 })).status,
      ).toBe(200);
      const started = await as('leadA').post(`/api/jobs/${j.jobId}/start`);
      expect(started.status, JSON.stringify(started.body)).toBe(200);
      expect(started.body.status).toBe('in_progress');
    });

    it('cannot start (nor be scheduled) before the 811 ticket’s earliest dig date (F.S. 556.105(1)(a))', async () => {
      const j = await ready();
      // Filed Friday 07-10: the two full business days are Mon 07-13 and Tue 07-14; dig from Wed 07-15.
      const res = await locate(j.jobId, { ticketNumber: '326191234', filedOn: '2026-07-10' });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.locate).toEqual({
        ticketNumber: '326191234',
        filedOn: '2026-07-10',
        earliestDigOn: earliestDigDate({ state: 'FL', filedOn: '2026-07-10' }).earliestDigDate,
        // Florida default: 30 calendar days from filing (F.S. 556.105, memory).
        expiresOn: '2026-08-09',
      });
      expect(res.body.locate.earliestDigOn).toBe('2026-07-15');

      const before = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-14',
        durationDays: 1,
      });
      expect(before.status).toBe(409);
      expect(before.body.code).toBe('JOB.BEFORE_DIG_DATE');
      // Put on today's calendar before the ticket was filed, then the ticket came: starting today is refused.
      await t
        .db('jobs')
        .where({ id: j.jobId })
        .update({ locate_ticket_number: null, locate_earliest_dig_on: null });
      expect(
        (await schedule('manager', j.jobId, { crewId: crewA.id, startOn: TODAY, durationDays: 2 })).status,
      ).toBe(200);
      await locate(j.jobId, { ticketNumber: '326191234', filedOn: '2026-07-10' });
      const start = await as('leadA').post(`/api/jobs/${j.jobId}/start`);
      expect(start.status).toBe(409);
      expect(start.body.code).toBe('JOB.BEFORE_DIG_DATE');
      expect((await t.db('jobs').where({ id: j.jobId }).first()).status).toBe('scheduled');
      const onDig = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-15',
        durationDays: 2,
      });
      expect(onDig.status).toBe(200);
    });

    it('cannot start without a ticket on file, nor on an expired one (409)', async () => {
      const j = await ready();
      expect(j.lastDayToCancel).toBe(CLOSED_LAST_DAY); // signed 14 days ago: the window has closed
      await schedule('manager', j.jobId, { crewId: crewA.id, startOn: TODAY, durationDays: 1 });
      const none = await as('leadA').post(`/api/jobs/${j.jobId}/start`);
      expect(none.status).toBe(409);
      expect(none.body.code).toBe('JOB.NO_LOCATE_TICKET');
      await locate(j.jobId, { ticketNumber: '326160001', filedOn: '2026-06-10', expiresOn: '2026-07-10' });
      const expired = await as('leadA').post(`/api/jobs/${j.jobId}/start`);
      expect(expired.status).toBe(409);
      expect(expired.body.code).toBe('JOB.LOCATE_EXPIRED');
      expect(
        clock((await as('manager').get(`/api/jobs/${j.jobId}`)).body.clocks, 'LOCATE_EXPIRY'),
      ).toMatchObject({
        state: 'overdue',
        daysLeft: -3,
      });
    });

    it('cannot start before the deposit is in (409); a contract asking none needs nothing', async () => {
      const j = await signed({ windowClosed: true, depositAmount: '1000' });
      await schedule('manager', j.jobId, { crewId: crewA.id, startOn: TODAY, durationDays: 1 });
      await locate(j.jobId, { ticketNumber: '326180001', filedOn: '2026-07-08' });
      const res = await as('leadA').post(`/api/jobs/${j.jobId}/start`);
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('JOB.DEPOSIT_NOT_RECEIVED');
      await markDepositReceived(t, j.contractId);
      expect((await as('leadA').post(`/api/jobs/${j.jobId}/start`)).status).toBe(200);
    });

    it('refuses a start day already past (422) and a crew of another branch (400)', async () => {
      const j = await ready();
      const past = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-10',
        durationDays: 1,
      });
      expect(past.status).toBe(422);
      expect(past.body.code).toBe('JOB.START_IN_PAST');
      const foreign = await makeCrew(t, other, people.otherLead!);
      const wrong = await schedule('manager', j.jobId, {
        crewId: foreign.id,
        startOn: TODAY,
        durationDays: 1,
      });
      expect(wrong.status).toBe(400);
      expect(wrong.body.details[0].field).toBe('crewId');
      const bad = await schedule('manager', j.jobId, {
        crewId: crewA.id,
        startOn: '2026-02-30',
        durationDays: 0,
      });
      expect(bad.status).toBe(400);
      expect(bad.body.details.map((d: { field: string }) => d.field).sort()).toEqual([
        'durationDays',
        'startOn',
      ]);
    });

    it('a ticket in a state without a one-call pack: 422 with the state named', async () => {
      const j = await ready({ state: 'GA' });
      const res = await locate(j.jobId, { ticketNumber: 'GA-1', filedOn: '2026-07-08' });
      expect(res.status).toBe(422);
      expect(res.body.code).toBe('CALC.NO_STATE_PACK');
      expect(res.body.message).toContain('GA');
    });
  });

  describe('the lead follows the job', () => {
    it('contract signed → deposit received → scheduled → in progress, each with its timeline row', async () => {
      const j = await signed({ windowClosed: true, depositAmount: '500' });
      expect(await stage(j.leadId)).toBe('contract_signed');
      await markDepositReceived(t, j.contractId);
      expect(await stage(j.leadId)).toBe('deposit_received');
      await schedule('manager', j.jobId, { crewId: crewB.id, startOn: TODAY, durationDays: 1 });
      expect(await stage(j.leadId)).toBe('scheduled');
      await locate(j.jobId, { ticketNumber: '326170001', filedOn: '2026-07-08' });
      const started = await as('leadB').post(`/api/jobs/${j.jobId}/start`);
      expect(started.status, JSON.stringify(started.body)).toBe(200);
      expect(started.body.startedAt).toBe('2026-07-13T14:00:00.000Z');
      // Started: nothing more to start; the log opens.
      expect(started.body.can).toMatchObject({ start: false, log: true });
      expect(await stage(j.leadId)).toBe('in_progress');
      const again = await as('leadB').post(`/api/jobs/${j.jobId}/start`);
      expect(again.body.code).toBe('JOB.ALREADY_STARTED');

      const acts = await t.db('lead_activities').where({ lead_id: j.leadId }).orderBy('created_at');
      const moves = acts.filter((a) => a.kind === 'stage_change').map((a) => a.data.to);
      // The signing's two moves share its transaction's timestamp; the job's come one event at a time.
      expect(moves.slice(0, 2).sort()).toEqual(['contract_signed', 'proposal_sent']);
      expect(moves.slice(2)).toEqual(['deposit_received', 'scheduled', 'in_progress']);
      const jobEvents = acts.filter((a) => a.kind === 'job').map((a) => a.data.event);
      expect(jobEvents).toEqual(['scheduled', 'locate', 'started']);
    });

    it('a contract asking no deposit goes from signed to scheduled in one step', async () => {
      const j = await signed({ windowClosed: true });
      expect(await stage(j.leadId)).toBe('contract_signed');
      await schedule('manager', j.jobId, { crewId: crewB.id, startOn: '2026-07-27', durationDays: 1 });
      expect(await stage(j.leadId)).toBe('scheduled');
    });
  });

  describe('scheduling: conflicts and the homeowner’s e-mails', () => {
    it('flags a crew on two jobs on overlapping days, but allows it', async () => {
      const a = await ready();
      const b = await ready();
      const c = await ready();
      // A: Mon 08-03 to Wed 08-05; B: Wed 08-05; C: Thu 08-06 (back to back with A).
      const ra = await schedule('manager', a.jobId, {
        crewId: crewA.id,
        startOn: '2026-08-03',
        durationDays: 3,
      });
      expect(ra.body.conflict).toBe(false);
      const rb = await schedule('manager', b.jobId, {
        crewId: crewA.id,
        startOn: '2026-08-05',
        durationDays: 1,
      });
      expect(rb.status).toBe(200);
      expect(rb.body.conflict).toBe(true);
      expect(rb.body.conflicts).toEqual([
        { jobId: a.jobId, number: a.number, startOn: '2026-08-03', durationDays: 3 },
      ]);
      const rc = await schedule('manager', c.jobId, {
        crewId: crewA.id,
        startOn: '2026-08-06',
        durationDays: 1,
      });
      expect(rc.body.conflict).toBe(false);
      expect((await as('manager').get(`/api/jobs/${a.jobId}`)).body.conflict).toBe(true);
      const week = await as('manager').get(
        `/api/jobs?crewId=${crewA.id}&status=scheduled&from=2026-08-04&to=2026-08-06&pageSize=100`,
      );
      expect(week.status).toBe(200);
      expect(week.body.items.map((x: { id: string }) => x.id)).toEqual([a.jobId, b.jobId, c.jobId]);
      expect(week.body.items.map((x: { conflict: boolean }) => x.conflict)).toEqual([true, true, false]);
      expect(week.body.total).toBe(3);
      expect((await as('manager').get('/api/jobs?status=done')).status).toBe(400);

      const cal = await as('manager').get(
        `/api/jobs/calendar?branchId=${gulf}&from=2026-08-03&to=2026-08-09`,
      );
      expect(cal.status, JSON.stringify(cal.body)).toBe(200);
      const onA = cal.body.crews.find((x: { id: string }) => x.id === crewA.id);
      expect(onA.leadName).toBe('Test leadA');
      expect(
        Object.fromEntries(onA.jobs.map((x: { jobId: string; conflict: boolean }) => [x.jobId, x.conflict])),
      ).toEqual({ [a.jobId]: true, [b.jobId]: true, [c.jobId]: false });
      expect(cal.body.crews.map((x: { id: string }) => x.id)).toEqual(expect.arrayContaining([crewB.id]));

      // Another crew the same day: no conflict.
      const rb2 = await schedule('manager', b.jobId, {
        crewId: crewB.id,
        startOn: '2026-08-05',
        durationDays: 1,
      });
      expect(rb2.body.conflict).toBe(false);
      expect((await as('manager').get(`/api/jobs/${a.jobId}`)).body.conflict).toBe(false);
    });

    it('e-mails the homeowner when scheduled and when moved, not for a change of crew only', async () => {
      const j = await ready();
      expect(mailsTo(j.email)).toHaveLength(1); // the signed contract
      await schedule('manager', j.jobId, { crewId: crewA.id, startOn: '2026-07-20', durationDays: 2 });
      const first = await t.mail.lastTo(j.email);
      expect(first.subject).toBe('Your foundation repair is scheduled: Monday, 2026-07-20');
      expect(first.text).toContain('from Monday, 2026-07-20 to Tuesday, 2026-07-21 (2 days)');
      expect(first.text).toContain('555-0142');
      expect(first.text).toContain(j.number);

      await schedule('manager', j.jobId, { crewId: crewA.id, startOn: '2026-07-22', durationDays: 1 });
      const moved = await t.mail.lastTo(j.email);
      expect(moved.subject).toBe('New date for your foundation repair: Wednesday, 2026-07-22');
      expect(moved.text).toContain('It was planned from Monday, 2026-07-20');
      expect(moved.text).toContain('it is now on Wednesday, 2026-07-22');
      expect(mailsTo(j.email)).toHaveLength(3);

      await schedule('manager', j.jobId, { crewId: crewB.id, startOn: '2026-07-22', durationDays: 1 });
      expect(mailsTo(j.email)).toHaveLength(3);
      expect((await t.db('jobs').where({ id: j.jobId }).first()).crew_lead_id).toBe(people.leadB!.id);

      const off = await as('manager').del(`/api/jobs/${j.jobId}/schedule`);
      expect(off.status).toBe(200);
      expect(off.body).toMatchObject({
        status: 'unscheduled',
        crewId: null,
        startOn: null,
        crewLeadId: null,
      });
      expect((await t.mail.lastTo(j.email)).subject).toBe('Your foundation repair date is on hold');
      expect(mailsTo(j.email)).toHaveLength(4);
      // Unscheduled → unscheduled: nobody to tell.
      expect((await as('manager').del(`/api/jobs/${j.jobId}/schedule`)).status).toBe(200);
      expect(mailsTo(j.email)).toHaveLength(4);

      const emails = await t.db('lead_activities').where({ lead_id: j.leadId, kind: 'email' });
      expect(emails.map((e) => e.data.event)).toEqual(
        expect.arrayContaining(['job_scheduled_mail', 'job_moved_mail', 'job_unscheduled_mail']),
      );
    });
  });

  describe('Florida clocks on the job (F.S. 489.126(2)(a))', () => {
    // The default plan's price is 5420.00 (job-fixtures): 10% is 542.00.
    it('exactly 10% of the price does not start the clocks; more than 10% does ("more than 10 percent")', async () => {
      const ten = await signed({ windowClosed: true, depositAmount: '542.00', depositReceived: true });
      const a = await as('manager').get(`/api/jobs/${ten.jobId}`);
      expect(a.body.clocks.map((c: JobClock) => c.code)).toEqual(['FTC_429_WINDOW']);

      const over = await signed({ windowClosed: true, depositAmount: '542.01' });
      await markDepositReceived(t, over.contractId, new Date('2026-07-01T15:00:00Z'));
      const b = (await as('manager').get(`/api/jobs/${over.jobId}`)).body;
      // Deposit received Wed 07-01: apply for the permits within 30 days after it → by 07-31 (F.S. 489.126(2)(a)).
      expect(clock(b.clocks, 'FL_489_126_PERMIT')).toMatchObject({
        dueOn: '2026-07-31',
        state: 'running',
        daysLeft: 18,
        source: 'F.S. 489.126(2)(a)',
      });
      // The start clock waits for the permit's issue.
      expect(clock(b.clocks, 'FL_489_126_START')).toMatchObject({ dueOn: null, state: 'not_started' });

      // Applied 07-02 (in time: met); issued 07-10 → start within 90 days after the issue (F.S. 489.126(2)(a)).
      const permit = await as('manager').put(`/api/jobs/${over.jobId}/permit`, {
        needed: true,
        appliedOn: '2026-07-02',
        number: 'BLD-26-0417',
        issuedOn: '2026-07-10',
      });
      expect(permit.status, JSON.stringify(permit.body)).toBe(200);
      expect(clock(permit.body.clocks, 'FL_489_126_PERMIT')).toMatchObject({
        state: 'met',
        doneOn: '2026-07-02',
      });
      // 2026-07-10 + 90 days = 2026-10-08.
      expect(clock(permit.body.clocks, 'FL_489_126_START')).toMatchObject({
        dueOn: '2026-10-08',
        state: 'running',
        daysLeft: 87,
      });
    });

    it('lists the jobs at risk: overdue first, then due soon; a clock met drops off', async () => {
      // Signed 06-01 (window long closed); deposits of 1000.00 (18.45% of 5420.00) received on these days.
      const overdue = await signed({ signedAt: new Date('2026-06-01T15:00:00Z'), depositAmount: '1000.00' });
      await markDepositReceived(t, overdue.contractId, new Date('2026-06-10T15:00:00Z')); // due 07-10: 3 days over
      const soon = await signed({ signedAt: new Date('2026-06-01T15:00:00Z'), depositAmount: '1000.00' });
      await markDepositReceived(t, soon.contractId, new Date('2026-06-20T15:00:00Z')); // due 07-20: 7 days left
      const fine = await signed({ signedAt: new Date('2026-06-01T15:00:00Z'), depositAmount: '1000.00' });
      await markDepositReceived(t, fine.contractId, new Date('2026-06-21T15:00:00Z')); // due 07-21: 8 days left

      const res = await as('manager').get(`/api/jobs/at-risk?branchId=${gulf}`);
      expect(res.status).toBe(200);
      const ids = res.body.map((x: { id: string }) => x.id);
      expect(ids.indexOf(overdue.jobId)).toBeGreaterThanOrEqual(0);
      expect(ids.indexOf(soon.jobId)).toBeGreaterThan(ids.indexOf(overdue.jobId));
      expect(ids).not.toContain(fine.jobId);
      const row = res.body.find((x: { id: string }) => x.id === overdue.jobId);
      expect(row.risk).toBe('overdue');
      expect(clock(row.clocks, 'FL_489_126_PERMIT')).toMatchObject({ dueOn: '2026-07-10', daysLeft: -3 });
      expect(res.body.find((x: { id: string }) => x.id === soon.jobId).risk).toBe('due_soon');
      const listed = await as('manager').get(
        `/api/jobs?branchId=${gulf}&q=${encodeURIComponent(soon.homeownerName)}`,
      );
      expect(listed.body.items).toEqual([expect.objectContaining({ id: soon.jobId, risk: 'due_soon' })]);

      // Applied late: the clock is overdue for the record, but there is nothing left to do about it.
      await as('manager').put(`/api/jobs/${overdue.jobId}/permit`, { needed: true, appliedOn: '2026-07-12' });
      const after = (await as('manager').get(`/api/jobs/at-risk?branchId=${gulf}`)).body.map(
        (x: { id: string }) => x.id,
      );
      expect(after).not.toContain(overdue.jobId);
      expect(after).toContain(soon.jobId);
      // No permit needed: no 489.126 clocks.
      await as('manager').put(`/api/jobs/${soon.jobId}/permit`, { needed: false });
      expect(
        (await as('manager').get(`/api/jobs/at-risk?branchId=${gulf}`)).body.map((x: { id: string }) => x.id),
      ).not.toContain(soon.jobId);
    });

    it('checks the permit’s days (400 on the field)', async () => {
      const j = await ready();
      const res = await as('manager').put(`/api/jobs/${j.jobId}/permit`, {
        needed: true,
        appliedOn: '2026-07-10',
        issuedOn: '2026-07-09',
      });
      expect(res.status).toBe(400);
      expect(res.body.details).toEqual([expect.objectContaining({ field: 'issuedOn' })]);
      const future = await as('manager').put(`/api/jobs/${j.jobId}/permit`, {
        needed: true,
        appliedOn: '2026-07-20',
      });
      expect(future.body.details).toEqual([expect.objectContaining({ field: 'appliedOn' })]);
      const notNeeded = await as('manager').put(`/api/jobs/${j.jobId}/permit`, {
        needed: false,
        number: 'X-1',
      });
      expect(notNeeded.body.details).toEqual([expect.objectContaining({ field: 'needed' })]);
    });
  });

  describe('role rules', () => {
    let mine: SignedJob; // the seller's, on crew A
    let theirs: SignedJob; // seller2's, on crew B

    beforeAll(async () => {
      mine = await ready();
      theirs = await ready({ seller: people.seller2! });
      await schedule('manager', mine.jobId, { crewId: crewA.id, startOn: TODAY, durationDays: 1 });
      await schedule('manager', theirs.jobId, { crewId: crewB.id, startOn: TODAY, durationDays: 1 });
    });

    it('a crew lead sees only their crew’s jobs: the list filtered, others 404, no scheduling (403)', async () => {
      const list = await as('leadA').get('/api/jobs?pageSize=100');
      expect(list.status).toBe(200);
      const ids = list.body.items.map((x: { id: string }) => x.id);
      expect(ids).toContain(mine.jobId);
      expect(ids).not.toContain(theirs.jobId);
      expect(list.body.items.every((x: { crewLeadId: string }) => x.crewLeadId === people.leadA!.id)).toBe(
        true,
      );

      const own = await as('leadA').get(`/api/jobs/${mine.jobId}`);
      expect(own.status).toBe(200);
      // Scheduled on their crew: the crew lead may start it (the office may not schedule through them).
      expect(own.body.can).toMatchObject({
        schedule: false,
        editPermits: false,
        start: true,
        seeCosts: false,
      });
      // The list carries the plan's labour in person-hours (job-fixtures DEFAULT_PLAN: 16 h).
      expect(list.body.items.find((x: { id: string }) => x.id === mine.jobId).estimatedLabourHours).toBe(
        '16.00',
      );
      expect(own.body.plan[0].unitCost).toBe('0.00');
      expect(own.body.labourCostPerHour).toBeNull();
      expect((await as('leadA').get(`/api/jobs/${theirs.jobId}`)).status).toBe(404);
      expect((await as('leadA').post(`/api/jobs/${theirs.jobId}/start`)).status).toBe(404);
      expect(
        (await schedule('leadA', mine.jobId, { crewId: crewA.id, startOn: '2026-07-20', durationDays: 1 }))
          .status,
      ).toBe(403);
      const ticket = { ticketNumber: 'T-1', filedOn: '2026-07-08' };
      expect((await as('leadA').put(`/api/jobs/${mine.jobId}/locate`, ticket)).status).toBe(403);

      const today = await as('leadA').get('/api/jobs/today');
      expect(today.status).toBe(200);
      expect(today.body.map((x: { id: string }) => x.id)).toContain(mine.jobId);
      expect(today.body.map((x: { id: string }) => x.id)).not.toContain(theirs.jobId);
      expect((await as('leadB').get('/api/jobs/today')).body.map((x: { id: string }) => x.id)).toContain(
        theirs.jobId,
      );

      const cal = await as('leadA').get(`/api/jobs/calendar?from=${TODAY}&to=2026-07-19`);
      expect(cal.status).toBe(200);
      expect(cal.body.crews.map((x: { id: string }) => x.id)).toEqual([crewA.id]);
    });

    it('a salesperson sees their own jobs, read only (403 on changes), and not another’s (404)', async () => {
      const list = await as('seller').get('/api/jobs?pageSize=100');
      const ids = list.body.items.map((x: { id: string }) => x.id);
      expect(ids).toContain(mine.jobId);
      expect(ids).not.toContain(theirs.jobId);
      const own = await as('seller').get(`/api/jobs/${mine.jobId}`);
      expect(own.status).toBe(200);
      expect(own.body.can).toMatchObject({
        schedule: false,
        editPermits: false,
        start: false,
        log: false,
        complete: false,
      });
      // The manager of the branch may start it too; leadB, whose crew it is not, does not see it at all.
      expect((await as('manager').get(`/api/jobs/${mine.jobId}`)).body.can.start).toBe(true);
      expect(
        (await schedule('seller', mine.jobId, { crewId: crewA.id, startOn: '2026-07-20', durationDays: 1 }))
          .status,
      ).toBe(403);
      expect((await as('seller').post(`/api/jobs/${mine.jobId}/start`)).status).toBe(403);
      expect((await as('seller').put(`/api/jobs/${mine.jobId}/permit`, { needed: false })).status).toBe(403);
      expect((await as('seller').get(`/api/jobs/${theirs.jobId}`)).status).toBe(404);
    });

    it('another branch’s manager gets 404; the bookkeeper reads, writes nothing; the owner schedules', async () => {
      expect((await as('otherManager').get(`/api/jobs/${mine.jobId}`)).status).toBe(404);
      expect(
        (
          await schedule('otherManager', mine.jobId, {
            crewId: crewA.id,
            startOn: '2026-07-20',
            durationDays: 1,
          })
        ).status,
      ).toBe(404);
      const otherList = await as('otherManager').get('/api/jobs?pageSize=100');
      expect(otherList.body.items.map((x: { id: string }) => x.id)).not.toContain(mine.jobId);
      expect(
        (await as('otherManager').get(`/api/jobs/calendar?branchId=${gulf}&from=${TODAY}&to=${TODAY}`))
          .status,
      ).toBe(404);
      expect((await as('bookkeeper').get(`/api/jobs/${mine.jobId}`)).status).toBe(200);
      expect((await as('bookkeeper').del(`/api/jobs/${mine.jobId}/schedule`)).status).toBe(403);
      const owner = await schedule('owner', mine.jobId, {
        crewId: crewA.id,
        startOn: '2026-07-21',
        durationDays: 1,
      });
      expect(owner.status).toBe(200);
    });

    it('answers 400 for an id that is not a uuid', async () => {
      expect((await as('manager').get('/api/jobs/not-a-job')).status).toBe(400);
    });
  });

  describe('crews', () => {
    it('a manager makes and edits the branch’s crews; the lead must be a crew lead of the branch', async () => {
      const created = await as('manager').post('/api/crews', {
        branchId: gulf,
        name: 'East crew',
        leadUserId: people.leadA!.id,
        members: [
          { name: 'Rowan Pell', phone: '555-0163' },
          { name: 'Ines Marl', phone: null },
        ],
      });
      expect(created.status, JSON.stringify(created.body)).toBe(201);
      expect(created.body).toMatchObject({
        branchId: gulf,
        name: 'East crew',
        leadUserId: people.leadA!.id,
        leadName: 'Test leadA',
        active: true,
        members: [
          { name: 'Rowan Pell', phone: '555-0163' },
          { name: 'Ines Marl', phone: null },
        ],
      });
      const dup = await as('manager').post('/api/crews', {
        branchId: gulf,
        name: 'East crew',
        leadUserId: people.leadB!.id,
        members: [],
      });
      expect(dup.status).toBe(409);
      expect(dup.body.code).toBe('CREW.NAME_TAKEN');
      const notLead = await as('manager').post('/api/crews', {
        branchId: gulf,
        name: 'West crew',
        leadUserId: people.seller!.id,
        members: [],
      });
      expect(notLead.status).toBe(400);
      expect(notLead.body.details[0].field).toBe('leadUserId');
      const foreignLead = await as('manager').post('/api/crews', {
        branchId: gulf,
        name: 'West crew',
        leadUserId: people.otherLead!.id,
        members: [],
      });
      expect(foreignLead.body.details[0].field).toBe('leadUserId');
      expect(
        (
          await as('otherManager').post('/api/crews', {
            branchId: gulf,
            name: 'X',
            leadUserId: people.leadA!.id,
            members: [],
          })
        ).status,
      ).toBe(404);
      expect(
        (
          await as('seller').post('/api/crews', {
            branchId: gulf,
            name: 'X',
            leadUserId: people.leadA!.id,
            members: [],
          })
        ).status,
      ).toBe(403);

      // A job on the crew, then a new lead: the new lead takes over the job still to do.
      const j = await ready();
      await schedule('manager', j.jobId, { crewId: created.body.id, startOn: '2026-07-28', durationDays: 1 });
      const patched = await as('manager').patch(`/api/crews/${created.body.id}`, {
        leadUserId: people.leadB!.id,
        members: [{ name: 'Rowan Pell', phone: '555-0163' }],
      });
      expect(patched.status, JSON.stringify(patched.body)).toBe(200);
      expect(patched.body).toMatchObject({ leadUserId: people.leadB!.id, members: [{ name: 'Rowan Pell' }] });
      expect((await as('leadB').get(`/api/jobs/${j.jobId}`)).status).toBe(200);
      expect((await as('leadA').get(`/api/jobs/${j.jobId}`)).status).toBe(404);
      expect((await as('otherManager').patch(`/api/crews/${created.body.id}`, { name: 'Mine' })).status).toBe(
        404,
      );

      const inactive = await as('manager').patch(`/api/crews/${created.body.id}`, { active: false });
      expect(inactive.body.active).toBe(false);
      const onInactive = await schedule('manager', j.jobId, {
        crewId: created.body.id,
        startOn: '2026-07-29',
        durationDays: 1,
      });
      expect(onInactive.status).toBe(422);
      expect(onInactive.body.code).toBe('CREW.INACTIVE');

      const list = await as('manager').get(`/api/crews?branchId=${gulf}`);
      expect(list.body.map((c: { name: string }) => c.name)).toEqual(
        expect.arrayContaining(['Crew A', 'Crew B', 'East crew']),
      );
      expect((await as('otherManager').get(`/api/crews?branchId=${gulf}`)).body).toEqual([]);
    });
  });
  it('seeds the demo crews idempotently, led by the demo crew leads (inside a transaction rolled back)', async () => {
    await t.db
      .transaction(async (trx) => {
        await seedCompany(trx);
        const crews = () =>
          trx('crews as c')
            .join('branches as b', 'b.id', 'c.branch_id')
            .join('users as u', 'u.id', 'c.lead_user_id')
            .whereIn('b.code', ['MRW', 'ALD', 'SBH'])
            .orderBy('c.name')
            .select('b.code', 'c.name', 'u.email', 'u.role', 'c.id');
        await seedCrews(trx);
        const first = await crews();
        await seedCrews(trx);
        expect(await crews()).toEqual(first);
        expect(first).toHaveLength(demoCrews.crews.length);
        for (const code of ['MRW', 'ALD', 'SBH'])
          expect(first.filter((c) => c.code === code)).toHaveLength(2);
        expect(first.every((c) => c.role === 'crew_lead')).toBe(true);
        expect(first.find((c) => c.code === 'MRW')!.email).toBe('hector.ilori@teasel-marl.test');
        const members = await trx('crew_members').whereIn(
          'crew_id',
          first.map((c) => c.id),
        );
        expect(members.length).toBe(demoCrews.crews.reduce((n, c) => n + c.members.length, 0));
        // Invented people only: 555-01xx phones.
        expect(members.every((m) => m.phone === null || /^555-01\d\d$/.test(m.phone))).toBe(true);
        throw new Error('rollback');
      })
      .catch((e: Error) => {
        if (e.message !== 'rollback') throw e;
      });
  });
});
