import {
  FOUNDATION_TYPES,
  PREFERRED_CONTACTS,
  US_STATES,
  type FoundationType,
  type LeadDetail,
  type LeadInput,
  type PreferredContact,
} from '@loambook/common';
import type { FieldErrors } from '@/lib/form-errors';
import type { DuplicateCheckInput } from './api/check-duplicates';
import type { LeadPatch } from './api/update-lead';

/** The form's fields, named as the server names them in its validation details. */
export const LEAD_FIELDS = [
  'homeownerName',
  'phonePrimary',
  'phoneSecondary',
  'email',
  'preferredContact',
  'addressLine1',
  'city',
  'state',
  'postalCode',
  'yearBuilt',
  'foundationType',
  'source',
  'notes',
  'branchId',
  'salespersonId',
] as const;
export type LeadField = (typeof LEAD_FIELDS)[number];

/** Everything as typed; '' for nothing chosen. */
export type LeadFormValues = Record<LeadField, string>;

export const EMPTY_LEAD: LeadFormValues = {
  homeownerName: '',
  phonePrimary: '',
  phoneSecondary: '',
  email: '',
  preferredContact: 'phone',
  addressLine1: '',
  city: '',
  state: '',
  postalCode: '',
  yearBuilt: '',
  foundationType: '',
  source: '',
  notes: '',
  branchId: '',
  salespersonId: '',
};

export function valuesFromLead(lead: LeadDetail): LeadFormValues {
  return {
    homeownerName: lead.homeownerName,
    phonePrimary: lead.phonePrimary ?? '',
    phoneSecondary: lead.phoneSecondary ?? '',
    email: lead.email ?? '',
    preferredContact: lead.preferredContact,
    addressLine1: lead.addressLine1,
    city: lead.city,
    state: lead.state,
    postalCode: lead.postalCode,
    yearBuilt: lead.yearBuilt == null ? '' : String(lead.yearBuilt),
    foundationType: lead.foundationType ?? '',
    source: lead.source ?? '',
    notes: lead.notes ?? '',
    branchId: lead.branchId,
    salespersonId: lead.salespersonId ?? '',
  };
}

// The server's patterns (backend/src/leads/dto/lead.dto.ts).
const PHONE = /^[0-9+()\-. ]{7,32}$/;
const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;
const ZIP = /^\d{5}(-\d{4})?$/;
const YEAR = /^\d{4}$/;
export const PHONE_MESSAGE = 'Enter a phone number (digits, spaces, dashes).';
const CONTACT_MESSAGE = 'Give a phone number or an e-mail address.';

const t = (v: string) => v.trim();

