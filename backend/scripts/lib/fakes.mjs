// The local stand-ins for hosted services, each a detached process on 127.0.0.1 with a pid file:
// maildev (the development mail inbox) and s3rver (file storage through the S3 API).
// Also the card-processor fake (backend/fakes/stripe), which posts signed webhooks to the app.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { readdirSync, statSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { mail, log, REPO, s3, STATE_DIR, stripe } from './env.mjs';

const RUN_DIR = path.join(STATE_DIR, 'run');

function alive(pid, name) {
  try {
    process.kill(pid, 0);
    return readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes(name);
  } catch {
    return false;
  }
}

function portOpen(port) {
  return new Promise((resolve) => {
    const s = net.connect(port, '127.0.0.1');
    s.on('connect', () => (s.destroy(), resolve(true)));
    s.on('error', () => resolve(false));
  });
}

function packageFile(pkg, file) {
  const found = [REPO, path.join(REPO, 'backend')]
    .map((dir) => path.join(dir, 'node_modules', pkg, file))
    .find((f) => existsSync(f));
  if (!found) throw new Error(`${pkg} is not installed: run npm ci`);
  return found;
}

/** Starts `node <script> <args>` detached unless it already runs; waits for its port. */
async function startDetached(name, script, args, port, env = {}) {
  const pidFile = path.join(RUN_DIR, `${name}.pid`);
  if (existsSync(pidFile) && alive(Number(readFileSync(pidFile, 'utf8')), name)) return false;
  if (await portOpen(port)) {
    log(`Port ${port} is already in use; assuming it is ${name}`);
    return false;
  }
  mkdirSync(RUN_DIR, { recursive: true });
  const logFd = openSync(path.join(RUN_DIR, `${name}.log`), 'a');
  const child = spawn(process.execPath, [script, ...args], {
    detached: true,
    stdio: ['ignore', logFd, logFd],
    env: { ...process.env, ...env },
  });
  child.unref();
  writeFileSync(pidFile, String(child.pid));
  for (let i = 0; i < 60 && !(await portOpen(port)); i++) await new Promise((r) => setTimeout(r, 250));
  if (!(await portOpen(port)))
    throw new Error(`${name} did not start; see ${path.join(RUN_DIR, `${name}.log`)}`);
  return true;
}

function stopDetached(name) {
  const pidFile = path.join(RUN_DIR, `${name}.pid`);
  if (!existsSync(pidFile)) return;
  const pid = Number(readFileSync(pidFile, 'utf8'));
  if (alive(pid, name)) {
    process.kill(pid, 'SIGTERM');
    log(`${name} stopped`);
  }
  rmSync(pidFile, { force: true });
}

export async function startMaildev() {
  const inbox = `http://127.0.0.1:${mail.webPort}`;
  const started = await startDetached(
    'maildev',
    packageFile('maildev', 'dist/bin/maildev.js'),
    [
      '-s',
      String(mail.smtpPort),
      '-w',
      String(mail.webPort),
      '--ip',
      '127.0.0.1',
      '--mail-directory',
      path.join(STATE_DIR, 'mail'),
    ],
    mail.smtpPort,
  );
  if (started) log(`maildev started (SMTP 127.0.0.1:${mail.smtpPort}, inbox ${inbox})`);
  return inbox;
}

export async function startS3() {
  const dir = path.join(STATE_DIR, 's3');
  mkdirSync(dir, { recursive: true });
  const started = await startDetached(
    's3rver',
    packageFile('s3rver', 'bin/s3rver.js'),
    [
      '--address',
      '127.0.0.1',
      '--port',
      String(s3.port),
      '--directory',
      dir,
      '--configure-bucket',
      s3.bucket,
      '--no-vhost-buckets',
    ],
    s3.port,
  );
  if (started) log(`s3rver started (S3 API on http://127.0.0.1:${s3.port}, bucket ${s3.bucket})`);
  return `http://127.0.0.1:${s3.port}`;
}

const STRIPE_FAKE_SRC = path.join(REPO, 'backend/fakes/stripe');
const STRIPE_FAKE_MAIN = path.join(REPO, 'backend/dist/backend/fakes/stripe/main.js');

/** npm start runs the fakes before the full build: compile the card-processor fake alone when stale. */
function ensureStripeFakeBuilt() {
  const built = existsSync(STRIPE_FAKE_MAIN) ? statSync(STRIPE_FAKE_MAIN).mtimeMs : 0;
  const sources = readdirSync(STRIPE_FAKE_SRC).filter((f) => f.endsWith('.ts') || f === 'tsconfig.json');
  if (sources.every((f) => statSync(path.join(STRIPE_FAKE_SRC, f)).mtimeMs <= built)) return;
  log('Compiling the card-processor fake');
  const tsc = packageFile('typescript', 'bin/tsc');
  const r = spawnSync(process.execPath, [tsc, '-p', path.join(STRIPE_FAKE_SRC, 'tsconfig.json')], {
    stdio: 'inherit',
  });
  if (r.status !== 0) throw new Error('The card-processor fake did not compile');
}

export async function startStripeFake() {
  ensureStripeFakeBuilt();
  // The label in argv lets the pid check recognise the process (main.js ignores its arguments).
  const started = await startDetached(
    'stripe-fake',
    STRIPE_FAKE_MAIN,
    ['--label=stripe-fake'],
    stripe.fakePort,
    {
      STRIPE_FAKE_PORT: String(stripe.fakePort),
      STRIPE_WEBHOOK_URL: stripe.webhookUrl,
      STRIPE_WEBHOOK_SECRET: stripe.webhookSecret,
      PAYOUT_INTERVAL_MS: String(stripe.payoutIntervalMs),
    },
  );
  const url = `http://127.0.0.1:${stripe.fakePort}`;
  if (started) log(`card-processor fake started (API ${url}/v1, webhooks to ${stripe.webhookUrl})`);
  return url;
}

export async function startFakes() {
  const inbox = await startMaildev();
  const storage = await startS3();
  const payments = await startStripeFake();
  return { inbox, storage, payments };
}

export function stopFakes() {
  stopDetached('maildev');
  stopDetached('s3rver');
  stopDetached('stripe-fake');
}
