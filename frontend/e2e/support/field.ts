import knexLib from 'knex';
import sharp from 'sharp';
import { contractRules } from '@loambook/common';
import { connection } from '../../../backend/scripts/lib/postgres.mjs';
import type { Stack } from './stack';

/*
 * Set-up for the field journey done through the API (and SQL for the two facts no screen sets yet): a
 * signed job in the Marrowfield branch, its window closed, its deposit in, its 811 ticket filed and the
 * job on the crew for today. Invented data only.
 */

export interface Api {
  token: string;
  get<T>(path: string): Promise<T>;
  send<T>(method: 'POST' | 'PUT' | 'PATCH', path: string, body: unknown, expect?: number[]): Promise<T>;
}

export async function apiAs(stack: Stack, email: string, password: string): Promise<Api> {
  const res = await fetch(`${stack.baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email}: ${res.status} ${await res.text()}`);
  const { accessToken } = (await res.json()) as { accessToken: string };
  const headers = { Authorization: `Bearer ${accessToken}`, 'Content-Type': 'application/json' };
  return {
    token: accessToken,
    async get<T>(path: string) {
      const r = await fetch(`${stack.baseUrl}/api${path}`, { headers });
      if (!r.ok) throw new Error(`GET ${path}: ${r.status} ${await r.text()}`);
      return (await r.json()) as T;
    },
    async send<T>(method: 'POST' | 'PUT' | 'PATCH', path: string, body: unknown, expect = [200, 201]) {
      const r = await fetch(`${stack.baseUrl}/api${path}`, { method, headers, body: JSON.stringify(body) });
      const text = await r.text();
      if (!expect.includes(r.status)) throw new Error(`${method} ${path}: ${r.status} ${text}`);
      return (text ? JSON.parse(text) : undefined) as T;
    },
  };
}

/** A few statements against the journey's own database (`?` placeholders, as knex.raw takes them). */
export async function sql(
  stack: Stack,
  text: string,
  values: knexLib.Knex.RawBinding[] = [],
): Promise<{ rows: Record<string, unknown>[] }> {
  const db = knexLib({ client: 'pg', connection: connection(stack.database) });
  try {
    return (await db.raw(text, values)) as { rows: Record<string, unknown>[] };
  } finally {
    await db.destroy();
  }
}

