import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { Branch, BranchInput } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

interface BranchRow {
  id: string;
  code: string;
  name: string;
  address_line1: string;
  city: string;
  state: string;
  postal_code: string;
  phone: string | null;
  timezone: string;
  margin_floor_pct: string;
  discount_limit_salesperson_pct: string;
  discount_limit_manager_pct: string;
  sales_tax_treatment: Branch['salesTaxTreatment'];
  sales_tax_rate_pct: string;
  user_count: string;
  created_at: Date;
  updated_at: Date;
}

/** numeric(5,2) comes back as "35.00"; the API shows "35" and "12.5" as typed. */
const pct = (v: string) => v.replace(/\.?0+$/, '') || '0';

function toBranch(r: BranchRow): Branch {
  const userCount = Number(r.user_count);
  return {
    id: r.id,
    code: r.code,
    name: r.name,
    addressLine1: r.address_line1,
    city: r.city,
    state: r.state,
    postalCode: r.postal_code,
    phone: r.phone,
    timezone: r.timezone,
    marginFloorPct: pct(r.margin_floor_pct),
    discountAuthority: {
      salesperson: pct(r.discount_limit_salesperson_pct),
      branch_manager: pct(r.discount_limit_manager_pct),
    },
    salesTaxTreatment: r.sales_tax_treatment,
    salesTaxRatePct: pct(r.sales_tax_rate_pct),
    userCount,
    inUse: userCount > 0,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

function toRow(b: Partial<BranchInput>): Record<string, unknown> {
  const row: Record<string, unknown> = {
    code: b.code,
    name: b.name,
    address_line1: b.addressLine1,
    city: b.city,
    state: b.state,
    postal_code: b.postalCode,
    phone: b.phone,
    timezone: b.timezone,
    margin_floor_pct: b.marginFloorPct,
    discount_limit_salesperson_pct: b.discountAuthority?.salesperson,
    discount_limit_manager_pct: b.discountAuthority?.branch_manager,
    sales_tax_treatment: b.salesTaxTreatment,
    sales_tax_rate_pct: b.salesTaxRatePct,
  };
  return Object.fromEntries(Object.entries(row).filter(([, v]) => v !== undefined));
}

/** A branch as other branches see it: enough to name it, nothing of its settings or people. */
export type BranchDirectoryEntry = Pick<Branch, 'id' | 'code' | 'name'>;

@Injectable()
export class BranchesRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private base(db: Db) {
    return db('branches as b').select(
      'b.*',
      db.raw('(select count(*) from user_branches ub where ub.branch_id = b.id) as user_count'),
    );
  }

  /** `scope` null: every branch; otherwise only those ids. */
  async list(scope: string[] | null, db: Db = this.knex): Promise<Branch[]> {
    const q = this.base(db).orderBy('b.name');
    if (scope) q.whereIn('b.id', scope);
    return (await q).map(toBranch);
  }

  /** Every branch's id, code and name, by code: what a transfer needs to name its target. */
  async directory(db: Db = this.knex): Promise<BranchDirectoryEntry[]> {
    return db('branches').select('id', 'code', 'name').orderBy('code');
  }

  async findById(id: string, db: Db = this.knex): Promise<Branch | undefined> {
    const row = await this.base(db).where('b.id', id).first();
    return row ? toBranch(row) : undefined;
  }

  async findByCode(code: string, db: Db = this.knex): Promise<{ id: string } | undefined> {
    return db('branches').select('id').where({ code }).first();
  }

  async idsByCodes(codes: string[], db: Db = this.knex): Promise<Map<string, string>> {
    const rows: { id: string; code: string }[] = await db('branches')
      .select('id', 'code')
      .whereIn('code', codes);
    return new Map(rows.map((r) => [r.code, r.id]));
  }

  async existingIds(ids: string[], db: Db = this.knex): Promise<string[]> {
    if (ids.length === 0) return [];
    return (await db('branches').select('id').whereIn('id', ids)).map((r: { id: string }) => r.id);
  }

  async insert(input: BranchInput, db: Db = this.knex): Promise<string> {
    const [row] = await db('branches').insert(toRow(input)).returning('id');
    return row.id;
  }

  async update(id: string, input: Partial<BranchInput>, db: Db = this.knex): Promise<void> {
    await db('branches')
      .where({ id })
      .update({ ...toRow(input), updated_at: db.fn.now() });
  }

  async delete(id: string, db: Db = this.knex): Promise<void> {
    await db('branches').where({ id }).delete();
  }
}
