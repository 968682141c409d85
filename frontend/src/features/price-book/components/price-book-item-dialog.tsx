import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { Dialog } from 'primereact/dialog';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import {
  PRICE_BOOK_CATEGORIES,
  PRICE_BOOK_CATEGORY_LABELS,
  PRICE_BOOK_UNITS,
  PRICE_BOOK_UNIT_LABELS,
  type CreatePriceBookItemRequest,
  type PriceBookItem,
} from '@loambook/common';
import { FormField } from '@/components/form-field';
import { Select } from '@/components/select';
import { hasErrors, serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { useLastValue } from '@/lib/use-last-value';
import {
  belowFloor,
  EMPTY_ITEM,
  ITEM_FIELDS,
  marginAtList,
  toItemRequest,
  validateItem,
  valuesFromItem,
  type ItemField,
  type ItemFormValues,
} from '../price-book-values';

const CATEGORY_OPTIONS = PRICE_BOOK_CATEGORIES.map((c) => ({
  label: PRICE_BOOK_CATEGORY_LABELS[c],
  value: c,
}));
const UNIT_OPTIONS = PRICE_BOOK_UNITS.map((u) => ({ label: PRICE_BOOK_UNIT_LABELS[u], value: u }));

/** What the dialog edits: a new item (null item) or an existing one. */
export interface ItemDialogState {
  item: PriceBookItem | null;
}

interface PriceBookItemDialogProps {
  /** null: closed. */
  state: ItemDialogState | null;
  branchLabel: string;
  marginFloorPct: string | null;
  /** Saves; a rejection with an ApiError puts the server's field errors on the fields. */
  onSubmit: (input: CreatePriceBookItemRequest, item: PriceBookItem | null) => Promise<unknown>;
  onClose: () => void;
  pending: boolean;
}

export function PriceBookItemDialog({ state, ...rest }: PriceBookItemDialogProps) {
  const shown = useLastValue(state);
  const editing = shown?.item ?? null;
  return (
    <Dialog
      visible={state !== null}
      onHide={rest.onClose}
      header={editing ? `Edit ${editing.code}` : 'New price-book item'}
      className="app-dialog"
      style={{ width: '40rem' }}
      breakpoints={{ '640px': 'calc(100vw - 1rem)' }}
      draggable={false}
      resizable={false}
    >
      {shown ? <ItemForm key={editing?.id ?? 'new'} item={editing} {...rest} /> : null}
    </Dialog>
  );
}

function ItemForm({
  item,
  branchLabel,
  marginFloorPct,
  onSubmit,
  onClose,
  pending,
}: Omit<PriceBookItemDialogProps, 'state'> & { item: PriceBookItem | null }) {
  const [values, setValues] = useState<ItemFormValues>(item ? valuesFromItem(item) : EMPTY_ITEM);
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<ItemField>>({});
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const clientErrors = validateItem(values);
  const errorFor = (f: ItemField) => serverFields[f] ?? (submitted ? clientErrors[f] : undefined);
  const set = <K extends keyof ItemFormValues>(field: K, value: ItemFormValues[K]) => {
    setValues((v) => ({ ...v, [field]: value }));
    setServerFields((s) => (field in s ? { ...s, [field]: undefined } : s));
  };

  const margin = marginAtList(values.unitCost, values.unitPrice);
  const low = belowFloor(margin, marginFloorPct);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormMessage(null);
    if (hasErrors(clientErrors)) {
      setFormMessage('Some fields need attention.');
      return;
    }
    try {
      await onSubmit(toItemRequest(values), item);
    } catch (error) {
      const mapped = serverFormErrors(error, ITEM_FIELDS);
      setServerFields(mapped.fields);
      setFormMessage(mapped.form ?? 'Some fields need attention.');
    }
  };

  const amountField = (field: 'unitCost' | 'unitPrice', label: string, hint: string) => (
    <FormField id={`item-${field}`} label={label} error={errorFor(field)} hint={hint} required>
      {({ invalid, ...control }) => (
        <div className="p-inputgroup money-input">
          <span className="p-inputgroup-addon" aria-hidden="true">
            $
          </span>
          <InputText
            {...control}
            value={values[field]}
            onChange={(e) => set(field, e.target.value)}
            invalid={invalid}
            inputMode="decimal"
            autoComplete="off"
            maxLength={13}
          />
        </div>
      )}
    </FormField>
  );

  return (
    <form onSubmit={submit} noValidate className="dialog-form" aria-label="Price-book item">
      <p className="dialog-intro">
        <i className="pi pi-building" aria-hidden="true" /> {branchLabel}
        {item?.inUse ? ' · Proposals already made keep the figures they were quoted with.' : null}
      </p>
      {formMessage ? <Message severity="error" text={formMessage} className="form-message" /> : null}
      <div className="form-grid">
        <FormField
          id="item-code"
          label="Code"
          error={errorFor('code')}
          hint="Capital letters, digits and hyphens, up to 24 (e.g. PU-LB)."
          required
        >
          {({ invalid, ...control }) => (
            <InputText
              {...control}
              value={values.code}
              onChange={(e) => set('code', e.target.value.toUpperCase())}
              invalid={invalid}
              maxLength={24}
              autoComplete="off"
            />
          )}
        </FormField>
        <FormField id="item-unit" label="Unit" error={errorFor('unit')} required>
          {({ invalid, id, ...aria }) => (
            <Select
              inputId={id}
              {...aria}
              value={values.unit || null}
              options={UNIT_OPTIONS}
              onChange={(e) => set('unit', e.value as ItemFormValues['unit'])}
              invalid={invalid}
              placeholder="Choose a unit"
              panelClassName="app-overlay"
            />
          )}
        </FormField>
      </div>
      <FormField
        id="item-description"
        label="Description"
        error={errorFor('description')}
        hint="As it reads on the proposal the homeowner gets."
        required
      >
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={values.description}
            onChange={(e) => set('description', e.target.value)}
            invalid={invalid}
            maxLength={200}
            autoComplete="off"
          />
        )}
      </FormField>
      <FormField id="item-category" label="Category" error={errorFor('category')} required>
        {({ invalid, id, ...aria }) => (
          <Select
            inputId={id}
            {...aria}
            value={values.category || null}
            options={CATEGORY_OPTIONS}
            onChange={(e) => set('category', e.value as ItemFormValues['category'])}
            invalid={invalid}
            placeholder="Choose a category"
            panelClassName="app-overlay"
          />
        )}
      </FormField>
      <div className="form-grid">
        {amountField('unitCost', 'Unit cost', 'What one unit costs the branch, installed.')}
        {amountField('unitPrice', 'Unit price', 'The list price to the homeowner.')}
      </div>
      <div className={`margin-preview${low ? ' margin-preview--low' : ''}`} aria-live="polite">
        <span className="margin-preview__label">Margin at list</span>
        <span className="margin-preview__value">{margin === null ? '—' : `${margin}%`}</span>
        {low ? (
          <span className="margin-preview__note">
            Below the branch’s {marginFloorPct}% margin floor: an option priced mostly with this item will
            need approval.
          </span>
        ) : marginFloorPct ? (
          <span className="margin-preview__note muted">Branch margin floor: {marginFloorPct}%</span>
        ) : null}
      </div>
      <div className="checkbox-field">
        <Checkbox
          inputId="item-active"
          checked={values.active}
          onChange={(e) => set('active', !!e.checked)}
        />
        <label htmlFor="item-active">Active (offered on new proposals)</label>
      </div>
      <div className="dialog-actions">
        <Button
          type="button"
          label="Cancel"
          severity="secondary"
          outlined
          onClick={onClose}
          disabled={pending}
        />
        <Button
          type="submit"
          label={item ? 'Save changes' : 'Add item'}
          icon="pi pi-check"
          loading={pending}
        />
      </div>
    </form>
  );
}
