import { useState } from 'react';
import { Button } from 'primereact/button';
import { useNotify } from '@/components/notify';
import { isApiError } from '@/lib/api-client';
import { downloadCsv } from '../api/download-csv';

interface LedgerActionsProps {
  /** The API path the CSV comes from (without /api), and the same filters as the screen. */
  csvPath: string | null;
  csvQuery: Record<string, string | null | undefined>;
  /** What the CSV holds, for the button's accessible name: "the journal". */
  what: string;
}

/** Download CSV and Print, at the top right of a ledger screen (neither is printed). */
export function LedgerActions({ csvPath, csvQuery, what }: LedgerActionsProps) {
  const notify = useNotify();
  const [busy, setBusy] = useState(false);
  const download = async () => {
    if (!csvPath) return;
    setBusy(true);
    try {
      const name = await downloadCsv(csvPath, csvQuery);
      notify.success('CSV downloaded', name);
    } catch (error) {
      notify.error('The CSV was not made', isApiError(error) ? error.message : 'Try again in a moment.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <div className="ledger-actions ledger-no-print">
      <Button
        type="button"
        label="Download CSV"
        icon="pi pi-download"
        outlined
        loading={busy}
        disabled={!csvPath}
        aria-label={`Download ${what} as CSV`}
        onClick={() => void download()}
      />
      <Button type="button" label="Print" icon="pi pi-print" text onClick={() => window.print()} />
    </div>
  );
}
