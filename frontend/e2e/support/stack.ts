import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import net from 'node:net';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import {
  chromium,
  type Browser,
  type BrowserContext,
  type BrowserContextOptions,
  type Page,
} from 'playwright-core';
import S3rver from 's3rver';
import { dropDatabase, ensureDatabase, startPostgres } from '../../../backend/scripts/lib/postgres.mjs';
import { pg, REPO } from '../../../backend/scripts/lib/env.mjs';
import { startMailCatcher, type MailCatcher } from '../../../backend/test/support/mail-catcher';
// The compiled fake (npm run build): its source is checked with the backend's compiler settings, not these.

/**
 * The parts of the card-processor fake (backend/fakes/stripe, its README) that the journeys use. It is loaded
 * from the backend's build at run time — the journeys run after `npm run build` — so that type-checking the
 * journeys, which comes before the build in `npm test`, does not need that build.
 */
export interface StripeFake {
  url: string;
  port: number;
  close(): Promise<void>;
  payoutNow(): { id: string; amount: number; arrival_date: number }[];
  configure(patch: Record<string, unknown>): unknown;
  state: { charges: Map<string, { id: string; status: string; amount: number }> };
}
interface StripeFakeModule {
  startStripeFake(options: {
    port: number;
    webhookUrl: string;
    webhookSecret: string;
    retryBaseMs: number;
  }): Promise<StripeFake>;
}
async function startStripeFake(options: Parameters<StripeFakeModule['startStripeFake']>[0]) {
  const built = path.join(REPO, 'backend/dist/backend/fakes/stripe/index.js');
  const mod = (await import(pathToFileURL(built).href)) as StripeFakeModule;
  return mod.startStripeFake(options);
}

const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export const PHONE = { width: 390, height: 844 };
export const DESKTOP = { width: 1280, height: 800 };

export interface DemoAccount {
  email: string;
  password: string;
  role: string;
  branches: string[];
  name: string;
}

export const demoAccounts: DemoAccount[] = JSON.parse(
  readFileSync(path.join(REPO, 'seeds/data/demo-accounts.json'), 'utf8'),
);
export const demo = (role: string, branch?: string) =>
  demoAccounts.find((a) => a.role === role && (!branch || a.branches.includes(branch)))!;

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export interface Stack {
  baseUrl: string;
  /** The journey's own database (for the few facts a journey sets directly, e.g. a deposit received). */
  database: string;
  mail: MailCatcher;
  /**
   * The card-processor fake (backend/fakes/stripe), on a random port, delivering signed webhooks to the
   * server; the server's SDK talks to it. `stripe.payoutNow()`, `stripe.configure({ clockOffsetSec })`…
   */
  stripe: StripeFake;
  browser: Browser;
  shotsDir: string;
  /**
   * A fresh browser profile (no session) sized like a desktop or a phone; `options` adds to it (e.g. the
   * office's `timezoneId`).
   */
  newContext(
    viewport?: { width: number; height: number },
    options?: BrowserContextOptions,
  ): Promise<BrowserContext>;
  shot(page: Page, name: string): Promise<void>;
  /**
   * Stops the server and starts it again on the same port and database with these variables added to (or,
   * when undefined, removed from) its environment: e.g. `{ TEST_NOW: '2026-12-09T17:00:00Z' }` moves the
   * server's clock (honoured with NODE_ENV=test, which vitest sets) without a test-only route.
   */
  restartServer(env: Record<string, string | undefined>): Promise<void>;
  close(): Promise<void>;
}

/** The stack of the journey now running, for the screenshots taken when a test fails (e2e/setup.ts). */
let running: Stack | null = null;

/**
 * A full-page screenshot of every page still open, named `FAILED-…`: a failed poll says only "expected
 * false to be true", the page says why. Called by e2e/setup.ts when a test fails.
 */
export async function shootOpenPages(): Promise<void> {
  if (!running) return;
  const pages = running.browser.contexts().flatMap((c) => c.pages());
  for (const [i, page] of pages.entries()) {
    const file = path.join(running.shotsDir, `FAILED-${i + 1}.png`);
    await page.screenshot({ path: file, fullPage: true, timeout: 10_000 }).catch(() => undefined);
    console.log(`A page open when the test failed (${page.url()}): ${file}`);
  }
}

/** Test keys of the journeys' own processor fake (apart from npm start's, scripts/lib/env.mjs). */
const STRIPE_SECRET_KEY = 'sk_test_loambook_e2e';
const STRIPE_WEBHOOK_SECRET = 'whsec_loambook_e2e_not_a_real_secret';

