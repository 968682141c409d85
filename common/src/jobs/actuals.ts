// A job's actuals: what the crew logged against the plan, and the margin that leaves.
//
// What the log measures, per plan line (our mapping of the price book's units and categories):
//   unit 'lb'                                      → pounds pumped (sum of the injection rows)
//   unit 'point', category soil_stabilisation      → injection points logged
//   unit 'each' or 'point', category piers         → push piers logged
//   unit 'each' or 'point', category helical_piles → helical piles logged
//   unit 'hour'                                    → labour person-hours (sum of the day notes)
//   anything else (mobilisation, permits, drainage, lump sums) → not measured: its planned quantity stands.
// Labour hours are person-hours on both sides (one person working one hour: 3 people × 8 h = 24): the
// price book's 'hour' items are priced per installer-hour and the day notes add everyone's hours up.
// When several lines measure the same thing, the logged total fills them in plan order, each up to its
// planned quantity, and whatever is left over goes on the last of them.
//
//   estimated cost = toCents(Σ planned quantity × unit cost)
//   actual cost    = toCents(Σ actual quantity × unit cost)
//   gross profit   = price − cost;   gross margin % = gross profit / price × 100 (half-up, 2 decimals)
// price is the contract's price without any sales tax charged on the invoice (that tax is the state's, not
// revenue). Tax a branch pays on its materials is not in these costs, so the estimate here is the plan's
// own cost and may read higher than the margin shown on the proposal for such branches; estimate and
// actual are computed the same way, which is what the comparison needs. The margin identities of
// common/src/pricing hold: price = cost / (1 − margin) (REFERENCE-VALUES.md, "Money").
import { money, MoneyDecimal, toCents, type Money } from '../money';
import { formatPct } from '../pricing/price-option';
import type { ActualsSummaryRow, JobActuals } from './api-types';

export type ActualMeasure = NonNullable<JobActuals['lines'][number]['measuredBy']>;

export interface ActualsPlanLine {
  code: string;
  description: string;
  category: string;
  unit: string;
  quantity: string;
  unitCost: string;
}

export interface ActualsLogTotals {
  injectionPoints: number;
  pounds: string;
  pushPiers: number;
  helicalPiles: number;
  labourHours: string;
}

export interface JobActualsInput {
  jobId: string;
  /** Contract price without invoice sales tax. */
  price: string;
  plan: readonly ActualsPlanLine[];
  log: ActualsLogTotals;
  /** The job's own estimate, when the manager set one; otherwise the plan's 'hour' lines. */
  estimatedLabourHours?: string | null;
  labourCostPerHour?: string | null;
}

export function actualMeasureOf(line: { unit: string; category: string }): ActualMeasure | null {
  const counted = line.unit === 'each' || line.unit === 'point';
  if (line.unit === 'lb') return 'lb';
  if (line.unit === 'hour') return 'labour_hours';
  if (counted && line.category === 'piers') return 'push_piers';
  if (counted && line.category === 'helical_piles') return 'helical_piles';
  if (line.unit === 'point' && line.category === 'soil_stabilisation') return 'injection_points';
  return null;
}

const ZERO = new MoneyDecimal(0);
const HUNDRED = new MoneyDecimal(100);
const cents = (v: Money) => (v.isZero() ? ZERO : toCents(v)).toFixed(2);
const qty = (v: Money) => v.toFixed();

function measured(log: ActualsLogTotals): Record<ActualMeasure, Money> {
  return {
    lb: money(log.pounds),
    injection_points: new MoneyDecimal(log.injectionPoints),
    push_piers: new MoneyDecimal(log.pushPiers),
    helical_piles: new MoneyDecimal(log.helicalPiles),
    labour_hours: money(log.labourHours),
  };
}

/** Gross margin %, rounded for display; null when there is no price to take it of. */
export function marginPct(price: Money, cost: Money): string | null {
  return price.isZero() ? null : formatPct(price.minus(cost).dividedBy(price).times(HUNDRED));
}

/** One value shared by every line in the list, else null. */
function single(values: string[]): string | null {
  const distinct = [...new Set(values.map((v) => money(v).toFixed(2)))];
  return distinct.length === 1 ? distinct[0]! : null;
}

