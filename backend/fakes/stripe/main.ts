// The fake as a process of its own, for npm start / npm run dev (backend/scripts/lib/fakes.mjs starts it
// detached): node backend/dist/backend/fakes/stripe/main.js (arguments are ignored; fakes.mjs passes a label)
//   STRIPE_FAKE_PORT (12111), STRIPE_WEBHOOK_URL, STRIPE_WEBHOOK_SECRET, PAYOUT_INTERVAL_MS (0 = only on
//   request), STRIPE_FAKE_RETRY_BASE_MS (1000), STRIPE_FAKE_MAX_ATTEMPTS (8).
import { startStripeFake } from './index';

function intFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  if (!/^\d+$/.test(raw)) throw new Error(`${name} must be a whole number (got ${raw})`);
  return Number(raw);
}

async function main(): Promise<void> {
  const fake = await startStripeFake({
    port: intFromEnv('STRIPE_FAKE_PORT', 12111),
    host: '127.0.0.1',
    webhookUrl: process.env.STRIPE_WEBHOOK_URL || undefined,
    webhookSecret: process.env.STRIPE_WEBHOOK_SECRET || undefined,
    payoutIntervalMs: intFromEnv('PAYOUT_INTERVAL_MS', 0),
    retryBaseMs: intFromEnv('STRIPE_FAKE_RETRY_BASE_MS', 1000),
    maxAttempts: intFromEnv('STRIPE_FAKE_MAX_ATTEMPTS', 8),
    log: (line) => console.log(`[stripe-fake] ${new Date().toISOString()} ${line}`),
  });
  const { webhookUrl, payoutIntervalMs } = fake.config;
  console.log(
    `[stripe-fake] listening on ${fake.url} (webhooks → ${webhookUrl ?? 'none'}; payouts ${payoutIntervalMs ? `every ${payoutIntervalMs} ms` : 'on request'})`,
  );
  const stop = () => {
    void fake.close().then(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
