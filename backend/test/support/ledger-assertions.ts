import type { Knex } from 'knex';
import { expect } from 'vitest';

/**
 * The ledger's first promise, for any test that posts money: debits equal credits over the whole ledger and
 * in every branch. Sums are compared in SQL (numeric), never as JavaScript numbers. Also checks that no entry
 * was committed with fewer than two lines (the database refuses it; this catches a disabled trigger).
 */
export async function expectTrialBalanceZero(knex: Knex): Promise<void> {
  const overall = (await knex('journal_lines').first(
    knex.raw(`coalesce(sum(amount) filter (where side = 'debit'), 0)::text as debits`),
    knex.raw(`coalesce(sum(amount) filter (where side = 'credit'), 0)::text as credits`),
  )) as { debits: string; credits: string };
  expect(overall.credits, 'credits equal debits over the whole ledger').toBe(overall.debits);

  const branches = (await knex('journal_lines')
    .select('branch_id')
    .select(knex.raw(`coalesce(sum(amount) filter (where side = 'debit'), 0)::text as debits`))
    .select(knex.raw(`coalesce(sum(amount) filter (where side = 'credit'), 0)::text as credits`))
    .groupBy('branch_id')
    .havingRaw(
      `coalesce(sum(amount) filter (where side = 'debit'), 0) <> coalesce(sum(amount) filter (where side = 'credit'), 0)`,
    )) as {
    branch_id: string;
  }[];
  expect(branches, 'branches whose debits and credits differ').toEqual([]);

  const thin = (await knex('journal_entries as e')
    .leftJoin('journal_lines as l', 'l.entry_id', 'e.id')
    .groupBy('e.id')
    .havingRaw('count(l.id) < 2')
    .select('e.id')) as { id: string }[];
  expect(thin, 'entries with fewer than two lines').toEqual([]);
}
