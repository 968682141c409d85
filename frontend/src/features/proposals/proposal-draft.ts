import {
  approvalDecision,
  commissionPreview,
  money,
  PricingError,
  priceOption,
  QUANTITY_PATTERN,
  UNIT_AMOUNT_PATTERN,
  type ApprovalDecision,
  type CreateProposalRequest,
  type DiscountAuthority,
  type DiscountKind,
  type OptionTax,
  type OptionTotals,
  type PriceBookItem,
  type PriceLineInput,
  type ProposalDetail,
  type QuantitySource,
  type Role,
} from '@loambook/common';

/** Most options a proposal offers, and most lines an option has (backend/src/proposals/dto). */
export const MAX_OPTIONS = 6;
export const MAX_LINES = 40;

export interface LineDraft {
  key: string;
  priceBookItemId: string | null;
  /** As typed: a decimal string, never a number. */
  quantity: string;
  quantitySource: QuantitySource;
}

export interface OptionDraft {
  key: string;
  title: string;
  description: string;
  discountKind: DiscountKind;
  discountValue: string;
  lines: LineDraft[];
}

export interface ProposalDraft {
  inspectionId: string | null;
  notes: string;
  options: OptionDraft[];
}

let counter = 0;
const nextKey = (prefix: string) => `${prefix}${++counter}`;

export function emptyLine(): LineDraft {
  return { key: nextKey('l'), priceBookItemId: null, quantity: '', quantitySource: 'typed' };
}

export function emptyOption(position: number): OptionDraft {
  return {
    key: nextKey('o'),
    title: `Option ${position}`,
    description: '',
    discountKind: 'none',
    discountValue: '',
    lines: [emptyLine()],
  };
}

export function newDraft(inspectionId: string | null): ProposalDraft {
  return { inspectionId, notes: '', options: [emptyOption(1)] };
}

export function draftFromProposal(p: ProposalDetail): ProposalDraft {
  return {
    inspectionId: p.inspectionId,
    notes: p.notes ?? '',
    options: [...p.options]
      .sort((a, b) => a.position - b.position)
      .map((o) => ({
        key: nextKey('o'),
        title: o.title,
        description: o.description ?? '',
        discountKind: o.discount.kind,
        discountValue: o.discount.kind === 'none' ? '' : o.discount.value,
        lines: [...o.lines]
          .sort((a, b) => a.position - b.position)
          .map((l) => ({
            key: nextKey('l'),
            priceBookItemId: l.priceBookItemId,
            quantity: l.quantity,
            quantitySource: l.quantitySource,
          })),
      })),
  };
}

/** The request body. Call after validateDraft found nothing. */
export function draftToRequest(d: ProposalDraft): CreateProposalRequest {
  return {
    inspectionId: d.inspectionId,
    notes: d.notes.trim() || null,
    options: d.options.map((o) => ({
      title: o.title.trim(),
      description: o.description.trim() || null,
      discount:
        o.discountKind === 'none'
          ? { kind: 'none', value: '0' }
          : { kind: o.discountKind, value: o.discountValue.trim() },
      lines: o.lines.map((l) => ({
        priceBookItemId: l.priceBookItemId ?? '',
        quantity: l.quantity.trim(),
        quantitySource: l.quantitySource,
      })),
    })),
  };
}

/** Whether two drafts ask for the same thing (keys and untouched spacing aside); amounts by value. */
export function sameDraft(a: ProposalDraft, b: ProposalDraft): boolean {
  const norm = (d: ProposalDraft) => {
    const r = draftToRequest(d);
    return JSON.stringify({
      ...r,
      options: r.options.map((o) => ({
        ...o,
        discount: { kind: o.discount.kind, value: canonical(o.discount.value) },
        lines: o.lines.map((l) => ({ ...l, quantity: canonical(l.quantity) })),
      })),
    });
  };
  return norm(a) === norm(b);
}

/** "10.00" and "10" are the same figure; anything unparseable stays as typed. */
function canonical(value: string): string {
  try {
    return money(value).toString();
  } catch {
    return value;
  }
}

export type DraftErrors = Record<string, string>;

