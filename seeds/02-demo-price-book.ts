import type { Knex } from 'knex';
import {
  PRICE_BOOK_CATEGORIES,
  PRICE_BOOK_CODE_PATTERN,
  PRICE_BOOK_UNITS,
  UNIT_AMOUNT_PATTERN,
} from '@loambook/common';
import priceBook from './data/demo-price-book.json';

/**
 * The demo branches' price books (seeds/data/demo-price-book.json: invented prices, not market data).
 * Runs after 01-demo-company. Running it again changes nothing that is already there: items are matched
 * by branch and code, and an item someone has since edited keeps the edit.
 */
interface DemoItem {
  code: string;
  description: string;
  category: string;
  unit: string;
  unitCost: string;
  unitPrice: string;
}

export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    const branchIds = new Map<string, string>(
      (await trx('branches').select('id', 'code')).map((r: { id: string; code: string }) => [r.code, r.id]),
    );
    for (const [code, items] of Object.entries(priceBook.branches as Record<string, DemoItem[]>)) {
      const branchId = branchIds.get(code);
      if (!branchId) throw new Error(`demo-price-book.json names unknown branch ${code}`);
      for (const item of items) {
        const fault = check(item);
        if (fault) throw new Error(`demo-price-book.json, ${code} ${item.code}: ${fault}`);
        await trx('price_book_items')
          .insert({
            branch_id: branchId,
            code: item.code,
            description: item.description,
            category: item.category,
            unit: item.unit,
            unit_cost: item.unitCost,
            unit_price: item.unitPrice,
          })
          .onConflict(['branch_id', 'code'])
          .ignore();
      }
    }
  });
}

function check(item: DemoItem): string | null {
  if (!PRICE_BOOK_CODE_PATTERN.test(item.code)) return 'bad code';
  if (!(PRICE_BOOK_CATEGORIES as readonly string[]).includes(item.category)) return 'unknown category';
  if (!(PRICE_BOOK_UNITS as readonly string[]).includes(item.unit)) return 'unknown unit';
  if (!UNIT_AMOUNT_PATTERN.test(item.unitCost) || !UNIT_AMOUNT_PATTERN.test(item.unitPrice))
    return 'bad amount';
  return null;
}
