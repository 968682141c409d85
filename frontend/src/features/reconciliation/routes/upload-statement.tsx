import '../reconciliation.css';
import { useMemo, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { Checkbox } from 'primereact/checkbox';
import { InputText } from 'primereact/inputtext';
import { Message } from 'primereact/message';
import { ProgressBar } from 'primereact/progressbar';
import type { BankCsvRowError, BankStatement, BankStatementRowErrors } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { FormField } from '@/components/form-field';
import { PageLoading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { isApiError } from '@/lib/api-client';
import { useBankAccounts } from '../api/get-bank-accounts';
import { statementCheckQueryOptions, usePreviewStatement, useStatementCheck } from '../api/preview-statement';
import { useUploadStatement } from '../api/upload-statement';
import { MappingStep } from '../components/mapping-step';
import { RowErrors } from '../components/row-errors';
import {
  draftFrom,
  draftFromSuggestion,
  mappingFieldOf,
  mappingFrom,
  type MappingDraft,
  type MappingField,
} from '../mapping-draft';
import {
  accountLabel,
  formatAmount,
  formatDay,
  formatRange,
  isCalendarDay,
  monthOf,
} from '../reconciliation-format';

const MAX_MB = 5;

/** Upload a bank statement CSV: choose the account and the file, confirm the columns, store the lines. */
export default function UploadStatementRoute() {
  const [params] = useSearchParams();
  const queryClient = useQueryClient();
  const accounts = useBankAccounts();
  const [accountId, setAccountId] = useState<string | null>(params.get('account'));
  const [file, setFile] = useState<File | null>(null);
  const [periodFrom, setPeriodFrom] = useState('');
  const [periodTo, setPeriodTo] = useState('');
  const [stepErrors, setStepErrors] = useState<{ account?: string; file?: string; periodTo?: string }>({});
  const [draft, setDraft] = useState<MappingDraft | null>(null);
  const [showMappingErrors, setShowMappingErrors] = useState(false);
  const [skip, setSkip] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  const [stored, setStored] = useState<BankStatement | null>(null);
  const fileInput = useRef<HTMLInputElement>(null);
  const preview = usePreviewStatement();
  const upload = useUploadStatement();

  const built = useMemo(() => (draft ? mappingFrom(draft) : null), [draft]);
  const check = useStatementCheck(preview.data ? file : null, accountId, built?.mapping ?? null);

  const account = accounts.data?.find((a) => a.id === accountId) ?? null;

  const restart = () => {
    preview.reset();
    upload.reset();
    setDraft(null);
    setShowMappingErrors(false);
    setSkip(false);
    setStored(null);
  };

  const readFile = () => {
    const errors: typeof stepErrors = {};
    if (!accountId) errors.account = 'Choose the bank account the statement is for.';
    if (!file) errors.file = 'Choose the CSV file the bank gave you.';
    else if (file.size > MAX_MB * 1024 * 1024)
      errors.file = `The file is larger than ${MAX_MB} MB: export a shorter period.`;
    if (periodFrom && periodTo && periodFrom > periodTo)
      errors.periodTo = 'The period ends before it starts.';
    setStepErrors(errors);
    if (Object.keys(errors).length > 0 || !file) return;
    setProgress(0);
    preview.mutate(
      {
        file,
        bankAccountId: accountId,
        onProgress: (p) => setProgress(Math.round((p.loaded / p.total) * 100)),
      },
      {
        onSuccess: (p) => {
          setDraft(p.mapping ? draftFrom(p.mapping) : draftFromSuggestion(p.suggestion));
          if (p.mapping)
            queryClient.setQueryData(statementCheckQueryOptions(file, accountId, p.mapping).queryKey, p);
        },
        onSettled: () => setProgress(null),
      },
    );
  };

  // Server refusals of the upload: row errors in a table, mapping faults on their fields.
  const uploadError = upload.error;
  const rowErrors =
    isApiError(uploadError) && uploadError.code === 'BANK_STATEMENT.ROWS_INVALID'
      ? (uploadError.details as unknown as BankStatementRowErrors)
      : null;
  const serverFieldErrors: Partial<Record<MappingField, string>> = {};
  if (isApiError(uploadError)) {
    for (const fe of uploadError.fieldErrors) {
      const f = mappingFieldOf(fe.field);
      if (f) serverFieldErrors[f] = fe.message;
    }
  }
  const mappingErrors = { ...(showMappingErrors && built?.errors ? built.errors : {}), ...serverFieldErrors };
  const otherUploadError =
    uploadError && !rowErrors && Object.keys(serverFieldErrors).length === 0 ? uploadError : null;

  const store = () => {
    setShowMappingErrors(true);
    if (!built?.mapping || !file || !accountId) return;
    setProgress(0);
    upload.mutate(
      {
        file,
        bankAccountId: accountId,
        mapping: built.mapping,
        skipInvalidRows: skip,
        periodFrom: periodFrom || undefined,
        periodTo: periodTo || undefined,
        onProgress: (p) => setProgress(Math.round((p.loaded / p.total) * 100)),
      },
      { onSuccess: (s) => setStored(s), onSettled: () => setProgress(null) },
    );
  };

  if (accounts.isPending) return <PageLoading label="Loading the bank accounts" />;
  if (accounts.isError) return <ApiErrorMessage error={accounts.error} />;

  if (accounts.data.length === 0) {
    return (
      <div className="page reconciliation-page">
        <PageHeader title="Upload a bank statement" />
        <EmptyState icon="pi-wallet" title="No bank accounts yet">
          <p>
            Add the bank account first. <Link to={paths.bankAccounts.href()}>Bank accounts</Link>
          </p>
        </EmptyState>
      </div>
    );
  }

  if (stored) {
    const month = monthOf(stored.periodTo);
    return (
      <div className="page reconciliation-page">
        <PageHeader title="Statement stored" />
        <Card className="content-card">
          <Message
            severity="success"
            text={`${stored.lineCount} line${stored.lineCount === 1 ? '' : 's'} from ${stored.fileName} stored on ${stored.bankAccountName} for ${formatRange(stored.periodFrom, stored.periodTo)}. Money in ${formatAmount(stored.moneyIn)}, money out ${formatAmount(stored.moneyOut)}.`}
          />
          {stored.skippedRows.length > 0 ? (
            <RowErrors
              errors={stored.skippedRows}
              total={stored.skippedRows.length}
              caption="These rows were skipped, as you chose:"
            />
          ) : null}
          <p className="reconciliation-note">
            The column choice is remembered for the next upload to this account.
          </p>
          <div className="dialog-actions dialog-actions--start">
            <Link
              className="p-button p-component"
              to={paths.reconciliation.href({
                bankAccountId: stored.bankAccountId,
                from: stored.periodFrom < month.from ? stored.periodFrom : month.from,
                to: stored.periodTo,
              })}
            >
              Reconcile this period
            </Link>
            <Button
              type="button"
              label="Upload another"
              outlined
              onClick={() => {
                restart();
                setFile(null);
                if (fileInput.current) fileInput.current.value = '';
              }}
            />
          </div>
        </Card>
      </div>
    );
  }

  const accountOptions = accounts.data.map((a) => ({
    label: `${accountLabel(a)} — ${a.branchName ?? 'company-wide'}`,
    value: a.id,
  }));
  const c = check.data?.check ?? null;
  const duplicate = preview.data?.duplicateOf ?? null;
  const busy = preview.isPending || upload.isPending;

  return (
    <div className="page reconciliation-page">
      <PageHeader
        title="Upload a bank statement"
        description="The CSV export of one account from the bank. You choose which column is which; the choice is remembered for the next file from the same account."
      />
      <Card className="content-card">
        <div className="form-grid">
          <FormField id="upload-account" label="Bank account" error={stepErrors.account} required>
            {({ invalid, id, ...aria }) => (
              <Select
                inputId={id}
                {...aria}
                value={accountId}
                options={accountOptions}
                onChange={(e) => {
                  setAccountId(e.value as string);
                  restart();
                }}
                invalid={invalid}
                placeholder="Choose an account"
                panelClassName="app-overlay"
                disabled={busy}
              />
            )}
          </FormField>
          <FormField
            id="upload-file"
            label="Statement file (CSV)"
            error={stepErrors.file}
            hint={`At most ${MAX_MB} MB.`}
            required
          >
            {({ invalid: _invalid, ...control }) => (
              <input
                {...control}
                ref={fileInput}
                type="file"
                accept=".csv,text/csv,text/plain"
                className="p-inputtext upload-file"
                disabled={busy}
                onChange={(e) => {
                  setFile(e.target.files?.[0] ?? null);
                  restart();
                }}
              />
            )}
          </FormField>
          <FormField
            id="upload-from"
            label="Statement period from"
            hint="As printed on the statement. Empty: the first line’s date."
          >
            {({ invalid, ...control }) => (
              <InputText
                {...control}
                type="date"
                value={periodFrom}
                invalid={invalid}
                onChange={(e) => setPeriodFrom(isCalendarDay(e.target.value) ? e.target.value : '')}
              />
            )}
          </FormField>
          <FormField
            id="upload-to"
            label="Statement period to"
            error={stepErrors.periodTo}
            hint="Empty: the last line’s date."
          >
            {({ invalid, ...control }) => (
              <InputText
                {...control}
                type="date"
                value={periodTo}
                invalid={invalid}
                onChange={(e) => setPeriodTo(isCalendarDay(e.target.value) ? e.target.value : '')}
              />
            )}
          </FormField>
        </div>
        {!preview.data ? (
          <div className="dialog-actions dialog-actions--start">
            <Button
              type="button"
              label="Read the file"
              icon="pi pi-file"
              onClick={readFile}
              loading={preview.isPending}
            />
          </div>
        ) : null}
        {progress !== null ? (
          <div className="upload-progress" role="status" aria-live="polite">
            <ProgressBar
              value={progress < 100 ? progress : undefined}
              mode={progress < 100 ? 'determinate' : 'indeterminate'}
              aria-label="Upload progress"
              style={{ height: '0.6rem' }}
            />
            <span>{progress < 100 ? `Sending the file… ${progress}%` : 'Reading the rows…'}</span>
          </div>
        ) : null}
        {preview.isError ? <ApiErrorMessage error={preview.error} /> : null}
      </Card>

      {preview.data && draft ? (
        <Card className="content-card">
          {duplicate ? (
            <Message
              severity="warn"
              className="form-message"
              text={`This very file was uploaded to ${account ? accountLabel(account) : 'this account'} already (${duplicate.fileName}, ${formatDay(duplicate.uploadedAt.slice(0, 10))}). It cannot be stored twice.`}
            />
          ) : null}
          <MappingStep preview={preview.data} draft={draft} onChange={setDraft} errors={mappingErrors} />
          <section className="mapping-check" aria-labelledby="check-title" aria-busy={check.isFetching}>
            <h2 id="check-title" className="section-title">
              What the file gives with these columns
            </h2>
            {!built?.mapping ? (
              <p className="reconciliation-note">Choose the columns above to see the lines the file gives.</p>
            ) : check.isError ? (
              <ApiErrorMessage error={check.error} />
            ) : c ? (
              <>
                <p>
                  <strong>{c.lineCount}</strong> line{c.lineCount === 1 ? '' : 's'}
                  {c.periodFrom && c.periodTo ? `, dated ${formatRange(c.periodFrom, c.periodTo)}` : ''}:
                  money in {formatAmount(c.moneyIn)}, money out {formatAmount(c.moneyOut)}.
                  {c.errorCount > 0 ? (
                    <>
                      {' '}
                      <strong className="text-danger">
                        {c.errorCount} problem{c.errorCount === 1 ? '' : 's'}
                      </strong>{' '}
                      in the rows listed below.
                    </>
                  ) : (
                    ' Every row reads.'
                  )}
                </p>
                {c.errorCount > 0 ? (
                  <RowErrors
                    errors={c.errors as BankCsvRowError[]}
                    total={c.errorCount}
                    caption="Rows that cannot be read with these columns:"
                  />
                ) : null}
              </>
            ) : (
              <p className="reconciliation-note">Reading the rows…</p>
            )}
          </section>
          {rowErrors ? (
            <Message
              severity="error"
              className="form-message"
              content={
                <div>
                  <p>{uploadError?.message}</p>
                  <RowErrors errors={rowErrors.errors} total={rowErrors.errorCount} caption="Rows refused:" />
                </div>
              }
            />
          ) : null}
          {otherUploadError ? <ApiErrorMessage error={otherUploadError} /> : null}
          {(c && c.errorCount > 0) || rowErrors ? (
            <div className="checkbox-row">
              <Checkbox inputId="upload-skip" checked={skip} onChange={(e) => setSkip(!!e.checked)} />
              <label htmlFor="upload-skip">
                Skip the rows that cannot be read and store the others (the skipped rows are kept with the
                statement so you can see what was left out)
              </label>
            </div>
          ) : null}
          <div className="dialog-actions dialog-actions--start">
            <Button
              type="button"
              label={c ? `Store ${c.lineCount} line${c.lineCount === 1 ? '' : 's'}` : 'Store the statement'}
              icon="pi pi-upload"
              onClick={store}
              loading={upload.isPending}
              disabled={
                !!duplicate || (c !== null && c.errorCount > 0 && !skip) || (c !== null && c.lineCount === 0)
              }
            />
            <Button type="button" label="Start again" text onClick={restart} disabled={busy} />
          </div>
        </Card>
      ) : null}
    </div>
  );
}
