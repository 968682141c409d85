import { useState } from 'react';
import { useParams } from 'react-router';
import { Button } from 'primereact/button';
import { ConfirmDialog } from 'primereact/confirmdialog';
import { Message } from 'primereact/message';
import { formatUsd, type CancelSigningResponse, type SigningView } from '@loambook/common';
import { PageLoading } from '@/components/loading';
import { isApiError } from '@/lib/api-client';
import { useCancelSignedContract } from '../api/cancel-signed-contract';
import { useSigningView } from '../api/get-signing-view';
import { useSignContract } from '../api/sign-contract';
import { SigningHeader } from '../components/signing-document';
import { SigningForm } from '../components/signing-form';
import { formatCalendarDate, formatInZone } from '../signing-format';
import '../signing.css';

/** The homeowner's page behind the e-mailed link: public, no account, no navigation. */
export default function SignRoute() {
  const { token = '' } = useParams();
  const view = useSigningView(token);
  const sign = useSignContract();
  const [cancelled, setCancelled] = useState<CancelSigningResponse | null>(null);

  let body;
  if (cancelled) body = <CancelledNotice result={cancelled} />;
  else if (view.isPending) body = <PageLoading label="Opening your proposal…" />;
  else if (view.isError) body = <LinkProblem error={view.error} />;
  else if (view.data.status === 'signed' && view.data.contract)
    body = <SignedConfirmation view={view.data} token={token} onCancelled={setCancelled} />;
  else
    body = (
      <SigningForm
        doc={view.data}
        pending={sign.isPending}
        onSign={(input) => sign.mutateAsync({ token, input })}
      />
    );

  return (
    <div className="public-page">
      <main className="public-page__main" id="main">
        {body}
      </main>
      <footer className="public-page__footer">
        <span className="wordmark wordmark--dark wordmark--small">
          <span className="wordmark__mark" aria-hidden="true" />
          <span className="wordmark__text">Loambook</span>
        </span>
        <span className="muted">Proposals and contracts for foundation repair.</span>
      </footer>
    </div>
  );
}

function LinkProblem({ error }: { error: unknown }) {
  const gone = isApiError(error) && error.status === 410;
  return (
    <section className="public-status" aria-labelledby="link-problem-title">
      <i className="pi pi-link public-status__icon" aria-hidden="true" />
      <h1 id="link-problem-title" className="public-status__title">
        {gone ? 'This link no longer works' : 'This page could not be opened'}
      </h1>
      <p className="public-status__text">
        {isApiError(error) ? error.message : 'Check your connection and try again.'}
      </p>
      {!gone ? (
        <Button
          type="button"
          label="Try again"
          icon="pi pi-refresh"
          onClick={() => window.location.reload()}
        />
      ) : (
        <p className="public-status__text muted">
          If you think this is a mistake, reply to the e-mail that brought you here or call the contractor.
        </p>
      )}
    </section>
  );
}

function SignedConfirmation({
  view,
  token,
  onCancelled,
}: {
  view: SigningView;
  token: string;
  onCancelled: (result: CancelSigningResponse) => void;
}) {
  const contract = view.contract!;
  const cancel = useCancelSignedContract();
  const [confirming, setConfirming] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const tz = view.branch.timezone;

  const doCancel = async () => {
    setConfirming(false);
    setError(null);
    try {
      onCancelled(await cancel.mutateAsync(token));
    } catch (e) {
      setError(
        isApiError(e) ? e.message : 'The contract could not be cancelled. Try again or call the contractor.',
      );
    }
  };

  return (
    <div className="signing">
      <SigningHeader doc={view} />
      <section className="signing-section signed" aria-labelledby="signed-title">
        <i className="pi pi-check-circle signed__icon" aria-hidden="true" />
        <h1 id="signed-title" className="signed__title">
          Your contract is signed
        </h1>
        <dl className="signed__facts">
          <div>
            <dt>Option</dt>
            <dd>{contract.optionTitle}</dd>
          </div>
          <div>
            <dt>Price</dt>
            <dd>{formatUsd(contract.price)}</dd>
          </div>
          {contract.depositAmount && contract.depositAmount !== '0.00' ? (
            <div>
              <dt>Deposit</dt>
              <dd>{formatUsd(contract.depositAmount)}</dd>
            </div>
          ) : null}
          <div>
            <dt>Signed by</dt>
            <dd>
              {contract.signedByName}, {formatInZone(contract.signedAt, tz)}
            </dd>
          </div>
          <div className="signed__deadline">
            <dt>Last day to cancel</dt>
            <dd>
              {formatCalendarDate(contract.lastDayToCancel)}, until midnight ({view.branch.city} time)
            </dd>
          </div>
        </dl>
        <p className="signed__text">
          A copy has been e-mailed to you. Keep it with the notice of cancellation that comes with it.
        </p>
        <div className="signed__actions">
          <a className="p-button p-component signed__pdf" href={view.pdfPath} target="_blank" rel="noopener">
            <i className="pi pi-file-pdf" aria-hidden="true" />
            <span>Download your contract (PDF)</span>
          </a>
          {contract.canCancel ? (
            <Button
              type="button"
              label="Cancel this contract"
              icon="pi pi-times"
              severity="danger"
              outlined
              loading={cancel.isPending}
              onClick={() => setConfirming(true)}
            />
          ) : null}
        </div>
        {contract.canCancel ? (
          <p className="signed__text muted">
            You may cancel without penalty until midnight at the end of{' '}
            {formatCalendarDate(contract.lastDayToCancel)}.
          </p>
        ) : (
          <p className="signed__text muted">The time to cancel this contract online has passed.</p>
        )}
        {error ? <Message severity="error" text={error} className="form-message" /> : null}
      </section>
      <ConfirmDialog
        visible={confirming}
        onHide={() => setConfirming(false)}
        header="Cancel this contract?"
        icon="pi pi-exclamation-triangle"
        message={`The contract for “${contract.optionTitle}” (${formatUsd(contract.price)}) will be cancelled. You owe nothing under it, and any payment you made is refunded.`}
        acceptLabel="Yes, cancel the contract"
        rejectLabel="Keep my contract"
        acceptClassName="p-button-danger"
        defaultFocus="reject"
        accept={() => void doCancel()}
        reject={() => setConfirming(false)}
        className="app-dialog public-dialog"
      />
    </div>
  );
}

function CancelledNotice({ result }: { result: CancelSigningResponse }) {
  return (
    <section className="public-status" aria-labelledby="cancelled-title">
      <i className="pi pi-check-circle public-status__icon" aria-hidden="true" />
      <h1 id="cancelled-title" className="public-status__title">
        Your contract is cancelled
      </h1>
      <p className="public-status__text">{result.message}</p>
      <p className="public-status__text">{result.refundNote}</p>
    </section>
  );
}
