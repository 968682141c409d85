import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import sharp from 'sharp';
import { fromBuffer } from 'file-type';
import type { Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FINDINGS_ITEM_KEYS, SETTLEMENT_CAUTION, settlement } from '@loambook/common';
import {
  makeBranch,
  makeUser,
  startTestApp,
  tokenFor,
  type TestApp,
  type TestUser,
} from './support/test-app';
import { makeLead } from './support/selling-fixtures';
import { StorageService, StoredObjectMissingError } from '../src/storage/storage.service';

const BUCKET = 'loambook-test';

/** Every checklist item answered: what completing an inspection needs. */
const FULL_FINDINGS = {
  interiorCracks: [{ location: 'Living room, NE corner', widthIn: '0.125', orientation: 'diagonal' }],
  exteriorCracks: [
    { location: 'East brick wall', widthIn: '0.25', orientation: 'stair_step', note: 'Widens upward' },
  ],
  doorsWindowsSticking: [{ location: 'Back bedroom door' }],
  floorSlope: { observed: true, note: 'Ball rolls toward the back bedroom' },
  erosion: { observed: false },
  drainage: { gutters: 'partial', downspoutsDischargeNearFoundation: true, grading: 'toward' },
  wallRotation: { observed: false },
  plumbingLeaks: { observed: false },
  soil: { type: 'clay', moisture: 'dry' },
};