/**
 * The built app as it ships: a fresh database with the demo company, the compiled server serving the
 * built screens, mail caught in this process, and Debian's Chromium.
 */
export async function startStack(journey: string): Promise<Stack> {
  await startPostgres();
  const database = `loambook_e2e_${journey.replace(/\W/g, '_')}_${Date.now()}`;
  await ensureDatabase(database);
  const mail = await startMailCatcher();
  const s3Dir = mkdtempSync(path.join(os.tmpdir(), 'loambook-e2e-s3-'));
  const s3 = new S3rver({
    port: 0,
    address: '127.0.0.1',
    silent: true,
    directory: s3Dir,
    configureBuckets: [{ name: 'loambook-e2e' }],
  });
  const s3Address = await s3.run();
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const stripe = await startStripeFake({
    port: 0,
    webhookUrl: `${baseUrl}/api/payments/webhook`,
    webhookSecret: STRIPE_WEBHOOK_SECRET,
    // A delivery that finds the server restarting is tried again soon.
    retryBaseMs: 250,
  });
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    PGPORT: String(pg.port),
    PGDATABASE: database,
    PORT: String(port),
    PUBLIC_URL: baseUrl,
    SMTP_PORT: String(mail.port),
    LOG_LEVEL: 'warn',
    SCRYPT_LOG_N: '12',
    S3_ENDPOINT: `http://127.0.0.1:${s3Address.port}`,
    S3_BUCKET: 'loambook-e2e',
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    STRIPE_SECRET_KEY,
    STRIPE_WEBHOOK_SECRET,
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(stripe.port),
    STRIPE_API_PROTOCOL: 'http',
    // The journeys run the commission earning check on request (the statements screen's button), never
    // on pg-boss's clock, so that what a journey sees does not depend on when a scheduled run falls.
    COMMISSIONS_SCHEDULER: 'off',
  };
  const db = spawnSync(process.execPath, ['backend/dist/backend/src/cli/db.js', 'migrate', 'seed'], {
    cwd: REPO,
    env,
    encoding: 'utf8',
  });
  if (db.status !== 0) throw new Error(`migrate/seed failed: ${db.stdout}${db.stderr}`);

  const startServer = async (serverEnv: NodeJS.ProcessEnv): Promise<ChildProcess> => {
    const child = spawn(process.execPath, ['backend/dist/backend/src/main.js'], {
      cwd: REPO,
      env: serverEnv,
      stdio: ['ignore', 'inherit', 'inherit'],
    });
    await waitForHealth(baseUrl, child);
    return child;
  };
  const stopServer = async (child: ChildProcess): Promise<void> => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    const exited = new Promise((r) => child.once('exit', r));
    child.kill('SIGTERM');
    await exited;
  };
  let server = await startServer(env);

  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: CHROMIUM_ARGS,
  });
  const shotsDir = path.join(REPO, 'frontend', 'e2e', '.screenshots', journey);
  mkdirSync(shotsDir, { recursive: true });
  // This run's screenshots only: numbering moves when a journey gains a step.
  for (const old of readdirSync(shotsDir)) if (old.endsWith('.png')) rmSync(path.join(shotsDir, old));
  let n = 0;

  const stack: Stack = {
    baseUrl,
    database,
    mail,
    stripe,
    browser,
    shotsDir,
    newContext: (viewport = DESKTOP, options = {}) =>
      browser.newContext({ ...options, viewport, baseURL: baseUrl }),
    async shot(page, name) {
      n += 1;
      await page.screenshot({
        path: path.join(shotsDir, `${String(n).padStart(2, '0')}-${name}.png`),
        fullPage: true,
      });
    },
    async restartServer(patch) {
      await stopServer(server);
      const next: NodeJS.ProcessEnv = { ...env };
      for (const [key, value] of Object.entries(patch)) {
        if (value === undefined) delete next[key];
        else next[key] = value;
      }
      server = await startServer(next);
    },
    async close() {
      await browser.close().catch(() => undefined);
      await stopServer(server);
      await stripe.close().catch(() => undefined);
      await mail.close().catch(() => undefined);
      await s3.close().catch(() => undefined);
      rmSync(s3Dir, { recursive: true, force: true });
      if (!process.env.KEEP_TEST_DB) await dropDatabase(database);
      if (running === stack) running = null;
      console.log(`Screenshots of the "${journey}" journey: ${shotsDir}`);
    },
  };
  running = stack;
  return stack;
}

async function waitForHealth(baseUrl: string, server: ChildProcess): Promise<void> {
  for (let i = 0; i < 120; i++) {
    if (server.exitCode !== null) throw new Error(`the server exited with ${server.exitCode}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('the server did not become healthy');
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}
