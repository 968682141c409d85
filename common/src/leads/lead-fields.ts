export const FOUNDATION_TYPES = ['slab', 'crawlspace', 'basement', 'pier_and_beam'] as const;
export type FoundationType = (typeof FOUNDATION_TYPES)[number];
export const FOUNDATION_TYPE_LABELS: Record<FoundationType, string> = {
  slab: 'Slab on grade',
  crawlspace: 'Crawlspace',
  basement: 'Basement',
  pier_and_beam: 'Pier and beam',
};

export const PREFERRED_CONTACTS = ['phone', 'text', 'email'] as const;
export type PreferredContact = (typeof PREFERRED_CONTACTS)[number];

export const LEAD_SOURCES = [
  'Phone call',
  'Website form',
  'Referral',
  'Repeat customer',
  'Home show',
  'Realtor',
  'Door hanger',
  'Other',
] as const;

/** Activities a person logs by hand; the rest are written by the system. */
export const MANUAL_ACTIVITY_KINDS = ['call', 'visit', 'note', 'email'] as const;
export type ManualActivityKind = (typeof MANUAL_ACTIVITY_KINDS)[number];
