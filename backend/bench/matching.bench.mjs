// Reconciliation matching: 50,000 payout-side lines against 50,000 bank lines through common's matchLines
// (exact cents, date window, one-to-one, closest date first), against a baseline in the same run: the
// least work any bucket-and-sort matcher does on the same data — a Map from amount to lines built over
// one side and probed with the other, plus sorting both sides by date. Reports the median of several
// runs and the ratio. Target: matchLines ≤ 1 s.
// Usage: npm run build -w common && node backend/bench/matching.bench.mjs [--lines 50000] [--runs 7]
import { createRequire } from 'node:module';
import path from 'node:path';
import { REPO } from '../scripts/lib/env.mjs';

const require = createRequire(import.meta.url);
const common = require(path.join(REPO, 'common', 'dist', 'index.js'));
const { matchLines } = common;

const arg = (name, fallback) => {
  const i = process.argv.indexOf(name);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const N = arg('--lines', 50_000);
const RUNS = arg('--runs', 7);
const WINDOW_DAYS = 3;

// Deterministic invented data (mulberry32). Amounts are integer cents generated as integers: no money
// arithmetic happens here, and matchLines receives bigint (payout side) and digit strings (bank side).
let seed = 20260709;
const rnd = () => {
  seed = (seed + 0x6d2b79f5) | 0;
  let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
  t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
};
const int = (n) => Math.floor(rnd() * n);
const DAY0 = Date.UTC(2026, 0, 1) / 86_400_000;
const isoDay = (d) => new Date(d * 86_400_000).toISOString().slice(0, 10);
const COMMON_AMOUNTS = Array.from({ length: 200 }, () => 50_000 + int(200) * 2_500); // $500–$5,475 in $25 steps

const payouts = [];
const bank = [];
let expectedPairs = 0;
for (let i = 0; i < N; i++) {
  // 15% of the amounts come from 200 common deposit sizes: same-amount collisions on both sides.
  const cents = rnd() < 0.15 ? COMMON_AMOUNTS[int(COMMON_AMOUNTS.length)] : 1_000 + int(5_000_000);
  const day = DAY0 + int(180);
  payouts.push({ id: `po_${i}`, amountCents: BigInt(cents), date: isoDay(day) });
  if (rnd() < 0.95) {
    // the bank posts it 0–3 days later, sometimes a day earlier (a value date before the payout date)
    const jitter = rnd() < 0.05 ? -1 : int(WINDOW_DAYS + 1);
    bank.push({ id: `bl_${bank.length}`, amountCents: String(cents), date: isoDay(day + jitter) });
    expectedPairs++;
  }
}
// Unmatched bank lines (cheques, transfers): negative amounts, never on the payout side.
while (bank.length < N) {
  bank.push({
    id: `bl_${bank.length}`,
    amountCents: String(-(100 + int(2_000_000))),
    date: isoDay(DAY0 + int(180)),
  });
}
for (let i = bank.length - 1; i > 0; i--) {
  const j = int(i + 1);
  [bank[i], bank[j]] = [bank[j], bank[i]];
}

function baseline() {
  const byAmount = new Map();
  for (const p of payouts) {
    const key = p.amountCents.toString();
    const list = byAmount.get(key);
    if (list) list.push(p);
    else byAmount.set(key, [p]);
  }
  let hits = 0;
  for (const b of bank) if (byAmount.has(b.amountCents)) hits++;
  const byDate = (a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0);
  const sortedPayouts = payouts.slice().sort(byDate);
  const sortedBank = bank.slice().sort(byDate);
  return hits + sortedPayouts.length + sortedBank.length;
}

function match() {
  return matchLines(payouts, bank, { windowDays: WINDOW_DAYS });
}

function time(fn) {
  const t0 = process.hrtime.bigint();
  const result = fn();
  return { ms: Number(process.hrtime.bigint() - t0) / 1e6, result };
}
const median = (xs) => {
  const s = xs.slice().sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
};

// Warm up both, then alternate the runs and take each one's median.
time(baseline);
const first = time(match).result;
const base = [];
const matched = [];
for (let r = 0; r < RUNS; r++) {
  base.push(time(baseline).ms);
  matched.push(time(match).ms);
}
const baseMs = median(base);
const matchMs = median(matched);
const mismatched = first.matches.filter(
  (m) => m.ledger.amountCents.toString() !== m.bank.amountCents || Math.abs(m.daysApart) > WINDOW_DAYS,
).length;

console.log(
  `${N} payout-side lines × ${bank.length} bank lines, window ${WINDOW_DAYS} days, median of ${RUNS} runs`,
);
console.log(
  `  matched ${first.matches.length} (generated pairs ${expectedPairs}), unmatched payouts ${first.unmatchedLedger.length}, unmatched bank ${first.unmatchedBank.length}, bad matches ${mismatched}`,
);
console.log(`  baseline (Map by amount + sort both by date): ${baseMs.toFixed(0)} ms`);
console.log(`  matchLines (common/):                         ${matchMs.toFixed(0)} ms   target ≤ 1000 ms`);
console.log(`  ratio matchLines / baseline:                  ${(matchMs / baseMs).toFixed(2)}`);
if (mismatched > 0 || matchMs > 1000) process.exitCode = 1;
