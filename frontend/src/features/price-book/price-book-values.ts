import {
  formatPct,
  money,
  MoneyDecimal,
  PRICE_BOOK_CATEGORIES,
  PRICE_BOOK_CODE_PATTERN,
  PRICE_BOOK_UNITS,
  UNIT_AMOUNT_PATTERN,
  type CreatePriceBookItemRequest,
  type PriceBookCategory,
  type PriceBookItem,
  type PriceBookUnit,
  type UpdatePriceBookItemRequest,
} from '@loambook/common';
import type { FieldErrors } from '@/lib/form-errors';

/** The dialog's fields, named as the server names them in its validation details. */
export const ITEM_FIELDS = ['code', 'description', 'category', 'unit', 'unitCost', 'unitPrice'] as const;
export type ItemField = (typeof ITEM_FIELDS)[number];

/** Everything as typed: amounts stay text from the keyboard to the wire. */
export interface ItemFormValues {
  code: string;
  description: string;
  category: PriceBookCategory | '';
  unit: PriceBookUnit | '';
  unitCost: string;
  unitPrice: string;
  active: boolean;
}

export const EMPTY_ITEM: ItemFormValues = {
  code: '',
  description: '',
  category: '',
  unit: '',
  unitCost: '',
  unitPrice: '',
  active: true,
};

export function valuesFromItem(item: PriceBookItem): ItemFormValues {
  return {
    code: item.code,
    description: item.description,
    category: item.category,
    unit: item.unit,
    unitCost: item.unitCost,
    unitPrice: item.unitPrice,
    active: item.active,
  };
}

export const AMOUNT_MESSAGE = 'Enter an amount of 0 or more with at most two decimals, e.g. 11.50.';

/** The checks the server makes (backend/src/price-book/dto/price-book.dto.ts), so most faults show at once. */
export function validateItem(values: ItemFormValues): FieldErrors<ItemField> {
  const errors: FieldErrors<ItemField> = {};
  const code = values.code.trim().toUpperCase();
  if (!code) errors.code = 'Enter a code, e.g. PU-LB.';
  else if (!PRICE_BOOK_CODE_PATTERN.test(code))
    errors.code = 'Use up to 24 capital letters, digits or hyphens, starting with a letter or digit.';
  const description = values.description.trim();
  if (description.length < 2) errors.description = 'Describe the item as it should read on a proposal.';
  else if (description.length > 200) errors.description = 'Use at most 200 characters.';
  if (!(PRICE_BOOK_CATEGORIES as readonly string[]).includes(values.category))
    errors.category = 'Choose a category.';
  if (!(PRICE_BOOK_UNITS as readonly string[]).includes(values.unit)) errors.unit = 'Choose a unit.';
  if (!UNIT_AMOUNT_PATTERN.test(values.unitCost.trim())) errors.unitCost = AMOUNT_MESSAGE;
  if (!UNIT_AMOUNT_PATTERN.test(values.unitPrice.trim())) errors.unitPrice = AMOUNT_MESSAGE;
  return errors;
}

/** The request body, from values that passed validateItem. */
export function toItemRequest(values: ItemFormValues): CreatePriceBookItemRequest {
  return {
    code: values.code.trim().toUpperCase(),
    description: values.description.trim(),
    category: values.category as PriceBookCategory,
    unit: values.unit as PriceBookUnit,
    unitCost: values.unitCost.trim(),
    unitPrice: values.unitPrice.trim(),
    active: values.active,
  };
}

/** Only what changed, for a PATCH. Amounts compare by value ("11.5" is "11.50"). */
export function itemPatch(
  item: PriceBookItem,
  input: CreatePriceBookItemRequest,
): UpdatePriceBookItemRequest {
  const patch: UpdatePriceBookItemRequest = {};
  if (input.code !== item.code) patch.code = input.code;
  if (input.description !== item.description) patch.description = input.description;
  if (input.category !== item.category) patch.category = input.category;
  if (input.unit !== item.unit) patch.unit = input.unit;
  if (!money(input.unitCost).equals(money(item.unitCost))) patch.unitCost = input.unitCost;
  if (!money(input.unitPrice).equals(money(item.unitPrice))) patch.unitPrice = input.unitPrice;
  if (input.active !== undefined && input.active !== item.active) patch.active = input.active;
  return patch;
}

const HUNDRED = new MoneyDecimal(100);

/**
 * Gross margin when the item sells at its list price: (price − cost) / price, as a percentage with two
 * decimals (decimal.js, never a float); null without a price to take a margin of or when a figure is not
 * a valid amount.
 */
export function marginAtList(unitCost: string, unitPrice: string): string | null {
  const cost = unitCost.trim();
  const price = unitPrice.trim();
  if (!UNIT_AMOUNT_PATTERN.test(cost) || !UNIT_AMOUNT_PATTERN.test(price)) return null;
  const p = money(price);
  if (p.isZero()) return null;
  return formatPct(p.minus(money(cost)).dividedBy(p).times(HUNDRED));
}

/** Is a margin string below the floor (both percentage strings)? */
export function belowFloor(marginPct: string | null, floorPct: string | null | undefined): boolean {
  if (marginPct === null || !floorPct) return false;
  return money(marginPct).lessThan(money(floorPct));
}
