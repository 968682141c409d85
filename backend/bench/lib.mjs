// Shared pieces of the benchmarks: a fresh database, the compiled server as a child process, and
// latency statistics. Benchmarks are run by hand (`npm run bench -w backend`), never by `npm test`.
import { spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createRequire } from 'node:module';
import { dropDatabase, ensureDatabase, startPostgres, connection } from '../scripts/lib/postgres.mjs';
import { pg, REPO } from '../scripts/lib/env.mjs';

const require = createRequire(import.meta.url);
// BENCH_DIST points at another build (e.g. a copy with an experiment in it) to compare two builds.
export const DIST = process.env.BENCH_DIST ?? path.join(REPO, 'backend', 'dist', 'backend', 'src');
export const here = path.dirname(fileURLToPath(import.meta.url));

/** A new, migrated database; with `reuse`, an existing one is kept (the caller checks its contents). */
export async function freshDatabase(name, { reuse = false } = {}) {
  await startPostgres();
  if (!reuse) await dropDatabase(name);
  await ensureDatabase(name);
  const knex = require('knex')({ client: 'pg', connection: connection(name), pool: { min: 0, max: 20 } });
  const { migrateLatest } = require(path.join(DIST, 'database', 'migrate.js'));
  await migrateLatest(knex);
  return knex;
}

export async function freePort() {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

/** The compiled server as a child process; `cpus` (e.g. '1') pins it there with taskset. */
export async function startServer(database, extraEnv = {}, { cpus } = {}) {
  const port = await freePort();
  // BENCH_SERVER_NODE_ARGS='--cpu-prof --cpu-prof-dir=/tmp/prof' profiles the server alone.
  const nodeArgs = (process.env.BENCH_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean);
  const main = [process.execPath, ...nodeArgs, path.join(DIST, 'main.js')];
  const [cmd, ...args] = cpus ? ['taskset', '-c', cpus, ...main] : main;
  const child = spawn(cmd, args, {
    env: {
      ...process.env,
      PGPORT: String(pg.port),
      PGDATABASE: database,
      PORT: String(port),
      LOG_LEVEL: 'error',
      FRONTEND_DIST: '',
      // BENCH_SERVER_NODE_OPTIONS='--cpu-prof --cpu-prof-dir=/tmp/prof' profiles the server alone.
      ...(process.env.BENCH_SERVER_NODE_OPTIONS
        ? { NODE_OPTIONS: process.env.BENCH_SERVER_NODE_OPTIONS }
        : {}),
      ...extraEnv,
    },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 120; i++) {
    try {
      if ((await fetch(`${url}/api/health`)).ok)
        return { url, pid: child.pid, stop: () => child.kill('SIGTERM') };
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  child.kill();
  throw new Error('server did not start');
}

export function percentile(sorted, p) {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1);
  return sorted[Math.max(0, i)];
}

/** Runs `work` from `concurrency` loops for `seconds`; returns latencies in ms, sorted. */
export async function closedLoop(work, { concurrency, seconds }) {
  const latencies = [];
  const end = Date.now() + seconds * 1000;
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (Date.now() < end) {
        const t0 = process.hrtime.bigint();
        await work();
        latencies.push(Number(process.hrtime.bigint() - t0) / 1e6);
      }
    }),
  );
  return latencies.sort((a, b) => a - b);
}

export { dropDatabase, pg };
