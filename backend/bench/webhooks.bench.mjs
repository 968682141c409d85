// Webhook ingestion of the compiled server: unique and duplicate signed events per second, against pgbench
// with the same concurrency in the same run, running two SQL transactions:
//   - "inserts": the insert into webhook_events and the posting inserts (journal entry, its three lines, the
//     payment with its timeline row) — the transaction's writes alone, one statement each;
//   - "app's statements": every statement the app runs for a posting event, in order (the duplicate lookup,
//     the event claim, the contract locked with the charge check, LedgerService.post's one statement, the
//     payment with its timeline row, and for a balance payment on a lead still at contract signed the
//     lead's look at moving on; built by the app's own code or captured from its repositories).
// The posting events and the "app's statements" runs take turns (--rounds), and the ratio is the median of
// the rounds' ratios, so that other work on the machine weighs on both sides alike.
// Targets (issue #5): unique posting events ≥ 40% of the pgbench rate; a duplicate costs ≤ 1 ms (the
// server's own time after the signature check, from its Server-Timing header, and the whole request).
//
// The card-processor fake runs in this process (the server's SDK fetches the charge's balance transaction
// from it, as it would from the real service); the events are taken from the fake and posted here, signed
// with the endpoint secret, so that delivery is not the bottleneck being measured.
//   - posting events: one charge.succeeded per charge, each new: records and posts the payment;
//   - natural mix: what the processor sends for each payment (payment_intent.created, charge.succeeded,
//     payment_intent.succeeded, checkout.session.completed; only one of them posts);
//   - duplicates: the posting events again: each answers 200 from the one indexed insert.
// Usage: npm run build && node backend/bench/webhooks.bench.mjs [--charges 3000] [--concurrency 8] [--seconds 10]
//   [--rounds 5]
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { DIST, dropDatabase, freshDatabase, percentile, pg, startServer } from './lib.mjs';
import { REPO } from '../scripts/lib/env.mjs';

const require = createRequire(import.meta.url);
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const CHARGES = arg('charges', 3000);
const CONCURRENCY = arg('concurrency', 8);
const SECONDS = arg('seconds', 10);
/** The posting events and the pgbench seconds are split into this many turns of pgbench then app. */
const ROUNDS = arg('rounds', 5);
const CONTRACTS = 40;
const DB = 'loambook_bench_webhooks';
const SECRET = 'whsec_bench_local_only_0123456789abcdef';

const fakeModule = path.join(REPO, 'backend/dist/backend/fakes/stripe/index.js');
if (!existsSync(fakeModule))
  throw new Error('Build first: npm run build (the fake is compiled with the backend)');
const { startStripeFake, signatureHeader } = require(fakeModule);
const Stripe = require('stripe');

function findPgbench() {
  const onPath = spawnSync('sh', ['-c', 'command -v pgbench'], { encoding: 'utf8' }).stdout.trim();
  const root = '/usr/lib/postgresql';
  const versions = existsSync(root) ? readdirSync(root).sort((a, b) => Number(b) - Number(a)) : [];
  const found =
    versions.map((v) => path.join(root, v, 'bin', 'pgbench')).find((f) => existsSync(f)) ?? (onPath || null);
  if (!found) throw new Error('pgbench not found (apt-get install postgresql-contrib or postgresql-client)');
  return found;
}

// ---- data: a branch, 40 signed contracts (written straight to the tables) ------------------------------
const knex = await freshDatabase(DB);
const {
  rows: [branch],
} = await knex.raw(`insert into branches (code, name, address_line1, city, state, postal_code, timezone,
    margin_floor_pct, discount_limit_salesperson_pct, discount_limit_manager_pct, sales_tax_treatment)
  values ('WB01', 'Bench Webhooks', '1 Bench Road', 'Benchton', 'FL', '32000', 'America/New_York', 35, 10, 20,
    'materials_cost') returning id`);
const {
  rows: [seller],
} =
  await knex.raw(`insert into users (name, email, role) values ('Bench Seller', 'seller@bench.test', 'salesperson')
  returning id`);