export function jobActuals(input: JobActualsInput): JobActuals {
  const price = money(input.price);
  const remaining = measured(input.log);
  const lastOf = new Map<ActualMeasure, number>();
  input.plan.forEach((l, i) => {
    const m = actualMeasureOf(l);
    if (m) lastOf.set(m, i);
  });

  let plannedExact = ZERO;
  let actualExact = ZERO;
  const lines = input.plan.map((l, i) => {
    const planned = money(l.quantity);
    const unitCost = money(l.unitCost);
    const m = actualMeasureOf(l);
    let actual = planned;
    if (m) {
      const left = remaining[m];
      actual = lastOf.get(m) === i ? left : MoneyDecimal.min(left, planned);
      remaining[m] = left.minus(actual);
    }
    const plannedCost = planned.times(unitCost);
    const actualCost = actual.times(unitCost);
    plannedExact = plannedExact.plus(plannedCost);
    actualExact = actualExact.plus(actualCost);
    return {
      code: l.code,
      description: l.description,
      plannedQty: qty(planned),
      actualQty: qty(actual),
      unitCost: cents(unitCost),
      plannedCost: cents(plannedCost),
      actualCost: cents(actualCost),
      measuredBy: m,
    };
  });
  const estimatedCost = toCents(plannedExact);
  const actualCost = toCents(actualExact);

  const sum = (f: (l: ActualsPlanLine) => boolean) =>
    input.plan.filter(f).reduce((s, l) => s.plus(money(l.quantity)), ZERO);
  const lbLines = input.plan.filter((l) => actualMeasureOf(l) === 'lb');
  const hourLines = input.plan.filter((l) => actualMeasureOf(l) === 'labour_hours');
  const pierLines = (l: ActualsPlanLine) => {
    const m = actualMeasureOf(l);
    return m === 'push_piers' || m === 'helical_piles';
  };
  const estimatedHours =
    input.estimatedLabourHours ??
    (hourLines.length > 0 ? qty(sum((l) => actualMeasureOf(l) === 'labour_hours')) : null);

  return {
    jobId: input.jobId,
    price: cents(price),
    estimatedCost: cents(estimatedCost),
    actualCost: cents(actualCost),
    estimatedMarginPct: marginPct(price, estimatedCost),
    actualMarginPct: marginPct(price, actualCost),
    estimatedGrossProfit: cents(price.minus(estimatedCost)),
    actualGrossProfit: cents(price.minus(actualCost)),
    material: {
      plannedLb: qty(sum((l) => actualMeasureOf(l) === 'lb')),
      usedLb: qty(money(input.log.pounds)),
      unitCost: single(lbLines.map((l) => l.unitCost)),
    },
    piers: { planned: qty(sum(pierLines)), installed: input.log.pushPiers + input.log.helicalPiles },
    labour: {
      estimatedHours: estimatedHours === null ? null : qty(money(estimatedHours)),
      actualHours: qty(money(input.log.labourHours)),
      costPerHour: input.labourCostPerHour
        ? cents(money(input.labourCostPerHour))
        : single(hourLines.map((l) => l.unitCost)),
    },
    injectionPoints: {
      planned: qty(sum((l) => actualMeasureOf(l) === 'injection_points')),
      installed: input.log.injectionPoints,
    },
    lines,
  };
}

export interface ActualsSummaryInput {
  key: string;
  name: string;
  price: string;
  estimatedCost: string;
  actualCost: string;
}

/**
 * Jobs summed per key (a salesperson, a branch). Margins are taken of the sums (a big job weighs more than
 * a small one); the drift is actual − estimated margin in percentage points, from the two printed margins,
 * so a reader can check it. Sorted by drift, most negative (the most under-estimated cost) first; groups
 * without a margin last.
 */
export function summariseActuals(jobs: readonly ActualsSummaryInput[]): ActualsSummaryRow[] {
  const groups = new Map<string, { name: string; jobs: number; price: Money; est: Money; act: Money }>();
  for (const j of jobs) {
    const g = groups.get(j.key) ?? { name: j.name, jobs: 0, price: ZERO, est: ZERO, act: ZERO };
    g.jobs++;
    g.price = g.price.plus(money(j.price));
    g.est = g.est.plus(money(j.estimatedCost));
    g.act = g.act.plus(money(j.actualCost));
    groups.set(j.key, g);
  }
  const rows: ActualsSummaryRow[] = [...groups].map(([key, g]) => {
    const estimatedMarginPct = marginPct(g.price, g.est);
    const actualMarginPct = marginPct(g.price, g.act);
    return {
      key,
      name: g.name,
      jobs: g.jobs,
      price: cents(g.price),
      estimatedCost: cents(g.est),
      actualCost: cents(g.act),
      estimatedMarginPct,
      actualMarginPct,
      marginDriftPts:
        estimatedMarginPct === null || actualMarginPct === null
          ? null
          : formatPct(money(actualMarginPct).minus(money(estimatedMarginPct))),
    };
  });
  return rows.sort((a, b) => {
    if (a.marginDriftPts === null || b.marginDriftPts === null) {
      if (a.marginDriftPts !== b.marginDriftPts) return a.marginDriftPts === null ? 1 : -1;
      return a.name.localeCompare(b.name);
    }
    return money(a.marginDriftPts).comparedTo(money(b.marginDriftPts)) || a.name.localeCompare(b.name);
  });
}
