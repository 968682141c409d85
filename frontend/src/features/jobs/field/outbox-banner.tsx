import { Button } from 'primereact/button';
import type { QueuedRow } from '../offline/row-queue';

/** How many rows are still only on this phone, and a way to send them now. */
export function OutboxBanner({
  rows,
  offline,
  durable,
  onRetry,
  retrying,
}: {
  rows: readonly QueuedRow[];
  offline: boolean;
  durable: boolean;
  onRetry: () => void;
  retrying: boolean;
}) {
  const refused = rows.filter((r) => r.refused).length;
  const waiting = rows.length - refused;
  return (
    <div
      className={rows.length ? 'outbox outbox--waiting' : 'outbox outbox--clear'}
      role="status"
      aria-live="polite"
      data-testid="outbox"
    >
      {rows.length === 0 ? (
        <span className="outbox__text">
          <i className="pi pi-cloud-upload" aria-hidden="true" /> Every row is sent
        </span>
      ) : (
        <>
          <span className="outbox__text">
            <i className={offline ? 'pi pi-wifi' : 'pi pi-clock'} aria-hidden="true" />{' '}
            {waiting ? <strong>Waiting to send ({waiting})</strong> : null}
            {waiting && refused ? ' · ' : null}
            {refused ? <strong>Refused by the office ({refused})</strong> : null}
            <span className="outbox__why">
              {offline
                ? ' No signal: kept on this phone, sent when it is back.'
                : refused && !waiting
                  ? ' See the reason on each row.'
                  : ' Kept on this phone.'}
            </span>
          </span>
          <Button
            type="button"
            label="Send now"
            icon="pi pi-refresh"
            size="small"
            onClick={onRetry}
            loading={retrying}
          />
        </>
      )}
      {!durable ? (
        <span className="outbox__warn">
          This browser cannot keep rows if the page is closed: keep it open until everything is sent.
        </span>
      ) : null}
    </div>
  );
}
