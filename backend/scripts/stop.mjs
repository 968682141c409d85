// npm run stop: stops the local PostgreSQL and the local fakes started by npm start / npm run dev.
import { stopPostgres } from './lib/postgres.mjs';
import { stopFakes } from './lib/fakes.mjs';

stopFakes();
await stopPostgres();