/** A drawn signature, as the signature pad exports it. */
export async function inkSignature(): Promise<string> {
  const svg = Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="400" height="120">
       <path d="M20 90 C 60 10, 90 10, 120 80 S 180 100, 220 40 S 300 20, 380 90" stroke="#1d2340" stroke-width="4" fill="none"/>
     </svg>`,
  );
  return `data:image/png;base64,${(await sharp(svg).png().toBuffer()).toString('base64')}`;
}

export interface FieldJob {
  jobId: string;
  number: string;
  leadId: string;
  contractId: string;
  price: string;
}

interface PriceBookItem {
  id: string;
  code: string;
}

/** The inspection's floor survey (inches, A the reference): C is 1.5 in low. */
export const BEFORE_SURVEY = [
  { label: 'A', x: '0', y: '0', z: '0' },
  { label: 'B', x: '32', y: '0', z: '-0.75' },
  { label: 'C', x: '32', y: '24', z: '-1.5' },
  { label: 'D', x: '0', y: '24', z: '-0.5' },
];

/**
 * The plan, by hand (MRW's demo price book; no tax on the invoice under its materials_cost treatment):
 *   8 points × 45 = 360 (cost 8 × 18 = 144); 120 lb × 11.50 = 1380 (cost 624); 16 h × 125 = 2000 (cost
 *   1040); mobilisation 600 (cost 300). Price 4340.00, cost 2108.00, margin 2232 / 4340 = 51.43 %.
 */
export const PLAN = [
  { code: 'PU-POINT', quantity: '8' },
  { code: 'PU-LB', quantity: '120' },
  { code: 'CREW-HOUR', quantity: '16' },
  { code: 'MOBILISE', quantity: '1' },
];

/** A signed job: lead and proposal through the API, the inspection by SQL, signed in person. */
export async function makeSignedJob(
  stack: Stack,
  seller: Api,
  branchId: string,
  homeowner: { name: string; email: string; street?: string },
): Promise<FieldJob> {
  const { lead } = await seller.send<{ lead: { id: string } }>('POST', '/leads', {
    branchId,
    homeownerName: homeowner.name,
    phonePrimary: '555-0171',
    email: homeowner.email,
    preferredContact: 'phone',
    addressLine1: homeowner.street ?? '27 Bramblewick Court',
    city: 'Marrowfield',
    state: 'FL',
    postalCode: '32901',
  });
  // The inspection and its survey, as the selling journey makes them on screen.
  const inspection = await sql(
    stack,
    `insert into inspections (lead_id, branch_id, scheduled_at, status, completed_at, findings, summary)
     values (?, ?, now() - interval '20 days', 'completed', now() - interval '20 days', ?, ?) returning id`,
    [
      lead.id,
      branchId,
      JSON.stringify({
        interiorCracks: [],
        exteriorCracks: [{ location: 'South-east corner', widthIn: '0.25', orientation: 'stair_step' }],
        doorsWindowsSticking: [{ location: 'Back door' }],
        floorSlope: { observed: true, note: 'Dining room slopes to the south-east' },
        erosion: { observed: false },
        drainage: { gutters: 'partial', downspoutsDischargeNearFoundation: true, grading: 'toward' },
        wallRotation: { observed: false },
        plumbingLeaks: { observed: false },
        soil: { type: 'clay', moisture: 'moist' },
      }),
      'Slab settling at the south-east corner.',
    ],
  );
  const inspectionId = (inspection.rows[0] as { id: string }).id;
  for (const [position, p] of BEFORE_SURVEY.entries()) {
    await sql(
      stack,
      `insert into survey_points (inspection_id, branch_id, kind, position, label, x_ft, y_ft, elevation_in, is_reference)
       values (?, ?, 'inspection', ?, ?, ?, ?, ?, ?)`,
      [inspectionId, branchId, position, p.label, p.x, p.y, p.z, p.label === 'A'],
    );
  }
  await sql(stack, `update leads set stage = 'inspected' where id = ?`, [lead.id]);

  const items = await seller.get<PriceBookItem[]>(`/branches/${branchId}/price-book`);
  const lines = PLAN.map((l) => {
    const item = items.find((i) => i.code === l.code);
    if (!item) throw new Error(`no ${l.code} in the price book`);
    return { priceBookItemId: item.id, quantity: l.quantity };
  });
  const proposal = await seller.send<{ id: string }>('POST', `/leads/${lead.id}/proposals`, {
    inspectionId,
    options: [{ title: 'Stabilise the south-east corner', discount: { kind: 'none', value: '0' }, lines }],
  });
  const submitted = await seller.send<{
    status: string;
    options: { id: string; totals: { customerTotal: string } }[];
  }>('POST', `/proposals/${proposal.id}/submit`, {});
  if (submitted.status !== 'approved') throw new Error(`proposal ${submitted.status}`);
  const option = submitted.options[0]!;
  const price = option.totals.customerTotal;
  const deposit = '651.00';
  const notices = contractRules({ state: 'FL', contractPrice: price, deposit }).notices.map((n) => n.code);
  const contract = await seller.send<{ id: string }>('POST', `/proposals/${proposal.id}/sign-in-person`, {
    optionId: option.id,
    signerName: homeowner.name,
    signaturePng: await inkSignature(),
    acknowledgedNotices: notices,
    depositAmount: deposit,
  });
  const job = await sql(stack, 'select id, number from jobs where contract_id = ?', [contract.id]);
  const row = job.rows[0] as { id: string; number: string };
  return { jobId: row.id, number: row.number, leadId: lead.id, contractId: contract.id, price };
}

/**
 * The homeowner's 3 days have passed: the contract is moved back two weeks (its terms are frozen by a
 * trigger, lifted for this one statement in the journey's throwaway database), and the deposit is in (no
 * screen records it before #5).
 */
export async function closeWindowAndTakeDeposit(
  stack: Stack,
  contractId: string,
  daysAgo = 14,
): Promise<void> {
  const days = Math.trunc(daysAgo);
  await sql(
    stack,
    `begin;
     alter table contracts disable trigger contracts_terms_frozen;
     update contracts set signed_at = signed_at - interval '${days} days', signed_on = signed_on - ${days},
       last_day_to_cancel = last_day_to_cancel - ${days}, deposit_received_at = now() - interval '${days - 1} days'
       where id = '${contractId.replace(/[^0-9a-f-]/g, '')}';
     alter table contracts enable trigger contracts_terms_frozen;
     commit;`,
  );
}
