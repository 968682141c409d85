import { useState } from 'react';
import { useQueries, useQuery } from '@tanstack/react-query';
import { Button } from 'primereact/button';
import { todayInZone, type ContractView, type DepositRulesResult } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { SigningForm } from '@/features/signing/components/signing-form';
import { useSignInPerson } from '../api/sign-in-person';
import { cancellationDeadlineQueryOptions, depositRulesQueryOptions } from '../api/get-contract-rules';
import { inPersonDocument, noticePrice } from '../in-person-document';
import { ContractSummary } from './contract-summary';
import type { InPersonSigningDialogProps } from './in-person-signing-dialog';
import '@/features/signing/signing.css';

/**
 * The dialog's content (its own chunk). The notices and the last day to cancel come from the server's
 * calculators — the rules it signs with — rather than from common/ in the browser, whose holiday calendars
 * would add about 250 kB to the page.
 */
export default function InPersonSigning({
  proposal,
  lead,
  branch,
  inspection,
  onClose,
  onSigned,
}: Omit<InPersonSigningDialogProps, 'visible'>) {
  const sign = useSignInPerson();
  const [contract, setContract] = useState<ContractView | null>(null);
  const today = todayInZone(branch.timezone);
  const deadline = useQuery(cancellationDeadlineQueryOptions(today));
  const rules = useQueries({
    queries: proposal.options.map((o) => depositRulesQueryOptions(lead.state, noticePrice(o))),
  });
  const rulesError = rules.find((r) => r.isError)?.error ?? null;
  // Cheap to build: no memo needed.
  let doc: ReturnType<typeof inPersonDocument> | null = null;
  if (deadline.data && rules.every((r) => r.isSuccess)) {
    const byOption = new Map<string, DepositRulesResult>();
    proposal.options.forEach((o, i) => {
      const r = rules[i]?.data;
      if (r) byOption.set(o.id, r);
    });
    doc = inPersonDocument({
      proposal,
      lead,
      branch,
      inspection,
      today,
      deadline: deadline.data,
      rules: byOption,
    });
  }

  if (contract) {
    return (
      <div className="in-person-done">
        <p className="in-person-done__title">
          <i className="pi pi-check-circle" aria-hidden="true" /> The contract is signed
        </p>
        <p className="muted">
          {lead.email
            ? `A copy with the notice of cancellation has been e-mailed to ${lead.email}, with a link to come back to it.`
            : 'The homeowner has no e-mail address: print the contract PDF and leave a copy with the notice of cancellation.'}
        </p>
        <ContractSummary contract={contract} timeZone={branch.timezone} />
        <div className="dialog-actions">
          <Button type="button" label="Done" icon="pi pi-check" onClick={onClose} />
        </div>
      </div>
    );
  }

  if (deadline.error || rulesError) return <ApiErrorMessage error={deadline.error ?? rulesError} />;
  if (!doc) return <PageLoading label="Preparing the contract…" />;

  return (
    <div className="in-person">
      <p className="in-person__hand-over">
        <i className="pi pi-tablet" aria-hidden="true" /> Hand the device to {lead.homeownerName}. They choose
        an option, read the notices, sign and type their name.
      </p>
      <SigningForm
        doc={doc}
        inPerson
        pending={sign.isPending}
        onSign={async (input) => {
          const signed = await sign.mutateAsync({ id: proposal.id, input });
          setContract(signed);
          onSigned(signed);
        }}
      />
    </div>
  );
}
