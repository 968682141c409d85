import { formatDateTime } from '@/lib/format';

/** What a printed page shows above the table in place of the filters (hidden on screen). */
export function PrintHeading({ title, lines }: { title: string; lines: string[] }) {
  return (
    <div className="ledger-print-only ledger-print-heading">
      <p className="ledger-print-heading__title">Loambook · {title}</p>
      <p>
        {lines.filter(Boolean).join(' · ')} · printed {formatDateTime(new Date().toISOString())}
      </p>
    </div>
  );
}
