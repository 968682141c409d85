import { Button } from 'primereact/button';
import type { OthersWaiting, QueuedRow } from '../offline/row-queue';

/** "2 rows entered by Hollis Varga are waiting for them to sign in again." */
export function othersWaitingText(o: OthersWaiting): string {
  const rows = o.count === 1 ? '1 row' : `${o.count} rows`;
  return `${rows} entered by ${o.userName} ${o.count === 1 ? 'is' : 'are'} waiting for them to sign in again`;
}

/**
 * Rows another person left on this phone: shown, not sent (they go with their own sign-in, under their
 * name) and not offered for discarding.
 */
export function OthersWaitingNote({ others }: { others: readonly OthersWaiting[] }) {
  if (!others.length) return null;
  return (
    <div className="outbox outbox--others" role="status" data-testid="outbox-others">
      <i className="pi pi-user" aria-hidden="true" />
      <span className="outbox__text">
        {others.map((o) => (
          <span key={o.userId} className="outbox__other">
            {othersWaitingText(o)}.
          </span>
        ))}
        <span className="outbox__why muted">
          {' '}
          They stay on this phone and are not sent with your sign-in.
        </span>
      </span>
    </div>
  );
}

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
