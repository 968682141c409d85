// node backend/scripts/pg.mjs start|stop|status — the local PostgreSQL on its own.
import { pg } from './lib/env.mjs';
import { ensureDatabase, startPostgres, stopPostgres } from './lib/postgres.mjs';

const cmd = process.argv[2] ?? 'start';
if (cmd === 'start') {
  await startPostgres();
  await ensureDatabase(pg.database);
  console.log(
    `PostgreSQL is up: postgres://${pg.user}@${pg.host}:${pg.port}/${pg.database} (data in ${pg.dataDir})`,
  );
} else if (cmd === 'stop') {
  await stopPostgres();
} else {
  console.error('usage: node backend/scripts/pg.mjs start|stop');
  process.exit(2);
}
