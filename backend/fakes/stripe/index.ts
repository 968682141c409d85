// A local stand-in for the card processor (Stripe), for development and tests: the parts of its REST
// API the app uses, a hosted payment page, payouts, and signed webhook events delivered with retries.
// The app talks to it through the official SDK: new Stripe(key, { host: '127.0.0.1', port, protocol: 'http' }).
// Everything is kept in memory. See README.md beside this file for the API and the control endpoints.
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomBytes } from 'node:crypto';
import Stripe from 'stripe';
import { invalid } from './errors';
import { Processor, NO_REQUEST, type PayResult } from './processor';
import type { CardForm } from './page';
import { createHandler } from './server';
import { FakeState } from './state';
import type { Payout } from './types';
import { Deliverer, type DeliveryAttempt, type DeliverySettings, type FlushResult } from './webhooks';

export { signatureHeader } from './webhooks';
export { cardFee, formatMinor } from './money';
export { TEST_CARDS } from './cards';
export type { DeliveryAttempt, FlushResult, PayResult };
export type * from './types';

export interface StripeFakeOptions {
  /** 0 (the default) picks a free port. */
  port?: number;
  host?: '127.0.0.1';
  /** Where events are POSTed; none means events are recorded but not delivered. */
  webhookUrl?: string;
  /** The endpoint secret (whsec_…) that signs deliveries; a random one when not given. */
  webhookSecret?: string;
  /** Pay out everything not yet paid out every this many milliseconds; 0 or absent = only on request. */
  payoutIntervalMs?: number;
  /** First retry after this many ms, then doubling (default 1000). */
  retryBaseMs?: number;
  /** Attempts per delivery, the first included (default 8). */
  maxAttempts?: number;
  /** Seed of the shuffled delivery order (default 1). */
  seed?: number;
  /** Copies of each event delivered (default 1). */
  duplicate?: number;
  /** Deliver each batch in a seeded random order (default false). */
  shuffle?: boolean;
  /** Deliveries in flight at once (default 1: one after another). */
  concurrency?: number;
  /** Time allowed for one delivery attempt (default 10 s). */
  timeoutMs?: number;
  /** Start with delivery paused (events queue up until flushDeliveries() or resume). */
  paused?: boolean;
  /** Seconds added to the real clock for created, expiry and signature times (default 0). */
  clockOffsetSec?: number;
  /** The api_version stamped on events (default: the installed SDK's). */
  apiVersion?: string;
  /** A line per delivery and payout, e.g. console.log in the CLI (default: silent). */
  log?: (line: string) => void;
}

/** What POST /_fake/config and configure() accept: any of these, the rest unchanged. */
export interface StripeFakeConfig {
  webhookUrl: string | null;
  webhookSecret: string;
  duplicate: number;
  shuffle: boolean;
  seed: number;
  retryBaseMs: number;
  maxAttempts: number;
  concurrency: number;
  timeoutMs: number;
  paused: boolean;
  payoutIntervalMs: number;
  clockOffsetSec: number;
}

export interface StripeFake {
  /** http://127.0.0.1:<port> */
  url: string;
  port: number;
  close(): Promise<void>;
  /** Sweeps everything not yet paid out into a payout per currency (none when nothing is due). */
  payoutNow(): Payout[];
  /** Delivers every queued event now (even while paused), waiting out retries until the queue is empty. */
  flushDeliveries(timeoutMs?: number): Promise<FlushResult>;
  configure(patch: Partial<StripeFakeConfig>): StripeFakeConfig;
  readonly config: StripeFakeConfig;
  /** Pays an open Checkout Session without the browser (card number, or the whole form). */
  pay(sessionId: string, card: string | Partial<CardForm>): PayResult;
  /** Every delivery attempt so far, oldest first. */
  deliveries: DeliveryAttempt[];
  /** Forgets every object, event, queued delivery and log entry (after an attempt on the wire ends); the configuration stays. */
  reset(): Promise<void>;
  /** The objects in memory, by id in creation order (read them; change them through the API). */
  state: FakeState;
}

const positiveInt = (key: string, v: unknown, min = 1) => {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min)
    throw invalid(key, `${key} must be an integer ≥ ${min}.`);
  return v;
};

