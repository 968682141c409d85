// npm start: PostgreSQL (installed when missing), maildev, a build of everything, migrations and the
// demo company, then the app in the foreground on http://127.0.0.1:3000. Ctrl-C stops the app;
// `npm run stop` stops the database and maildev.
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { app, log, pg, REPO } from './lib/env.mjs';
import { ensureDatabase, startPostgres } from './lib/postgres.mjs';
import { startFakes } from './lib/fakes.mjs';
import { runVisible } from './lib/run.mjs';

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
const { inbox } = await startFakes();
await step('Building common, backend and frontend', npm, ['run', 'build', '--silent']);
const env = { ...process.env, PGPORT: String(pg.port), PGDATABASE: pg.database, PORT: String(app.port) };
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
  API docs      ${url}/api/docs
  Sign in as    ${owner.email} / ${owner.password}   (all demo accounts: README.md or seeds/data/demo-accounts.json)

  Ctrl-C stops the app; "npm run stop" stops PostgreSQL, maildev and s3rver.
`);
