import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import {
  formatUsd,
  money,
  PRICE_BOOK_UNIT_LABELS,
  type PriceBookUnit,
  type SignContractRequest,
  type SigningNotice,
  type SigningOption,
} from '@loambook/common';
import { isApiError } from '@/lib/api-client';
import { formatCalendarDate } from '../signing-format';
import {
  CautionsSection,
  FindingsSection,
  SigningHeader,
  type SigningDocumentData,
} from './signing-document';
import { SignaturePad } from './signature-pad';

interface SigningFormProps {
  doc: SigningDocumentData;
  /** Signs; a rejection with an ApiError is shown above the button in the server's words. */
  onSign: (request: SignContractRequest) => Promise<unknown>;
  pending: boolean;
  /** On the salesperson's device: the wording speaks to the homeowner holding it. */
  inPerson?: boolean;
}

/**
 * SIGNER_NAME_MAX_LENGTH in common/src/signing/signing-rules.ts. Written out here because importing that
 * module would pull the deadline rules and their holiday calendars into the homeowner's page.
 */
const SIGNER_NAME_MAX_LENGTH = 120;

const unitLabel = (u: string) => PRICE_BOOK_UNIT_LABELS[u as PriceBookUnit] ?? u;

/**
 * The homeowner's side of the contract: choose an option, read the cautions and the notices, see the
 * cancellation right, sign with a finger and type the name. The same component serves the public link and
 * signing in person on the salesperson's device.
 */