/** Field names as the server gives them: options.0.title, options.0.lines.1.quantity, options.0.discount.value. */
export function validateDraft(d: ProposalDraft, previews: (OptionPreview | null)[] = []): DraftErrors {
  const errors: DraftErrors = {};
  if (d.options.length === 0) errors.options = 'A proposal needs at least one option.';
  d.options.forEach((o, i) => {
    const at = `options.${i}`;
    const title = o.title.trim();
    if (!title) errors[`${at}.title`] = 'Give the option a title.';
    else if (title.length > 120) errors[`${at}.title`] = 'Use at most 120 characters.';
    if (o.description.trim().length > 2000) errors[`${at}.description`] = 'Use at most 2000 characters.';
    if (o.lines.length === 0) errors[`${at}.lines`] = 'An option needs at least one line.';
    o.lines.forEach((l, j) => {
      if (!l.priceBookItemId)
        errors[`${at}.lines.${j}.priceBookItemId`] = 'Choose an item from the price book.';
      const q = l.quantity.trim();
      if (!q) errors[`${at}.lines.${j}.quantity`] = 'Enter the quantity.';
      else if (!QUANTITY_PATTERN.test(q))
        errors[`${at}.lines.${j}.quantity`] = 'Enter a number with at most 3 decimals, e.g. 12.5.';
      else if (money(q).isZero()) errors[`${at}.lines.${j}.quantity`] = 'The quantity must be more than 0.';
    });
    if (o.discountKind !== 'none') {
      const v = o.discountValue.trim();
      const field = `${at}.discount.value`;
      if (!UNIT_AMOUNT_PATTERN.test(v))
        errors[field] =
          o.discountKind === 'percent'
            ? 'Enter a percentage with at most two decimals, e.g. 5.'
            : 'Enter an amount in dollars with at most two decimals, e.g. 250.';
      else if (o.discountKind === 'percent' && money(v).greaterThan(100))
        errors[field] = 'A discount cannot be more than 100% of the list price.';
      else {
        const list = previews[i]?.totals?.listTotal;
        if (o.discountKind === 'amount' && list && money(v).greaterThan(money(list)))
          errors[field] = `A discount cannot be more than the list price (${list}).`;
      }
    }
  });
  return errors;
}

/** A line's figures: the ones already quoted on the version being edited, else today's price book. */
export interface LinePrices {
  unitCost: string;
  unitPrice: string;
  category: string;
}

export interface PricingContext {
  items: Map<string, PriceBookItem>;
  /** Prices held by the saved version, by price-book item (the server keeps them unless prices are refreshed). */
  held: Map<string, LinePrices>;
  tax: OptionTax;
}

export function heldPrices(p: ProposalDetail | null): Map<string, LinePrices> {
  const held = new Map<string, LinePrices>();
  for (const o of p?.options ?? [])
    for (const l of o.lines)
      if (l.priceBookItemId && !held.has(l.priceBookItemId))
        held.set(l.priceBookItemId, { unitCost: l.unitCost, unitPrice: l.unitPrice, category: l.category });
  return held;
}

export function linePrices(line: LineDraft, ctx: PricingContext): LinePrices | null {
  if (!line.priceBookItemId) return null;
  const held = ctx.held.get(line.priceBookItemId);
  if (held) return held;
  const item = ctx.items.get(line.priceBookItemId);
  return item ? { unitCost: item.unitCost, unitPrice: item.unitPrice, category: item.category } : null;
}

export interface OptionPreview {
  /** null when the figures cannot be priced yet (an invalid discount). */
  totals: OptionTotals | null;
  /** Lines left out because they have no item or no valid quantity yet. */
  incompleteLines: number;
  problem: string | null;
}

/**
 * The option's totals as the server will compute them on save (priceOption from common/, decimal.js):
 * a live preview only — the saved figures come from the API.
 */
export function previewOption(o: OptionDraft, ctx: PricingContext): OptionPreview {
  const lines: PriceLineInput[] = [];
  let incompleteLines = 0;
  for (const l of o.lines) {
    const prices = linePrices(l, ctx);
    const q = l.quantity.trim();
    if (!prices || !QUANTITY_PATTERN.test(q) || money(q).isZero()) {
      incompleteLines++;
      continue;
    }
    lines.push({
      quantity: q,
      unitCost: prices.unitCost,
      unitPrice: prices.unitPrice,
      category: prices.category,
    });
  }
  const v = o.discountValue.trim();
  const discount =
    o.discountKind === 'none' || !v
      ? { kind: 'none' as const, value: '0' }
      : { kind: o.discountKind, value: v };
  try {
    return { totals: priceOption({ lines, discount, tax: ctx.tax }), incompleteLines, problem: null };
  } catch (e) {
    if (e instanceof PricingError) return { totals: null, incompleteLines, problem: e.message };
    return { totals: null, incompleteLines, problem: 'These figures cannot be priced yet.' };
  }
}

export interface ApprovalSettings {
  marginFloorPct: string;
  discountAuthority: DiscountAuthority;
}

export function previewApproval(
  totals: OptionTotals | null,
  role: Role,
  settings: ApprovalSettings,
): ApprovalDecision | null {
  if (!totals) return null;
  return approvalDecision({
    role,
    marginFloorPct: settings.marginFloorPct,
    discountAuthority: settings.discountAuthority,
    discountPct: totals.discountPct,
    grossMarginPct: totals.grossMarginPct,
  });
}

export function previewCommission(totals: OptionTotals | null, ratePct: string | null): string | null {
  if (!totals || !ratePct) return null;
  return commissionPreview({
    netTotal: totals.netTotal,
    grossProfit: totals.grossProfit,
    ratePct,
    basis: 'net',
  });
}
