import { Tag } from 'primereact/tag';
import { FOUNDATION_TYPE_LABELS, formatUsd, money, type LeadDetail } from '@loambook/common';
import { days, dialable, PREFERRED_CONTACT_LABELS, stageLabel, stageSeverity } from '../lead-format';
import { LeadFlags } from './pipeline-table';

/** Who, where, how far along, what it is worth, and the ways to reach the homeowner. */
export function LeadHeader({ lead, actions }: { lead: LeadDetail; actions: React.ReactNode }) {
  const preferred = PREFERRED_CONTACT_LABELS[lead.preferredContact];
  return (
    <header className="lead-header">
      <div className="lead-header__main">
        <div className="lead-header__title-row">
          <h1 className="lead-header__name">{lead.homeownerName}</h1>
          <Tag value={stageLabel(lead.stage)} severity={stageSeverity(lead.stage)} className="stage-tag" />
          <LeadFlags lead={lead} />
        </div>
        <p className="lead-header__address">
          <i className="pi pi-map-marker" aria-hidden="true" /> {lead.addressLine1}, {lead.city}, {lead.state}{' '}
          {lead.postalCode}
        </p>
        <dl className="lead-header__facts">
          <div>
            <dt>Value</dt>
            <dd className="strong">
              {money(lead.value).isZero() ? 'No proposal yet' : formatUsd(lead.value)}
            </dd>
          </div>
          <div>
            <dt>Salesperson</dt>
            <dd>{lead.salespersonName ?? 'Unassigned'}</dd>
          </div>
          <div>
            <dt>Branch</dt>
            <dd>{lead.branchCode}</dd>
          </div>
          <div>
            <dt>In stage</dt>
            <dd>{days(lead.daysInStage)}</dd>
          </div>
          <div>
            <dt>Age</dt>
            <dd>{days(lead.ageDays)}</dd>
          </div>
          {lead.foundationType ? (
            <div>
              <dt>Foundation</dt>
              <dd>{FOUNDATION_TYPE_LABELS[lead.foundationType]}</dd>
            </div>
          ) : null}
        </dl>
        <div className="contact-actions" aria-label="Contact the homeowner" role="group">
          {lead.phonePrimary ? (
            <a
              className="p-button p-button-outlined p-button-sm contact-action"
              href={`tel:${dialable(lead.phonePrimary)}`}
            >
              <i className="pi pi-phone" aria-hidden="true" />
              <span>
                Call <span className="contact-action__detail">{lead.phonePrimary}</span>
              </span>
            </a>
          ) : null}
          {lead.phonePrimary ? (
            <a
              className="p-button p-button-outlined p-button-sm contact-action"
              href={`sms:${dialable(lead.phonePrimary)}`}
            >
              <i className="pi pi-comment" aria-hidden="true" />
              <span>Text</span>
            </a>
          ) : null}
          {lead.phoneSecondary ? (
            <a
              className="p-button p-button-outlined p-button-sm contact-action"
              href={`tel:${dialable(lead.phoneSecondary)}`}
            >
              <i className="pi pi-phone" aria-hidden="true" />
              <span>
                Call <span className="contact-action__detail">{lead.phoneSecondary}</span>
              </span>
            </a>
          ) : null}
          {lead.email ? (
            <a
              className="p-button p-button-outlined p-button-sm contact-action"
              href={`mailto:${lead.email}`}
            >
              <i className="pi pi-envelope" aria-hidden="true" />
              <span>
                E-mail <span className="contact-action__detail">{lead.email}</span>
              </span>
            </a>
          ) : null}
          <span className="contact-actions__preferred muted">Prefers: {preferred}</span>
        </div>
      </div>
      <div className="lead-header__actions">{actions}</div>
    </header>
  );
}
