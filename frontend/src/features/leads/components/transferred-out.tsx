import { Link } from 'react-router';
import { Tag } from 'primereact/tag';
import { paths } from '@/app/paths';
import { formatDate } from '@/lib/format';
import { useTransferredOut } from '../api/get-transferred-out';
import { stageLabel, stageSeverity } from '../lead-format';

/** For a manager: leads their branches handed on, still open to read, newest first. */
export function TransferredOut({ branchCode }: { branchCode: string | null }) {
  const leads = useTransferredOut({ enabled: true });
  const shown = (leads.data ?? []).filter((l) => !branchCode || l.fromBranchCode === branchCode);
  if (shown.length === 0) return null;
  return (
    <details className="transferred-out">
      <summary>
        {shown.length === 1 ? '1 lead' : `${shown.length} leads`} transferred to other branches
      </summary>
      <ul className="transferred-out__list">
        {shown.map((l) => (
          <li key={`${l.id}-${l.transferredAt}`}>
            <Link to={paths.lead.href(l.id)} className="strong">
              {l.homeownerName}
            </Link>{' '}
            <span className="muted">
              {l.addressLine1}, {l.city} · {l.fromBranchCode} → {l.toBranchCode} on{' '}
              {formatDate(l.transferredAt)}
            </span>{' '}
            <Tag value={stageLabel(l.stage)} severity={stageSeverity(l.stage)} className="stage-tag" />
          </li>
        ))}
      </ul>
    </details>
  );
}
