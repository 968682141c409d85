import { Link } from 'react-router';
import type { ProposalVersionRef } from '@loambook/common';
import { paths } from '@/app/paths';
import { formatRecent } from '@/lib/format';
import { ProposalStatusTag } from './proposal-status-tag';

/** Every version of the lead's proposal, newest first; the one on screen is marked. */
export function VersionsList({ versions, currentId }: { versions: ProposalVersionRef[]; currentId: string }) {
  return (
    <nav className="versions" aria-label="Versions">
      <h2 className="versions__title">Versions</h2>
      <ol className="versions__list">
        {versions.map((v) => (
          <li
            key={v.id}
            className={v.id === currentId ? 'versions__item versions__item--current' : 'versions__item'}
          >
            {v.id === currentId ? (
              <span className="versions__link" aria-current="page">
                Version {v.version}
              </span>
            ) : (
              <Link to={paths.proposal.href(v.id)} className="versions__link">
                Version {v.version}
              </Link>
            )}
            <ProposalStatusTag status={v.status} />
            <span className="versions__when muted">
              {v.sentAt ? `sent ${formatRecent(v.sentAt)}` : `made ${formatRecent(v.createdAt)}`}
            </span>
          </li>
        ))}
      </ol>
    </nav>
  );
}
