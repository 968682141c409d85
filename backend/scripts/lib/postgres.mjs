// The project's own PostgreSQL: Debian's package, a private cluster outside the repository and outside
// /root, listening on 127.0.0.1 only. Idempotent: starting a running cluster does nothing, and a stale
// pid file left by a crash or a reboot is cleared.
import { chownSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import pgPkg from 'pg';
import { pg, log, STATE_DIR } from './env.mjs';
import { aptInstall, isRoot, run } from './run.mjs';

function findBinDir() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(path.join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

export function ensureInstalled() {
  let bin = findBinDir();
  if (!bin) {
    aptInstall(['postgresql'], 'PostgreSQL is not installed.');
    bin = findBinDir();
    if (!bin)
      throw new Error('PostgreSQL was installed but its programs were not found under /usr/lib/postgresql');
  }
  return bin;
}

/** As root, PostgreSQL's programs run as the postgres user (initdb refuses root). */
function asOwner(bin, program, args, options = {}) {
  const exe = path.join(bin, program);
  return isRoot() ? run('runuser', ['-u', 'postgres', '--', exe, ...args], options) : run(exe, args, options);
}

function ensureCluster(bin) {
  if (existsSync(path.join(pg.dataDir, 'PG_VERSION'))) return;
  log(`Creating a PostgreSQL cluster in ${pg.dataDir}`);
  mkdirSync(STATE_DIR, { recursive: true, mode: 0o755 });
  mkdirSync(pg.dataDir, { recursive: true, mode: 0o700 });
  const pwfile = path.join(STATE_DIR, `.pgpass-init-${process.pid}`);
  writeFileSync(pwfile, `${pg.password}\n`, { mode: 0o600 });
  if (isRoot()) {
    const { uid, gid } = postgresIds();
    chownSync(pg.dataDir, uid, gid);
    chownSync(pwfile, uid, gid);
  }
  try {
    asOwner(bin, 'initdb', [
      '-D',
      pg.dataDir,
      '-U',
      pg.user,
      '--pwfile',
      pwfile,
      '--auth',
      'scram-sha-256',
      '--encoding',
      'UTF8',
      '--locale',
      'C',
    ]);
  } finally {
    rmSync(pwfile, { force: true });
  }
}

function postgresIds() {
  const line = readFileSync('/etc/passwd', 'utf8')
    .split('\n')
    .find((l) => l.startsWith('postgres:'));
  if (!line) throw new Error('The postgres user is missing; reinstall the postgresql package');
  const [, , uid, gid] = line.split(':');
  return { uid: Number(uid), gid: Number(gid) };
}

function isRunning(bin) {
  return asOwner(bin, 'pg_ctl', ['status', '-D', pg.dataDir], { allowFailure: true }).status === 0;
}

/** A postmaster.pid whose process is gone (or is now some other program) is stale. */
function clearStalePidFile() {
  const pidFile = path.join(pg.dataDir, 'postmaster.pid');
  if (!existsSync(pidFile)) return;
  const pid = Number(readFileSync(pidFile, 'utf8').split('\n')[0]);
  let alive = false;
  try {
    alive = readFileSync(`/proc/${pid}/comm`, 'utf8').trim().startsWith('postgres');
  } catch {
    alive = false;
  }
  if (!alive) {
    log('Removing a stale PostgreSQL pid file');
    rmSync(pidFile);
  }
}

export async function startPostgres() {
  const bin = ensureInstalled();
  ensureCluster(bin);
  const started = !isRunning(bin);
  if (started) {
    clearStalePidFile();
    log(`Starting PostgreSQL on 127.0.0.1:${pg.port}`);
    asOwner(bin, 'pg_ctl', [
      'start',
      '-D',
      pg.dataDir,
      '-l',
      path.join(pg.dataDir, 'server.log'),
      '-w',
      '-t',
      '60',
      '-o',
      `-c listen_addresses=127.0.0.1 -p ${pg.port} -c unix_socket_directories='' -c fsync=${process.env.CI ? 'off' : 'on'}`,
    ]);
  }
  await waitForConnection();
  return { bin, started };
}

export async function stopPostgres() {
  const bin = findBinDir();
  if (!bin || !existsSync(path.join(pg.dataDir, 'PG_VERSION'))) return;
  if (!isRunning(bin)) {
    log('PostgreSQL is not running');
    return;
  }
  asOwner(bin, 'pg_ctl', ['stop', '-D', pg.dataDir, '-m', 'fast', '-w']);
  log('PostgreSQL stopped');
}

function client(database = 'postgres') {
  return new pgPkg.Client({ host: pg.host, port: pg.port, user: pg.user, password: pg.password, database });
}

async function waitForConnection() {
  for (let i = 0; i < 60; i++) {
    const c = client();
    try {
      await c.connect();
      await c.end();
      return;
    } catch {
      await new Promise((r) => setTimeout(r, 500));
    }
  }
  throw new Error(`PostgreSQL did not accept connections on ${pg.host}:${pg.port}`);
}

export async function ensureDatabase(name) {
  const c = client();
  await c.connect();
  try {
    const { rowCount } = await c.query('select 1 from pg_database where datname = $1', [name]);
    if (!rowCount) await c.query(`create database "${name.replace(/"/g, '')}"`);
  } finally {
    await c.end();
  }
}

export async function dropDatabase(name) {
  const c = client();
  await c.connect();
  try {
    await c.query(`drop database if exists "${name.replace(/"/g, '')}" with (force)`);
  } finally {
    await c.end();
  }
}

export const connection = (database) => ({
  host: pg.host,
  port: pg.port,
  user: pg.user,
  password: pg.password,
  database,
});
