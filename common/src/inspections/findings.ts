// The findings checklist of an inspection: what the salesperson looks at in and around a settling
// house. One list, used by the server (validation, the rule for completing an inspection) and by the
// screens (the form, in this order, with these labels).
//
// These are observations recorded at a visit, not a structural evaluation: what they mean, and what
// to do about them, is for a licensed engineer and the local building department.

export const CRACK_ORIENTATIONS = ['horizontal', 'vertical', 'diagonal', 'stair_step'] as const;
export type CrackOrientation = (typeof CRACK_ORIENTATIONS)[number];
export const CRACK_ORIENTATION_LABELS: Record<CrackOrientation, string> = {
  horizontal: 'Horizontal',
  vertical: 'Vertical',
  diagonal: 'Diagonal',
  stair_step: 'Stair-step (along mortar joints)',
};

export const GUTTER_COVERAGES = ['none', 'partial', 'full'] as const;
export type GutterCoverage = (typeof GUTTER_COVERAGES)[number];
export const GUTTER_COVERAGE_LABELS: Record<GutterCoverage, string> = {
  none: 'No gutters',
  partial: 'Gutters on part of the roof line',
  full: 'Gutters all round',
};

export const GRADINGS = ['toward', 'flat', 'away'] as const;
export type Grading = (typeof GRADINGS)[number];
export const GRADING_LABELS: Record<Grading, string> = {
  toward: 'Slopes toward the house',
  flat: 'Flat',
  away: 'Slopes away from the house',
};

export const SOIL_TYPES = ['clay', 'sand', 'silt', 'loam', 'fill', 'unknown'] as const;
export type SoilType = (typeof SOIL_TYPES)[number];
export const SOIL_TYPE_LABELS: Record<SoilType, string> = {
  clay: 'Clay',
  sand: 'Sand',
  silt: 'Silt',
  loam: 'Loam',
  fill: 'Fill',
  unknown: 'Not known',
};

export const SOIL_MOISTURES = ['dry', 'moist', 'wet'] as const;
export type SoilMoisture = (typeof SOIL_MOISTURES)[number];
export const SOIL_MOISTURE_LABELS: Record<SoilMoisture, string> = {
  dry: 'Dry',
  moist: 'Moist',
  wet: 'Wet',
};

/** Crack width in inches, as a decimal string: more than 0, under 100, at most 4 decimals (1/16 in = "0.0625"). */
export const CRACK_WIDTH_PATTERN = /^(?=.*[1-9])\d{1,2}(\.\d{1,4})?$/;
export const FINDINGS_MAX_ENTRIES = 50;
export const FINDINGS_LOCATION_MAX_LENGTH = 120;
export const FINDINGS_NOTE_MAX_LENGTH = 1000;

export interface CrackFinding {
  /** Where: "Living room, NE corner above the window". */
  location: string;
  /** Widest point, inches, decimal string ("0.125"). */
  widthIn: string;
  orientation: CrackOrientation;
  note?: string;
}

export interface LocationFinding {
  location: string;
  note?: string;
}

/** A yes/no observation with an optional note. */
export interface ObservedFinding {
  observed: boolean;
  note?: string;
}

export interface DrainageFinding {
  gutters: GutterCoverage;
  downspoutsDischargeNearFoundation: boolean;
  grading: Grading;
  note?: string;
}

export interface SoilFinding {
  type: SoilType;
  moisture: SoilMoisture;
  note?: string;
}

export interface InspectionFindings {
  interiorCracks: CrackFinding[];
  exteriorCracks: CrackFinding[];
  doorsWindowsSticking: LocationFinding[];
  floorSlope: ObservedFinding;
  erosion: ObservedFinding;
  drainage: DrainageFinding;
  wallRotation: ObservedFinding;
  plumbingLeaks: ObservedFinding;
  soil: SoilFinding;
}

export type FindingsItemKey = keyof InspectionFindings;

export type FindingsItemKind = 'cracks' | 'locations' | 'observed' | 'drainage' | 'soil';

export interface FindingsItem {
  key: FindingsItemKey;
  kind: FindingsItemKind;
  label: string;
  /** What to look for, shown under the label. */
  hint: string;
  /** A safety caution to show with the item, where one applies. */
  caution?: string;
}

/** The checklist, in the order the form shows it. An empty list ("none seen") is an answer. */
export const FINDINGS_ITEMS: readonly FindingsItem[] = [
  {
    key: 'interiorCracks',
    kind: 'cracks',
    label: 'Interior cracks',
    hint: 'Walls, ceilings and floors inside: where, how wide at the widest point, which way they run.',
  },
  {
    key: 'exteriorCracks',
    kind: 'cracks',
    label: 'Exterior cracks',
    hint: 'Brick, block, stucco, the foundation wall and the slab edge.',
  },
  {
    key: 'doorsWindowsSticking',
    kind: 'locations',
    label: 'Doors and windows sticking',
    hint: 'Doors or windows that stick, rub, will not latch, or show uneven gaps.',
  },
  {
    key: 'floorSlope',
    kind: 'observed',
    label: 'Floor slope noticed',
    hint: 'A slope felt underfoot or seen with a level or a rolling ball; the survey measures it.',
  },
  {
    key: 'erosion',
    kind: 'observed',
    label: 'Erosion',
    hint: 'Soil washed away at the foundation, exposed footings, voids under the slab edge.',
  },
  {
    key: 'drainage',
    kind: 'drainage',
    label: 'Drainage and gutters',
    hint: 'Gutters, where the downspouts discharge, and which way the ground slopes.',
  },
  {
    key: 'wallRotation',
    kind: 'observed',
    label: 'Wall rotation',
    hint: 'Foundation or basement walls bowing, leaning or sliding inward.',
    caution:
      'A wall that bows or leans can give way: keep people away from it and refer it to a licensed engineer.',
  },
  {
    key: 'plumbingLeaks',
    kind: 'observed',
    label: 'Plumbing leaks',
    hint: 'Signs of leaking supply or drain lines: damp areas, high water bills, water heard running.',
  },
  {
    key: 'soil',
    kind: 'soil',
    label: 'Soil observed',
    hint: 'The soil at the foundation as seen at the visit: its kind and how wet it is.',
  },
];

export const FINDINGS_ITEM_KEYS: readonly FindingsItemKey[] = FINDINGS_ITEMS.map((i) => i.key);

export const FINDINGS_CAUTION =
  'Findings are observations made at a visit, not a structural evaluation. A licensed engineer and the local ' +
  'building department decide what they mean and what work is needed.';

/**
 * The checklist items not yet answered, in checklist order. An inspection can be completed only when
 * this is empty: every item answered, an empty list meaning "none seen".
 */
export function missingFindings(findings: Partial<InspectionFindings> | null | undefined): FindingsItemKey[] {
  const given = (findings ?? {}) as Record<string, unknown>;
  return FINDINGS_ITEM_KEYS.filter((key) => given[key] === undefined || given[key] === null);
}
