import { Inject, Injectable } from '@nestjs/common';
import type { Knex } from 'knex';
import type { CreatePriceBookItemRequest, PriceBookItem, UpdatePriceBookItemRequest } from '@loambook/common';
import { KNEX } from '../database/database.module';
import type { Db } from '../database/transaction';

interface ItemRow {
  id: string;
  branch_id: string;
  code: string;
  description: string;
  category: PriceBookItem['category'];
  unit: PriceBookItem['unit'];
  unit_cost: string;
  unit_price: string;
  active: boolean;
  in_use: boolean;
  created_at: Date;
  updated_at: Date;
}

function toItem(r: ItemRow): PriceBookItem {
  return {
    id: r.id,
    branchId: r.branch_id,
    code: r.code,
    description: r.description,
    category: r.category,
    unit: r.unit,
    unitCost: r.unit_cost,
    unitPrice: r.unit_price,
    active: r.active,
    inUse: r.in_use,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

function toRow(i: UpdatePriceBookItemRequest): Record<string, unknown> {
  const row: Record<string, unknown> = {
    code: i.code,
    description: i.description,
    category: i.category,
    unit: i.unit,
    unit_cost: i.unitCost,
    unit_price: i.unitPrice,
    active: i.active,
  };
  return Object.fromEntries(Object.entries(row).filter(([, v]) => v !== undefined));
}

@Injectable()
export class PriceBookRepository {
  constructor(@Inject(KNEX) private readonly knex: Knex) {}

  private base(db: Db) {
    return db('price_book_items as i').select(
      'i.*',
      db.raw('exists (select 1 from proposal_lines l where l.price_book_item_id = i.id) as in_use'),
    );
  }

  async list(branchId: string, includeInactive: boolean, db: Db = this.knex): Promise<PriceBookItem[]> {
    const q = this.base(db).where('i.branch_id', branchId).orderBy('i.code');
    if (!includeInactive) q.where('i.active', true);
    return (await q).map(toItem);
  }

  async findById(id: string, db: Db = this.knex): Promise<PriceBookItem | undefined> {
    const row = await this.base(db).where('i.id', id).first();
    return row ? toItem(row) : undefined;
  }

  /** The items of one branch among `ids` (others are simply absent from the map). */
  async findForBranch(
    branchId: string,
    ids: string[],
    db: Db = this.knex,
  ): Promise<Map<string, PriceBookItem>> {
    if (ids.length === 0) return new Map();
    const rows: ItemRow[] = await this.base(db).where('i.branch_id', branchId).whereIn('i.id', ids);
    return new Map(rows.map((r) => [r.id, toItem(r)]));
  }

  async codeTaken(
    branchId: string,
    code: string,
    exceptId: string | null,
    db: Db = this.knex,
  ): Promise<boolean> {
    const q = db('price_book_items').where({ branch_id: branchId, code }).first('id');
    if (exceptId) q.whereNot('id', exceptId);
    return Boolean(await q);
  }

  async branchExists(branchId: string, db: Db = this.knex): Promise<boolean> {
    return Boolean(await db('branches').where({ id: branchId }).first('id'));
  }

  async insert(branchId: string, input: CreatePriceBookItemRequest, db: Db = this.knex): Promise<string> {
    const [row] = await db('price_book_items')
      .insert({ ...toRow(input), branch_id: branchId })
      .returning('id');
    return row.id;
  }

  async update(id: string, input: UpdatePriceBookItemRequest, db: Db = this.knex): Promise<void> {
    await db('price_book_items')
      .where({ id })
      .update({ ...toRow(input), updated_at: db.fn.now() });
  }

  async delete(id: string, db: Db = this.knex): Promise<void> {
    await db('price_book_items').where({ id }).delete();
  }
}
