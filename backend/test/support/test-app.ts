import { randomBytes } from 'node:crypto';
import type { NestExpressApplication } from '@nestjs/platform-express';
import type { Knex } from 'knex';
import request from 'supertest';
import { inject } from 'vitest';
import type { Role } from '@loambook/common';
import { createApp } from '../../src/app.factory';
import { loadConfig } from '../../src/config/config';
import { KNEX } from '../../src/database/database.module';
import { hashPassword } from '../../src/auth/password-hash';
import { pg } from '../../scripts/lib/env.mjs';
import { startMailCatcher, type MailCatcher } from './mail-catcher';

export const PASSWORD = 'correct horse battery';
export const PUBLIC_URL = 'http://loambook.test';

export interface TestApp {
  app: NestExpressApplication;
  http: ReturnType<typeof request>;
  db: Knex;
  mail: MailCatcher;
  close(): Promise<void>;
}

/** The whole application against the run's database, with mail caught in-process. */
export async function startTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const mail = await startMailCatcher();
  const config = loadConfig({
    PGHOST: pg.host,
    PGPORT: String(pg.port),
    PGUSER: pg.user,
    PGPASSWORD: pg.password,
    PGDATABASE: inject('databaseName'),
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(mail.port),
    PUBLIC_URL,
    LOG_LEVEL: 'silent',
    FRONTEND_DIST: '',
    JWT_SECRET: 'test-secret-of-enough-length',
    // The pg-boss commission schedule stays off in test apps unless a test turns it on (commissions tests).
    COMMISSIONS_SCHEDULER: 'off',
    ...env,
  });
  const app = await createApp(config);
  await app.init();
  const db = app.get<Knex>(KNEX);
  return {
    app,
    http: request(app.getHttpServer()),
    db,
    mail,
    async close() {
      await app.close();
      await mail.close();
    },
  };
}

const unique = () => randomBytes(4).toString('hex');

/** A branch code nobody else in this run has: two letters then digits/letters. */
export function uniqueCode(): string {
  const letters = 'ABCDEFGHJKLMNPQRSTUVWXYZ';
  const bytes = randomBytes(7);
  return Array.from(bytes, (b, i) =>
    i < 2 ? letters[b % letters.length] : (b % 36).toString(36).toUpperCase(),
  ).join('');
}

export function branchInput(overrides: Record<string, unknown> = {}) {
  return {
    code: uniqueCode(),
    name: 'Test Branch',
    addressLine1: '1 Clayfield Row',
    city: 'Testerton',
    state: 'FL',
    postalCode: '32000',
    phone: '555-0142',
    timezone: 'America/New_York',
    marginFloorPct: '35',
    discountAuthority: { salesperson: '10', branch_manager: '20' },
    salesTaxTreatment: 'materials_cost',
    salesTaxRatePct: '6',
    ...overrides,
  };
}

export async function makeBranch(db: Knex, overrides: Record<string, unknown> = {}): Promise<string> {
  const b = branchInput(overrides);
  const [row] = await db('branches')
    .insert({
      code: b.code,
      name: b.name,
      address_line1: b.addressLine1,
      city: b.city,
      state: b.state,
      postal_code: b.postalCode,
      timezone: b.timezone,
      margin_floor_pct: b.marginFloorPct,
      discount_limit_salesperson_pct: '10',
      discount_limit_manager_pct: '20',
      sales_tax_treatment: b.salesTaxTreatment,
    })
    .returning('id');
  return row.id;
}

export interface TestUser {
  id: string;
  email: string;
  role: Role;
  branchIds: string[];
}

export async function makeUser(
  db: Knex,
  role: Role,
  branchIds: string[] = [],
  opts: { active?: boolean; password?: string | null; name?: string } = {},
): Promise<TestUser> {
  const email = `${role}.${unique()}@loambook.test`;
  const password = opts.password === undefined ? PASSWORD : opts.password;
  const [row] = await db('users')
    .insert({
      name: opts.name ?? `Test ${role}`,
      email,
      role,
      active: opts.active ?? true,
      password_hash: password === null ? null : await hashPassword(password),
    })
    .returning('id');
  for (const branchId of branchIds)
    await db('user_branches').insert({ user_id: row.id, branch_id: branchId });
  return { id: row.id, email, role, branchIds };
}

export async function tokenFor(t: TestApp, user: { email: string }, password = PASSWORD): Promise<string> {
  const res = await t.http.post('/api/auth/login').send({ email: user.email, password });
  if (res.status !== 200)
    throw new Error(`login failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.accessToken;
}
