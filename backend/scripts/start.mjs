// npm start: PostgreSQL (installed when missing), maildev, a build of everything, migrations and the
// demo company, then the app in the foreground on http://127.0.0.1:3000. Ctrl-C stops the app;
// `npm run stop` stops the database, maildev, s3rver and the card-processor fake.
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { app, log, pg, REPO, stripe } from './lib/env.mjs';
import { ensureDatabase, startPostgres } from './lib/postgres.mjs';
import { startFakes } from './lib/fakes.mjs';
import { runVisible } from './lib/run.mjs';

/** The processor settings for the app: the local fake (scripts/lib/env.mjs `stripe.*`) unless a host is given. */
function stripeEnv() {
  return {
    STRIPE_SECRET_KEY: stripe.secretKey,
    STRIPE_WEBHOOK_SECRET: stripe.webhookSecret,
    STRIPE_API_HOST: process.env.STRIPE_API_HOST ?? '127.0.0.1',
    STRIPE_API_PORT: process.env.STRIPE_API_PORT ?? String(stripe.fakePort),
    STRIPE_API_PROTOCOL: process.env.STRIPE_API_PROTOCOL ?? 'http',
  };
}

const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
const step = async (what, cmd, args, options = {}) => {
  log(what);
  const code = await runVisible(cmd, args, { cwd: REPO, ...options });
  if (code !== 0) {
    console.error(`[loambook] ${what} failed (exit ${code})`);
    process.exit(code);
  }
};

await startPostgres();
await ensureDatabase(pg.database);
const { inbox, payments } = await startFakes();
await step('Building common, backend and frontend', npm, ['run', 'build', '--silent']);
const env = { ...process.env, PGPORT: String(pg.port), PGDATABASE: pg.database, PORT: String(app.port) };
// The app's SDK talks to the local card-processor fake with its test key and checks its webhooks' signatures.
Object.assign(env, stripeEnv());
await step(
  'Migrating and seeding the demo company',
  process.execPath,
  ['backend/dist/backend/src/cli/db.js', 'migrate', 'seed'],
  { env },
);

const accounts = JSON.parse(readFileSync(path.join(REPO, 'seeds/data/demo-accounts.json'), 'utf8'));
const owner = accounts.find((a) => a.role === 'owner');
const url = `http://127.0.0.1:${app.port}`;

const server = spawn(process.execPath, ['backend/dist/backend/src/main.js'], {
  cwd: REPO,
  env,
  stdio: 'inherit',
});
const forward = (signal) => () => server.kill(signal);
process.on('SIGINT', forward('SIGINT'));
process.on('SIGTERM', forward('SIGTERM'));
server.on('exit', (code) => process.exit(code ?? 0));

// The banner comes once the app answers, so it is the last thing on the screen rather than lost in the
// start-up log.
for (let i = 0; i < 240; i++) {
  try {
    if ((await fetch(`${url}/api/health`)).ok) break;
  } catch {
    // not listening yet
  }
  await new Promise((r) => setTimeout(r, 250));
}
console.log(`
  Loambook      ${url}
  Mail inbox    ${inbox}   (every e-mail the app sends lands here)
  Card payments ${payments}   (local test stand-in for the processor: pay with 4242 4242 4242 4242)
  API docs      ${url}/api/docs
  Sign in as    ${owner.email} / ${owner.password}   (all demo accounts: README.md or seeds/data/demo-accounts.json)

  Ctrl-C stops the app; "npm run stop" stops PostgreSQL, maildev, s3rver and the card-processor fake.
`);
