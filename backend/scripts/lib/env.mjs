// Settings shared by the start, stop, dev and test scripts. Everything can be overridden from the
// environment; the defaults keep every service on 127.0.0.1 and on non-standard ports.
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
export const STATE_DIR = process.env.LOAMBOOK_STATE_DIR ?? '/var/tmp/loambook';

export const pg = {
  host: '127.0.0.1',
  port: Number(process.env.PGPORT ?? 54329),
  user: process.env.PGUSER ?? 'loambook',
  password: process.env.PGPASSWORD ?? 'loambook-local-only',
  database: process.env.PGDATABASE ?? 'loambook',
  dataDir: process.env.LOAMBOOK_PGDATA ?? path.join(STATE_DIR, `pg-${process.env.PGPORT ?? 54329}`),
};

export const mail = {
  smtpPort: Number(process.env.SMTP_PORT ?? 1025),
  webPort: Number(process.env.MAILDEV_WEB_PORT ?? 1080),
};

export const s3 = {
  port: Number(process.env.S3_PORT ?? 4569),
  bucket: process.env.S3_BUCKET ?? 'loambook-files',
};

export const app = {
  port: Number(process.env.PORT ?? 3000),
};

// The local card-processor fake (backend/fakes/stripe): the app's SDK talks to it with these test keys,
// and it signs the webhooks it posts to the app with the local endpoint secret. Not real credentials.
export const stripe = {
  fakePort: Number(process.env.STRIPE_FAKE_PORT ?? 12111),
  secretKey: process.env.STRIPE_SECRET_KEY ?? 'sk_test_local_loambook',
  webhookSecret: process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_local_loambook_not_a_real_secret',
  webhookUrl: process.env.STRIPE_WEBHOOK_URL ?? `http://127.0.0.1:${app.port}/api/payments/webhook`,
  payoutIntervalMs: Number(process.env.PAYOUT_INTERVAL_MS ?? 300_000),
};

export function log(message) {
  console.log(`[loambook] ${message}`);
}