await knex.raw('insert into user_branches (user_id, branch_id) values (?, ?)', [seller.id, branch.id]);
const contracts = [];
for (let i = 0; i < CONTRACTS; i++) {
  const {
    rows: [lead],
  } = await knex.raw(
    `insert into leads (branch_id, salesperson_id, homeowner_name, phone_primary, email, address_line1, city, state,
       postal_code, stage)
     values (?, ?, ?, '555-0150', ?, '7 Clay Street', 'Benchton', 'FL', '32000', 'contract_signed') returning id`,
    [branch.id, seller.id, `Bench Homeowner ${i}`, `bench.homeowner.${i}@example.com`],
  );
  const {
    rows: [proposal],
  } = await knex.raw(
    `insert into proposals (lead_id, branch_id, version, status, salesperson_id, created_by)
     values (?, ?, 1, 'approved', ?, ?) returning id`,
    [lead.id, branch.id, seller.id, seller.id],
  );
  const {
    rows: [option],
  } = await knex.raw(
    `insert into proposal_options (proposal_id, branch_id, position, title, list_total, net_total, customer_total)
     values (?, ?, 1, 'Stabilise the slab', 999999.00, 999999.00, 999999.00) returning id`,
    [proposal.id, branch.id],
  );
  const {
    rows: [contract],
  } = await knex.raw(
    `insert into contracts (proposal_id, option_id, lead_id, branch_id, salesperson_id, price, signed_by_name,
       signed_at, signed_on, signature_png, cancellation_statement, last_day_to_cancel, deposit_amount)
     values (?, ?, ?, ?, ?, 999999.00, 'Bench Homeowner', now(), current_date, '\\x89504e47'::bytea, 'x',
       current_date + 3, 1000.00) returning id`,
    [proposal.id, option.id, lead.id, branch.id, seller.id],
  );
  contracts.push({ id: contract.id, leadId: lead.id });
}

// ---- the fake and the server ------------------------------------------------------------------------
const fake = await startStripeFake({ port: 0, webhookSecret: SECRET });
const server = await startServer(DB, {
  STRIPE_SECRET_KEY: 'sk_test_bench_webhooks',
  STRIPE_WEBHOOK_SECRET: SECRET,
  STRIPE_API_HOST: '127.0.0.1',
  STRIPE_API_PORT: String(fake.port),
  STRIPE_API_PROTOCOL: 'http',
  LOG_LEVEL: 'warn',
});
const webhook = `${server.url}/api/payments/webhook`;
/** The server process's CPU time so far (user + system), in ms, from /proc (Linux). */
const serverCpuMs = () => {
  const f = readFileSync(`/proc/${server.pid}/stat`, 'utf8').split(') ')[1].split(' ');
  return { user: (Number(f[11]) * 1000) / 100, system: (Number(f[12]) * 1000) / 100 };
};
/** CPU time in ms (user + system) of every PostgreSQL process, from /proc: the database's share of a phase. */
const postgresCpuMs = () => {
  let ms = 0;
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
      if (!stat.includes('(postgres)')) continue;
      const f = stat.split(') ')[1].split(' ');
      ms += ((Number(f[11]) + Number(f[12])) * 1000) / 100;
    } catch {
      // gone meanwhile
    }
  }
  return ms;
};
/** This process's CPU (the load generator and the processor fake), and its waited-for children's (pgbench). */
const selfCpuMs = () => {
  const f = readFileSync('/proc/self/stat', 'utf8').split(') ')[1].split(' ');
  return {
    own: ((Number(f[11]) + Number(f[12])) * 1000) / 100,
    children: ((Number(f[13]) + Number(f[14])) * 1000) / 100,
  };
};
const sdk = new Stripe('sk_test_bench_driver', { host: '127.0.0.1', port: fake.port, protocol: 'http' });

