// npm run dev: the same services as npm start, then hot reload on both sides: tsc --watch + node --watch
// for the API on :3000, Vite with its dev server on :5173 (proxying /api to the API).
import { spawn } from 'node:child_process';
import { app, log, pg, REPO } from './lib/env.mjs';
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
