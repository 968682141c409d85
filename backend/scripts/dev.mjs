// npm run dev: the same services as npm start, then hot reload on both sides: tsc --watch + node --watch
// for the API on :3000, Vite with its dev server on :5173 (proxying /api to the API).
import { spawn } from 'node:child_process';
import { app, log, pg, REPO, stripe } from './lib/env.mjs';
import { ensureDatabase, startPostgres } from './lib/postgres.mjs';
import { startFakes } from './lib/fakes.mjs';
import { runVisible } from './lib/run.mjs';

await startPostgres();
await ensureDatabase(pg.database);
const { inbox } = await startFakes();
const env = {
  ...process.env,
  PGPORT: String(pg.port),
  PGDATABASE: pg.database,
  PORT: String(app.port),
  FRONTEND_DIST: '',
  // The app's SDK talks to the local card-processor fake (scripts/lib/env.mjs `stripe.*`).
  STRIPE_SECRET_KEY: stripe.secretKey,
  STRIPE_WEBHOOK_SECRET: stripe.webhookSecret,
  STRIPE_API_HOST: process.env.STRIPE_API_HOST ?? '127.0.0.1',
  STRIPE_API_PORT: process.env.STRIPE_API_PORT ?? String(stripe.fakePort),
  STRIPE_API_PROTOCOL: process.env.STRIPE_API_PROTOCOL ?? 'http',
};
for (const ws of ['common', 'backend']) {
  if ((await runVisible('npm', ['run', 'build', '-w', ws, '--silent'], { cwd: REPO })) !== 0) process.exit(1);
}
await runVisible(process.execPath, ['backend/dist/backend/src/cli/db.js', 'migrate', 'seed'], {
  cwd: REPO,
  env,
});
log(`Screens: http://127.0.0.1:5173   API: http://127.0.0.1:${app.port}/api/docs   Mail: ${inbox}`);

const child = spawn(
  'npx',
  [
    'concurrently',
    '--kill-others',
    '--names',
    'common,api-build,api,web',
    '--prefix-colors',
    'gray,blue,green,magenta',
    'tsc -p common/tsconfig.build.json --watch --preserveWatchOutput',
    'tsc -p backend/tsconfig.build.json --watch --preserveWatchOutput',
    'node --watch-path=backend/dist --watch-path=common/dist backend/dist/backend/src/main.js',
    'npm run dev -w frontend',
  ],
  { cwd: REPO, env, stdio: 'inherit' },
);
process.on('SIGINT', () => child.kill('SIGINT'));
child.on('exit', (code) => process.exit(code ?? 0));