export function SigningForm({ doc, onSign, pending, inPerson = false }: SigningFormProps) {
  const [optionId, setOptionId] = useState<string | null>(
    doc.options.length === 1 ? doc.options[0]!.id : null,
  );
  const [acknowledged, setAcknowledged] = useState<Set<string>>(new Set());
  const [signature, setSignature] = useState<string | null>(null);
  const [name, setName] = useState('');
  const [error, setError] = useState<string | null>(null);

  const chosen = doc.options.find((o) => o.id === optionId) ?? null;
  const notices: SigningNotice[] = chosen
    ? doc.notices.filter((n) => chosen.requiredNotices.includes(n.code))
    : doc.notices;
  const required = chosen?.requiredNotices ?? [];
  const allRead = required.every((c) => acknowledged.has(c));

  const missing: string[] = [];
  if (!chosen) missing.push('choose an option');
  if (!chosen || !allRead) missing.push('tick each notice you have read');
  if (!signature) missing.push('sign in the box');
  if (!name.trim()) missing.push('type your full name');
  const ready = missing.length === 0;

  const cancel = doc.cancellation;
  const lastDay = formatCalendarDate(cancel.lastDayToCancelIfSignedToday);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (!ready || !chosen || !signature) return;
    setError(null);
    try {
      await onSign({
        optionId: chosen.id,
        signerName: name.trim(),
        signaturePng: signature,
        acknowledgedNotices: required.filter((c) => acknowledged.has(c)),
      });
    } catch (e) {
      setError(isApiError(e) ? e.message : 'The contract could not be signed. Try again.');
    }
  };

  return (
    <form className="signing" onSubmit={submit} noValidate aria-label="Sign the contract">
      <SigningHeader doc={doc} />

      {doc.findings ? <FindingsSection findings={doc.findings} /> : null}

      <section className="signing-section" aria-labelledby="options-title">
        <h2 id="options-title" className="signing-section__title">
          {doc.options.length > 1 ? 'Choose one of the options' : 'The work proposed'}
        </h2>
        <div className="signing-options">
          {[...doc.options]
            .sort((a, b) => a.position - b.position)
            .map((o) => (
              <OptionCard
                key={o.id}
                option={o}
                chosen={o.id === optionId}
                onChoose={() => setOptionId(o.id)}
              />
            ))}
        </div>
      </section>

      <CautionsSection cautions={doc.cautions} />

      <section className="signing-section" aria-labelledby="notices-title">
        <h2 id="notices-title" className="signing-section__title">
          Notices to read before signing
        </h2>
        {!chosen ? (
          <p className="signing-section__lead">Choose an option first: the notices depend on its price.</p>
        ) : null}
        <ul className="notice-list">
          {notices.map((n) => (
            <li key={n.code} className="notice">
              <h3 className="notice__title">{n.title}</h3>
              <p className="notice__source">{n.source}</p>
              {n.wordingIncluded && n.text ? <p className="notice__text">{n.text}</p> : null}
              {!n.wordingIncluded && n.wordingStatement ? (
                <p className="notice__text">{n.wordingStatement}</p>
              ) : null}
              <p className="notice__why">{n.appliesBecause}</p>
              {chosen ? (
                <div className="notice__ack">
                  <Checkbox
                    inputId={`notice-${n.code}`}
                    checked={acknowledged.has(n.code)}
                    onChange={(e) =>
                      setAcknowledged((s) => {
                        const next = new Set(s);
                        if (e.checked) next.add(n.code);
                        else next.delete(n.code);
                        return next;
                      })
                    }
                  />
                  <label htmlFor={`notice-${n.code}`}>I have read “{n.title}”</label>
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      </section>

      <section className="signing-section signing-cancel" aria-labelledby="cancel-title">
        <h2 id="cancel-title" className="signing-section__title">
          Your right to cancel
        </h2>
        <p className="signing-cancel__statement">{cancel.statement}</p>
        <p className="signing-cancel__deadline">
          If you sign today, you may cancel until <strong>midnight at the end of {lastDay}</strong>.
        </p>
        <p className="signing-cancel__source muted">{cancel.source}</p>
      </section>

      <section className="signing-section signing-sign" aria-labelledby="sign-title">
        <h2 id="sign-title" className="signing-section__title">
          {inPerson ? 'Homeowner’s signature' : 'Sign the contract'}
        </h2>
        <p id="sign-meaning" className="signing-section__lead">
          {chosen
            ? `By signing you accept option ${chosen.position}, “${chosen.title}”, for ${formatUsd(chosen.customerTotal)}.`
            : 'Choose an option above, then sign.'}
        </p>
        <SignaturePad onChange={setSignature} describedBy="sign-meaning" disabled={pending} />
        <div className="form-field signing-name">
          <label htmlFor="signer-name" className="form-field__label">
            Your full name
          </label>
          <InputText
            id="signer-name"
            value={name}
            onChange={(e) => setName(e.target.value)}
            autoComplete={inPerson ? 'off' : 'name'}
            maxLength={SIGNER_NAME_MAX_LENGTH}
            disabled={pending}
          />
        </div>
        {error ? <Message severity="error" text={error} className="form-message" /> : null}
        {!ready ? (
          <p className="signing-sign__missing" aria-live="polite">
            To sign: {missing.join(', ')}.
          </p>
        ) : null}
        <Button
          type="submit"
          label="Sign contract"
          icon="pi pi-pen-to-square"
          className="signing-sign__button"
          disabled={!ready}
          loading={pending}
        />
      </section>
    </form>
  );
}

function OptionCard({
  option,
  chosen,
  onChoose,
}: {
  option: SigningOption;
  chosen: boolean;
  onChoose: () => void;
}) {
  const hasDiscount = !money(option.discountTotal).isZero();
  return (
    <article className={`signing-option${chosen ? ' signing-option--chosen' : ''}`} aria-label={option.title}>
      <header className="signing-option__head">
        <span className="signing-option__number">Option {option.position}</span>
        {chosen ? (
          <span className="signing-option__chosen">
            <i className="pi pi-check" aria-hidden="true" /> Your choice
          </span>
        ) : null}
      </header>
      <h3 className="signing-option__title">{option.title}</h3>
      {option.description ? <p className="signing-option__description">{option.description}</p> : null}
      <ul className="signing-option__lines">
        {option.lines.map((l) => (
          <li key={l.position}>
            <span className="signing-option__line-text">
              {l.description}
              <span className="muted">
                {' '}
                · {l.quantity} {unitLabel(l.unit)}
              </span>
            </span>
            <span className="signing-option__line-amount">{formatUsd(l.amount)}</span>
          </li>
        ))}
      </ul>
      <dl className="signing-option__totals">
        {hasDiscount ? (
          <>
            <div>
              <dt>List price</dt>
              <dd>{formatUsd(option.listTotal)}</dd>
            </div>
            <div>
              <dt>Discount</dt>
              <dd>−{formatUsd(option.discountTotal)}</dd>
            </div>
          </>
        ) : null}
        {option.tax.treatment === 'invoice' ? (
          <div>
            <dt>{option.tax.label}</dt>
            <dd>{formatUsd(option.tax.chargedToHomeowner)}</dd>
          </div>
        ) : null}
        <div className="signing-option__total">
          <dt>Total</dt>
          <dd>{formatUsd(option.customerTotal)}</dd>
        </div>
        {option.deposit ? (
          <div>
            <dt>Deposit at signing</dt>
            <dd>{formatUsd(option.deposit.amount)}</dd>
          </div>
        ) : null}
      </dl>
      {option.tax.treatment !== 'invoice' ? (
        <p className="signing-option__tax-note">{option.tax.label}.</p>
      ) : null}
      <Button
        type="button"
        label="Choose this option"
        icon={chosen ? 'pi pi-check' : undefined}
        outlined={!chosen}
        aria-pressed={chosen}
        className="signing-option__choose"
        onClick={onChoose}
      />
    </article>
  );
}
