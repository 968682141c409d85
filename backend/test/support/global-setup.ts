import knex from 'knex';
import type { TestProject } from 'vitest/node';
import { connection, dropDatabase, ensureDatabase, startPostgres } from '../../scripts/lib/postgres.mjs';
import { migrateLatest } from '../../src/database/migrate';

/**
 * Starts the project's PostgreSQL (installing it when missing) and creates a database for this run
 * only, so the tests never touch the demo data. It is dropped at the end unless KEEP_TEST_DB is set.
 */
export default async function setup(project: TestProject) {
  await startPostgres();
  const name = process.env.TEST_DATABASE ?? `loambook_test_${Date.now()}_${process.pid}`;
  await ensureDatabase(name);
  const db = knex({ client: 'pg', connection: connection(name) });
  try {
    await migrateLatest(db);
  } finally {
    await db.destroy();
  }
  project.provide('databaseName', name);
  return async () => {
    if (!process.env.KEEP_TEST_DB) await dropDatabase(name);
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseName: string;
  }
}
