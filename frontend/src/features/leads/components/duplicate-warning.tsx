import { Link } from 'react-router';
import type { DuplicateCheckResponse } from '@loambook/common';
import { paths } from '@/app/paths';
import { DUPLICATE_REASON_LABELS, stageLabel } from '../lead-format';

/**
 * Leads that may be this same homeowner or house, found while the form is typed. Each opens in a new tab
 * so the form keeps what has been typed; matches in branches the person cannot see are only counted.
 */
export function DuplicateWarning({ result }: { result: DuplicateCheckResponse | undefined }) {
  const matches = result?.matches ?? [];
  const others = result?.otherBranchMatches ?? 0;
  return (
    <div aria-live="polite">
      {matches.length || others ? (
        <div className="duplicate-warning" role="status">
          <p className="duplicate-warning__title">
            <i className="pi pi-exclamation-triangle" aria-hidden="true" /> Possible duplicate
          </p>
          <p className="duplicate-warning__intro">
            {matches.length
              ? 'Check these before saving: the homeowner may already be in Loambook.'
              : 'This homeowner may already be in Loambook.'}
          </p>
          {matches.length ? (
            <ul className="duplicate-warning__list">
              {matches.map((m) => (
                <li key={m.id}>
                  <Link to={paths.lead.href(m.id)} target="_blank" rel="noopener">
                    {m.homeownerName}
                  </Link>{' '}
                  <span>
                    {m.addressLine1}, {m.city}
                  </span>{' '}
                  <span className="muted">
                    · {m.branchCode} · {stageLabel(m.stage)} ·{' '}
                    {m.reasons.map((r) => DUPLICATE_REASON_LABELS[r]).join(', ')}
                  </span>
                </li>
              ))}
            </ul>
          ) : null}
          {others ? (
            <p className="duplicate-warning__others">
              {others === 1 ? '1 more in other branches' : `${others} more in other branches`} (ask the office
              which branch has it).
            </p>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
