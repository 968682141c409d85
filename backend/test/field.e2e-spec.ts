import { randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import sharp from 'sharp';
import type { Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_KT_PER_FT } from '@loambook/common';
import { JOB_COMPLETED_HANDLERS, type JobCompletedHandler } from '../src/field/job-completed';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';
import {
  makeCrew,
  makeSignedJob,
  putJobOnCrew,
  type CrewFixture,
  type SignedJob,
} from './support/job-fixtures';
import { blankSignature, inkSignature } from './support/signing-fixtures';

const BUCKET = 'loambook-field-test';
// Monday 2026-07-20, 11:00 EDT: "today" in the branch is 2026-07-20.
const TEST_NOW = '2026-07-20T15:00:00Z';
const TODAY = '2026-07-20';
/** A photo of job A sent with a client id before completion (its resend after completion still answers). */
const JOB_A_PHOTO = randomUUID();

function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

/** The helical plan, by hand: 2 piles × 2000 = 4000 (cost 2 × 900 = 1800) + mobilisation 600 (cost 300)
 *  → price 4600.00, estimated cost 2100.00. */
const HELICAL_PLAN = [
  {
    description: 'Helical pile, 1.5 in square shaft',
    category: 'helical_piles',
    unit: 'each',
    quantity: '2',
    unitCost: '900',
    unitPrice: '2000',
  },
  {
    description: 'Mobilisation',
    category: 'mobilisation',
    unit: 'lump_sum',
    quantity: '1',
    unitCost: '300',
    unitPrice: '600',
  },
];

const CHECKLIST = {
  siteCleaned: true,
  injectionHolesPatched: true,
  plumbingChecked: true,
  doorsWindowsChecked: true,
  drainageRestored: true,
  homeownerWalkthrough: true,
};
// After the repair B reads 0.25 in below A, 25 ft away: 0.25 in over 300 in → β = 1/1200 (the same
// arithmetic as REFERENCE-VALUES.md's example: 1.0 in over 25 ft → 1/300).
const RESURVEY = [
  { label: 'A', xFt: '0', yFt: '0', elevationIn: '0', isReference: true },
  { label: 'B', xFt: '25', yFt: '0', elevationIn: '-0.25' },
  { label: 'C', xFt: '0', yFt: '25', elevationIn: '-0.25' },
];

describe('the field log, completion, actuals and warranty', () => {
  let t: TestApp;
  let s3: S3rver;
  let s3Dir: string;
  let gulf: string;
  let gulfCode: string;
  let other: string;
  const people: Record<string, TestUser> = {};
  const tokens: Record<string, string> = {};
  let crew: CrewFixture;
  /** Injection job (J1's DEFAULT_PLAN), sold by `seller`, in progress on `crew`. */
  let jobA: SignedJob;
  /** Helical job, sold by `seller2`, in progress on `crew`. */
  let jobH: SignedJob;
  /** Scheduled, not started, on `crew`. */
  let jobS: SignedJob;
  let ink: string;
  let png: Buffer;

  const as = (who: string) => {
    const auth = { Authorization: `Bearer ${tokens[who]}` };
    return {
      get: (url: string) => t.http.get(url).set(auth),
      getBinary: (url: string) => t.http.get(url).set(auth).buffer(true).parse(binary),
      post: (url: string, body: object = {}) => t.http.post(url).set(auth).send(body),
      upload: (url: string, file: Buffer, filename: string, fields: Record<string, string> = {}) => {
        const req = t.http.post(url).set(auth);
        for (const [k, v] of Object.entries(fields)) req.field(k, v);
        return req.attach('file', file, filename);
      },
    };
  };

  const point = (n: number, extra: Record<string, unknown> = {}) => ({
    clientRowId: randomUUID(),
    kind: 'injection',
    number: n,
    location: `East wall, ${n * 5} ft from the NE corner`,
    locationFt: String(n * 5),
    depthFt: '5',
    pounds: '20',
    stopReason: 'surface_return',
    loggedAt: '2026-07-20T14:30:00Z',
    ...extra,
  });
  const pile = (n: number, torqueFtLb: string, extra: Record<string, unknown> = {}) => ({
    clientRowId: randomUUID(),
    kind: 'helical_pile',
    number: n,
    depthFt: '22',
    torqueFtLb,
    shaft: '1.5in-square',
    designLoadLb: '18000',
    loggedAt: '2026-07-20T14:30:00Z',
    ...extra,
  });
  const completion = (extra: Record<string, unknown> = {}) => ({
    checklist: CHECKLIST,
    resurvey: RESURVEY,
    homeownerName: jobA.homeownerName,
    signaturePng: ink,
    ...extra,
  });

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
    gulf = await makeBranch(t.db, { name: 'North Gulf Foundations', timezone: 'America/New_York' });
    other = await makeBranch(t.db, { name: 'Panhandle Foundations', timezone: 'America/Chicago' });
    gulfCode = (await t.db('branches').where({ id: gulf }).first('code')).code;
    await t.db('branches').where({ id: gulf }).update({ phone: '555-0142' });
    const roles: [string, Parameters<typeof makeUser>[1], string[], string][] = [
      ['manager', 'branch_manager', [gulf], 'Morgan Manager'],
      ['seller', 'salesperson', [gulf], 'Sam Seller'],
      ['seller2', 'salesperson', [gulf], 'Terry Seller'],
      ['crewLead', 'crew_lead', [gulf], 'Casey Crewlead'],
      ['crewLead2', 'crew_lead', [gulf], 'Devon Crewlead'],
      ['otherManager', 'branch_manager', [other], 'Pat Panhandle'],
      ['bookkeeper', 'bookkeeper', [], 'Bea Bookkeeper'],
      ['owner', 'owner', [], 'Olive Owner'],
    ];
    for (const [key, role, branches, name] of roles) {
      people[key] = await makeUser(t.db, role, branches, { name });
      tokens[key] = await tokenFor(t, people[key]!);
    }
    crew = await makeCrew(t, gulf, people.crewLead!, { name: 'East crew' });
    // Another crew of the branch, whose lead must not see the East crew's jobs.
    await makeCrew(t, gulf, people.crewLead2!, { name: 'West crew' });
    jobA = await makeSignedJob(t, { branchId: gulf, seller: people.seller!, windowClosed: true });
    jobH = await makeSignedJob(t, {
      branchId: gulf,
      seller: people.seller2!,
      windowClosed: true,
      lines: HELICAL_PLAN,
    });
    jobS = await makeSignedJob(t, { branchId: gulf, seller: people.seller!, windowClosed: true });
    await putJobOnCrew(t, jobA.jobId, crew);
    await putJobOnCrew(t, jobH.jobId, crew);
    await putJobOnCrew(t, jobS.jobId, crew, { status: 'scheduled', startOn: '2026-07-27' });
    ink = await inkSignature();
    png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#806040' } })
      .png()
      .toBuffer();
  });

  afterAll(async () => {
    await t?.close();
    await s3?.close();
    if (s3Dir) await rm(s3Dir, { recursive: true, force: true });
  });

  describe('the install log', () => {
    it('refuses rows before the job has started: 409 JOB.NOT_STARTED', async () => {
      const res = await as('crewLead').post(`/api/jobs/${jobS.jobId}/log/entries`, point(1));
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('JOB.NOT_STARTED');
      const note = await as('crewLead').post(`/api/jobs/${jobS.jobId}/log/day-notes`, {
        clientRowId: randomUUID(),
        workDate: TODAY,
        labourHours: '8',
      });
      expect(note.status).toBe(409);
      expect(await t.db('install_entries').where({ job_id: jobS.jobId })).toHaveLength(0);
    });

    it('writes a row once per client row id: a resend answers 200 with the row first stored', async () => {
      const row = point(1);
      const first = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/entries`, row);
      expect(first.status, JSON.stringify(first.body)).toBe(201);
      expect(first.body).toMatchObject({
        clientRowId: row.clientRowId,
        kind: 'injection',
        number: 1,
        pounds: '20.00',
        stopReason: 'surface_return',
        belowDesignLoad: null,
        loggedByName: 'Casey Crewlead',
        photoCount: 0,
      });
      // The phone lost the answer and sends again, the pounds retyped meanwhile: the first write wins.
      const again = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/entries`, {
        ...row,
        pounds: '21',
      });
      expect(again.status).toBe(200);
      expect(again.body).toEqual(first.body);
      expect(await t.db('install_entries').where({ client_row_id: row.clientRowId })).toHaveLength(1);

      // The same id on another job is a phone bug, not a resend.
      const elsewhere = await as('crewLead').post(`/api/jobs/${jobH.jobId}/log/entries`, row);
      expect(elsewhere.status).toBe(409);
      expect(elsewhere.body.code).toBe('INSTALL.CLIENT_ROW_OTHER_JOB');

      // A second row with the same point number (a new client row id) is refused.
      const twice = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/entries`, point(1));
      expect(twice.status).toBe(409);
      expect(twice.body.code).toBe('INSTALL.NUMBER_TAKEN');

      expect(
        (await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/entries`, point(2, { pounds: '25.5' })))
          .status,
      ).toBe(201);
      const third = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/log/entries`,
        point(3, { pounds: '30', stopReason: 'other', note: 'Hit the old footing' }),
      );
      expect(third.status).toBe(201);
    });

    it('checks each row for its kind (400 with the fields at fault)', async () => {
      const noReason = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/log/entries`,
        point(4, { stopReason: null }),
      );
      expect(noReason.status).toBe(400);
      expect(noReason.body.details).toEqual([{ field: 'stopReason', message: 'Say why the point stopped.' }]);
      const noNote = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/log/entries`,
        point(4, { stopReason: 'other' }),
      );
      expect(noNote.status).toBe(400);
      expect(noNote.body.details.map((d: { field: string }) => d.field)).toEqual(['note']);
      const pier = await as('crewLead').post(`/api/jobs/${jobH.jobId}/log/entries`, {
        clientRowId: randomUUID(),
        kind: 'push_pier',
        number: 1,
        loggedAt: '2026-07-20T14:30:00Z',
      });
      expect(pier.status).toBe(400);
      expect(pier.body.details.map((d: { field: string }) => d.field)).toEqual([
        'depthFt',
        'finalPressurePsi',
      ]);
      const numeric = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/log/entries`,
        point(4, { pounds: 20 }),
      );
      expect(numeric.status).toBe(400);
      expect(await t.db('install_entries').where({ job_id: jobA.jobId, number: 4 })).toHaveLength(0);
    });

    it('flags a helical pile whose torque gives less than the design load', async () => {
      // Qu = Kt × T (Hoyt & Clemence 1989, secondary) with Kt = 10 ft⁻¹ for a 1.5 in square shaft (ICC-ES
      // AC358 defaults, secondary; common/src/calculators/helical-capacity.ts); allowable = Qu / 2 (IBC
      // 1810.3.3.1.9 "Pa = 0.5 Pu", memory).
      expect(DEFAULT_KT_PER_FT['1.5in-square']).toBe('10');
      // 10 × 3,000 ft·lb = 30,000 lb; / 2 = 15,000 lb < 18,000 lb design load → flagged.
      const low = await as('crewLead').post(`/api/jobs/${jobH.jobId}/log/entries`, pile(1, '3000'));
      expect(low.status, JSON.stringify(low.body)).toBe(201);
      expect(low.body).toMatchObject({
        capacityUltimateLb: '30000.00',
        capacityAllowableLb: '15000.00',
        designLoadLb: '18000.00',
        belowDesignLoad: true,
      });
      // 10 × 3,600 = 36,000; / 2 = 18,000 = the design load → met, not flagged.
      const met = await as('crewLead').post(`/api/jobs/${jobH.jobId}/log/entries`, pile(2, '3600'));
      expect(met.body).toMatchObject({ capacityAllowableLb: '18000.00', belowDesignLoad: false });
      // 10 × 4,500 = 45,000; / 2 = 22,500 → met.
      const high = await as('crewLead').post(`/api/jobs/${jobH.jobId}/log/entries`, pile(3, '4500'));
      expect(high.body).toMatchObject({ capacityAllowableLb: '22500.00', belowDesignLoad: false });

      const log = await as('manager').get(`/api/jobs/${jobH.jobId}/log`);
      expect(log.status).toBe(200);
      expect(log.body.totals).toEqual({
        injectionPoints: 0,
        pounds: '0.00',
        pushPiers: 0,
        helicalPiles: 3,
        flagged: 1,
      });
      expect(log.body.entries.filter((e: { belowDesignLoad: boolean }) => e.belowDesignLoad)).toHaveLength(1);
      const stored = await t.db('install_entries').where({ job_id: jobH.jobId, number: 1 }).first();
      expect(stored.below_design_load).toBe(true);
    });

    it('day notes carry the labour hours, written once per client row id', async () => {
      const note = {
        clientRowId: randomUUID(),
        workDate: TODAY,
        crewSize: 3,
        labourHours: '8.5',
        note: 'East wall',
      };
      const first = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/day-notes`, note);
      expect(first.status, JSON.stringify(first.body)).toBe(201);
      expect(first.body).toMatchObject({
        workDate: TODAY,
        labourHours: '8.50',
        crewSize: 3,
        writtenByName: 'Casey Crewlead',
      });
      const again = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/day-notes`, {
        ...note,
        labourHours: '9',
      });
      expect(again.status).toBe(200);
      expect(again.body).toEqual(first.body);
      const second = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/day-notes`, {
        clientRowId: randomUUID(),
        workDate: TODAY,
        labourHours: '9',
      });
      expect(second.status).toBe(201);
      const future = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/day-notes`, {
        clientRowId: randomUUID(),
        workDate: '2026-07-21',
        labourHours: '9',
      });
      expect(future.status).toBe(400);
      expect(await t.db('job_day_notes').where({ job_id: jobA.jobId })).toHaveLength(2);
    });

    it('the database refuses to change or delete a written row', async () => {
      const row = await t.db('install_entries').where({ job_id: jobA.jobId, number: 1 }).first();
      await expect(t.db('install_entries').where({ id: row.id }).update({ pounds: '1' })).rejects.toThrow(
        /cannot be changed or deleted/,
      );
      await expect(t.db('install_entries').where({ id: row.id }).delete()).rejects.toThrow(
        /cannot be changed or deleted/,
      );
      const note = await t.db('job_day_notes').where({ job_id: jobA.jobId }).first();
      await expect(
        t.db('job_day_notes').where({ id: note.id }).update({ labour_hours: '1' }),
      ).rejects.toThrow(/cannot be changed or deleted/);
      await expect(t.db('job_day_notes').where({ id: note.id }).delete()).rejects.toThrow(
        /cannot be changed/,
      );
      expect((await t.db('install_entries').where({ id: row.id }).first()).pounds).toBe('20.00');
    });
  });

  describe('photos', () => {
    it('keeps a photo of a row, with a thumbnail, and answers its bytes', async () => {
      const entry = await t.db('install_entries').where({ job_id: jobA.jobId, number: 2 }).first('id');
      const res = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'point-2.png', {
        caption: 'Point 2 after injection',
        installEntryId: entry.id,
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        installEntryId: entry.id,
        contentType: 'image/png',
        caption: 'Point 2 after injection',
      });
      expect(res.body.url).toBe(`/api/jobs/${jobA.jobId}/photos/${res.body.id}`);
      const original = await as('seller').getBinary(res.body.url);
      expect(original.status).toBe(200);
      expect(original.headers['content-type']).toBe('image/png');
      expect(Buffer.compare(original.body, png)).toBe(0);
      const thumb = await as('manager').getBinary(res.body.thumbnailUrl);
      expect(thumb.status).toBe(200);
      expect(thumb.headers['content-type']).toBe('image/jpeg');
      expect((await sharp(thumb.body).metadata()).format).toBe('jpeg');
      const log = await as('crewLead').get(`/api/jobs/${jobA.jobId}/log`);
      expect(log.body.photos).toHaveLength(1);
      expect(log.body.entries.find((e: { number: number }) => e.number === 2).photoCount).toBe(1);
      // Another crew's lead cannot see it.
      expect((await as('crewLead2').getBinary(res.body.url)).status).toBe(404);
    });

    it('refuses what is not a photo by its content, a file over 15 MB and another job’s row', async () => {
      const text = await as('crewLead').upload(
        `/api/jobs/${jobA.jobId}/photos`,
        Buffer.from('not a photo at all, only text'),
        'site.jpg',
      );
      expect(text.status).toBe(415);
      expect(text.body.code).toBe('UPLOAD.UNSUPPORTED_TYPE');
      const big = Buffer.concat([png, Buffer.alloc(15 * 1024 * 1024)]);
      const tooLarge = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, big, 'big.png');
      expect(tooLarge.status).toBe(413);
      expect(tooLarge.body.code).toBe('UPLOAD.TOO_LARGE');
      const otherRow = await t.db('install_entries').where({ job_id: jobH.jobId }).first('id');
      const wrong = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'p.png', {
        installEntryId: otherRow.id,
      });
      expect(wrong.status).toBe(400);
      expect((await as('seller').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'p.png')).status).toBe(403);
      expect(await t.db('job_photos').where({ job_id: jobA.jobId })).toHaveLength(1);
    });

    it('writes a photo once per client photo id: a resend answers 200 with the photo first stored', async () => {
      const pile1 = await t.db('install_entries').where({ job_id: jobH.jobId, number: 1 }).first('id');
      const clientPhotoId = randomUUID();
      const url = `/api/jobs/${jobH.jobId}/photos`;
      const first = await as('crewLead').upload(url, png, 'pile-1.png', {
        caption: 'Pile 1 at torque',
        installEntryId: pile1.id,
        clientPhotoId,
      });
      expect(first.status, JSON.stringify(first.body)).toBe(201);
      expect(first.body).toMatchObject({
        clientPhotoId,
        installEntryId: pile1.id,
        caption: 'Pile 1 at torque',
      });

      // The answer was lost with the signal: the phone sends the same photo again, under the same id.
      const resend = await as('crewLead').upload(url, png, 'pile-1.png', {
        caption: 'Pile 1 at torque (again)',
        installEntryId: pile1.id,
        clientPhotoId,
      });
      expect(resend.status, JSON.stringify(resend.body)).toBe(200);
      expect(resend.body.id).toBe(first.body.id);
      expect(resend.body.caption).toBe('Pile 1 at torque');
      expect(await t.db('job_photos').where({ client_photo_id: clientPhotoId })).toHaveLength(1);
      const log = await as('crewLead').get(`/api/jobs/${jobH.jobId}/log`);
      expect(log.body.photos.map((p: { id: string }) => p.id)).toEqual([first.body.id]);
      expect(log.body.entries.find((e: { number: number }) => e.number === 1).photoCount).toBe(1);

      // The same id on another job is the phone's mistake (409); an id that is no uuid is refused (400).
      const elsewhere = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'p.png', {
        clientPhotoId,
      });
      expect(elsewhere.status).toBe(409);
      expect(elsewhere.body.code).toBe('PHOTO.CLIENT_ID_OTHER_JOB');
      const onA = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'a.png', {
        clientPhotoId: JOB_A_PHOTO,
      });
      expect(onA.status).toBe(201);
      const notUuid = await as('crewLead').upload(url, png, 'p.png', { clientPhotoId: 'photo-1' });
      expect(notUuid.status).toBe(400);
      // Two sends at once: still one photo.
      const racing = randomUUID();
      const both = await Promise.all(
        [1, 2].map(() => as('crewLead').upload(url, png, 'race.png', { clientPhotoId: racing })),
      );
      expect(both.map((r) => r.status).sort()).toEqual([200, 201]);
      expect(both[0]!.body.id).toBe(both[1]!.body.id);
      expect(await t.db('job_photos').where({ client_photo_id: racing })).toHaveLength(1);
      // Without a client id every upload is a photo of its own (as before).
      const plain = await as('crewLead').upload(url, png, 'plain.png');
      expect(plain.status).toBe(201);
      expect(plain.body.clientPhotoId).toBeNull();
      expect(await t.db('job_photos').where({ job_id: jobH.jobId })).toHaveLength(3);
    });
  });

  describe('who may see and write the log', () => {
    it('a crew lead of another crew finds no such job (404), reading or writing', async () => {
      expect((await as('crewLead2').get(`/api/jobs/${jobA.jobId}/log`)).status).toBe(404);
      const write = await as('crewLead2').post(`/api/jobs/${jobA.jobId}/log/entries`, point(9));
      expect(write.status).toBe(404);
      expect(write.body.code).toBe('JOB.NOT_FOUND');
      expect((await as('crewLead2').get(`/api/jobs/${jobA.jobId}/survey-comparison`)).status).toBe(404);
    });

    it('a salesperson reads the log and actuals of their own job, writes nothing (403), sees no other job (404)', async () => {
      const log = await as('seller').get(`/api/jobs/${jobA.jobId}/log`);
      expect(log.status).toBe(200);
      expect(log.body.entries.map((e: { number: number }) => e.number)).toEqual([1, 2, 3]);
      expect((await as('seller').get(`/api/jobs/${jobA.jobId}/actuals`)).status).toBe(200);
      const write = await as('seller').post(`/api/jobs/${jobA.jobId}/log/entries`, point(8));
      expect(write.status).toBe(403);
      expect((await as('seller').post(`/api/jobs/${jobA.jobId}/complete`, completion())).status).toBe(403);
      expect((await as('seller2').get(`/api/jobs/${jobA.jobId}/log`)).status).toBe(404);
    });

    it('another branch’s manager finds no such job (404); the crew lead sees no money figures (403)', async () => {
      expect((await as('otherManager').get(`/api/jobs/${jobA.jobId}/log`)).status).toBe(404);
      expect((await as('otherManager').get(`/api/jobs/${jobA.jobId}/actuals`)).status).toBe(404);
      expect((await as('otherManager').post(`/api/jobs/${jobA.jobId}/log/entries`, point(8))).status).toBe(
        404,
      );
      expect((await as('crewLead').get(`/api/jobs/${jobA.jobId}/actuals`)).status).toBe(403);
      expect((await as('bookkeeper').get(`/api/jobs/${jobA.jobId}/actuals`)).status).toBe(200);
      expect((await as('bookkeeper').post(`/api/jobs/${jobA.jobId}/log/entries`, point(8))).status).toBe(403);
    });
  });

  describe('completion', () => {
    it('shows the inspection’s survey alone until the re-survey exists', async () => {
      const res = await as('crewLead').get(`/api/jobs/${jobA.jobId}/survey-comparison`);
      expect(res.status).toBe(200);
      // The fixture's inspection survey: B 1.0 in below A over 25 ft → 1/300 (REFERENCE-VALUES.md example).
      expect(res.body.beforeWorstRatio).toBe('1/300');
      expect(res.body.after).toEqual([]);
      expect(res.body.afterWorstRatio).toBeNull();
    });

    it('refuses an unanswered checklist (422, listing the items), a short re-survey and a blank signature', async () => {
      const { drainageRestored: _d, plumbingChecked: _p, ...partial } = CHECKLIST;
      const unanswered = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/complete`,
        completion({ checklist: partial }),
      );
      expect(unanswered.status).toBe(422);
      expect(unanswered.body.code).toBe('JOB.CHECKLIST_INCOMPLETE');
      expect(unanswered.body.details.map((d: { field: string }) => d.field)).toEqual([
        'checklist.plumbingChecked',
        'checklist.drainageRestored',
      ]);
      expect(unanswered.body.message).toMatch(/plumbing checked.*drainage/);
      const no = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/complete`,
        completion({ checklist: { ...CHECKLIST, drainageRestored: false } }),
      );
      expect(no.status).toBe(422);
      expect(no.body.code).toBe('JOB.CHECKLIST_NOTE_REQUIRED');
      const short = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/complete`,
        completion({ resurvey: RESURVEY.slice(0, 2) }),
      );
      expect(short.status).toBe(422);
      expect(short.body.code).toBe('JOB.RESURVEY_INVALID');
      const blank = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/complete`,
        completion({ signaturePng: await blankSignature() }),
      );
      expect(blank.status).toBe(400);
      expect(blank.body.code).toBe('SIGNING.SIGNATURE_INVALID');
      expect((await t.db('jobs').where({ id: jobA.jobId }).first()).status).toBe('in_progress');
      expect(await t.db('job_survey_points').where({ job_id: jobA.jobId })).toHaveLength(0);
    });

    it('a handler that fails rolls the whole completion back', async () => {
      const handlers = t.app.get<JobCompletedHandler[]>(JOB_COMPLETED_HANDLERS);
      const failing: JobCompletedHandler = {
        onJobCompleted: async () => {
          throw new Error('ledger unavailable');
        },
      };
      handlers.push(failing);
      try {
        const res = await as('crewLead').post(`/api/jobs/${jobA.jobId}/complete`, completion());
        expect(res.status).toBe(500);
      } finally {
        handlers.splice(handlers.indexOf(failing), 1);
      }
      expect((await t.db('jobs').where({ id: jobA.jobId }).first()).status).toBe('in_progress');
      expect(await t.db('job_completions').where({ job_id: jobA.jobId })).toHaveLength(0);
    });

    it('completes the job and the lead, tells the handlers, and compares the surveys', async () => {
      const events: unknown[] = [];
      const handlers = t.app.get<JobCompletedHandler[]>(JOB_COMPLETED_HANDLERS);
      const recorder: JobCompletedHandler = {
        onJobCompleted: async (e, trx) => {
          // Inside the transaction: the job already reads completed there.
          events.push({ ...e, statusInside: (await trx('jobs').where({ id: e.jobId }).first()).status });
        },
      };
      handlers.push(recorder);
      let res;
      try {
        res = await as('crewLead').post(`/api/jobs/${jobA.jobId}/complete`, completion({ note: 'All good' }));
      } finally {
        handlers.splice(handlers.indexOf(recorder), 1);
      }
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ id: jobA.jobId, status: 'completed' });
      expect(res.body.completedAt).toBe(new Date(TEST_NOW).toISOString());
      expect(events).toEqual([
        {
          jobId: jobA.jobId,
          contractId: jobA.contractId,
          leadId: jobA.leadId,
          branchId: gulf,
          completedAt: new Date(TEST_NOW),
          statusInside: 'completed',
        },
      ]);
      expect((await t.db('leads').where({ id: jobA.leadId }).first()).stage).toBe('completed');
      const record = await t.db('job_completions').where({ job_id: jobA.jobId }).first();
      expect(record.homeowner_name).toBe(jobA.homeownerName);
      expect(record.checklist).toEqual(CHECKLIST);
      expect(record.signature_png.subarray(1, 4).toString()).toBe('PNG');

      const cmp = await as('manager').get(`/api/jobs/${jobA.jobId}/survey-comparison`);
      // Before: A 0, B −1, C −0.25 (the fixture's inspection): 1.0 in over 25 ft → 1/300.
      // After: A 0, B −0.25, C −0.25: 0.25 in over 25 ft (300 in) → 1/1200; B came up 0.75 in.
      expect(cmp.body).toMatchObject({
        beforeMaxDifferentialIn: '1',
        afterMaxDifferentialIn: '0.25',
        beforeWorstRatio: '1/300',
        afterWorstRatio: '1/1200',
        sameReference: true,
      });
      expect(cmp.body.changes).toEqual([
        { label: 'A', beforeIn: '0', afterIn: '0', changeIn: '0' },
        { label: 'B', beforeIn: '-1', afterIn: '-0.25', changeIn: '0.75' },
        { label: 'C', beforeIn: '-0.25', afterIn: '-0.25', changeIn: '0' },
      ]);
    });

    it('a completed job takes no more rows, nor a second completion; its record is final', async () => {
      const more = await as('crewLead').post(`/api/jobs/${jobA.jobId}/log/entries`, point(10));
      expect(more.status).toBe(409);
      expect(more.body.code).toBe('JOB.ALREADY_COMPLETED');
      const photo = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'late.png');
      expect(photo.status).toBe(409);
      // A photo sent before completion, sent again (its answer lost): the stored one, not a refusal.
      const photoAgain = await as('crewLead').upload(`/api/jobs/${jobA.jobId}/photos`, png, 'a.png', {
        clientPhotoId: JOB_A_PHOTO,
      });
      expect(photoAgain.status).toBe(200);
      expect(photoAgain.body.clientPhotoId).toBe(JOB_A_PHOTO);
      const again = await as('crewLead').post(`/api/jobs/${jobA.jobId}/complete`, completion());
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('JOB.ALREADY_COMPLETED');
      // A resend of a row stored before completion still answers the stored row.
      const stored = await t
        .db('install_entries')
        .where({ job_id: jobA.jobId, number: 1 })
        .first('client_row_id');
      const resend = await as('crewLead').post(
        `/api/jobs/${jobA.jobId}/log/entries`,
        point(1, { clientRowId: stored.client_row_id }),
      );
      expect(resend.status).toBe(200);
      await expect(
        t.db('job_survey_points').where({ job_id: jobA.jobId }).update({ elevation_in: '0' }),
      ).rejects.toThrow(/cannot be changed or deleted/);
      await expect(
        t.db('job_completions').where({ job_id: jobA.jobId }).update({ note: 'changed' }),
      ).rejects.toThrow(/cannot be changed or deleted/);
    });
  });

  describe('actuals', () => {
    it('prices the plan at the logged quantities (hand-checked)', async () => {
      // J1's DEFAULT_PLAN (backend/test/support/job-fixtures.ts), price 5,420.00, no invoice tax:
      //   240 lb × 5.20 = 1,248.00; 12 points × 18 = 216.00; 16 hours × 55 = 880.00; mobilisation 300.00
      //   estimated cost 2,644.00; margin (5420 − 2644) / 5420 = 2776 / 5420 = 0.51217… → 51.22 %.
      // The log: points 1–3 of 20 + 25.5 + 30 = 75.5 lb; day notes 8.5 + 9 = 17.5 hours:
      //   75.5 × 5.20 = 392.60; 3 × 18 = 54.00; 17.5 × 55 = 962.50; mobilisation 300.00 (not measured)
      //   actual cost = 392.60 + 54 + 962.50 + 300 = 1,709.10
      //   actual margin (5420 − 1709.10) / 5420 = 3710.90 / 5420 = 0.68466… → 68.47 %.
      const res = await as('manager').get(`/api/jobs/${jobA.jobId}/actuals`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        jobId: jobA.jobId,
        price: '5420.00',
        estimatedCost: '2644.00',
        actualCost: '1709.10',
        estimatedMarginPct: '51.22',
        actualMarginPct: '68.47',
        estimatedGrossProfit: '2776.00',
        actualGrossProfit: '3710.90',
        material: { plannedLb: '240', usedLb: '75.5', unitCost: '5.20' },
        labour: { estimatedHours: '16', actualHours: '17.5', costPerHour: '55.00' },
        piers: { planned: '0', installed: 0 },
        injectionPoints: { planned: '12', installed: 3 },
      });
      expect(
        res.body.lines.map((l: { actualQty: string; actualCost: string }) => [l.actualQty, l.actualCost]),
      ).toEqual([
        ['75.5', '392.60'],
        ['3', '54.00'],
        ['17.5', '962.50'],
        ['1', '300.00'],
      ]);
    });

    it('sums completed jobs per salesperson and per branch', async () => {
      // Complete the helical job too. Its plan: 2 piles × 900 + 300 = 2,100.00 against 4,600.00 →
      // (4600 − 2100) / 4600 = 54.347… → 54.35 %. Logged 3 piles: 3 × 900 + 300 = 3,000.00 →
      // (4600 − 3000) / 4600 = 0.347826… → 34.78 %; drift 34.78 − 54.35 = −19.57 points.
      const done = await as('crewLead').post(
        `/api/jobs/${jobH.jobId}/complete`,
        completion({ homeownerName: jobH.homeownerName }),
      );
      expect(done.status, JSON.stringify(done.body)).toBe(200);

      // Per salesperson: Terry (the helical job) under-estimated, listed first; Sam's job A
      // 51.22 % → 68.47 %: +17.25 points.
      const bySeller = await as('manager').get('/api/jobs/actuals/summary?by=salesperson');
      expect(bySeller.status, JSON.stringify(bySeller.body)).toBe(200);
      expect(bySeller.body).toEqual([
        {
          key: people.seller2!.id,
          name: 'Terry Seller',
          jobs: 1,
          price: '4600.00',
          estimatedCost: '2100.00',
          actualCost: '3000.00',
          estimatedMarginPct: '54.35',
          actualMarginPct: '34.78',
          marginDriftPts: '-19.57',
        },
        {
          key: people.seller!.id,
          name: 'Sam Seller',
          jobs: 1,
          price: '5420.00',
          estimatedCost: '2644.00',
          actualCost: '1709.10',
          estimatedMarginPct: '51.22',
          actualMarginPct: '68.47',
          marginDriftPts: '17.25',
        },
      ]);

      // Per branch: price 5420 + 4600 = 10,020.00; estimated 2644 + 2100 = 4,744.00 →
      // (10020 − 4744) / 10020 = 5276 / 10020 = 0.52654… → 52.65 %; actual 1709.10 + 3000 = 4,709.10 →
      // 5310.90 / 10020 = 0.53002… → 53.00 %; drift +0.35 points.
      const byBranch = await as('manager').get(`/api/jobs/actuals/summary?by=branch&branchId=${gulf}`);
      expect(byBranch.body).toEqual([
        {
          key: gulf,
          name: 'North Gulf Foundations',
          jobs: 2,
          price: '10020.00',
          estimatedCost: '4744.00',
          actualCost: '4709.10',
          estimatedMarginPct: '52.65',
          actualMarginPct: '53.00',
          marginDriftPts: '0.35',
        },
      ]);

      // Dates are the branch's completion days.
      expect(
        (await as('manager').get(`/api/jobs/actuals/summary?from=${TODAY}&to=${TODAY}`)).body,
      ).toHaveLength(2);
      expect((await as('manager').get('/api/jobs/actuals/summary?from=2026-07-21')).body).toEqual([]);
      // A salesperson sees their own row only; the crew lead no money; another branch is not found.
      const own = await as('seller').get('/api/jobs/actuals/summary');
      expect(own.body.map((r: { key: string }) => r.key)).toEqual([people.seller!.id]);
      expect((await as('crewLead').get('/api/jobs/actuals/summary')).status).toBe(403);
      expect((await as('otherManager').get(`/api/jobs/actuals/summary?branchId=${gulf}`)).status).toBe(404);
      expect((await as('otherManager').get('/api/jobs/actuals/summary')).body).toEqual([]);
    });
  });

  describe('warranty', () => {
    const WARRANTY = {
      termYears: 10,
      covers: 'Settlement of the stabilised slab area along the east wall, and the injected material.',
      exclusions: 'Movement from plumbing leaks, tree roots or new loads added after the work.',
      transferable: true,
    };

    it('is issued by the office for a completed job only', async () => {
      const notDone = await as('manager').post(`/api/jobs/${jobS.jobId}/warranty`, WARRANTY);
      expect(notDone.status).toBe(409);
      expect(notDone.body.code).toBe('JOB.NOT_COMPLETED');
      expect((await as('crewLead').post(`/api/jobs/${jobA.jobId}/warranty`, WARRANTY)).status).toBe(403);
      expect((await as('seller').post(`/api/jobs/${jobA.jobId}/warranty`, WARRANTY)).status).toBe(403);
      const none = await as('manager').get(`/api/jobs/${jobA.jobId}/warranty`);
      expect(none.status).toBe(404);
      expect(none.body.code).toBe('WARRANTY.NOT_FOUND');
    });

    it('numbers warranties per branch, keeps one per job and makes the certificate', async () => {
      const res = await as('manager').post(`/api/jobs/${jobA.jobId}/warranty`, WARRANTY);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({
        jobId: jobA.jobId,
        number: `W-${gulfCode}-0001`,
        termYears: 10,
        transferable: true,
        issuedOn: TODAY,
        pdfUrl: `/api/jobs/${jobA.jobId}/warranty/certificate.pdf`,
      });
      const second = await as('owner').post(`/api/jobs/${jobH.jobId}/warranty`, {
        ...WARRANTY,
        transferable: false,
      });
      expect(second.body.number).toBe(`W-${gulfCode}-0002`);
      const twice = await as('manager').post(`/api/jobs/${jobA.jobId}/warranty`, WARRANTY);
      expect(twice.status).toBe(409);
      expect(twice.body.code).toBe('WARRANTY.ALREADY_ISSUED');
      expect((await as('seller').get(`/api/jobs/${jobA.jobId}/warranty`)).body).toEqual(res.body);

      const pdf = await as('seller').getBinary(res.body.pdfUrl);
      expect(pdf.status).toBe(200);
      expect(pdf.headers['content-type']).toBe('application/pdf');
      expect(pdf.body.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      expect(pdf.body.toString('latin1')).toContain(`Warranty certificate W-${gulfCode}-0001`);
      const row = await t.db('warranties').where({ job_id: jobA.jobId }).first();
      expect(row.pdf_key).toBe(`branches/${gulf}/warranties/${row.id}.pdf`);
      // The terms never change once issued.
      await expect(t.db('warranties').where({ id: row.id }).update({ term_years: 20 })).rejects.toThrow(
        /cannot change/,
      );
      expect((await as('crewLead2').getBinary(res.body.pdfUrl)).status).toBe(404);
      expect((await as('otherManager').get(`/api/jobs/${jobA.jobId}/warranty`)).status).toBe(404);
    });
  });
});
