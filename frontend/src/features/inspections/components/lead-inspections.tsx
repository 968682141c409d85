import { useState } from 'react';
import { Link } from 'react-router';
import { Button } from 'primereact/button';
import { Tag } from 'primereact/tag';
import { FINDINGS_ITEMS, type Inspection } from '@loambook/common';
import { paths } from '@/app/paths';
import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { useLeadInspections } from '../api/get-lead-inspections';
import { formatWallClock, minutes, STATUS_LABELS, STATUS_SEVERITY, zoneLabel } from '../inspection-format';
import { BookInspectionDialog } from './book-inspection-dialog';

interface LeadInspectionsProps {
  leadId: string;
  branchId: string;
  homeownerName: string;
  /** Whether this person may book one for this lead (and the lead is open). */
  canBook: boolean;
}

/** The lead's inspections, newest first, and booking the next one. */
export function LeadInspections({ leadId, branchId, homeownerName, canBook }: LeadInspectionsProps) {
  const notify = useNotify();
  const inspections = useLeadInspections(leadId);
  const [booking, setBooking] = useState(false);
  const hasBooked = inspections.data?.some((i) => i.status === 'booked') ?? false;

  return (
    <section className="lead-section" aria-labelledby="lead-inspections-title">
      <div className="lead-section__head">
        <h2 id="lead-inspections-title" className="lead-section__title">
          Inspections
        </h2>
        {canBook && !hasBooked ? (
          <Button
            type="button"
            label="Book inspection"
            icon="pi pi-calendar-plus"
            size="small"
            onClick={() => setBooking(true)}
          />
        ) : null}
      </div>
      {inspections.isPending ? (
        <TableSkeleton rows={2} label="Loading inspections" />
      ) : inspections.isError ? (
        <ApiErrorMessage error={inspections.error} />
      ) : inspections.data.length === 0 ? (
        <p className="muted">
          No inspection yet.{' '}
          {canBook ? 'Book one to look at the cracks, the floors and the drainage with the homeowner.' : ''}
        </p>
      ) : (
        <ul className="inspection-list">
          {inspections.data.map((i) => (
            <InspectionRow key={i.id} inspection={i} />
          ))}
        </ul>
      )}
      {canBook ? (
        <BookInspectionDialog
          visible={booking}
          onClose={() => setBooking(false)}
          onBooked={(inspection) => {
            setBooking(false);
            notify.success(
              'Inspection booked',
              `${formatWallClock(inspection.scheduledLocal)}, ${zoneLabel(inspection.timezone, inspection.scheduledUtcOffset)}.`,
            );
          }}
          leadId={leadId}
          branchId={branchId}
          homeownerName={homeownerName}
        />
      ) : null}
      {hasBooked && canBook ? (
        <p className="lead-section__note muted">
          One inspection at a time: open the booked one to reschedule it or record its findings.
        </p>
      ) : null}
    </section>
  );
}

function InspectionRow({ inspection: i }: { inspection: Inspection }) {
  const answered = FINDINGS_ITEMS.length - i.missingFindings.length;
  return (
    <li className="inspection-row">
      <div className="inspection-row__when">
        <Link to={paths.inspection.href(i.id)} className="inspection-row__link">
          {formatWallClock(i.scheduledLocal)}
        </Link>
        <span className="muted">
          {zoneLabel(i.timezone, i.scheduledUtcOffset)} · {minutes(i.durationMinutes)}
        </span>
      </div>
      <div className="inspection-row__facts">
        <Tag value={STATUS_LABELS[i.status]} severity={STATUS_SEVERITY[i.status]} />
        <span>{i.inspector ? i.inspector.name : <span className="muted">No inspector</span>}</span>
        <span className="muted">
          Findings {answered}/{FINDINGS_ITEMS.length} · {i.surveyPointCounts.inspection} survey points ·{' '}
          {i.photoCount === 1 ? '1 photo' : `${i.photoCount} photos`}
        </span>
      </div>
    </li>
  );
}
