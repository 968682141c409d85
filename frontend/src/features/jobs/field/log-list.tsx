import { useState } from 'react';
import { Button } from 'primereact/button';
import { formatRecent } from '@/lib/format';
import { formatQty, KIND_SHORT, STOP_REASON_SHORT } from '../job-format';
import type { LogRow } from './log-rows';

function details(r: LogRow): string[] {
  const out: string[] = [];
  if (r.location || r.locationFt)
    out.push([r.location, r.locationFt ? `${formatQty(r.locationFt)} ft` : null].filter(Boolean).join(' '));
  if (r.depthFt) out.push(`${formatQty(r.depthFt)} ft deep`);
  if (r.kind === 'injection' && r.pounds) out.push(`${formatQty(r.pounds)} lb`);
  if (r.stopReason) out.push(STOP_REASON_SHORT[r.stopReason]);
  if (r.finalPressurePsi) out.push(`${formatQty(r.finalPressurePsi)} psi`);
  if (r.torqueFtLb) out.push(`${formatQty(r.torqueFtLb)} ft·lb`);
  if (r.capacityAllowableLb) out.push(`allowable ${formatQty(r.capacityAllowableLb)} lb`);
  return out;
}

/** The log, newest first: each row says whether the office has it yet. */
export function LogList({
  rows,
  onAddPhoto,
  onDiscard,
}: {
  rows: LogRow[];
  onAddPhoto?: (row: LogRow, file: File) => void;
  onDiscard?: (row: LogRow) => void;
}) {
  const [confirming, setConfirming] = useState<string | null>(null);
  if (rows.length === 0) return <p className="muted log-list__empty">Nothing logged yet on this job.</p>;
  return (
    <ol className="log-list" aria-label="Install log">
      {rows.map((r) => (
        <li
          key={r.clientRowId}
          className={`log-row log-row--${r.state}${r.belowDesignLoad ? ' log-row--flagged' : ''}`}
          data-testid="log-row"
        >
          <div className="log-row__head">
            <span className="log-row__title">
              {KIND_SHORT[r.kind]} {r.number}
            </span>
            {r.state === 'stored' ? (
              <span className="log-row__state log-row__state--stored">
                <i className="pi pi-check" aria-hidden="true" /> Sent
              </span>
            ) : r.state === 'waiting' ? (
              <span className="log-row__state log-row__state--waiting">
                <i className="pi pi-clock" aria-hidden="true" /> Waiting to send
              </span>
            ) : (
              <span className="log-row__state log-row__state--refused">
                <i className="pi pi-times-circle" aria-hidden="true" /> Not accepted
              </span>
            )}
          </div>
          <p className="log-row__details">{details(r).join(' · ')}</p>
          {r.belowDesignLoad ? (
            <p className="log-row__flag">
              <i className="pi pi-exclamation-triangle" aria-hidden="true" /> Below design load (
              {formatQty(r.designLoadLb)} lb)
            </p>
          ) : null}
          {r.note ? <p className="log-row__note">{r.note}</p> : null}
          {r.refusal ? <p className="log-row__refusal">{r.refusal}</p> : null}
          <div className="log-row__foot">
            <span className="muted">
              {formatRecent(r.loggedAt)}
              {r.photos ? ` · ${r.photos} ${r.photos === 1 ? 'photo' : 'photos'}` : ''}
              {r.photosWaiting
                ? ` · ${r.photosWaiting} ${r.photosWaiting === 1 ? 'photo' : 'photos'} waiting`
                : ''}
            </span>
            {r.state === 'stored' && r.id && onAddPhoto ? (
              <span className="log-row__photo">
                <input
                  id={`photo-${r.clientRowId}`}
                  type="file"
                  accept="image/*"
                  capture="environment"
                  className="photo-pick__input"
                  onChange={(e) => {
                    const f = e.target.files?.[0];
                    if (f) onAddPhoto(r, f);
                    e.target.value = '';
                  }}
                />
                <label htmlFor={`photo-${r.clientRowId}`} className="log-row__photo-button">
                  <i className="pi pi-camera" aria-hidden="true" /> Add photo
                  <span className="visually-hidden">
                    {' '}
                    to {KIND_SHORT[r.kind].toLowerCase()} {r.number}
                  </span>
                </label>
              </span>
            ) : null}
            {r.state === 'refused' && onDiscard ? (
              confirming === r.clientRowId ? (
                <span className="confirm-inline__actions">
                  <Button type="button" label="Keep" text size="small" onClick={() => setConfirming(null)} />
                  <Button
                    type="button"
                    label="Yes, delete from this phone"
                    severity="danger"
                    size="small"
                    onClick={() => {
                      setConfirming(null);
                      onDiscard(r);
                    }}
                  />
                </span>
              ) : (
                <Button
                  type="button"
                  label="Delete"
                  severity="danger"
                  text
                  size="small"
                  onClick={() => setConfirming(r.clientRowId)}
                />
              )
            ) : null}
          </div>
        </li>
      ))}
    </ol>
  );
}
