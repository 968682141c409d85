import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeBranch, makeUser, startTestApp, tokenFor, type TestApp } from './support/test-app';

describe('calculators over HTTP', () => {
  let t: TestApp;
  let token: string;

  beforeAll(async () => {
    t = await startTestApp();
    token = await tokenFor(t, await makeUser(t.db, 'crew_lead', [await makeBranch(t.db)]));
  });
  afterAll(() => t.close());

  const calc = (name: string, body: object) =>
    t.http.post(`/api/calculators/${name}`).set('Authorization', `Bearer ${token}`).send(body);

  it('helical capacity: 1.5 in square shaft at 6,500 ft·lb', async () => {
    // Qu = Kt·T (Hoyt & Clemence 1989, secondary); Kt 10 ft⁻¹ (ICC-ES AC358 default, secondary);
    // allowable = Qu/2 (IBC 1810.3.3.1.9, memory). REFERENCE-VALUES.md example.
    const res = await calc('helical-capacity', { shaft: '1.5in-square', torqueFtLb: '6500' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ kt: '10', ultimateLb: '65000', allowableLb: '32500' });
  });

  it('cancellation deadline: signed Thu 2026-07-02 → Wed 2026-07-08', async () => {
    // 16 CFR 429.1(a); 5 U.S.C. 6103(a) (Independence Day observed Fri 07-03); REFERENCE-VALUES.md example.
    const res = await calc('cancellation-deadline', { signedOn: '2026-07-02' });
    expect(res.status).toBe(200);
    expect(res.body.lastDayToCancel).toBe('2026-07-08');
  });

  it('dig date: Florida ticket filed Wed 2026-11-25 → Wed 2026-12-02', async () => {
    // F.S. 556.105(1)(a) and 556.102 (Thanksgiving and the Friday after); REFERENCE-VALUES.md example.
    const res = await calc('dig-date', { state: 'FL', filedOn: '2026-11-25' });
    expect(res.status).toBe(200);
    expect(res.body.earliestDigDate).toBe('2026-12-02');
  });

  it('dig date for a state without a rule pack: a clear 422', async () => {
    const res = await calc('dig-date', { state: 'OH', filedOn: '2026-11-25' });
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('CALC.NO_STATE_PACK');
    expect(res.body.message).toMatch(/OH/);
  });

  it('injection plan: open 40 ft run at 5 ft → 9 points (floor(L/s)+1), 180 lb at 20 lb a point', async () => {
    // Counting rule from issue #3; 5 ft spacing and 20 lb a point are common practice.
    const res = await calc('injection-plan', { runLengthFt: '40' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ points: 9, totalLb: '180' });
  });

  it('settlement: 1.0 in over 25 ft is 1/300 (Skempton & MacDonald 1956 first cracking, secondary)', async () => {
    const res = await calc('settlement', {
      points: [
        { label: 'A', xFt: '0', yFt: '0', elevationIn: '0' },
        { label: 'B', xFt: '25', yFt: '0', elevationIn: '-1.0' },
      ],
    });
    expect(res.status).toBe(200);
    expect(res.body.worstRatio).toBe('1/300');
    expect(res.body.band.code).toBe('beyond-1/300');
    expect(res.body.caution).toMatch(/not an engineering determination/i);
  });

  it('refuses numbers, unknown fields and bad input with field errors', async () => {
    const num = await calc('injection-plan', { runLengthFt: 40 });
    expect(num.status).toBe(400);
    expect(num.body.details[0].field).toBe('runLengthFt');
    const extra = await calc('pier-plan', { runLengthFt: '30', spacingFt: '6', colour: 'red' });
    expect(extra.status).toBe(400);
    expect(extra.body.details).toEqual([
      { field: 'colour', message: 'colour is not a field this calculator takes.' },
    ]);
    const nested = await calc('settlement', {
      points: [{ label: 'A', xFt: '0', yFt: '0', elevationIn: '0', z: '1' }],
    });
    expect(nested.body.details).toContainEqual({
      field: 'points[0].z',
      message: 'points[0].z is not a field this calculator takes.',
    });
  });
});
