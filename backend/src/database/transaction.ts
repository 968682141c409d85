import type { Knex } from 'knex';

/** A query runner: the pool, or an open transaction. Repositories take one of these. */
export type Db = Knex | Knex.Transaction;

/**
 * Joins the caller's transaction when there is one, or opens a new one. Services use it to run several
 * repository calls atomically without caring whether an outer caller already began a transaction.
 */
export async function inTransaction<T>(db: Db, work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  if (db.isTransaction) return work(db as Knex.Transaction);
  return (db as Knex).transaction(work);
}
