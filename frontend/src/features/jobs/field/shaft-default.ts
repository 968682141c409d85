import { HELICAL_SHAFTS, type HelicalShaft, type JobPlanLine } from '@loambook/common';
import type { LogRow } from './log-rows';

/*
 * Which shaft the helical pile form starts on. A job's piles are nearly always one shaft, so the form
 * follows the last pile logged on the job; before the first one, the plan's helical line when its words
 * name exactly one shaft ("Helical pile, 1.5 in square shaft"); otherwise nothing is chosen and the crew
 * lead picks it. The shaft sets the torque factor Kt behind the capacity shown, so no shaft is assumed.
 */

const SIZES: Record<HelicalShaft, { size: number; shape: 'square' | 'round' }> = {
  '1.5in-square': { size: 1.5, shape: 'square' },
  '1.75in-square': { size: 1.75, shape: 'square' },
  '2.875in-round': { size: 2.875, shape: 'round' },
  '3.5in-round': { size: 3.5, shape: 'round' },
};

/** Written fractions as decimals: 1-1/2, 1 1/2 and 1½ → 1.5; 2-7/8 and 2⅞ → 2.875. */
function decimalFractions(text: string): string {
  return text
    .replace(/(\d)\s*(?:-|\s)\s*1\/2/g, '$1.5')
    .replace(/(\d)\s*(?:-|\s)\s*3\/4/g, '$1.75')
    .replace(/(\d)\s*(?:-|\s)\s*7\/8/g, '$1.875')
    .replace(/(\d)\s*½/g, '$1.5')
    .replace(/(\d)\s*¾/g, '$1.75')
    .replace(/(\d)\s*⅞/g, '$1.875');
}

const SHAFT_WORDS =
  /(\d+(?:\.\d+)?)\s*(?:in\b\.?|inch(?:es)?\b|"|″|”)?\s*(?:od\s*)?(square|sq\b|round|pipe|rs\b|ss\b)/g;

/** The shafts a line's words name ('1.5 in square shaft', '2-7/8" round pipe'), each once. */
export function shaftsNamedIn(text: string): HelicalShaft[] {
  const found = new Set<HelicalShaft>();
  for (const m of decimalFractions(text.toLowerCase()).matchAll(SHAFT_WORDS)) {
    const size = Number(m[1]);
    const word = m[2]!;
    const shape = word.startsWith('s') ? 'square' : 'round';
    const shaft = HELICAL_SHAFTS.find((s) => SIZES[s].size === size && SIZES[s].shape === shape);
    if (shaft) found.add(shaft);
  }
  return [...found];
}

/** The one shaft the plan's helical lines name, or null (none named, or more than one). */
export function planShaft(plan: readonly JobPlanLine[]): HelicalShaft | null {
  const named = new Set<HelicalShaft>();
  for (const l of plan) {
    if (l.category !== 'helical_piles' && !/helical/i.test(l.description)) continue;
    for (const s of shaftsNamedIn(`${l.description} ${l.code}`)) named.add(s);
  }
  return named.size === 1 ? [...named][0]! : null;
}

export interface ShaftDefault {
  shaft: HelicalShaft;
  /** Where it came from, for the hint under the field. */
  from: string;
}

/** The last pile logged (rows newest first, as mergeRows gives them), then the plan's, else none. */
export function defaultShaft(rows: readonly LogRow[], plan: readonly JobPlanLine[]): ShaftDefault | null {
  const last = rows.find((r) => r.kind === 'helical_pile' && r.shaft);
  if (last?.shaft) return { shaft: last.shaft, from: `As pile ${last.number}, the last one logged.` };
  const planned = planShaft(plan);
  return planned ? { shaft: planned, from: 'As the plan names it.' } : null;
}
