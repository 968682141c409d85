import type { FindingsSummary, SigningCaution, SigningView } from '@loambook/common';
import { formatDate } from '@/lib/format';

/** The parts of the signing page that are the same online and in person. */
export type SigningDocumentData = Omit<SigningView, 'status' | 'link' | 'contract' | 'pdfPath'>;

export function SigningHeader({ doc }: { doc: SigningDocumentData }) {
  const b = doc.branch;
  return (
    <header className="signing-header">
      <div className="signing-header__branch">
        <p className="signing-header__name">{b.name}</p>
        <p className="signing-header__address">
          {b.addressLine1}, {b.city}, {b.state} {b.postalCode}
          {b.phone ? (
            <>
              {' · '}
              <a href={`tel:${b.phone.replace(/[^\d+]/g, '')}`}>{b.phone}</a>
            </>
          ) : null}
        </p>
      </div>
      <div className="signing-header__for">
        <p className="signing-header__label">Prepared for</p>
        <p className="signing-header__homeowner">{doc.homeowner.name}</p>
        <p className="signing-header__property">
          {doc.property.addressLine1}, {doc.property.city}, {doc.property.state} {doc.property.postalCode}
        </p>
        <p className="signing-header__meta">
          Proposal version {doc.proposal.version}
          {doc.proposal.sentAt ? ` · sent ${formatDate(doc.proposal.sentAt)}` : ''}
          {doc.salesperson ? ` · ${doc.salesperson.name}` : ''}
        </p>
      </div>
    </header>
  );
}

/** What the inspection found, in words: observations, not an engineering determination. */
export function FindingsSection({ findings }: { findings: FindingsSummary }) {
  const recorded = findings.items.filter((i) => !(i.lines.length === 1 && i.lines[0] === 'Not recorded.'));
  return (
    <section className="signing-section" aria-labelledby="findings-title">
      <h2 id="findings-title" className="signing-section__title">
        What the inspection found
      </h2>
      {findings.inspectedOn ? (
        <p className="signing-section__lead">
          Inspected on {formatDate(`${findings.inspectedOn}T12:00:00Z`)}.
        </p>
      ) : null}
      {findings.summary ? <p className="findings-summary">{findings.summary}</p> : null}
      {recorded.length ? (
        <dl className="findings-list">
          {recorded.map((item) => (
            <div key={item.key} className="findings-list__item">
              <dt>{item.label}</dt>
              <dd>
                {item.lines.length === 1 ? (
                  item.lines[0]
                ) : (
                  <ul>
                    {item.lines.map((l) => (
                      <li key={l}>{l}</li>
                    ))}
                  </ul>
                )}
                {item.caution ? <p className="caution-inline">{item.caution}</p> : null}
              </dd>
            </div>
          ))}
        </dl>
      ) : null}
      {findings.survey ? (
        <div className="survey-summary">
          <p>
            <strong>Floor survey:</strong> {findings.survey.pointCount} readings; the floor varies by{' '}
            {findings.survey.maxDifferentialIn} in (highest at {findings.survey.highestLabel}, lowest at{' '}
            {findings.survey.lowestLabel})
            {findings.survey.worstRatio ? `; steepest slope ${findings.survey.worstRatio}` : ''}.{' '}
            {findings.survey.band.label}.
          </p>
          <p className="caution-inline">{findings.survey.caution}</p>
        </div>
      ) : null}
      <p className="caution-inline">{findings.caution}</p>
    </section>
  );
}

export function CautionsSection({ cautions }: { cautions: SigningCaution[] }) {
  return (
    <section className="signing-section signing-cautions" aria-labelledby="cautions-title">
      <h2 id="cautions-title" className="signing-section__title">
        <i className="pi pi-exclamation-triangle" aria-hidden="true" /> Safety and the limits of these figures
      </h2>
      <ul className="signing-cautions__list">
        {cautions.map((c) => (
          <li key={c.code}>{c.text}</li>
        ))}
      </ul>
    </section>
  );
}
