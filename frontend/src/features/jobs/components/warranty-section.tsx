import { useState } from 'react';
import type { FormEvent } from 'react';
import { Button } from 'primereact/button';
import { Checkbox } from 'primereact/checkbox';
import { InputText } from 'primereact/inputtext';
import { InputTextarea } from 'primereact/inputtextarea';
import type { JobDetail, Warranty } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { FormField } from '@/components/form-field';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { serverFormErrors, type FieldErrors } from '@/lib/form-errors';
import { openPdf } from '@/features/proposals/api/download-pdf';
import { certificatePath, useIssueWarranty, useWarranty } from '../api/warranty';
import { formatDayLong } from '../job-format';
import { RefusalMessage } from './refusal-message';

type Field = 'termYears' | 'covers' | 'exclusions';

/** The warranty of a completed job: the manager issues it; everyone who reads the job gets the certificate. */
export function WarrantySection({ job, canIssue }: { job: JobDetail; canIssue: boolean }) {
  const warranty = useWarranty(job.id);
  return (
    <section className="job-section" aria-labelledby="warranty-title">
      <h2 id="warranty-title" className="job-section__title">
        <i className="pi pi-verified" aria-hidden="true" /> Warranty
      </h2>
      {warranty.isPending ? (
        <TableSkeleton rows={2} label="Loading the warranty" />
      ) : warranty.isError ? (
        <ApiErrorMessage error={warranty.error} />
      ) : warranty.data ? (
        <WarrantyFacts warranty={warranty.data} />
      ) : canIssue ? (
        <WarrantyForm job={job} />
      ) : (
        <p className="muted">No warranty has been issued for this job yet.</p>
      )}
    </section>
  );
}

function WarrantyFacts({ warranty }: { warranty: Warranty }) {
  const notify = useNotify();
  const [busy, setBusy] = useState(false);
  return (
    <>
      <dl className="fact-list">
        <div>
          <dt>Number</dt>
          <dd>{warranty.number}</dd>
        </div>
        <div>
          <dt>Issued</dt>
          <dd>{formatDayLong(warranty.issuedOn)}</dd>
        </div>
        <div>
          <dt>Term</dt>
          <dd>{warranty.termYears === 1 ? '1 year' : `${warranty.termYears} years`}</dd>
        </div>
        <div>
          <dt>Transferable</dt>
          <dd>{warranty.transferable ? 'Yes, to a later owner of the house' : 'No'}</dd>
        </div>
      </dl>
      <p className="warranty-text">
        <span className="strong">Covers: </span>
        {warranty.covers}
      </p>
      {warranty.exclusions ? (
        <p className="warranty-text">
          <span className="strong">Does not cover: </span>
          {warranty.exclusions}
        </p>
      ) : null}
      <Button
        type="button"
        label="Certificate (PDF)"
        icon="pi pi-file-pdf"
        outlined
        loading={busy}
        onClick={async () => {
          setBusy(true);
          try {
            await openPdf(certificatePath(warranty.jobId), `warranty-${warranty.number}.pdf`);
          } catch {
            notify.error('The certificate could not be opened', 'Try again in a moment.');
          } finally {
            setBusy(false);
          }
        }}
      />
    </>
  );
}

function WarrantyForm({ job }: { job: JobDetail }) {
  const issue = useIssueWarranty();
  const notify = useNotify();
  const [termYears, setTermYears] = useState('10');
  const [covers, setCovers] = useState('');
  const [exclusions, setExclusions] = useState('');
  const [transferable, setTransferable] = useState(true);
  const [submitted, setSubmitted] = useState(false);
  const [serverFields, setServerFields] = useState<FieldErrors<Field>>({});
  const [formError, setFormError] = useState<unknown>(null);

  const n = Number(termYears);
  const errors: FieldErrors<Field> = {};
  if (!/^\d{1,2}$/.test(termYears.trim()) || n < 1 || n > 99) errors.termYears = 'From 1 to 99 years.';
  if (!covers.trim()) errors.covers = 'Say what the warranty covers, in plain words for the homeowner.';
  const errorFor = (f: Field) => serverFields[f] ?? (submitted ? errors[f] : undefined);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setSubmitted(true);
    setFormError(null);
    if (Object.values(errors).some(Boolean)) return;
    try {
      const w = await issue.mutateAsync({
        id: job.id,
        input: { termYears: n, covers: covers.trim(), exclusions: exclusions.trim() || null, transferable },
      });
      notify.success(`Warranty ${w.number} issued`, 'The certificate is ready to print or send.');
    } catch (error) {
      const mapped = serverFormErrors(error, ['termYears', 'covers', 'exclusions'] as const);
      setServerFields(mapped.fields);
      setFormError(mapped.form ? error : null);
    }
  };

  return (
    <form className="job-form" onSubmit={submit} noValidate aria-label="Warranty">
      {formError ? <RefusalMessage error={formError} /> : null}
      <FormField id="warranty-term" label="Term (years)" error={errorFor('termYears')} required>
        {({ invalid, ...control }) => (
          <InputText
            {...control}
            value={termYears}
            inputMode="numeric"
            onChange={(e) => setTermYears(e.target.value)}
            invalid={invalid}
          />
        )}
      </FormField>
      <FormField
        id="warranty-covers"
        label="What it covers"
        error={errorFor('covers')}
        required
        hint="For example: further settlement of the stabilised area beyond ¼ inch."
      >
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={covers}
            rows={3}
            maxLength={4000}
            onChange={(e) => setCovers(e.target.value)}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <FormField id="warranty-exclusions" label="What it does not cover" error={errorFor('exclusions')}>
        {({ invalid, ...control }) => (
          <InputTextarea
            {...control}
            value={exclusions}
            rows={2}
            maxLength={4000}
            onChange={(e) => setExclusions(e.target.value)}
            invalid={invalid}
            className="w-full"
          />
        )}
      </FormField>
      <div className="checkbox-row">
        <Checkbox
          inputId="warranty-transferable"
          checked={transferable}
          onChange={(e) => setTransferable(!!e.checked)}
        />
        <label htmlFor="warranty-transferable">Transferable to a later owner of the house</label>
      </div>
      <div className="form-actions">
        <Button type="submit" label="Issue warranty" icon="pi pi-verified" loading={issue.isPending} />
      </div>
    </form>
  );
}
