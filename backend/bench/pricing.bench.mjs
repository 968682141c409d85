// Pricing: 10,000 proposals of 30 lines through common's priceOption (validation, totals, tax, margin,
// rounding), against a baseline in the same run: the bare decimal.js arithmetic the totals need (two
// multiply-adds per line and the roundings), with no validation. Reports the time per proposal and the ratio.
// Usage: npm run build -w common && node backend/bench/pricing.bench.mjs [--proposals 10000]
import { createRequire } from 'node:module';
import path from 'node:path';
import { REPO } from '../scripts/lib/env.mjs';

const require = createRequire(import.meta.url);
const common = require(path.join(REPO, 'common', 'dist', 'index.js'));
const { priceOption, MoneyDecimal } = common;

const i = process.argv.indexOf('--proposals');
const N = i > 0 ? Number(process.argv[i + 1]) : 10_000;
const LINES = 30;
const categories = [
  'soil_stabilisation',
  'piers',
  'helical_piles',
  'drainage',
  'permits_engineering',
  'mobilisation',
];

// Deterministic invented proposals: quantities with 0–3 decimals, prices in cents.
let seed = 42;
const rnd = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
const cents = (max) => (Math.floor(rnd() * max * 100) / 100).toFixed(2); // data generation only, not money logic
const proposals = Array.from({ length: N }, (_, p) => ({
  lines: Array.from({ length: LINES }, () => ({
    quantity: (Math.floor(rnd() * 400000) / 1000).toString(),
    unitCost: cents(400),
    unitPrice: cents(900),
    category: categories[Math.floor(rnd() * categories.length)],
  })),
  discount:
    p % 3 === 0
      ? { kind: 'percent', value: '7.5' }
      : p % 3 === 1
        ? { kind: 'amount', value: '150.00' }
        : { kind: 'none', value: '0' },
  tax: p % 2 ? { treatment: 'invoice', ratePct: '7' } : { treatment: 'materials_cost', ratePct: '6' },
}));

function baseline(prop) {
  let cost = new MoneyDecimal(0);
  let list = new MoneyDecimal(0);
  for (const l of prop.lines) {
    const q = new MoneyDecimal(l.quantity);
    cost = cost.plus(q.times(l.unitCost));
    list = list.plus(q.times(l.unitPrice));
  }
  const listC = list.toDecimalPlaces(2);
  const net =
    prop.discount.kind === 'percent'
      ? listC.minus(listC.times(prop.discount.value).div(100).toDecimalPlaces(2))
      : listC;
  const tax = net.times(prop.tax.ratePct).div(100).toDecimalPlaces(2);
  return [cost.toDecimalPlaces(2).toFixed(2), net.toFixed(2), tax.toFixed(2)];
}

function time(fn) {
  const t0 = process.hrtime.bigint();
  let sink = 0;
  for (const p of proposals) sink += fn(p).length;
  return { ms: Number(process.hrtime.bigint() - t0) / 1e6, sink };
}

// Warm up both, then alternate three rounds and keep each one's best.
time(baseline);
time((p) => Object.keys(priceOption(p)));
let best = { base: Infinity, price: Infinity };
for (let round = 0; round < 3; round++) {
  best.base = Math.min(best.base, time(baseline).ms);
  best.price = Math.min(best.price, time((p) => Object.keys(priceOption(p))).ms);
}
console.log(`${N} proposals × ${LINES} lines`);
console.log(
  `  baseline (bare decimal.js sums): ${best.base.toFixed(0)} ms  = ${((best.base / N) * 1000).toFixed(1)} µs per proposal`,
);
console.log(
  `  priceOption (common/):           ${best.price.toFixed(0)} ms  = ${((best.price / N) * 1000).toFixed(1)} µs per proposal`,
);
console.log(`  ratio priceOption / baseline:    ${(best.price / best.base).toFixed(2)}`);