function checkPatch(patch: Record<string, unknown>): Partial<StripeFakeConfig> {
  const out: Record<string, unknown> = {};
  for (const [key, v] of Object.entries(patch)) {
    if (v === undefined) continue;
    switch (key) {
      case 'webhookUrl':
        if (v !== null && (typeof v !== 'string' || !/^https?:\/\//.test(v)))
          throw invalid(key, 'webhookUrl must be an http(s) URL or null.');
        break;
      case 'webhookSecret':
        if (typeof v !== 'string' || !v.startsWith('whsec_'))
          throw invalid(key, 'webhookSecret must start with whsec_.');
        break;
      case 'shuffle':
      case 'paused':
        if (typeof v !== 'boolean') throw invalid(key, `${key} must be true or false.`);
        break;
      case 'duplicate':
      case 'maxAttempts':
      case 'concurrency':
        positiveInt(key, v);
        break;
      case 'seed':
      case 'retryBaseMs':
      case 'timeoutMs':
      case 'payoutIntervalMs':
        positiveInt(key, v, 0);
        break;
      case 'clockOffsetSec':
        if (typeof v !== 'number' || !Number.isInteger(v))
          throw invalid(key, 'clockOffsetSec must be an integer.');
        break;
      default:
        throw invalid(key, `Unknown setting ${key}.`);
    }
    out[key] = v;
  }
  return out as Partial<StripeFakeConfig>;
}

export async function startStripeFake(options: StripeFakeOptions = {}): Promise<StripeFake> {
  const log = options.log ?? (() => {});
  const apiVersion = options.apiVersion ?? Stripe.API_VERSION;
  const config: StripeFakeConfig = {
    webhookUrl: options.webhookUrl ?? null,
    webhookSecret: options.webhookSecret ?? `whsec_${randomBytes(24).toString('hex')}`,
    duplicate: options.duplicate ?? 1,
    shuffle: options.shuffle ?? false,
    seed: options.seed ?? 1,
    retryBaseMs: options.retryBaseMs ?? 1000,
    maxAttempts: options.maxAttempts ?? 8,
    concurrency: options.concurrency ?? 1,
    timeoutMs: options.timeoutMs ?? 10_000,
    paused: options.paused ?? false,
    payoutIntervalMs: options.payoutIntervalMs ?? 0,
    clockOffsetSec: options.clockOffsetSec ?? 0,
  };
  checkPatch({ ...config });
  const now = () => Math.floor(Date.now() / 1000) + config.clockOffsetSec;
  const state = new FakeState();
  const deliverer = new Deliverer(
    (): DeliverySettings => config,
    now,
    (event) => {
      event.pending_webhooks = 0;
    },
    log,
  );
  let baseUrl = '';
  const processor = new Processor(
    state,
    () => baseUrl,
    now,
    apiVersion,
    (event) => deliverer.enqueue(event),
  );

  let payoutTimer: NodeJS.Timeout | null = null;
  const payoutNow = () => {
    const payouts = processor.payOut(NO_REQUEST);
    for (const p of payouts) log(`payout ${p.id} ${p.amount} ${p.currency}`);
    return payouts;
  };
  const schedulePayouts = () => {
    if (payoutTimer) clearInterval(payoutTimer);
    payoutTimer = config.payoutIntervalMs > 0 ? setInterval(payoutNow, config.payoutIntervalMs) : null;
    payoutTimer?.unref();
  };

  const configure = (patch: Partial<StripeFakeConfig>): StripeFakeConfig => {
    const checked = checkPatch(patch as Record<string, unknown>);
    Object.assign(config, checked);
    if (checked.seed !== undefined) deliverer.reseed(checked.seed);
    if (checked.payoutIntervalMs !== undefined) schedulePayouts();
    deliverer.wake();
    return { ...config };
  };
  const reset = async () => {
    state.clear();
    processor.clear();
    await deliverer.clear();
    deliverer.reseed(config.seed);
  };
  const pay = (sessionId: string, card: string | Partial<CardForm>) =>
    processor.pay(
      sessionId,
      typeof card === 'string'
        ? {
            number: card,
            expiry: `12 / ${new Date(now() * 1000).getUTCFullYear() + 3}`,
            cvc: '123',
            name: 'Test Cardholder',
          }
        : card,
    );

  const handler = createHandler(
    processor,
    state,
    {
      payoutNow,
      flushDeliveries: (timeoutMs) => deliverer.flush(timeoutMs),
      configure: (patch) => configure(patch as Partial<StripeFakeConfig>),
      config: () => ({ ...config }),
      deliveries: (eventId) => deliverer.log.filter((d) => !eventId || d.eventId === eventId),
      redeliver: (eventIds) => {
        const ids = eventIds ?? [...deliverer.gaveUp];
        const events = ids.map((id) => state.get(state.events, 'event', id));
        return { queued: deliverer.redeliver(events) };
      },
      reset,
    },
    apiVersion,
  );
  const server = createServer((req, res) => void handler(req, res));
  server.keepAliveTimeout = 5_000;
  const host = options.host ?? '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  baseUrl = `http://${host}:${port}`;
  schedulePayouts();

  return {
    url: baseUrl,
    port,
    state,
    get config() {
      return { ...config };
    },
    get deliveries() {
      return deliverer.log;
    },
    payoutNow,
    flushDeliveries: (timeoutMs) => deliverer.flush(timeoutMs),
    configure,
    pay,
    reset,
    async close() {
      if (payoutTimer) clearInterval(payoutTimer);
      await deliverer.close();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    },
  };
}
