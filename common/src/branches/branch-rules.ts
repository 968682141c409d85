import Decimal from 'decimal.js';

/** How a branch handles sales tax on a repair contract (a real-property improvement). */
export const SALES_TAX_TREATMENTS = ['materials_cost', 'invoice'] as const;
export type SalesTaxTreatment = (typeof SALES_TAX_TREATMENTS)[number];

export const SALES_TAX_TREATMENT_LABELS: Record<SalesTaxTreatment, string> = {
  // Fla. Admin. Code 12A-1.051 (memory) / Texas Tax Code 151.056(a) (published): under a lump-sum
  // contract the contractor is the consumer of the materials and pays tax on their cost.
  materials_cost: 'Contractor pays tax on materials cost',
  invoice: 'Tax charged on the invoice',
};

/** USPS two-letter codes of the states and DC (an open standard list). */
// prettier-ignore
export const US_STATES = [
  'AL', 'AK', 'AZ', 'AR', 'CA', 'CO', 'CT', 'DE', 'DC', 'FL', 'GA', 'HI', 'ID', 'IL', 'IN', 'IA', 'KS',
  'KY', 'LA', 'ME', 'MD', 'MA', 'MI', 'MN', 'MS', 'MO', 'MT', 'NE', 'NV', 'NH', 'NJ', 'NM', 'NY', 'NC',
  'ND', 'OH', 'OK', 'OR', 'PA', 'RI', 'SC', 'SD', 'TN', 'TX', 'UT', 'VT', 'VA', 'WA', 'WV', 'WI', 'WY',
] as const;

/** IANA zones offered for a branch; the server accepts any zone the runtime knows. */
export const US_TIMEZONES = [
  'America/New_York',
  'America/Chicago',
  'America/Denver',
  'America/Phoenix',
  'America/Los_Angeles',
  'America/Anchorage',
  'Pacific/Honolulu',
] as const;

export const BRANCH_CODE_PATTERN = /^[A-Z][A-Z0-9]{1,7}$/;

/** A percentage typed as a string: 0 to 100 with at most two decimals. */
export const PERCENT_PATTERN = /^(100(\.0{1,2})?|\d{1,2}(\.\d{1,2})?)$/;

export interface DiscountAuthority {
  /** Largest discount, as a percentage of list price, a salesperson may give without approval. */
  salesperson: string;
  /** Largest discount a branch manager may approve; beyond it only the owner may. */
  branch_manager: string;
}

/** A discount authority is sensible when the manager's reach is at least the salesperson's. */
export function discountAuthorityProblem(a: DiscountAuthority): string | null {
  if (!PERCENT_PATTERN.test(a.salesperson) || !PERCENT_PATTERN.test(a.branch_manager)) {
    return 'Discount limits are percentages from 0 to 100.';
  }
  if (new Decimal(a.branch_manager).lessThan(a.salesperson)) {
    return "The branch manager's limit cannot be below the salesperson's.";
  }
  return null;
}

export function isKnownTimezone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}
