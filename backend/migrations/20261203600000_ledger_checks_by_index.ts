import type { Knex } from 'knex';

/**
 * The ledger's triggers look up one entry's rows by key (journal_lines_guard: the entry and the account
 * of a new line; journal_entry_check: an entry's lines, at commit). PL/pgSQL keeps a session's plans, and a
 * plan made while the tables were small is a sequential scan, kept while they grow until the next
 * ANALYZE: on a busy new database (the webhook benchmark starts from empty) each commit read every line
 * four times over, and PostgreSQL's time per card payment rose from about 4 ms to 9 ms. Every one of
 * these look-ups has an index (the keys and unique (entry_id, position)), so the functions plan without
 * sequential scans at any table size.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    alter function journal_lines_guard() set enable_seqscan = off;
    alter function journal_entry_check(uuid) set enable_seqscan = off;
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    alter function journal_lines_guard() reset enable_seqscan;
    alter function journal_entry_check(uuid) reset enable_seqscan;
  `);
}