/** The checks the server makes, so most faults show at once. `needsBranch`: a new lead names its branch. */
export function validateLead(
  values: LeadFormValues,
  options: { needsBranch: boolean },
): FieldErrors<LeadField> {
  const e: FieldErrors<LeadField> = {};
  const name = t(values.homeownerName);
  if (name.length < 2) e.homeownerName = 'Enter the homeowner’s name.';
  else if (name.length > 120) e.homeownerName = 'Use at most 120 characters.';

  const phone = t(values.phonePrimary);
  const email = t(values.email);
  if (phone && !PHONE.test(phone)) e.phonePrimary = PHONE_MESSAGE;
  if (t(values.phoneSecondary) && !PHONE.test(t(values.phoneSecondary))) e.phoneSecondary = PHONE_MESSAGE;
  if (email && (!EMAIL.test(email) || email.length > 254)) e.email = 'Enter a valid e-mail address.';
  if (!phone && !email) e.phonePrimary = CONTACT_MESSAGE;
  if (values.preferredContact === 'email' && !email && !e.email) {
    e.email = 'Enter the e-mail address, or choose another way to contact them.';
  }
  if ((values.preferredContact === 'phone' || values.preferredContact === 'text') && !phone && email) {
    e.phonePrimary = 'Enter the phone number, or choose e-mail as the preferred contact.';
  }
  if (!(PREFERRED_CONTACTS as readonly string[]).includes(values.preferredContact)) {
    e.preferredContact = 'Choose how the homeowner prefers to be contacted.';
  }

  const street = t(values.addressLine1);
  if (street.length < 3) e.addressLine1 = 'Enter the street address.';
  else if (street.length > 120) e.addressLine1 = 'Use at most 120 characters.';
  const city = t(values.city);
  if (city.length < 2) e.city = 'Enter the city.';
  else if (city.length > 80) e.city = 'Use at most 80 characters.';
  if (!(US_STATES as readonly string[]).includes(values.state)) e.state = 'Choose a US state.';
  if (!ZIP.test(t(values.postalCode))) e.postalCode = 'Enter a 5-digit ZIP code (or ZIP+4).';

  const year = t(values.yearBuilt);
  if (year) {
    const next = new Date().getFullYear() + 1;
    if (!YEAR.test(year)) e.yearBuilt = 'Enter the year as four digits.';
    else if (Number(year) < 1700) e.yearBuilt = 'Enter a year after 1700.';
    else if (Number(year) > next) e.yearBuilt = `Enter a year up to ${next}.`;
  }
  if (t(values.notes).length > 4000) e.notes = 'Use at most 4000 characters.';
  if (options.needsBranch && !values.branchId) e.branchId = 'Choose the branch that takes this lead.';
  return e;
}

const orNull = (v: string) => (t(v) === '' ? null : t(v));

/** The request body of a new lead, from values that passed validateLead. */
export function toLeadInput(values: LeadFormValues, options: { sendSalesperson: boolean }): LeadInput {
  return {
    branchId: values.branchId,
    ...(options.sendSalesperson ? { salespersonId: values.salespersonId || null } : {}),
    homeownerName: t(values.homeownerName),
    phonePrimary: orNull(values.phonePrimary),
    phoneSecondary: orNull(values.phoneSecondary),
    email: orNull(values.email),
    preferredContact: values.preferredContact as PreferredContact,
    addressLine1: t(values.addressLine1),
    city: t(values.city),
    state: values.state,
    postalCode: t(values.postalCode),
    yearBuilt: t(values.yearBuilt) ? Number(t(values.yearBuilt)) : null,
    foundationType: (FOUNDATION_TYPES as readonly string[]).includes(values.foundationType)
      ? (values.foundationType as FoundationType)
      : null,
    source: orNull(values.source),
    notes: orNull(values.notes),
  };
}

/** Only what changed, for a PATCH (the branch changes by a transfer, never here). */
export function leadPatch(
  original: LeadFormValues,
  values: LeadFormValues,
  options: { sendSalesperson: boolean },
): LeadPatch {
  const before = toLeadInput(original, options);
  const after = toLeadInput(values, options);
  const patch: LeadPatch = {};
  for (const key of Object.keys(after) as (keyof LeadInput)[]) {
    if (key === 'branchId') continue;
    if (after[key] !== before[key]) Object.assign(patch, { [key]: after[key] });
  }
  return patch;
}

/**
 * What is worth a duplicate check: a street address with its ZIP, a phone number of seven digits or
 * more, an e-mail address that looks complete. null when there is nothing yet.
 */
export function duplicateCheckInput(values: LeadFormValues, excludeId?: string): DuplicateCheckInput | null {
  const input: DuplicateCheckInput = {};
  const street = t(values.addressLine1);
  const zip = t(values.postalCode);
  if (street.length >= 3 && /^\d{5}/.test(zip)) {
    input.addressLine1 = street;
    input.postalCode = zip;
  }
  const phone = t(values.phonePrimary);
  if (phone.replace(/\D/g, '').length >= 7 && phone.length <= 32) input.phone = phone;
  const email = t(values.email);
  if (EMAIL.test(email) && email.length <= 254) input.email = email;
  if (Object.keys(input).length === 0) return null;
  if (excludeId) input.excludeId = excludeId;
  return input;
}
