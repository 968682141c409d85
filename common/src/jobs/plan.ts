import { money, MoneyDecimal, toMoneyString } from '../money';

/** The parts of a plan line (a copy of a signed option's line) that the job's figures read. */
export interface PlanLineLike {
  category: string;
  unit: string;
  quantity: string;
  unitCost: string;
}

const sum = (lines: PlanLineLike[]) => lines.reduce((s, l) => s.plus(money(l.quantity)), new MoneyDecimal(0));

const qty = (v: InstanceType<typeof MoneyDecimal>) =>
  v
    .toDecimalPlaces(3)
    .toFixed(3)
    .replace(/\.?0+$/, '');

/**
 * The labour the plan carries: person-hours from its 'hour' lines (to the hundredth, as
 * jobs.estimated_labour_hours keeps them) and the cost of a person-hour (their unit cost, weighted by hours
 * when several lines differ).
 * Null for both when the plan has no labour line.
 */
export function labourEstimate(lines: PlanLineLike[]): { hours: string | null; costPerHour: string | null } {
  const hourLines = lines.filter((l) => l.unit === 'hour');
  const hours = sum(hourLines);
  if (hours.isZero()) return { hours: null, costPerHour: null };
  const cost = hourLines.reduce(
    (s, l) => s.plus(money(l.quantity).times(money(l.unitCost))),
    new MoneyDecimal(0),
  );
  return { hours: hours.toDecimalPlaces(2).toFixed(2), costPerHour: toMoneyString(cost.dividedBy(hours)) };
}

/**
 * What the crew is to install, counted from the plan: injection points ('point' lines of soil
 * stabilisation), push piers ('each'/'point' lines of piers), helical piles (the same of helical piles)
 * and pounds of material ('lb' lines). Quantities as decimal strings without trailing zeros.
 */
export function plannedCounts(lines: PlanLineLike[]): {
  injectionPoints: string;
  pushPiers: string;
  helicalPiles: string;
  materialLb: string;
} {
  const of = (category: string, units: string[]) =>
    lines.filter((l) => l.category === category && units.includes(l.unit));
  return {
    injectionPoints: qty(sum(of('soil_stabilisation', ['point']))),
    pushPiers: qty(sum(of('piers', ['each', 'point']))),
    helicalPiles: qty(sum(of('helical_piles', ['each', 'point']))),
    materialLb: qty(sum(lines.filter((l) => l.unit === 'lb'))),
  };
}
