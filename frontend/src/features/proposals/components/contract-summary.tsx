import { useState } from 'react';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import { formatUsd, type ContractView } from '@loambook/common';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import { formatCalendarDate, formatInZone } from '@/features/signing/signing-format';
import { openPdf } from '../api/download-pdf';

/**
 * The signed contract in a few lines: who signed, when, for how much, and the cancellation clock. Times on
 * the branch's clock with its zone's abbreviation when `timeZone` (the branch's) is given.
 */
export function ContractSummary({ contract, timeZone }: { contract: ContractView; timeZone?: string }) {
  const notify = useNotify();
  const when = (iso: string) => (timeZone ? formatInZone(iso, timeZone) : formatDateTime(iso));
  const [opening, setOpening] = useState(false);
  const cancelled = contract.status === 'cancelled';

  const openContract = async () => {
    setOpening(true);
    try {
      await openPdf(
        `/contracts/${encodeURIComponent(contract.id)}/pdf`,
        `contract-${contract.proposalVersion}.pdf`,
      );
    } catch (error) {
      notify.error('The contract PDF did not open', isApiError(error) ? error.message : undefined);
    } finally {
      setOpening(false);
    }
  };

  return (
    <section
      className={`contract-summary${cancelled ? ' contract-summary--cancelled' : ''}`}
      aria-label="Contract"
    >
      <header className="contract-summary__head">
        <h3 className="contract-summary__title">
          <i className="pi pi-file-check" aria-hidden="true" /> Contract
        </h3>
        {cancelled ? (
          <Tag value="Cancelled" severity="danger" />
        ) : contract.windowOpen ? (
          <Tag value="Signed · can still be cancelled" severity="warning" />
        ) : (
          <Tag value="Signed" severity="success" />
        )}
      </header>
      <dl className="contract-summary__facts">
        <div>
          <dt>Signed by</dt>
          <dd>
            {contract.signedByName}
            {contract.signedInPerson ? ' (in person)' : ' (online)'}
          </dd>
        </div>
        <div>
          <dt>When</dt>
          <dd>{when(contract.signedAt)}</dd>
        </div>
        <div>
          <dt>Option</dt>
          <dd>
            {contract.option.position}. {contract.option.title}
          </dd>
        </div>
        <div>
          <dt>Price</dt>
          <dd className="strong">{formatUsd(contract.price)}</dd>
        </div>
        {contract.depositAmount !== '0.00' ? (
          <div>
            <dt>Deposit</dt>
            <dd>{formatUsd(contract.depositAmount)}</dd>
          </div>
        ) : null}
        <div className={contract.windowOpen && !cancelled ? 'contract-summary__clock' : undefined}>
          <dt>Last day to cancel</dt>
          <dd>{formatCalendarDate(contract.lastDayToCancel)}</dd>
        </div>
        {contract.cancellation ? (
          <div>
            <dt>Cancelled</dt>
            <dd>
              {when(contract.cancellation.at)}
              {contract.cancellation.byKind === 'homeowner'
                ? ' by the homeowner'
                : contract.cancellation.by
                  ? ` by ${contract.cancellation.by.name}`
                  : ''}
            </dd>
          </div>
        ) : null}
      </dl>
      <Button
        type="button"
        label="Contract PDF"
        icon="pi pi-file-pdf"
        outlined
        size="small"
        loading={opening}
        onClick={() => void openContract()}
      />
    </section>
  );
}