/** Collects a binary response body as a Buffer, whatever its content type. */
function binary(res: Response, done: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

describe('inspections, survey and photos', () => {
  let t: TestApp;
  let s3: S3rver;
  let s3Dir: string;
  let chicago: string;
  let eastern: string;
  let south: string;
  let seller: TestUser;
  let manager: TestUser;
  const tokens = {} as Record<
    'seller' | 'otherSeller' | 'manager' | 'southManager' | 'owner' | 'bookkeeper' | 'crew',
    string
  >;
  type Who = keyof typeof tokens;

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
    t = await startTestApp({ S3_ENDPOINT: `http://127.0.0.1:${port}`, S3_BUCKET: BUCKET });
    chicago = await makeBranch(t.db, { name: 'Chicago', timezone: 'America/Chicago' });
    eastern = await makeBranch(t.db, { name: 'Eastern', timezone: 'America/New_York' });
    south = await makeBranch(t.db, { name: 'South', timezone: 'America/Chicago' });
    seller = await makeUser(t.db, 'salesperson', [chicago, eastern], { name: 'Sela Seller' });
    manager = await makeUser(t.db, 'branch_manager', [chicago], { name: 'Mona Manager' });
    tokens.seller = await tokenFor(t, seller);
    tokens.otherSeller = await tokenFor(t, await makeUser(t.db, 'salesperson', [chicago]));
    tokens.manager = await tokenFor(t, manager);
    tokens.southManager = await tokenFor(t, await makeUser(t.db, 'branch_manager', [south]));
    tokens.owner = await tokenFor(t, await makeUser(t.db, 'owner'));
    tokens.bookkeeper = await tokenFor(t, await makeUser(t.db, 'bookkeeper'));
    tokens.crew = await tokenFor(t, await makeUser(t.db, 'crew_lead', [chicago]));
  });
  afterAll(async () => {
    await t?.close();
    await s3?.close();
    if (s3Dir) await rm(s3Dir, { recursive: true, force: true });
  });

  const auth = (who: Who) => ({ Authorization: `Bearer ${tokens[who]}` });
  const as = (who: Who) => ({
    get: (url: string) => t.http.get(url).set(auth(who)),
    getBinary: (url: string) => t.http.get(url).set(auth(who)).buffer(true).parse(binary),
    post: (url: string, body: object = {}) => t.http.post(url).set(auth(who)).send(body),
    put: (url: string, body: object) => t.http.put(url).set(auth(who)).send(body),
    patch: (url: string, body: object) => t.http.patch(url).set(auth(who)).send(body),
    delete: (url: string) => t.http.delete(url).set(auth(who)),
    upload: (url: string, file: Buffer, filename: string, caption?: string) => {
      const req = t.http
        .post(url)
        .set(auth(who))
        .attach('file', file, { filename, contentType: 'image/jpeg' });
      return caption === undefined ? req : req.field('caption', caption);
    },
  });

  const newLead = (branchId = chicago, salespersonId: string | null = seller.id) =>
    makeLead(t.db, { branchId, salespersonId });

  async function bookFor(leadId: string, scheduledAt = '2026-12-03T09:00', who: Who = 'seller') {
    const res = await as(who).post(`/api/leads/${leadId}/inspections`, { scheduledAt });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as { id: string; [k: string]: unknown };
  }

  const activities = (leadId: string) =>
    t
      .db('lead_activities')
      .where({ lead_id: leadId })
      .orderBy('created_at')
      .select('kind', 'data', 'body', 'actor_id');

  describe('booking', () => {
    it("stores the branch's local time as UTC and moves the lead to inspection booked, with timeline rows", async () => {
      const leadId = await newLead();
      const before = await t.db('leads').where({ id: leadId }).first();
      const res = await as('seller').post(`/api/leads/${leadId}/inspections`, {
        scheduledAt: '2026-12-03T09:00',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      // America/Chicago is on CST (UTC−6) in December (15 U.S.C. 260a, memory).
      expect(res.body).toMatchObject({
        leadId,
        branchId: chicago,
        salespersonId: seller.id,
        status: 'booked',
        scheduledAt: '2026-12-03T15:00:00.000Z',
        scheduledLocal: '2026-12-03T09:00',
        scheduledUtcOffset: '-06:00',
        timezone: 'America/Chicago',
        durationMinutes: 90,
        inspector: { id: seller.id, name: 'Sela Seller' },
        findings: {},
        missingFindings: FINDINGS_ITEM_KEYS,
        photoCount: 0,
        surveyPointCounts: { inspection: 0, completion: 0 },
        lead: { id: leadId, stage: 'inspection_booked' },
      });
      const row = await t.db('inspections').where({ id: res.body.id }).first();
      expect(row.scheduled_at.toISOString()).toBe('2026-12-03T15:00:00.000Z');

      const lead = await t.db('leads').where({ id: leadId }).first();
      expect(lead.stage).toBe('inspection_booked');
      expect(lead.stage_changed_at.getTime()).toBeGreaterThanOrEqual(before.stage_changed_at.getTime());
      const rows = await activities(leadId);
      expect(rows.map((r) => r.kind).sort()).toEqual(['inspection', 'stage_change']);
      expect(rows.find((r) => r.kind === 'stage_change')).toMatchObject({
        data: { from: 'new', to: 'inspection_booked' },
        actor_id: seller.id,
      });
      expect(rows.find((r) => r.kind === 'inspection')?.data).toMatchObject({
        action: 'booked',
        inspectionId: res.body.id,
        scheduledAt: '2026-12-03T15:00:00.000Z',
      });

      const again = await as('seller').post(`/api/leads/${leadId}/inspections`, {
        scheduledAt: '2026-12-05T09:00',
      });
      expect(again.status).toBe(409);
      expect(again.body).toMatchObject({
        code: 'INSPECTION.ALREADY_BOOKED',
        details: { inspectionId: res.body.id },
      });
    });

    it('refuses a time the clocks skip, and takes the earlier of a repeated time', async () => {
      const gap = await as('seller').post(`/api/leads/${await newLead(eastern)}/inspections`, {
        scheduledAt: '2026-03-08T02:30',
      });
      expect(gap.status).toBe(400);
      expect(gap.body.code).toBe('INSPECTION.TIME_DOES_NOT_EXIST');
      expect(gap.body.details[0]).toMatchObject({ field: 'scheduledAt' });
      expect(gap.body.message).toContain('does not exist in America/New_York');

      const twice = await bookFor(await newLead(eastern), '2026-11-01T01:30');
      expect(twice).toMatchObject({
        scheduledAt: '2026-11-01T05:30:00.000Z',
        scheduledLocal: '2026-11-01T01:30',
        scheduledUtcOffset: '-04:00',
      });
    });

    it('validates the request', async () => {
      const leadId = await newLead();
      for (const body of [
        { scheduledAt: '2026-12-03 09:00' },
        { scheduledAt: '2026-02-30T09:00' },
        { scheduledAt: '2026-12-03T09:00', durationMinutes: 5 },
        { scheduledAt: '2026-12-03T09:00', colour: 'red' },
      ]) {
        const res = await as('seller').post(`/api/leads/${leadId}/inspections`, body);
        expect(res.status, JSON.stringify(body)).toBe(400);
        expect(res.body.code).toBe('VALIDATION.FAILED');
      }
      const foreign = await makeUser(t.db, 'salesperson', [south]);
      const res = await as('seller').post(`/api/leads/${leadId}/inspections`, {
        scheduledAt: '2026-12-03T09:00',
        inspectorId: foreign.id,
      });
      expect(res.status).toBe(400);
      expect(res.body.details).toEqual([{ field: 'inspectorId', message: expect.any(String) }]);
      expect((await t.db('leads').where({ id: leadId }).first()).stage).toBe('new');
    });

    it('leaves a lead past "new" where it is', async () => {
      const leadId = await makeLead(t.db, {
        branchId: chicago,
        salespersonId: seller.id,
        stage: 'inspected',
      });
      await bookFor(leadId);
      expect((await t.db('leads').where({ id: leadId }).first()).stage).toBe('inspected');
      expect((await activities(leadId)).map((r) => r.kind)).toEqual(['inspection']);
    });

    it('lets a manager book with another inspector, and refuses the bookkeeper and crew lead', async () => {
      const leadId = await newLead();
      const res = await as('manager').post(`/api/leads/${leadId}/inspections`, {
        scheduledAt: '2026-12-07T14:15',
        durationMinutes: 120,
        inspectorId: manager.id,
      });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ inspector: { id: manager.id }, durationMinutes: 120 });
      for (const who of ['bookkeeper', 'crew'] as const) {
        expect(
          (
            await as(who).post(`/api/leads/${await newLead()}/inspections`, {
              scheduledAt: '2026-12-03T09:00',
            })
          ).status,
        ).toBe(403);
      }
    });
  });

  describe('findings, rescheduling, completing and cancelling', () => {
    it('saves findings item by item and completes only when every item is answered', async () => {
      const leadId = await newLead();
      const { id } = await bookFor(leadId);

      const partial = await as('seller').patch(`/api/inspections/${id}`, {
        findings: { interiorCracks: FULL_FINDINGS.interiorCracks, soil: FULL_FINDINGS.soil },
        summary: 'Diagonal cracking at the NE corner.',
      });
      expect(partial.status, JSON.stringify(partial.body)).toBe(200);
      expect(partial.body.findings).toEqual({
        interiorCracks: FULL_FINDINGS.interiorCracks,
        soil: FULL_FINDINGS.soil,
      });
      expect(partial.body.missingFindings).toEqual([
        'exteriorCracks',
        'doorsWindowsSticking',
        'floorSlope',
        'erosion',
        'drainage',
        'wallRotation',
        'plumbingLeaks',
      ]);

      const early = await as('seller').post(`/api/inspections/${id}/complete`);
      expect(early.status).toBe(422);
      expect(early.body.code).toBe('INSPECTION.FINDINGS_INCOMPLETE');
      expect(early.body.details.map((d: { field: string }) => d.field)).toContain('findings.drainage');

      const bad = await as('seller').patch(`/api/inspections/${id}`, {
        findings: {
          exteriorCracks: [{ location: 'East wall', widthIn: '0', orientation: 'sideways' }],
          drainage: { gutters: 'partial', grading: 'toward' },
          erosion: { observed: 'no' },
        },
      });
      expect(bad.status).toBe(400);
      const fields = bad.body.details.map((d: { field: string }) => d.field);
      expect(fields).toEqual(
        expect.arrayContaining([
          'findings.exteriorCracks.0.widthIn',
          'findings.exteriorCracks.0.orientation',
          'findings.drainage.downspoutsDischargeNearFoundation',
          'findings.erosion.observed',
        ]),
      );

      // An item given replaces the stored one; null clears one.
      const cleared = await as('seller').patch(`/api/inspections/${id}`, { findings: { soil: null } });
      expect(cleared.body.findings).toEqual({ interiorCracks: FULL_FINDINGS.interiorCracks });

      const full = await as('seller').patch(`/api/inspections/${id}`, { findings: FULL_FINDINGS });
      expect(full.body.missingFindings).toEqual([]);
      expect(full.body.summary).toBe('Diagonal cracking at the NE corner.'); // left out: kept

      const done = await as('seller').post(`/api/inspections/${id}/complete`, {
        summary: 'Settlement at the NE corner.',
      });
      expect(done.status, JSON.stringify(done.body)).toBe(200);
      expect(done.body).toMatchObject({ status: 'completed', summary: 'Settlement at the NE corner.' });
      expect(Date.parse(done.body.completedAt)).toBeGreaterThan(Date.now() - 60_000);
      expect((await t.db('leads').where({ id: leadId }).first()).stage).toBe('inspected');
      const rows = await activities(leadId);
      expect(rows.filter((r) => r.kind === 'stage_change').map((r) => r.data)).toEqual([
        { from: 'new', to: 'inspection_booked' },
        { from: 'inspection_booked', to: 'inspected' },
      ]);
      expect(rows.filter((r) => r.kind === 'inspection').map((r) => r.data.action)).toEqual([
        'booked',
        'completed',
      ]);

      const late = await as('seller').patch(`/api/inspections/${id}`, { summary: 'changed' });
      expect(late.status).toBe(409);
      expect(late.body.code).toBe('INSPECTION.COMPLETED');
      expect((await as('seller').post(`/api/inspections/${id}/complete`)).body.code).toBe(
        'INSPECTION.COMPLETED',
      );
    });

    it('reschedules in the branch zone and records it', async () => {
      const leadId = await newLead();
      const { id } = await bookFor(leadId);
      // 2026-03-09 is after the spring change: Chicago on CDT (UTC−5).
      const res = await as('seller').patch(`/api/inspections/${id}`, { scheduledAt: '2026-03-09T13:30' });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        scheduledAt: '2026-03-09T18:30:00.000Z',
        scheduledUtcOffset: '-05:00',
      });
      const moved = (await activities(leadId)).find((r) => r.data.action === 'rescheduled');
      expect(moved?.data).toMatchObject({ from: '2026-12-03T15:00:00.000Z', to: '2026-03-09T18:30:00.000Z' });
    });

    it('cancels, and a lead with nothing else booked goes back to new', async () => {
      const leadId = await newLead();
      const { id } = await bookFor(leadId);
      const res = await as('seller').post(`/api/inspections/${id}/cancel`, { reason: 'Homeowner away' });
      expect(res.status).toBe(200);
      expect(res.body.status).toBe('cancelled');
      expect((await t.db('leads').where({ id: leadId }).first()).stage).toBe('new');
      const rows = await activities(leadId);
      expect(rows.at(-1)).toMatchObject({
        kind: 'stage_change',
        data: { from: 'inspection_booked', to: 'new' },
      });
      expect((await as('seller').post(`/api/inspections/${id}/cancel`)).body.code).toBe(
        'INSPECTION.CANCELLED',
      );
      // A new booking can be made after the cancellation.
      await bookFor(leadId);
      expect((await t.db('leads').where({ id: leadId }).first()).stage).toBe('inspection_booked');
    });

    it('lists a lead’s inspections', async () => {
      const leadId = await newLead();
      const { id } = await bookFor(leadId);
      for (const who of ['seller', 'manager', 'owner', 'bookkeeper'] as const) {
        const res = await as(who).get(`/api/leads/${leadId}/inspections`);
        expect(res.status, who).toBe(200);
        expect(res.body.map((i: { id: string }) => i.id)).toEqual([id]);
      }
    });
  });

  describe('floor-elevation survey', () => {
    const HAND_EXAMPLE = [
      { label: 'A', xFt: '0', yFt: '0', elevationIn: '0' },
      { label: 'B', xFt: '25', yFt: '0', elevationIn: '-1.0' },
    ];

    it('stores the points and returns the settlement screening of them', async () => {
      const { id } = await bookFor(await newLead());
      const res = await as('seller').put(`/api/inspections/${id}/survey`, {
        points: HAND_EXAMPLE,
        referenceLabel: 'A',
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({
        inspectionId: id,
        kind: 'inspection',
        referenceLabel: 'A',
        caution: SETTLEMENT_CAUTION,
      });
      expect(res.body.points.map((p: { label: string }) => p.label)).toEqual(['A', 'B']);
      // 1.0 in over 25 ft (300 in) → β = 1/300 (REFERENCE-VALUES.md example; Skempton & MacDonald 1956, secondary).
      expect(res.body.result.worstRatio).toBe('1/300');
      expect(res.body.result.band.code).toBe('beyond-1/300');
      expect(res.body.result.maxDifferentialIn).toBe('1');
      expect(res.body.result.caution).toBe(SETTLEMENT_CAUTION);
      expect(res.body.result).toEqual(settlement({ points: HAND_EXAMPLE }));

      const got = await as('manager').get(`/api/inspections/${id}/survey`);
      expect(got.status).toBe(200);
      expect(got.body.result).toEqual(res.body.result);
      expect((await as('seller').get(`/api/inspections/${id}`)).body.surveyPointCounts).toEqual({
        inspection: 2,
        completion: 0,
      });

      // A PUT replaces the set.
      const grid = [
        { label: 'R', xFt: '0', yFt: '0', elevationIn: '0.00' },
        { label: 'S', xFt: '20', yFt: '0', elevationIn: '-0.5' },
        { label: 'T', xFt: '20', yFt: '20', elevationIn: '-0.25' },
      ];
      const replaced = await as('seller').put(`/api/inspections/${id}/survey`, {
        points: grid,
        referenceLabel: 'R',
      });
      expect(replaced.body.points.map((p: { label: string }) => p.label)).toEqual(['R', 'S', 'T']);
      expect(replaced.body.result.pointCount).toBe(3);
    });

    it('refuses a reference point whose elevation is not zero, or that is not a point', async () => {
      const { id } = await bookFor(await newLead());
      const res = await as('seller').put(`/api/inspections/${id}/survey`, {
        points: HAND_EXAMPLE,
        referenceLabel: 'B',
      });
      expect(res.status).toBe(422);
      expect(res.body.code).toBe('SURVEY.REFERENCE_NOT_ZERO');
      expect(res.body.message).toContain('must be 0');
      expect(res.body.details).toEqual([
        { field: 'points[1].elevationIn', message: expect.stringContaining('"B"') },
      ]);
      const unknown = await as('seller').put(`/api/inspections/${id}/survey`, {
        points: HAND_EXAMPLE,
        referenceLabel: 'Z',
      });
      expect(unknown.status).toBe(422);
      expect(unknown.body.code).toBe('SURVEY.REFERENCE_UNKNOWN');
      expect((await as('seller').get(`/api/inspections/${id}/survey`)).body).toMatchObject({
        points: [],
        result: null,
      });
    });

    it('validates the points', async () => {
      const { id } = await bookFor(await newLead());
      for (const points of [
        [HAND_EXAMPLE[0]], // one point
        [HAND_EXAMPLE[0], { ...HAND_EXAMPLE[1], elevationIn: -1 }], // a number, not a string
        [HAND_EXAMPLE[0], { ...HAND_EXAMPLE[1], xFt: '1e3' }],
        [HAND_EXAMPLE[0], { ...HAND_EXAMPLE[1], label: 'A' }], // duplicate label
        [HAND_EXAMPLE[0], { ...HAND_EXAMPLE[1], xFt: '0' }], // same spot
      ]) {
        const res = await as('seller').put(`/api/inspections/${id}/survey`, { points, referenceLabel: 'A' });
        expect(res.status, JSON.stringify(points)).toBe(400);
        expect(res.body.code).toBe('VALIDATION.FAILED');
      }
      expect((await as('seller').get(`/api/inspections/${id}/survey?kind=later`)).status).toBe(400);
    });

    it('takes the completion re-survey only once the inspection is completed, separately from the first', async () => {
      const { id } = await bookFor(await newLead());
      await as('seller').put(`/api/inspections/${id}/survey`, { points: HAND_EXAMPLE, referenceLabel: 'A' });
      const after = [
        { label: 'A', xFt: '0', yFt: '0', elevationIn: '0' },
        { label: 'B', xFt: '25', yFt: '0', elevationIn: '-0.25' },
      ];
      const early = await as('seller').put(`/api/inspections/${id}/survey?kind=completion`, {
        points: after,
        referenceLabel: 'A',
      });
      expect(early.status).toBe(409);
      expect(early.body.code).toBe('SURVEY.INSPECTION_NOT_COMPLETED');

      await as('seller').patch(`/api/inspections/${id}`, { findings: FULL_FINDINGS });
      expect((await as('seller').post(`/api/inspections/${id}/complete`)).status).toBe(200);
      const closed = await as('seller').put(`/api/inspections/${id}/survey`, {
        points: after,
        referenceLabel: 'A',
      });
      expect(closed.body.code).toBe('INSPECTION.COMPLETED');

      const res = await as('seller').put(`/api/inspections/${id}/survey?kind=completion`, {
        points: after,
        referenceLabel: 'A',
      });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        kind: 'completion',
        result: { worstRatio: '1/1200', band: { code: 'within-1/500' } },
      });
      expect(
        (await as('seller').get(`/api/inspections/${id}/survey?kind=completion`)).body.result.worstRatio,
      ).toBe('1/1200');
      expect((await as('seller').get(`/api/inspections/${id}/survey`)).body.result.worstRatio).toBe('1/300');
    });
  });

  describe('photos', () => {
    let inspectionId: string;
    let jpeg: Buffer;
    let jpegPhotoId: string;

    beforeAll(async () => {
      ({ id: inspectionId } = await bookFor(await newLead()));
      jpeg = await sharp({
        create: { width: 800, height: 600, channels: 3, background: { r: 140, g: 110, b: 80 } },
      })
        .jpeg()
        .toBuffer();
    });

    it('stores a JPEG under the branch and inspection, with a JPEG thumbnail of at most 320 px', async () => {
      const res = await as('seller').upload(
        `/api/inspections/${inspectionId}/photos`,
        jpeg,
        'crack.jpg',
        'NE corner crack',
      );
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const prefix = `branches/${chicago}/inspections/${inspectionId}/${res.body.id}`;
      expect(res.body).toMatchObject({
        inspectionId,
        contentType: 'image/jpeg',
        sizeBytes: jpeg.length,
        caption: 'NE corner crack',
        storageKey: `${prefix}.jpg`,
        thumbnailKey: `${prefix}.thumb.jpg`,
        thumbnailNote: null,
        contentUrl: `/api/photos/${res.body.id}/content`,
        thumbnailUrl: `/api/photos/${res.body.id}/thumbnail`,
        uploadedBy: { id: seller.id, name: 'Sela Seller' },
      });
      jpegPhotoId = res.body.id;

      const content = await as('seller').getBinary(`/api/photos/${jpegPhotoId}/content`);
      expect(content.status).toBe(200);
      expect(content.headers['content-type']).toBe('image/jpeg');
      expect(Buffer.compare(content.body, jpeg)).toBe(0);

      const thumb = await as('seller').getBinary(`/api/photos/${jpegPhotoId}/thumbnail`);
      expect(thumb.status).toBe(200);
      expect(thumb.headers['content-type']).toBe('image/jpeg');
      expect((await fromBuffer(thumb.body))?.mime).toBe('image/jpeg');
      expect(await sharp(thumb.body).metadata()).toMatchObject({ format: 'jpeg', width: 320, height: 240 });
    });

    it('stores a PNG with a JPEG thumbnail, never enlarged', async () => {
      const png = await sharp({
        create: { width: 50, height: 40, channels: 4, background: { r: 0, g: 90, b: 200, alpha: 0.5 } },
      })
        .png()
        .toBuffer();
      const res = await as('seller').upload(`/api/inspections/${inspectionId}/photos`, png, 'drain.png');
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ contentType: 'image/png', caption: null });
      expect(res.body.storageKey).toMatch(/\.png$/);
      const content = await as('seller').getBinary(res.body.contentUrl);
      expect(content.headers['content-type']).toBe('image/png');
      const thumb = await as('seller').getBinary(res.body.thumbnailUrl);
      expect(await sharp(thumb.body).metadata()).toMatchObject({ format: 'jpeg', width: 50, height: 40 });
    });

    it('keeps a HEIC photo without a thumbnail, and says so', async () => {
      // The start of an ISO-BMFF file with the 'heic' brand: what a phone's HEIC begins with.
      const heic = Buffer.concat([
        Buffer.from([0x00, 0x00, 0x00, 0x18]),
        Buffer.from('ftypheic', 'latin1'),
        Buffer.from([0x00, 0x00, 0x00, 0x00]),
        Buffer.from('mif1heic', 'latin1'),
        Buffer.alloc(64, 0),
      ]);
      const res = await as('seller').upload(`/api/inspections/${inspectionId}/photos`, heic, 'IMG_0001.HEIC');
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ contentType: 'image/heic', thumbnailKey: null, thumbnailUrl: null });
      expect(res.body.thumbnailNote).toMatch(/HEIC/);
      expect(res.body.storageKey).toMatch(/\.heic$/);
      const thumb = await as('seller').get(`/api/photos/${res.body.id}/thumbnail`);
      expect(thumb.status).toBe(404);
      expect(thumb.body.code).toBe('PHOTO.NO_THUMBNAIL');
      expect((await as('seller').getBinary(res.body.contentUrl)).headers['content-type']).toBe('image/heic');
    });

    it('answers 413 over 15 MB, in the common error shape', async () => {
      const big = Buffer.alloc(16 * 1024 * 1024, 0x41);
      jpeg.copy(big, 0, 0, 64); // looks like a JPEG: the size alone is at fault
      const res = await as('seller').upload(`/api/inspections/${inspectionId}/photos`, big, 'huge.jpg');
      expect(res.status).toBe(413);
      expect(res.body).toEqual({
        code: 'UPLOAD.TOO_LARGE',
        message: expect.stringContaining('15 MB'),
        details: null,
        requestId: expect.any(String),
      });
    });

    it.each([
      ['a text file named photo.jpg', Buffer.from('Just some notes about the crack.\n'), 'photo.jpg'],
      [
        'an ELF executable renamed .png',
        Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(120, 0)]),
        'photo.png',
      ],
      [
        'a Windows PE executable renamed .png',
        Buffer.concat([Buffer.from('MZ', 'latin1'), Buffer.alloc(126, 0x90)]),
        'photo.png',
      ],
      ['a PDF named .jpg', Buffer.from('%PDF-1.4\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n', 'latin1'), 'scan.jpg'],
      [
        'a broken JPEG',
        Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(200, 0x11)]),
        'broken.jpg',
      ],
    ])('answers 415 to %s', async (_name, file, filename) => {
      const res = await as('seller').upload(`/api/inspections/${inspectionId}/photos`, file, filename);
      expect(res.status).toBe(415);
      expect(res.body).toMatchObject({
        code: 'UPLOAD.UNSUPPORTED_TYPE',
        details: null,
        requestId: expect.any(String),
      });
    });

    it('refuses an upload without a file, and unknown form fields', async () => {
      const none = await t.http
        .post(`/api/inspections/${inspectionId}/photos`)
        .set(auth('seller'))
        .field('caption', 'x');
      expect(none.status).toBe(400);
      expect(none.body.details).toEqual([{ field: 'file', message: expect.any(String) }]);
      const extra = await as('seller')
        .upload(`/api/inspections/${inspectionId}/photos`, jpeg, 'a.jpg')
        .field('colour', 'red');
      expect(extra.status).toBe(400);
    });

    it('lists photos with captions, edits a caption, and deletes a photo while the inspection is open', async () => {
      const list = await as('manager').get(`/api/inspections/${inspectionId}/photos`);
      expect(list.status).toBe(200);
      expect(list.body.map((p: { contentType: string }) => p.contentType)).toEqual([
        'image/jpeg',
        'image/png',
        'image/heic',
      ]);
      expect(list.body[0].caption).toBe('NE corner crack');
      expect((await as('seller').get(`/api/inspections/${inspectionId}`)).body.photoCount).toBe(3);

      const edited = await as('seller').patch(`/api/photos/${jpegPhotoId}`, {
        caption: 'Diagonal crack, NE corner',
      });
      expect(edited.status).toBe(200);
      expect(edited.body.caption).toBe('Diagonal crack, NE corner');
      expect(
        (await as('seller').patch(`/api/photos/${jpegPhotoId}`, { caption: null })).body.caption,
      ).toBeNull();
      expect((await as('seller').patch(`/api/photos/${jpegPhotoId}`, {})).status).toBe(400);

      const storageKey = list.body[1].storageKey;
      expect(await t.db('inspection_photos').where({ storage_key: storageKey }).first()).toBeDefined();
      expect((await as('seller').delete(`/api/photos/${list.body[1].id}`)).status).toBe(204);
      expect((await as('seller').get(`/api/photos/${list.body[1].id}/content`)).status).toBe(404);
      // The files went from the bucket too.
      const storage = t.app.get(StorageService);
      await expect(storage.get(storageKey)).rejects.toBeInstanceOf(StoredObjectMissingError);
      await expect(storage.get(list.body[1].thumbnailKey)).rejects.toBeInstanceOf(StoredObjectMissingError);
      expect((await storage.getBuffer(list.body[0].storageKey)).length).toBe(jpeg.length);
      expect((await as('seller').get(`/api/inspections/${inspectionId}/photos`)).body).toHaveLength(2);
    });

    it('keeps the photos of a completed inspection', async () => {
      const { id } = await bookFor(await newLead());
      const photo = (await as('seller').upload(`/api/inspections/${id}/photos`, jpeg, 'a.jpg')).body;
      await as('seller').patch(`/api/inspections/${id}`, { findings: FULL_FINDINGS });
      await as('seller').post(`/api/inspections/${id}/complete`);
      const res = await as('seller').delete(`/api/photos/${photo.id}`);
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('PHOTO.INSPECTION_COMPLETED');
      expect((await as('seller').getBinary(photo.contentUrl)).status).toBe(200);
    });

    it('lets the bookkeeper look but not upload', async () => {
      expect((await as('bookkeeper').getBinary(`/api/photos/${jpegPhotoId}/content`)).status).toBe(200);
      expect(
        (await as('bookkeeper').upload(`/api/inspections/${inspectionId}/photos`, jpeg, 'a.jpg')).status,
      ).toBe(403);
      expect((await as('bookkeeper').delete(`/api/photos/${jpegPhotoId}`)).status).toBe(403);
    });
  });

  describe('who sees what', () => {
    let inspectionId: string;
    let leadId: string;
    let photoId: string;

    beforeAll(async () => {
      leadId = await newLead();
      ({ id: inspectionId } = await bookFor(leadId));
      await as('seller').put(`/api/inspections/${inspectionId}/survey`, {
        points: [
          { label: 'A', xFt: '0', yFt: '0', elevationIn: '0' },
          { label: 'B', xFt: '10', yFt: '0', elevationIn: '-0.5' },
        ],
        referenceLabel: 'A',
      });
      const png = await sharp({ create: { width: 10, height: 10, channels: 3, background: '#777' } })
        .png()
        .toBuffer();
      photoId = (await as('seller').upload(`/api/inspections/${inspectionId}/photos`, png, 'a.png')).body.id;
    });

    it('answers 404 to a manager of another branch: inspection, survey, photos and their content', async () => {
      for (const url of [
        `/api/inspections/${inspectionId}`,
        `/api/inspections/${inspectionId}/survey`,
        `/api/inspections/${inspectionId}/photos`,
        `/api/photos/${photoId}/content`,
        `/api/photos/${photoId}/thumbnail`,
        `/api/leads/${leadId}/inspections`,
      ]) {
        const res = await as('southManager').get(url);
        expect(res.status, url).toBe(404);
        expect(res.body.code, url).toMatch(/NOT_FOUND$/);
      }
      expect(
        (await as('southManager').patch(`/api/inspections/${inspectionId}`, { summary: 'x' })).status,
      ).toBe(404);
      expect((await as('southManager').patch(`/api/photos/${photoId}`, { caption: 'x' })).status).toBe(404);
      expect((await as('southManager').delete(`/api/photos/${photoId}`)).status).toBe(404);
      expect((await as('southManager').post(`/api/inspections/${inspectionId}/cancel`)).status).toBe(404);
      expect(
        (
          await as('southManager').post(`/api/leads/${leadId}/inspections`, {
            scheduledAt: '2026-12-03T09:00',
          })
        ).status,
      ).toBe(404);
    });

    it("answers 404 to a salesperson on another salesperson's lead", async () => {
      for (const url of [
        `/api/inspections/${inspectionId}`,
        `/api/inspections/${inspectionId}/survey`,
        `/api/photos/${photoId}/content`,
        `/api/leads/${leadId}/inspections`,
      ]) {
        expect((await as('otherSeller').get(url)).status, url).toBe(404);
      }
      expect(
        (await as('otherSeller').patch(`/api/inspections/${inspectionId}`, { summary: 'x' })).status,
      ).toBe(404);
      expect(
        (await as('otherSeller').upload(`/api/inspections/${inspectionId}/photos`, Buffer.from('x'), 'a.jpg'))
          .status,
      ).toBe(404);
    });

    it('lets the branch manager and the owner in, and keeps the crew lead out', async () => {
      for (const who of ['manager', 'owner', 'seller'] as const) {
        expect((await as(who).get(`/api/inspections/${inspectionId}`)).status, who).toBe(200);
        expect((await as(who).getBinary(`/api/photos/${photoId}/thumbnail`)).status, who).toBe(200);
      }
      expect((await as('crew').get(`/api/inspections/${inspectionId}`)).status).toBe(403);
    });

    it('answers 404 for an unknown inspection and lead', async () => {
      const missing = '00000000-0000-4000-8000-000000000000';
      expect((await as('owner').get(`/api/inspections/${missing}`)).body.code).toBe('INSPECTION.NOT_FOUND');
      expect((await as('owner').get(`/api/leads/${missing}/inspections`)).body.code).toBe('LEAD.NOT_FOUND');
      expect((await as('owner').get(`/api/photos/${missing}/content`)).body.code).toBe('PHOTO.NOT_FOUND');
    });
  });
});
