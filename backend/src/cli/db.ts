/**
 * `node dist/backend/src/cli/db.js migrate [seed]`: brings the schema up to date and, with `seed`,
 * loads the invented demo company. Used by `npm start`; safe to run again.
 */
import knex from 'knex';
import { loadConfig } from '../config/config';
import { knexConfig } from '../database/knex-config';
import { migrateLatest } from '../database/migrate';
import { seed } from '../../../seeds/01-demo-company';
import { seed as seedPriceBook } from '../../../seeds/02-demo-price-book';
import { seed as seedCrews } from '../../../seeds/03-demo-crews';
import { seed as seedScenario } from '../../../seeds/04-demo-scenario';

async function main(args: string[]): Promise<void> {
  const config = loadConfig();
  const db = knex(knexConfig(config.database));
  try {
    if (args.includes('migrate')) {
      const applied = await migrateLatest(db);
      console.log(applied.length ? `Applied migrations: ${applied.join(', ')}` : 'Schema is up to date.');
    }
    if (args.includes('seed')) {
      await seed(db);
      await seedPriceBook(db);
      await seedCrews(db);
      await seedScenario(db);
      console.log('Demo company is in place.');
    }
  } finally {
    await db.destroy();
  }
}

main(process.argv.slice(2)).catch((err) => {
  console.error(err);
  process.exit(1);
});
