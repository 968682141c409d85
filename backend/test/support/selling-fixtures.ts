import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';

/**
 * Fixtures for the selling features (leads, inspections, proposals). Rows go straight into the
 * database, so a test of one feature does not depend on another feature's routes.
 */

export interface LeadFixture {
  branchId: string;
  /** null: nobody assigned. */
  salespersonId: string | null;
  stage?: string;
  homeownerName?: string;
  addressLine1?: string;
  city?: string;
  state?: string;
  postalCode?: string;
}

/** An invented homeowner's lead; returns its id. */
export async function makeLead(db: Knex, lead: LeadFixture): Promise<string> {
  const n = randomBytes(2).readUInt16BE(0);
  const [row] = await db('leads')
    .insert({
      branch_id: lead.branchId,
      salesperson_id: lead.salespersonId,
      homeowner_name: lead.homeownerName ?? `Test Homeowner ${n}`,
      phone_primary: `555-01${String(n % 100).padStart(2, '0')}`,
      email: `homeowner.${n}.${randomBytes(3).toString('hex')}@example.com`,
      address_line1: lead.addressLine1 ?? `${100 + (n % 900)} Settling Lane`,
      city: lead.city ?? 'Testerton',
      state: lead.state ?? 'FL',
      postal_code: lead.postalCode ?? '32000',
      stage: lead.stage ?? 'new',
    })
    .returning('id');
  return row.id;
}
