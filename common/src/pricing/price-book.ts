// The price book's vocabulary: categories and units of an item, with the labels the screens show.
// Stored as text in price_book_items (CHECK constraints in the selling migration list the same values).

export const PRICE_BOOK_CATEGORIES = [
  'soil_stabilisation',
  'piers',
  'helical_piles',
  'drainage',
  'permits_engineering',
  'mobilisation',
] as const;
export type PriceBookCategory = (typeof PRICE_BOOK_CATEGORIES)[number];

export const PRICE_BOOK_CATEGORY_LABELS: Record<PriceBookCategory, string> = {
  soil_stabilisation: 'Soil stabilisation (polyurethane injection)',
  piers: 'Steel push piers',
  helical_piles: 'Helical piles',
  drainage: 'Drainage',
  permits_engineering: 'Permits and engineering',
  mobilisation: 'Mobilisation',
};

export const PRICE_BOOK_UNITS = ['each', 'lb', 'linear_ft', 'point', 'hour', 'lump_sum'] as const;
export type PriceBookUnit = (typeof PRICE_BOOK_UNITS)[number];

export const PRICE_BOOK_UNIT_LABELS: Record<PriceBookUnit, string> = {
  each: 'each',
  lb: 'lb',
  linear_ft: 'linear ft',
  point: 'point',
  hour: 'hour',
  lump_sum: 'lump sum',
};

/**
 * The categories whose lines count as materials when a branch pays sales tax on the cost of the
 * materials it installs (SALES_TAX_TREATMENTS 'materials_cost'). Our modelling choice: the whole unit
 * cost of a line in one of these categories is taken as materials cost. It overstates the tax a little
 * where a unit cost also carries labour, which can only make the margin shown lower, never higher;
 * permits, engineering and mobilisation are services and carry no materials.
 */
export const MATERIALS_CATEGORIES: readonly PriceBookCategory[] = [
  'soil_stabilisation',
  'piers',
  'helical_piles',
  'drainage',
];

/** Same pattern as the price_book_items.code CHECK constraint. */
export const PRICE_BOOK_CODE_PATTERN = /^[A-Z0-9][A-Z0-9-]{0,23}$/;

/** A unit cost or price typed as a string: up to 9 digits before the point, at most 2 after. */
export const UNIT_AMOUNT_PATTERN = /^\d{1,9}(\.\d{1,2})?$/;

/** A line quantity as a string: up to 7 digits before the point, at most 3 after (numeric(14,3)). */
export const QUANTITY_PATTERN = /^\d{1,7}(\.\d{1,3})?$/;

/** Where a line's quantity came from: typed by hand, or taken from one of the scope calculators. */
export const QUANTITY_SOURCES = ['typed', 'injection-plan', 'pier-plan'] as const;
export type QuantitySource = (typeof QUANTITY_SOURCES)[number];
