import type { Knex } from 'knex';
import { MIGRATIONS } from '../../migrations';

class ListedMigrations implements Knex.MigrationSource<readonly [string, Knex.Migration]> {
  async getMigrations() {
    return [...MIGRATIONS];
  }
  getMigrationName([name]: readonly [string, Knex.Migration]) {
    return name;
  }
  async getMigration([, migration]: readonly [string, Knex.Migration]) {
    return migration;
  }
}

/** Brings the schema up to date; returns the names applied. */
export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, applied] = await knex.migrate.latest({ migrationSource: new ListedMigrations() });
  return applied as string[];
}
