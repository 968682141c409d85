/**
 * Keys for the possible-duplicate check when a lead is entered: the same address (letters and digits
 * of the street line, with the 5-digit ZIP), the same phone (its last ten digits) or the same e-mail.
 * The database computes the same keys in generated columns (migration 20261202000000_selling).
 */
export function phoneKey(phone: string | null | undefined): string {
  return (phone ?? '').replace(/[^0-9]/g, '').slice(-10);
}

export function emailKey(email: string | null | undefined): string | null {
  return email ? email.toLowerCase() : null;
}

export function addressKey(addressLine1: string, postalCode: string): string {
  return `${addressLine1.replace(/[^A-Za-z0-9]/g, '').toLowerCase()}:${postalCode.slice(0, 5)}`;
}

export type DuplicateReason = 'address' | 'phone' | 'email';
