import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import {
  formatUsd,
  money,
  PRICE_BOOK_UNIT_LABELS,
  QUANTITY_PATTERN,
  toMoneyString,
  type DiscountKind,
  type PriceBookItem,
  type QuantitySource,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import type { PlanTarget } from './plan-dialog';
import {
  emptyLine,
  linePrices,
  MAX_LINES,
  type LineDraft,
  type OptionDraft,
  type PricingContext,
} from '../proposal-draft';

const DISCOUNT_OPTIONS: { label: string; value: DiscountKind }[] = [
  { label: 'None', value: 'none' },
  { label: 'Percent of list', value: 'percent' },
  { label: 'Amount ($)', value: 'amount' },
];

const SOURCE_LABELS: Record<QuantitySource, string | null> = {
  typed: null,
  'injection-plan': 'From the injection plan',
  'pier-plan': 'From the pier plan',
};

interface OptionEditorProps {
  option: OptionDraft;
  index: number;
  items: PriceBookItem[];
  ctx: PricingContext;
  errorFor: (field: string) => string | undefined;
  onChange: (next: OptionDraft) => void;
  onOpenPlan: (lineKey: string, target: PlanTarget) => void;
  onRemove: (() => void) | null;
  disabled: boolean;
}

/** Which calculator can fill a line's quantity, from the item's unit and category. */
export function planFor(item: PriceBookItem | undefined): PlanTarget['kind'] | null {
  if (!item) return null;
  if (item.unit === 'point' || item.unit === 'lb') return 'injection';
  if (item.unit === 'each' && (item.category === 'piers' || item.category === 'helical_piles')) return 'pier';
  return null;
}

const itemLabel = (i: PriceBookItem) => `${i.code} · ${i.description}`;

export function OptionEditor({
  option,
  index,
  items,
  ctx,
  errorFor,
  onChange,
  onOpenPlan,
  onRemove,
  disabled,
}: OptionEditorProps) {
  const at = `options.${index}`;
  const set = (patch: Partial<OptionDraft>) => onChange({ ...option, ...patch });
  const setLine = (key: string, patch: Partial<LineDraft>) =>
    set({ lines: option.lines.map((l) => (l.key === key ? { ...l, ...patch } : l)) });
  const idBase = `opt-${option.key}`;

  return (
    <div className="option-editor">
      <div className="form-grid">
        <FormField id={`${idBase}-title`} label="Option title" error={errorFor(`${at}.title`)} required>
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={option.title}
              onChange={(e) => set({ title: e.target.value })}
              invalid={invalid}
              maxLength={120}
              autoComplete="off"
              disabled={disabled}
            />
          )}
        </FormField>
        {onRemove ? (
          <div className="option-editor__remove">
            <Button
              type="button"
              label="Remove option"
              icon="pi pi-trash"
              severity="danger"
              text
              onClick={onRemove}
              disabled={disabled}
            />
          </div>
        ) : null}
      </div>
      <FormField
        id={`${idBase}-description`}
        label="Description"
        error={errorFor(`${at}.description`)}
        hint="Optional. What this option does for the house, in the homeowner’s words."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={option.description}
            onChange={(e) => set({ description: e.target.value })}
            invalid={invalid}
            rows={2}
            autoResize
            maxLength={2000}
            disabled={disabled}
          />
        )}
      </FormField>

      <fieldset className="option-lines" disabled={disabled}>
        <legend className="option-lines__legend">Lines</legend>
        {errorFor(`${at}.lines`) ? (
          <p className="form-field__error">
            <i className="pi pi-exclamation-circle" aria-hidden="true" /> {errorFor(`${at}.lines`)}
          </p>
        ) : null}
        <ol className="option-lines__list">
          {option.lines.map((line, j) => (
            <LineEditor
              key={line.key}
              line={line}
              number={j + 1}
              idBase={`${idBase}-${line.key}`}
              fieldBase={`${at}.lines.${j}`}
              items={items}
              ctx={ctx}
              errorFor={errorFor}
              onChange={(patch) => setLine(line.key, patch)}
              onOpenPlan={(target) => onOpenPlan(line.key, target)}
              onRemove={
                option.lines.length > 1
                  ? () => set({ lines: option.lines.filter((l) => l.key !== line.key) })
                  : null
              }
              disabled={disabled}
            />
          ))}
        </ol>
        <Button
          type="button"
          label="Add line"
          icon="pi pi-plus"
          outlined
          size="small"
          onClick={() => set({ lines: [...option.lines, emptyLine()] })}
          disabled={disabled || option.lines.length >= MAX_LINES}
        />
      </fieldset>

      <div className="form-grid option-discount">
        <FormField id={`${idBase}-discount`} label="Discount" error={errorFor(`${at}.discount.kind`)}>
          {({ invalid, id, ...aria }) => (
            <Select
              inputId={id}
              {...aria}
              value={option.discountKind}
              options={DISCOUNT_OPTIONS}
              onChange={(e) =>
                set({
                  discountKind: e.value as DiscountKind,
                  discountValue: e.value === 'none' ? '' : option.discountValue,
                })
              }
              invalid={invalid}
              disabled={disabled}
              panelClassName="app-overlay"
            />
          )}
        </FormField>
        <FormField
          id={`${idBase}-discount-value`}
          label="Discount value"
          error={errorFor(`${at}.discount.value`)}
          hint={
            option.discountKind === 'none'
              ? 'Choose a kind of discount first.'
              : option.discountKind === 'percent'
                ? 'Percent off the list total.'
                : 'Dollars off the list total.'
          }
        >
          {({ invalid, ...control }) => (
            <div className="p-inputgroup money-input">
              {option.discountKind === 'amount' ? (
                <span className="p-inputgroup-addon" aria-hidden="true">
                  $
                </span>
              ) : null}
              <InputText
                {...control}
                value={option.discountValue}
                onChange={(e) => set({ discountValue: e.target.value })}
                invalid={invalid}
                inputMode="decimal"
                autoComplete="off"
                maxLength={13}
                disabled={disabled || option.discountKind === 'none'}
              />
              {option.discountKind === 'percent' ? (
                <span className="p-inputgroup-addon" aria-hidden="true">
                  %
                </span>
              ) : null}
            </div>
          )}
        </FormField>
      </div>
    </div>
  );
}

