import {
  BRANCH_CODE_PATTERN,
  PERCENT_PATTERN,
  SALES_TAX_TREATMENTS,
  US_STATES,
  discountAuthorityProblem,
  money,
  type Branch,
  type BranchInput,
  type SalesTaxTreatment,
} from '@loambook/common';
import type { FieldErrors } from '@/lib/form-errors';

/** The form's fields, named as the server names them in its validation details. */
export const BRANCH_FIELDS = [
  'code',
  'name',
  'addressLine1',
  'city',
  'state',
  'postalCode',
  'phone',
  'timezone',
  'marginFloorPct',
  'discountAuthority.salesperson',
  'discountAuthority.branch_manager',
  'salesTaxTreatment',
  'salesTaxRatePct',
] as const;
export type BranchField = (typeof BRANCH_FIELDS)[number];

/** Everything as typed: percentages stay text from the keyboard to the wire. */
export type BranchFormValues = Record<BranchField, string>;

export const EMPTY_BRANCH: BranchFormValues = {
  code: '',
  name: '',
  addressLine1: '',
  city: '',
  state: '',
  postalCode: '',
  phone: '',
  timezone: '',
  marginFloorPct: '',
  'discountAuthority.salesperson': '',
  'discountAuthority.branch_manager': '',
  // Lump-sum repair contracts usually make the contractor the consumer of the materials (see
  // SALES_TAX_TREATMENT_LABELS in common); the form says to confirm it for the branch's state.
  salesTaxTreatment: 'materials_cost',
  salesTaxRatePct: '',
};

export function valuesFromBranch(branch: Branch): BranchFormValues {
  return {
    code: branch.code,
    name: branch.name,
    addressLine1: branch.addressLine1,
    city: branch.city,
    state: branch.state,
    postalCode: branch.postalCode,
    phone: branch.phone ?? '',
    timezone: branch.timezone,
    marginFloorPct: branch.marginFloorPct,
    'discountAuthority.salesperson': branch.discountAuthority.salesperson,
    'discountAuthority.branch_manager': branch.discountAuthority.branch_manager,
    salesTaxTreatment: branch.salesTaxTreatment,
    salesTaxRatePct: branch.salesTaxRatePct,
  };
}

export const PERCENT_MESSAGE = 'Enter a percentage from 0 to 100 with at most two decimals, e.g. 12.5.';
const ZIP_PATTERN = /^\d{5}(-\d{4})?$/;

const trimmed = (v: string) => v.trim();

/** The same checks the server makes (backend/src/branches/dto/branch.dto.ts), so most faults show at once. */
export function validateBranch(values: BranchFormValues): FieldErrors<BranchField> {
  const errors: FieldErrors<BranchField> = {};
  const code = trimmed(values.code).toUpperCase();
  if (!BRANCH_CODE_PATTERN.test(code))
    errors.code = 'Use 2 to 8 capital letters or digits, starting with a letter.';

  const name = trimmed(values.name);
  if (name.length < 2) errors.name = 'Enter the branch name.';
  else if (name.length > 80) errors.name = 'Use at most 80 characters.';

  const street = trimmed(values.addressLine1);
  if (street.length < 3) errors.addressLine1 = 'Enter the street address.';
  else if (street.length > 120) errors.addressLine1 = 'Use at most 120 characters.';

  const city = trimmed(values.city);
  if (city.length < 2) errors.city = 'Enter the city.';
  else if (city.length > 80) errors.city = 'Use at most 80 characters.';

  if (!(US_STATES as readonly string[]).includes(values.state)) errors.state = 'Choose a US state.';
  if (!ZIP_PATTERN.test(trimmed(values.postalCode)))
    errors.postalCode = 'Enter a 5-digit ZIP code (or ZIP+4).';
  if (trimmed(values.phone).length > 32) errors.phone = 'Use at most 32 characters.';
  if (!values.timezone) errors.timezone = 'Choose the time zone the branch works in.';

  const percent = (field: BranchField) => {
    if (!PERCENT_PATTERN.test(trimmed(values[field]))) errors[field] = PERCENT_MESSAGE;
  };
  percent('marginFloorPct');
  percent('discountAuthority.salesperson');
  percent('discountAuthority.branch_manager');
  percent('salesTaxRatePct');
  if (!errors['discountAuthority.salesperson'] && !errors['discountAuthority.branch_manager']) {
    const problem = discountAuthorityProblem({
      salesperson: trimmed(values['discountAuthority.salesperson']),
      branch_manager: trimmed(values['discountAuthority.branch_manager']),
    });
    if (problem) errors['discountAuthority.branch_manager'] = problem;
  }

  if (!(SALES_TAX_TREATMENTS as readonly string[]).includes(values.salesTaxTreatment)) {
    errors.salesTaxTreatment = 'Choose how sales tax is handled.';
  }
  return errors;
}

/** The request body, from values that passed validateBranch. */
export function toBranchInput(values: BranchFormValues): BranchInput {
  const phone = trimmed(values.phone);
  return {
    code: trimmed(values.code).toUpperCase(),
    name: trimmed(values.name),
    addressLine1: trimmed(values.addressLine1),
    city: trimmed(values.city),
    state: values.state,
    postalCode: trimmed(values.postalCode),
    phone: phone === '' ? null : phone,
    timezone: values.timezone,
    marginFloorPct: trimmed(values.marginFloorPct),
    discountAuthority: {
      salesperson: trimmed(values['discountAuthority.salesperson']),
      branch_manager: trimmed(values['discountAuthority.branch_manager']),
    },
    salesTaxTreatment: values.salesTaxTreatment as SalesTaxTreatment,
    salesTaxRatePct: trimmed(values.salesTaxRatePct),
  };
}

/** Only what changed, for a PATCH; the two discount limits always travel together. */
export function branchPatch(original: Branch, input: BranchInput): Partial<BranchInput> {
  const patch: Partial<BranchInput> = {};
  const keys = [
    'code',
    'name',
    'addressLine1',
    'city',
    'state',
    'postalCode',
    'phone',
    'timezone',
    'marginFloorPct',
    'salesTaxTreatment',
    'salesTaxRatePct',
  ] as const;
  for (const key of keys) {
    if (input[key] !== original[key]) Object.assign(patch, { [key]: input[key] });
  }
  const da = input.discountAuthority;
  if (
    da.salesperson !== original.discountAuthority.salesperson ||
    da.branch_manager !== original.discountAuthority.branch_manager
  ) {
    patch.discountAuthority = da;
  }
  return patch;
}

/** Orders two percentage strings by value without turning them into JavaScript numbers. */
export function comparePercent(a: string, b: string): number {
  try {
    return money(a).comparedTo(money(b));
  } catch {
    return a.localeCompare(b);
  }
}
