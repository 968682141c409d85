import { ProgressSpinner } from 'primereact/progressspinner';
import { Skeleton } from 'primereact/skeleton';

export function PageLoading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div className="page-loading" role="status" aria-live="polite">
      <ProgressSpinner style={{ width: '2.5rem', height: '2.5rem' }} strokeWidth="4" aria-hidden="true" />
      <span className="page-loading__label">{label}</span>
    </div>
  );
}

/** Grey bars in the shape of a table while its rows load. */
export function TableSkeleton({ rows = 5, label = 'Loading…' }: { rows?: number; label?: string }) {
  return (
    <div className="table-skeleton" role="status" aria-label={label}>
      {Array.from({ length: rows }, (_, i) => (
        <Skeleton key={i} height="2.25rem" className="table-skeleton__row" />
      ))}
    </div>
  );
}
