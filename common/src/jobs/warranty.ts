// A completed job's warranty: its number and the fixed wording the certificate carries.
import { CAUTION_ENGINEER } from '../calculators/cautions';

/** Digits of the sequence in a warranty number; past 9999 it simply grows a digit. */
export const WARRANTY_SEQUENCE_DIGITS = 4;

/** "W-MRW-0007": the branch's code and the branch's own sequence of warranties. */
export function formatWarrantyNumber(branchCode: string, sequence: number): string {
  if (!/^[A-Z][A-Z0-9]{1,7}$/.test(branchCode)) throw new Error(`Not a branch code: ${branchCode}`);
  if (!Number.isInteger(sequence) || sequence < 1) throw new Error(`Not a sequence: ${sequence}`);
  return `W-${branchCode}-${String(sequence).padStart(WARRANTY_SEQUENCE_DIGITS, '0')}`;
}

/** The sequence of a warranty number of the branch, or null when it is not one. */
export function warrantySequence(branchCode: string, number: string): number | null {
  const prefix = `W-${branchCode}-`;
  if (!number.startsWith(prefix)) return null;
  const rest = number.slice(prefix.length);
  return /^\d{4,}$/.test(rest) ? Number(rest) : null;
}

/**
 * The last day of a warranty of `years` from `issuedOn`: the same day `years` later. Issued on 29 February
 * and ending in a common year, it runs to 1 March (the longer reading, which favours the homeowner).
 */
export function warrantyEndsOn(issuedOn: string, years: number): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(issuedOn);
  if (!m || !Number.isInteger(years) || years < 1)
    throw new Error(`Not a warranty term: ${issuedOn}, ${years}`);
  const year = Number(m[1]) + years;
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  const [month, day] = m[2] === '02' && m[3] === '29' && !leap ? ['03', '01'] : [m[2]!, m[3]!];
  return `${String(year).padStart(4, '0')}-${month}-${day}`;
}

export const WARRANTY_LIMITS = { termYearsMin: 1, termYearsMax: 99, textMaxLength: 4000 } as const;

/** Printed on every certificate. */
export const WARRANTY_CAUTION =
  "This warranty covers the contractor's own work as described. It does not replace the judgement of the " +
  'engineer of record or the decisions of the local building department. ' +
  CAUTION_ENGINEER;
