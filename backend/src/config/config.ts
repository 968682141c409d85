/**
 * Every setting comes from the environment, with defaults that work on a developer's machine.
 * Read once at start-up; the rest of the code receives the typed object.
 */
export interface AppConfig {
  port: number;
  host: string;
  /** The address people open; links in e-mails point here. */
  publicUrl: string;
  database: { host: string; port: number; user: string; password: string; database: string };
  jwt: { secret: string; expiresInSeconds: number };
  loginThrottle: { limit: number; ttlMs: number };
  invitationTtlHours: number;
  /** Days a proposal's signing link works (SIGNING_LINK_TTL_DAYS, default 14). */
  signingLinkTtlDays: number;
  /** A fixed "now" for the signing clock: TEST_NOW, honoured only when NODE_ENV=test. */
  testNow: Date | null;
  mail: { host: string; port: number; from: string };
  /** File storage through the S3 API (s3rver locally; any S3-compatible service in production). */
  s3: {
    endpoint: string;
    bucket: string;
    region: string;
    accessKeyId: string;
    secretAccessKey: string;
    forcePathStyle: boolean;
  };
  logLevel: string;
  /** Where the built screens are; served by the same process when present. */
  frontendDist: string | null;
  /**
   * The card processor (Stripe, through its SDK). No host: the real service. A host, port and protocol:
   * a stand-in such as the local fake (backend/fakes/stripe). No secret key: payments are switched off.
   */
  stripe: {
    secretKey: string | null;
    webhookSecret: string | null;
    apiHost: string | null;
    apiPort: number | null;
    apiProtocol: 'http' | 'https' | null;
  };
  /**
   * The commission earning check, scheduled with pg-boss on the same PostgreSQL (schema pgboss).
   * COMMISSIONS_SCHEDULER=off leaves it out (the ordinary API tests); COMMISSIONS_EARNING_CRON is when
   * it runs (UTC, default every 15 minutes); COMMISSIONS_SCHEDULER_POLL_SECONDS is how often pg-boss looks
   * for due schedules and jobs (1–45, default 30; the tests use 1).
   */
  commissions: { scheduler: boolean; earningCron: string; pollSeconds: number };
}

function int(value: string | undefined, fallback: number, name: string): number {
  if (value === undefined || value === '') return fallback;
  if (!/^\d+$/.test(value)) throw new Error(`${name} must be a whole number, got "${value}"`);
  return Number(value);
}

function protocol(value: string | undefined): 'http' | 'https' | null {
  if (value === undefined || value === '') return null;
  if (value !== 'http' && value !== 'https')
    throw new Error(`STRIPE_API_PROTOCOL must be http or https, got "${value}"`);
  return value;
}

function onOff(value: string | undefined, fallback: boolean, name: string): boolean {
  if (value === undefined || value === '') return fallback;
  if (value === 'on') return true;
  if (value === 'off') return false;
  throw new Error(`${name} must be on or off, got "${value}"`);
}

function testNow(env: NodeJS.ProcessEnv): Date | null {
  if (env.NODE_ENV !== 'test' || !env.TEST_NOW) return null;
  const at = new Date(env.TEST_NOW);
  if (Number.isNaN(at.getTime()))
    throw new Error(`TEST_NOW must be an ISO-8601 instant, got "${env.TEST_NOW}"`);
  return at;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const port = int(env.PORT, 3000, 'PORT');
  const host = env.HOST ?? '127.0.0.1';
  const secret =
    env.JWT_SECRET ?? (env.NODE_ENV === 'production' ? '' : 'loambook-development-secret-change-me');
  if (secret.length < 16) throw new Error('JWT_SECRET must be set to at least 16 characters in production');
  return {
    port,
    host,
    publicUrl: (env.PUBLIC_URL ?? `http://${host}:${port}`).replace(/\/$/, ''),
    database: {
      host: env.PGHOST ?? '127.0.0.1',
      port: int(env.PGPORT, 54329, 'PGPORT'),
      user: env.PGUSER ?? 'loambook',
      password: env.PGPASSWORD ?? 'loambook-local-only',
      database: env.PGDATABASE ?? 'loambook',
    },
    jwt: { secret, expiresInSeconds: int(env.JWT_EXPIRES_IN_SECONDS, 8 * 3600, 'JWT_EXPIRES_IN_SECONDS') },
    loginThrottle: {
      limit: int(env.LOGIN_THROTTLE_LIMIT, 10, 'LOGIN_THROTTLE_LIMIT'),
      ttlMs: int(env.LOGIN_THROTTLE_TTL_MS, 15 * 60 * 1000, 'LOGIN_THROTTLE_TTL_MS'),
    },
    invitationTtlHours: int(env.INVITATION_TTL_HOURS, 72, 'INVITATION_TTL_HOURS'),
    signingLinkTtlDays: int(env.SIGNING_LINK_TTL_DAYS, 14, 'SIGNING_LINK_TTL_DAYS'),
    testNow: testNow(env),
    mail: {
      host: env.SMTP_HOST ?? '127.0.0.1',
      port: int(env.SMTP_PORT, 1025, 'SMTP_PORT'),
      from: env.MAIL_FROM ?? 'Loambook <no-reply@loambook.example.com>',
    },
    s3: {
      // The local s3rver that `npm start` launches (scripts/lib/fakes.mjs, port S3_PORT), with s3rver's own keys.
      endpoint: env.S3_ENDPOINT ?? `http://127.0.0.1:${int(env.S3_PORT, 4569, 'S3_PORT')}`,
      bucket: env.S3_BUCKET ?? 'loambook-files',
      region: env.S3_REGION ?? 'us-east-1',
      accessKeyId: env.S3_ACCESS_KEY_ID ?? 'S3RVER',
      secretAccessKey: env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
      // Path-style URLs (endpoint/bucket/key) work with s3rver and every S3-compatible service.
      forcePathStyle: env.S3_FORCE_PATH_STYLE !== 'false',
    },
    logLevel: env.LOG_LEVEL ?? 'info',
    frontendDist: env.FRONTEND_DIST === '' ? null : (env.FRONTEND_DIST ?? null),
    stripe: {
      secretKey: env.STRIPE_SECRET_KEY || null,
      webhookSecret: env.STRIPE_WEBHOOK_SECRET || null,
      apiHost: env.STRIPE_API_HOST || null,
      apiPort: env.STRIPE_API_PORT ? int(env.STRIPE_API_PORT, 0, 'STRIPE_API_PORT') : null,
      apiProtocol: protocol(env.STRIPE_API_PROTOCOL),
    },
    commissions: {
      scheduler: onOff(env.COMMISSIONS_SCHEDULER, true, 'COMMISSIONS_SCHEDULER'),
      earningCron: env.COMMISSIONS_EARNING_CRON || '*/15 * * * *',
      pollSeconds: int(env.COMMISSIONS_SCHEDULER_POLL_SECONDS, 30, 'COMMISSIONS_SCHEDULER_POLL_SECONDS'),
    },
  };
}

export const APP_CONFIG = Symbol('APP_CONFIG');