interface LineEditorProps {
  line: LineDraft;
  number: number;
  idBase: string;
  fieldBase: string;
  items: PriceBookItem[];
  ctx: PricingContext;
  errorFor: (field: string) => string | undefined;
  onChange: (patch: Partial<LineDraft>) => void;
  onOpenPlan: (target: PlanTarget) => void;
  onRemove: (() => void) | null;
  disabled: boolean;
}

function LineEditor({
  line,
  number,
  idBase,
  fieldBase,
  items,
  ctx,
  errorFor,
  onChange,
  onOpenPlan,
  onRemove,
  disabled,
}: LineEditorProps) {
  const item = line.priceBookItemId ? ctx.items.get(line.priceBookItemId) : undefined;
  // Deactivated items are not offered, but a line that already has one keeps it.
  const choices = items.filter((i) => i.active || i.id === line.priceBookItemId);
  const prices = linePrices(line, ctx);
  const q = line.quantity.trim();
  const lineTotal =
    prices && QUANTITY_PATTERN.test(q) ? toMoneyString(money(q).times(money(prices.unitPrice))) : null;
  const plan = planFor(item);
  const unit = item ? (PRICE_BOOK_UNIT_LABELS[item.unit] ?? item.unit) : null;
  const source = SOURCE_LABELS[line.quantitySource];

  return (
    <li className="line-editor">
      <span className="line-editor__number" aria-hidden="true">
        {number}
      </span>
      <FormField
        id={`${idBase}-item`}
        label="Item"
        error={errorFor(`${fieldBase}.priceBookItemId`)}
        required
        className="line-editor__item"
      >
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={line.priceBookItemId}
            options={choices}
            optionValue="id"
            optionLabel="code"
            filter
            filterBy="code,description"
            filterInputAutoFocus
            filterPlaceholder="Search code or description"
            placeholder="Choose from the price book"
            emptyFilterMessage="No item matches"
            valueTemplate={(i: PriceBookItem | null, props) =>
              i ? (
                <span className="item-choice__value">{itemLabel(i)}</span>
              ) : (
                <span>{props.placeholder}</span>
              )
            }
            itemTemplate={(i: PriceBookItem) => (
              <div className="item-choice">
                <span className="item-choice__code">{i.code}</span>
                <span className="item-choice__description">{i.description}</span>
                <span className="item-choice__price">
                  {formatUsd(i.unitPrice)} / {PRICE_BOOK_UNIT_LABELS[i.unit] ?? i.unit}
                  {i.active ? '' : ' · deactivated'}
                </span>
              </div>
            )}
            onChange={(e) =>
              onChange({ priceBookItemId: (e.value as string | null) ?? null, quantitySource: 'typed' })
            }
            invalid={invalid}
            disabled={disabled}
            panelClassName="app-overlay item-choice-panel"
          />
        )}
      </FormField>
      <div className="line-editor__quantity">
        <FormField
          id={`${idBase}-quantity`}
          label="Quantity"
          error={errorFor(`${fieldBase}.quantity`)}
          required
          hint={source ?? undefined}
        >
          {({ invalid, ...control }) => (
            <div className="p-inputgroup quantity-input">
              <InputText
                {...control}
                value={line.quantity}
                onChange={(e) => onChange({ quantity: e.target.value, quantitySource: 'typed' })}
                invalid={invalid}
                inputMode="decimal"
                autoComplete="off"
                maxLength={11}
                disabled={disabled}
              />
              {unit ? (
                <span className="p-inputgroup-addon" aria-hidden="true">
                  {unit}
                </span>
              ) : null}
            </div>
          )}
        </FormField>
      </div>
      <div className="line-editor__figures">
        <span className="line-editor__unit-price">
          {prices ? `${formatUsd(prices.unitPrice)}${unit ? ` / ${unit}` : ''}` : '—'}
        </span>
        <span className="line-editor__total">{lineTotal ? formatUsd(lineTotal) : '—'}</span>
      </div>
      {onRemove ? (
        <Button
          type="button"
          icon="pi pi-times"
          text
          rounded
          severity="secondary"
          aria-label={`Remove line ${number}`}
          className="line-editor__remove"
          onClick={onRemove}
          disabled={disabled}
        />
      ) : (
        <span className="line-editor__remove" aria-hidden="true" />
      )}
      {plan && item && !disabled ? (
        <div className="line-editor__tools">
          <Button
            type="button"
            label={plan === 'pier' ? 'Piers from run' : 'Points from injection plan'}
            icon="pi pi-calculator"
            text
            size="small"
            className="line-editor__plan"
            onClick={() => onOpenPlan({ kind: plan, unit: item.unit, itemLabel: itemLabel(item) })}
          />
        </div>
      ) : null}
    </li>
  );
}
