import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';

/**
 * Rows for the proposal and price-book tests, written straight to the database (the leads API has its
 * own tests). Invented data only.
 */
const suffix = () => randomBytes(3).toString('hex').toUpperCase();

export interface BranchSettingsInput {
  marginFloorPct?: string;
  salespersonPct?: string;
  managerPct?: string;
  salesTaxTreatment?: 'invoice' | 'materials_cost';
  salesTaxRatePct?: string;
  commissionRatePct?: string;
}

/** makeBranch() leaves the discount authority at 10/20 and no tax rate; set what a test needs. */
export async function setBranchSettings(db: Knex, branchId: string, s: BranchSettingsInput): Promise<void> {
  const row: Record<string, string | undefined> = {
    margin_floor_pct: s.marginFloorPct,
    discount_limit_salesperson_pct: s.salespersonPct,
    discount_limit_manager_pct: s.managerPct,
    sales_tax_treatment: s.salesTaxTreatment,
    sales_tax_rate_pct: s.salesTaxRatePct,
    commission_rate_pct: s.commissionRatePct,
  };
  await db('branches')
    .where({ id: branchId })
    .update(Object.fromEntries(Object.entries(row).filter(([, v]) => v !== undefined)));
}

export async function makeLead(
  db: Knex,
  branchId: string,
  salespersonId: string | null,
  homeownerName = `Homeowner ${suffix()}`,
): Promise<string> {
  const [row] = await db('leads')
    .insert({
      branch_id: branchId,
      salesperson_id: salespersonId,
      homeowner_name: homeownerName,
      phone_primary: '555-0131',
      email: `${homeownerName.toLowerCase().replace(/[^a-z0-9]+/g, '.')}@example.com`,
      address_line1: '12 Settling Lane',
      city: 'Testerton',
      state: 'FL',
      postal_code: '32000',
      foundation_type: 'slab',
      stage: 'inspected',
    })
    .returning('id');
  return row.id;
}

export async function makeInspection(db: Knex, leadId: string, branchId: string): Promise<string> {
  const [row] = await db('inspections')
    .insert({ lead_id: leadId, branch_id: branchId, scheduled_at: '2026-11-20T14:00:00Z' })
    .returning('id');
  return row.id;
}

export interface ItemInput {
  code?: string;
  description?: string;
  category?: string;
  unit?: string;
  unitCost: string;
  unitPrice: string;
  active?: boolean;
}

export async function makeItem(db: Knex, branchId: string, item: ItemInput): Promise<string> {
  const [row] = await db('price_book_items')
    .insert({
      branch_id: branchId,
      code: item.code ?? `T-${suffix()}`,
      description: item.description ?? 'Test item',
      category: item.category ?? 'soil_stabilisation',
      unit: item.unit ?? 'each',
      unit_cost: item.unitCost,
      unit_price: item.unitPrice,
      active: item.active ?? true,
    })
    .returning('id');
  return row.id;
}