/** Makes `n` paid sessions (metadata as our links carry it); returns their events in the order made. */
async function payments(n) {
  const from = fake.state.events.size;
  for (let i = 0; i < n; i++) {
    const c = contracts[i % contracts.length];
    const metadata = { contractId: c.id, branchId: branch.id, kind: i % 2 ? 'balance' : 'deposit' };
    const s = await sdk.checkout.sessions.create({
      mode: 'payment',
      line_items: [
        {
          price_data: {
            currency: 'usd',
            unit_amount: 10_000 + (i % 900) * 111,
            product_data: { name: 'Bench' },
          },
          quantity: 1,
        },
      ],
      metadata,
      payment_intent_data: { metadata },
      success_url: 'http://loambook.test/payment/thank-you',
    });
    if (fake.pay(s.id, '4242 4242 4242 4242').outcome !== 'succeeded') throw new Error('payment failed');
  }
  return [...fake.state.events.values()].slice(from);
}

const bodies = (events) => events.map((e) => JSON.stringify(e));
let statusErrors = 0;
let serverMs = [];
// The load generator's requests go through node:http with a keep-alive agent rather than fetch: fetch
// (undici) cost this process about 1 ms of CPU per request, on the same two cores as the server and
// PostgreSQL, where pgbench's own client costs a third of that per transaction.
const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });
const webhookUrl = new URL(webhook);
function post(body) {
  return new Promise((resolve, reject) => {
    const payload = Buffer.from(body);
    const req = http.request(
      {
        host: webhookUrl.hostname,
        port: webhookUrl.port,
        path: webhookUrl.pathname,
        method: 'POST',
        agent,
        headers: {
          'content-type': 'application/json',
          'content-length': payload.length,
          'stripe-signature': signatureHeader(body, SECRET, Math.floor(Date.now() / 1000)),
        },
      },
      (res) => {
        res.resume();
        res.on('error', reject);
        res.on('end', () => {
          if (res.statusCode !== 200) statusErrors += 1;
          const timing = /process;dur=([\d.]+)/.exec(String(res.headers['server-timing'] ?? ''));
          if (timing) serverMs.push(Number(timing[1]));
          resolve();
        });
      },
    );
    req.on('error', reject);
    req.end(payload);
  });
}

/** Posts every body once from `concurrency` loops; returns { rate, latencies }. */
async function run(list, concurrency = CONCURRENCY) {
  let next = 0;
  serverMs = [];
  const latencies = [];
  const t0 = process.hrtime.bigint();
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (next < list.length) {
        const body = list[next++];
        const s = process.hrtime.bigint();
        await post(body);
        latencies.push(Number(process.hrtime.bigint() - s) / 1e6);
      }
    }),
  );
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  latencies.sort((a, b) => a - b);
  serverMs.sort((a, b) => a - b);
  return { rate: list.length / seconds, latencies, seconds, server: serverMs };
}

const fmt = (r) =>
  `${r.rate.toFixed(0).padStart(5)} events/s  request p50 ${percentile(r.latencies, 50).toFixed(2)} ms  p95 ` +
  `${percentile(r.latencies, 95).toFixed(2)} ms  server p50 ${percentile(r.server, 50).toFixed(2)} ms  p95 ` +
  `${percentile(r.server, 95).toFixed(2)} ms`;

