// Pipeline list API over 200k leads in 10 branches with 50 salespeople, at concurrency 16 (autocannon),
// against the same SQL run directly through pg with the same concurrency in the same run, the two taking
// turns (--rounds) so that other work on the machine weighs on both alike.
// Target (issue #3): API p95 ≤ 2 × the direct-SQL p95.
// Usage: npm run build && node backend/bench/pipeline.bench.mjs [--leads 200000] [--seconds 15]
//   [--rounds 5] [--pin] [--reuse] [--only 1,3]
//
// Fairness: the baseline replays the very SQL the repositories send for one request (captured from
// them below): the user look-up, then the page (with its stage totals when those come from the
// trigger-kept table) and, for filters that aggregate the leads, the totals beside it. It runs from 16
// loops through a pg pool as large as the app's own (knex-config.ts), so it may not queue less at the
// database than the API does. The machine this was written on has 2 cores, shared by PostgreSQL, the
// server and the load generator; --pin puts the server on CPU 1 and this process on CPU 0 (taskset).
import { execFileSync } from 'node:child_process';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import pgPkg from 'pg';
import { closedLoop, DIST, dropDatabase, freshDatabase, percentile, pg, startServer } from './lib.mjs';

const require = createRequire(import.meta.url);
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const LEADS = arg('leads', 200_000);
const SECONDS = arg('seconds', 15);
const CONCURRENCY = 16;
/** The measured seconds are split into this many turns of baseline then API (--rounds). */
const ROUNDS = arg('rounds', 5);
const DB = 'loambook_bench_pipeline';

// --reuse seeds only when needed and keeps the database afterwards (as KEEP_BENCH_DB=1 does), for repeated runs.
const REUSE = process.argv.includes('--reuse');
const knex = await freshDatabase(DB, { reuse: REUSE });
const seeded = Number((await knex.raw('select count(*) as n from leads')).rows[0].n);
if (REUSE && seeded === LEADS) console.log(`Reusing ${DB} with ${seeded} leads`);
else await seed();

async function seed() {
  if (seeded) throw new Error(`${DB} holds ${seeded} leads, not ${LEADS}: run without --reuse`);
  console.log(`Seeding ${LEADS} leads in 10 branches with 50 salespeople …`);
  const { hashPassword } = require(path.join(DIST, 'auth', 'password-hash.js'));
  process.env.SCRYPT_LOG_N = '12';
  const hash = await hashPassword('benchmark password');
  await knex.raw(`
  insert into branches (code, name, address_line1, city, state, postal_code, timezone, margin_floor_pct,
    discount_limit_salesperson_pct, discount_limit_manager_pct, sales_tax_treatment)
  select 'B' || lpad(i::text, 2, '0'), 'Bench ' || i, i || ' Bench Road', 'Benchton', 'FL', '32000',
    'America/New_York', 35, 10, 20, 'materials_cost'
  from generate_series(1, 10) i`);
  await knex.raw(
    `
  insert into users (name, email, role, password_hash)
  select 'Seller ' || i, 'seller' || i || '@bench.test', 'salesperson', ? from generate_series(1, 50) i`,
    [hash],
  );
  await knex.raw(`
  insert into user_branches (user_id, branch_id)
  select u.id, b.id from users u
  join branches b on b.code = 'B' || lpad((((substring(u.email from 'seller([0-9]+)')::int - 1) % 10) + 1)::text, 2, '0')`);
  await knex.raw(
    `insert into users (name, email, role, password_hash) values ('Bench Manager', 'manager@bench.test', 'branch_manager', ?)`,
    [hash],
  );
  await knex.raw(
    `insert into user_branches (user_id, branch_id) select u.id, b.id from users u, branches b where u.email = 'manager@bench.test' and b.code = 'B01'`,
  );
  await knex.raw(
    `insert into users (name, email, role, password_hash) values ('Bench Owner', 'owner@bench.test', 'owner', ?)`,
    [hash],
  );
  await knex.raw(
    `
  with sellers as (select ub.user_id, ub.branch_id, row_number() over (order by ub.user_id) - 1 as k from user_branches ub
                   join users u on u.id = ub.user_id where u.role = 'salesperson')
  insert into leads (branch_id, salesperson_id, homeowner_name, phone_primary, email, address_line1, city, state,
    postal_code, stage, lost_reason, stage_changed_at, created_at, value)
  select s.branch_id, s.user_id, 'Homeowner ' || g, '555-01' || lpad((g % 100)::text, 2, '0'), 'h' || g || '@example.com',
    g || ' Clay Street', 'Benchton', 'FL', lpad((32000 + g % 900)::text, 5, '0'),
    (array['new','inspection_booked','inspected','proposal_sent','contract_signed','deposit_received','scheduled',
           'in_progress','completed','paid_in_full','lost'])[1 + g % 11],
    case when g % 11 = 10 then 'Chose another contractor' end,
    now() - make_interval(hours => g % 5000), now() - make_interval(hours => g % 9000 + 24),
    case when g % 11 >= 3 then ((g * 37) % 40000 + 2500)::numeric(14,2) else 0 end
  from generate_series(1, ?) g join sellers s on s.k = g % 50`,
    [LEADS],
  );
  // What autovacuum would have done by the time an office uses it: statistics and the visibility map.
  await knex.raw('vacuum analyze');
}