const results = {};
let pgbenchDir = null;
try {
  // warm the server and both connections
  const warm = bodies((await payments(50)).filter((e) => e.type === 'charge.succeeded'));
  await run(warm);

  console.log(`Making ${CHARGES} paid sessions in the fake …`);
  const events = await payments(CHARGES);
  const posting = bodies(events.filter((e) => e.type === 'charge.succeeded'));
  const mixPayments = await payments(Math.floor(CHARGES / 2));
  const mix = bodies(mixPayments);

  // ---- pgbench: the same transaction ------------------------------------------------------------------
  const acc = Object.fromEntries(
    (await knex.raw(`select code, id from ledger_accounts where branch_id = ?`, [branch.id])).rows.map(
      (r) => [r.code, r.id],
    ),
  );
  const lit = (x) => (x === null ? 'null' : `'${String(x).replace(/'/g, "''")}'`);
  /**
   * The app's SQL with each bound value written in: `valueOf(v)` gives a pgbench expression for a value it
   * stands for (this transaction's contract, lead, key…), else the value is quoted. knex reports a built
   * query with ? placeholders and a raw one with $1, $2 …: both are read.
   */
  const inline = (sql, bindings, valueOf = () => undefined) => {
    let nth = 0;
    const used = new Set();
    const text = sql.replace(/\s+/g, ' ').replace(/\$(\d+)|\?/g, (_m, n) => {
      const i = n ? Number(n) - 1 : nth++;
      used.add(i);
      const v = bindings[i];
      return `(${valueOf(v) ?? lit(v)})`;
    });
    if (used.size !== bindings.length) throw new Error(`unbound placeholders in ${sql}`);
    return text;
  };
  const B = lit(branch.id);
  // Spread over the 40 contracts, as the events are (a contract's row is locked by the app's transaction).
  const C = `(array[${contracts.map((c) => lit(c.id)).join(', ')}]::uuid[])[:k]`;
  const L = `(array[${contracts.map((c) => lit(c.leadId)).join(', ')}]::uuid[])[:k]`;
  const KEY = `'charge:ch_pgbench_' || :n`;
  const EVENT = `'evt_pgbench_' || :n`;
  const claim = `insert into webhook_events (event_id, type, api_version, created, payload, processed_at, outcome) values (${EVENT}, 'charge.succeeded', null, now(), ${lit(posting[0])}::jsonb, now(), 'processed') on conflict (event_id) do update set attempts = webhook_events.attempts + 1, processed_at = now(), outcome = 'processed', last_error = null, received_at = now() where webhook_events.processed_at is null returning id \\gset ev_`;
  const entry = `insert into journal_entries (branch_id, reason_code, source_kind, source_ref, idempotency_key, memo, effective_on, lead_id, contract_id, job_id, reverses_entry_id, posted_by) values (${B}, 'deposit.card', 'event', ${EVENT}, ${KEY}, 'Card deposit (bench)', current_date, ${L}, ${C}, null, null, null) on conflict (idempotency_key) do nothing returning id \\gset je_`;
  const lines = `insert into journal_lines (entry_id, position, account_id, branch_id, side, amount, salesperson_id) values (':je_id', 1, ${lit(acc['1050'])}, ${B}, 'debit', 970.70, null), (':je_id', 2, ${lit(acc['5100'])}, ${B}, 'debit', 29.30, null), (':je_id', 3, ${lit(acc['2100'])}, ${B}, 'credit', 1000.00, null);`;
  const payment = `with p as (insert into payments (contract_id, branch_id, payment_request_id, kind, method, amount, fee, net, currency, processor_payment_intent_id, processor_charge_id, processor_balance_transaction_id, card_brand, card_last4, reference, received_on, recorded_by, request_key, journal_entry_id) values (${C}, ${B}, null, 'deposit', 'card', 1000.00, 29.30, 970.70, 'usd', 'pi_pgbench_' || :n, 'ch_pgbench_' || :n, 'txn_pgbench_' || :n, 'visa', '4242', null, current_date, null, null, ':je_id') on conflict do nothing returning id, branch_id, kind, amount) insert into lead_activities (lead_id, branch_id, kind, body, data, actor_id) select ${L}, p.branch_id, 'payment', 'Deposit of $1,000.00 received by card (Visa •••• 4242).', jsonb_build_object('paymentId', p.id, 'kind', p.kind, 'amount', p.amount::text), null from p returning data ->> 'paymentId' as id;`;
  // LedgerService.post's one statement, built by the app's own code (postEntryStatement) for a card
  // deposit with placeholders, each then replaced by this transaction's value: the very SQL it sends.
  const { postEntryStatement } = require(path.join(DIST, 'ledger', 'ledger.repository.js'));
  const ledgerValues = {
    branch: B,
    'deposit.card': `'deposit.card'`,
    event: `'event'`,
    sourceRef: EVENT,
    key: KEY,
    memo: `'Card deposit (Visa •••• 4242), charge ch_pgbench_' || :n`,
    day: 'current_date',
    lead: L,
    contract: C,
  };
  const built = postEntryStatement(
    {
      branchId: 'branch',
      reasonCode: 'deposit.card',
      sourceKind: 'event',
      sourceRef: 'sourceRef',
      idempotencyKey: 'key',
      reversesEntryId: null,
      memo: 'memo',
      effectiveOn: 'day',
      postedBy: null,
      leadId: 'lead',
      contractId: 'contract',
      jobId: null,
    },
    [
      { accountId: acc['1050'], side: 'debit', amount: '970.70', salespersonId: null },
      { accountId: acc['5100'], side: 'debit', amount: '29.30', salespersonId: null },
      { accountId: acc['2100'], side: 'credit', amount: '1000.00', salespersonId: null },
    ],
  );
  const ledgerPost = inline(built.sql, built.bindings, (v) => ledgerValues[v]) + ' \\aset je_';
  // The contract locked with the charge check, as PaymentsRepository.contractForCharge builds it.
  const { PaymentsRepository } = require(path.join(DIST, 'payments', 'payments.repository.js'));
  const lockQuery = new PaymentsRepository(knex).contractForChargeQuery('contract', 'charge', knex).toSQL();
  const lockValues = { contract: C, charge: `'ch_pgbench_' || :n` };
  const contractLock = inline(lockQuery.sql, lockQuery.bindings, (v) => lockValues[v]) + ';';
  // A balance payment on a lead still at contract signed (every odd contract here: its events are all
  // balance payments, and nothing moves its lead) also looks whether the lead can move on
  // (JobsService.advanceLead: the lead locked, its facts) and whether it is paid in full
  // (LeadsService.settleIfPaid: the lead locked). Their SQL is captured from the app's repositories, run
  // once here on one lead, and replayed for the event's own lead.
  const { JobsRepository } = require(path.join(DIST, 'jobs', 'jobs.repository.js'));
  const { LeadsRepository } = require(path.join(DIST, 'leads', 'leads.repository.js'));
  const sentinel = contracts[1].leadId;
  const captured = [];
  const onQuery = (q) => captured.push({ sql: q.sql, bindings: q.bindings ?? [] });
  knex.on('query', onQuery);
  try {
    await new JobsRepository(knex).leadStage(sentinel, knex, true);
    await new LeadsRepository(knex).facts(sentinel, knex);
    await new LeadsRepository(knex).lockStage(sentinel, knex);
  } finally {
    knex.off('query', onQuery);
  }
  const balanceStatements = captured.map(
    ({ sql, bindings }) => `${inline(sql, bindings, (v) => (v === sentinel ? L : undefined))};`,
  );
  if (balanceStatements.length !== 3)
    throw new Error(`captured ${balanceStatements.length} statements, not 3`);
  const header = [
    '\\set n random(1, 9000000000000000000)',
    `\\set k random(1, ${contracts.length})`,
    // contracts[k - 1]: an odd index is a contract whose events are balance payments (payments() below).
    '\\set balance (:k - 1) % 2',
  ];
  const inserts = [...header, 'BEGIN;', claim, entry, lines, payment, 'COMMIT;'];
  // What the app runs for a posting event, in its order: the duplicate lookup, the event claim, the
  // contract locked with the charge check (PaymentsRepository.contractForChargeQuery), LedgerService.post's one
  // statement (the accounts are known: the first posting of a branch reads them once), the payment with its
  // timeline row. Left out: a deposit while the contract's deposit is not yet covered also sums the
  // contract's movements (the first few deposits of each contract here: a few % of the events), and the one
  // that covers it marks the contract and moves the lead on (once per contract).
  const appStatements = [
    ...header,
    `select 1 from webhook_events where event_id = ${EVENT} and processed_at is not null;`,
    'BEGIN;',
    claim,
    contractLock,
    ledgerPost,
    payment,
    '\\if :balance',
    ...balanceStatements,
    '\\endif',
    'COMMIT;',
  ];
  pgbenchDir = mkdtempSync(path.join(os.tmpdir(), 'loambook-pgbench-'));
  const pgbench = findPgbench();
  const bench = (name, statements, seconds) => {
    const file = path.join(pgbenchDir, `${name}.sql`);
    writeFileSync(file, statements.join('\n') + '\n');
    const out = execFileSync(
      pgbench,
      [
        '-n',
        '-h',
        pg.host,
        '-p',
        String(pg.port),
        '-U',
        pg.user,
        '-c',
        String(CONCURRENCY),
        '-j',
        '2',
        '-T',
        String(seconds),
        '-f',
        file,
        DB,
      ],
      { env: { ...process.env, PGPASSWORD: pg.password }, encoding: 'utf8' },
    );
    const tps = Number(
      /tps = ([\d.]+) \(without initial connection time\)/.exec(out)?.[1] ?? /tps = ([\d.]+)/.exec(out)?.[1],
    );
    const failed = Number(/number of failed transactions: (\d+)/.exec(out)?.[1] ?? '0');
    if (!(tps > 0) || failed)
      throw new Error(`pgbench ${name}: could not read its rate, or it failed:\n${out}`);
    return tps;
  };

  // The app's entries (pgbench posts its own, under keys of its own).
  const APP_ENTRIES = `select count(*) as n from journal_entries where idempotency_key not like 'charge:ch_pgbench_%'`;
  // Rounds of pgbench (the app's statements) then a share of the posting events through the server, so
  // that whatever else the machine is doing weighs on both sides alike; the ratio is taken per round.
  const before = Number((await knex.raw(APP_ENTRIES)).rows[0].n);
  const cpu0 = serverCpuMs();
  const rounds = [];
  const share = Math.ceil(posting.length / ROUNDS);
  // Where the CPU goes, per posting event and per pgbench transaction (ms of one core).
  const cpu = { appPg: 0, appSelf: 0, pgbenchPg: 0, pgbenchClient: 0, pgbenchTx: 0 };
  for (let r = 0; r < ROUNDS; r++) {
    const seconds = Math.max(1, Math.round(SECONDS / ROUNDS));
    let pg0 = postgresCpuMs();
    let me0 = selfCpuMs();
    const tps = bench('app-statements', appStatements, seconds);
    cpu.pgbenchPg += postgresCpuMs() - pg0;
    cpu.pgbenchClient += selfCpuMs().children - me0.children;
    cpu.pgbenchTx += tps * seconds;
    pg0 = postgresCpuMs();
    me0 = selfCpuMs();
    const app = await run(posting.slice(r * share, (r + 1) * share));
    cpu.appPg += postgresCpuMs() - pg0;
    cpu.appSelf += selfCpuMs().own - me0.own;
    rounds.push({ tps, app });
  }
  const cpu1 = serverCpuMs();
  const cpuPerEvent = {
    user: (cpu1.user - cpu0.user) / posting.length,
    system: (cpu1.system - cpu0.system) / posting.length,
  };
  const after = Number((await knex.raw(APP_ENTRIES)).rows[0].n);
  if (after - before !== posting.length)
    throw new Error(`posted ${after - before} entries for ${posting.length} charges`);
  const all = (k) => rounds.flatMap((r) => r.app[k]).sort((a, b) => a - b);
  const appSeconds = rounds.reduce((t, r) => t + r.app.seconds, 0);
  results.posting = {
    rate: posting.length / appSeconds,
    latencies: all('latencies'),
    server: all('server'),
    seconds: appSeconds,
  };
  const median = (xs) =>
    percentile(
      [...xs].sort((a, b) => a - b),
      50,
    );
  results.rounds = rounds.map((r) => ({ tps: r.tps, rate: r.app.rate, ratio: r.app.rate / r.tps }));

  results.mix = await run(mix);
  results.duplicates = await run(posting);
  results.duplicatesSerial = await run(posting.slice(0, 2000), 1);
  const afterDup = Number((await knex.raw(APP_ENTRIES)).rows[0].n);
  if (afterDup !== after + mixPayments.length / 4)
    throw new Error('duplicates or the mix posted the wrong number of entries');
  if (statusErrors) throw new Error(`${statusErrors} answers were not 200`);

  // the server's own SQL for a duplicate: the indexed lookup that finds it processed
  const dupId = JSON.parse(posting[0]).id;
  const dupTimes = [];
  for (let i = 0; i < 2000; i++) {
    const s = process.hrtime.bigint();
    await knex.raw('select 1 from webhook_events where event_id = ? and processed_at is not null', [dupId]);
    dupTimes.push(Number(process.hrtime.bigint() - s) / 1e6);
  }
  dupTimes.sort((a, b) => a - b);
  results.duplicateSql = { p50: percentile(dupTimes, 50), p95: percentile(dupTimes, 95) };

  results.pgbench = {
    inserts: bench('inserts', inserts, SECONDS),
    app: median(results.rounds.map((r) => r.tps)),
    binary: pgbench,
  };

  const ratio = results.posting.rate / results.pgbench.inserts;
  const ratioApp = median(results.rounds.map((r) => r.ratio));
  console.log(
    `\nWebhook ingestion, concurrency ${CONCURRENCY}, ${os.cpus().length} cores, load average ${os.loadavg()[0].toFixed(1)} (${posting.length} posting events in ${ROUNDS} rounds; ${pgbench})`,
  );
  console.log(`  pgbench, the inserts only:          ${results.pgbench.inserts.toFixed(0).padStart(5)} tx/s`);
  console.log(
    `  pgbench, the app's statements:      ${results.pgbench.app.toFixed(0).padStart(5)} tx/s  (median of the rounds; ${appStatements.filter((x) => !x.startsWith('\\')).length} statements, 3 more on balance payments)`,
  );
  console.log(`  unique posting events:              ${fmt(results.posting)}`);
  console.log(
    `    server CPU per posting event:     ${(cpuPerEvent.user + cpuPerEvent.system).toFixed(2)} ms (user ${cpuPerEvent.user.toFixed(2)}, system ${cpuPerEvent.system.toFixed(2)})`,
  );
  console.log(
    `    PostgreSQL CPU per posting event: ${(cpu.appPg / posting.length).toFixed(2)} ms; load generator and processor fake: ${(cpu.appSelf / posting.length).toFixed(2)} ms`,
  );
  console.log(
    `    per pgbench transaction: PostgreSQL ${(cpu.pgbenchPg / cpu.pgbenchTx).toFixed(2)} ms, pgbench itself ${(cpu.pgbenchClient / cpu.pgbenchTx).toFixed(2)} ms`,
  );
  console.log(
    `    per round (events/s / pgbench tx/s): ${results.rounds.map((r) => `${r.rate.toFixed(0)}/${r.tps.toFixed(0)}`).join('  ')}`,
  );
  console.log(`  unique events, natural mix:         ${fmt(results.mix)}`);
  console.log(`  duplicate events:                   ${fmt(results.duplicates)}`);
  console.log(`  duplicate events, one at a time:    ${fmt(results.duplicatesSerial)}`);
  console.log(
    `  a duplicate's lookup, in SQL:       p50 ${results.duplicateSql.p50.toFixed(3)} ms  p95 ${results.duplicateSql.p95.toFixed(3)} ms`,
  );
  console.log(
    `  posting events / pgbench inserts:          ${(ratio * 100).toFixed(0)}%  (target ≥ 40%)  ${ratio >= 0.4 ? 'MET' : 'NOT MET'}`,
  );
  console.log(
    `  posting events / pgbench app's statements: ${(ratioApp * 100).toFixed(0)}%  (median of the rounds' ratios; target ≥ 40%)  ${ratioApp >= 0.4 ? 'MET' : 'NOT MET'}`,
  );
  const dupServer = percentile(results.duplicatesSerial.server, 50);
  const dupMs = percentile(results.duplicatesSerial.latencies, 50);
  console.log(
    `  duplicate, server time after the signature (p50): ${dupServer.toFixed(3)} ms  (target ≤ 1 ms)  ${dupServer <= 1 ? 'MET' : 'NOT MET'}`,
  );
  console.log(`  duplicate, whole request one at a time (p50):    ${dupMs.toFixed(2)} ms`);
} finally {
  server.stop();
  await fake.close();
  await knex.destroy();
  if (pgbenchDir && process.env.KEEP_BENCH_DB) console.log(`pgbench scripts kept in ${pgbenchDir}`);
  else if (pgbenchDir) rmSync(pgbenchDir, { recursive: true, force: true });
  if (!process.env.KEEP_BENCH_DB) await dropDatabase(DB);
}