// --pin: the server on CPU 1, this process (autocannon, and the pg client of the baseline) on CPU 0, so
// the load generator cannot take the server's core; PostgreSQL's backends are left to the scheduler.
const PIN = process.argv.includes('--pin');
if (PIN) execFileSync('taskset', ['-cp', '0', String(process.pid)], { stdio: 'ignore' });
const server = await startServer(DB, {}, { cpus: PIN ? '1' : undefined });
const results = {};
try {
  const login = async (email) => {
    const r = await fetch(`${server.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email, password: 'benchmark password' }),
    });
    return (await r.json()).accessToken;
  };
  const {
    rows: [b01],
  } = await knex.raw(`select id from branches where code = 'B01'`);
  const scenarios = [
    {
      name: 'manager, own branch (20k leads), default sort, page 1',
      email: 'manager@bench.test',
      qs: `branchId=${b01.id}`,
      scope: { branchIds: [b01.id], salespersonId: null },
      filter: { branchId: b01.id },
    },
    {
      name: 'owner, all branches (200k leads), proposals sent, by value',
      email: 'owner@bench.test',
      qs: 'stage=proposal_sent&sort=value&order=desc',
      scope: { branchIds: null, salespersonId: null },
      filter: { stages: ['proposal_sent'], sort: 'value', order: 'desc' },
    },
    {
      name: 'owner, all branches, search by name',
      email: 'owner@bench.test',
      qs: 'q=homeowner%2012345',
      scope: { branchIds: null, salespersonId: null },
      filter: { q: 'homeowner 12345' },
    },
  ];

  // The same SQL the API runs, captured from the repository itself, then replayed through pg.
  const { LeadsRepository } = require(path.join(DIST, 'leads', 'leads.repository.js'));
  const { AuthRepository } = require(path.join(DIST, 'auth', 'auth.repository.js'));
  // As many connections as the app's own pool holds: the baseline may not queue less at the database
  // than the API does (16 concurrent requests share the app's connections too).
  const { knexConfig } = require(path.join(DIST, 'database', 'knex-config.js'));
  const APP_POOL = knexConfig({}).pool.max;
  const pool = new pgPkg.Pool({
    host: pg.host,
    port: pg.port,
    user: pg.user,
    password: pg.password,
    database: DB,
    max: APP_POOL,
  });
  console.log(
    `Baseline pool: ${APP_POOL} connections (the app's); ${PIN ? 'pinned: server CPU 1, load CPU 0' : 'not pinned'}`,
  );

  // --only 1,3 runs some scenarios (numbered from 1), for quicker rounds while tuning.
  const only = process.argv.includes('--only')
    ? process.argv[process.argv.indexOf('--only') + 1].split(',').map(Number)
    : null;
  for (const [n, s] of scenarios.entries()) {
    if (only && !only.includes(n + 1)) continue;
    const token = await login(s.email);
    // Every request first looks its user up (the token must still match an active account), then runs
    // what the repository sends: one statement (page and stored totals), or the page beside an aggregate
    // of the totals for filters the stored totals cannot answer. The baseline sends the same, the same way.
    const capture = async (work) => {
      const sent = [];
      const onQuery = (q) => sent.push({ sql: knex.client.positionBindings(q.sql), bindings: q.bindings });
      knex.on('query', onQuery);
      try {
        await work();
      } finally {
        knex.off('query', onQuery);
      }
      return sent;
    };
    const {
      rows: [me],
    } = await knex.raw('select id from users where email = ?', [s.email]);
    // The account check sends its statement on a pooled connection, past knex's query events, and says
    // which (a build from before that (BENCH_DIST) read the account through knex: captured instead).
    const auth = AuthRepository.sessionRowStatement
      ? [AuthRepository.sessionRowStatement(me.id)]
      : await capture(() => new AuthRepository(knex).findById(me.id));
    const captured = await capture(() =>
      new LeadsRepository(knex).pipeline(s.scope, {
        sort: 'daysInStage',
        order: 'asc',
        limit: 25,
        offset: 0,
        ...s.filter,
      }),
    );
    const sameSql = async () => {
      for (const q of auth) await pool.query(q.sql, q.bindings);
      await Promise.all(captured.map((q) => pool.query(q.sql, q.bindings)));
    };

    const apiRound = async (seconds) => {
      const latencies = [];
      const instance = autocannon({
        url: `${server.url}/api/leads?${s.qs}`,
        connections: CONCURRENCY,
        duration: seconds,
        headers: { authorization: `Bearer ${token}` },
      });
      // Every response time, so the p95 is exact rather than read off autocannon's fixed percentiles.
      instance.on('response', (_client, _status, _bytes, ms) => latencies.push(ms));
      const api = await instance;
      if (api.non2xx) throw new Error(`${api.non2xx} non-2xx answers from the API`);
      return latencies;
    };

    // Warm both paths, then take turns: ROUNDS × (baseline, API), so a change in what else the machine
    // is doing falls on both sides alike rather than on whichever happened to run second.
    for (let i = 0; i < 20; i++) await sameSql();
    await apiRound(1);
    const slice = Math.max(1, Math.round(SECONDS / ROUNDS));
    const direct = [];
    const apiLatencies = [];
    // Each round's own figures too: the median over rounds is less swayed by one noisy slice.
    const perRound = [];
    for (let round = 0; round < ROUNDS; round++) {
      const d = await closedLoop(sameSql, { concurrency: CONCURRENCY, seconds: slice });
      const a = (await apiRound(slice)).sort((x, y) => x - y);
      direct.push(...d);
      apiLatencies.push(...a);
      perRound.push({
        directP50: percentile(d, 50),
        directP95: percentile(d, 95),
        apiP50: percentile(a, 50),
        apiP95: percentile(a, 95),
        ratioP95: percentile(a, 95) / percentile(d, 95),
      });
    }
    direct.sort((a, b) => a - b);
    apiLatencies.sort((a, b) => a - b);
    const measured = slice * ROUNDS;
    const median = (xs) =>
      percentile(
        [...xs].sort((a, b) => a - b),
        50,
      );
    const r = {
      directP50: percentile(direct, 50),
      directP95: percentile(direct, 95),
      directRps: direct.length / measured,
      apiP50: percentile(apiLatencies, 50),
      apiP95: percentile(apiLatencies, 95),
      apiRps: apiLatencies.length / measured,
      medianRound: Object.fromEntries(
        ['directP50', 'directP95', 'apiP50', 'apiP95', 'ratioP95'].map((k) => [
          k,
          median(perRound.map((x) => x[k])),
        ]),
      ),
      loadAverage: os.loadavg()[0],
    };
    r.ratioP95 = r.apiP95 / r.directP95;
    results[s.name] = r;
    console.log(`\n${s.name}`);
    console.log(
      `  same SQL through pg:  p50 ${r.directP50.toFixed(1)} ms  p95 ${r.directP95.toFixed(1)} ms  ${r.directRps.toFixed(0)} req/s`,
    );
    console.log(
      `  API GET /api/leads: p50 ${r.apiP50.toFixed(1)} ms  p95 ${r.apiP95.toFixed(1)} ms  ${r.apiRps.toFixed(0)} req/s`,
    );
    console.log(
      `  p95 ratio API / SQL: ${r.ratioP95.toFixed(2)}  (target ≤ 2.00)  ${r.ratioP95 <= 2 ? 'MET' : 'NOT MET'}`,
    );
    const m = r.medianRound;
    console.log(
      `  median of ${ROUNDS} rounds: SQL p50 ${m.directP50.toFixed(1)} / p95 ${m.directP95.toFixed(1)} ms, ` +
        `API p50 ${m.apiP50.toFixed(1)} / p95 ${m.apiP95.toFixed(1)} ms, p95 ratio ${m.ratioP95.toFixed(2)}; ` +
        `per round ${perRound.map((x) => x.ratioP95.toFixed(2)).join(' ')}; load average ${r.loadAverage.toFixed(1)}`,
    );
  }
  await pool.end();
} finally {
  server.stop();
  await knex.destroy();
  if (!process.env.KEEP_BENCH_DB && !REUSE) await dropDatabase(DB);
}
