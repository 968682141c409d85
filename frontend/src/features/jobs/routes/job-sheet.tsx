import '../jobs.css';
import { Link, useParams } from 'react-router';
import { Button } from 'primereact/button';
import { money, type InstallKind, type JobDetail } from '@loambook/common';
import { paths } from '@/app/paths';
import { NotFound } from '@/app/routes/not-found';
import { ApiErrorMessage } from '@/components/api-error-message';
import { PageLoading } from '@/components/loading';
import { isApiError } from '@/lib/api-client';
import { useJob } from '../api/get-job';
import { DEFAULT_CAUTIONS } from '../components/job-cautions';
import { formatDayLong, formatQty, formatRun, formatUnit, KIND_LABELS } from '../job-format';

export default function JobSheetRoute() {
  const { jobId = '' } = useParams();
  const job = useJob(jobId);
  if (job.isPending) return <PageLoading label="Loading job" />;
  if (job.isError) {
    if (isApiError(job.error) && (job.error.status === 404 || job.error.status === 400)) return <NotFound />;
    return (
      <div className="page">
        <ApiErrorMessage error={job.error} />
      </div>
    );
  }
  return <JobSheet job={job.data} />;
}

const BLANK_ROWS = 14;

function kindsOf(job: JobDetail): InstallKind[] {
  const has = (v: string) => !money(v || '0').isZero();
  const k: InstallKind[] = [];
  if (has(job.planned.injectionPoints)) k.push('injection');
  if (has(job.planned.pushPiers)) k.push('push_pier');
  if (has(job.planned.helicalPiles)) k.push('helical_pile');
  return k.length ? k : ['injection'];
}

/** The crew's paper copy: where, who, what, the tickets, the cautions, and blank log lines to fill in. */
function JobSheet({ job }: { job: JobDetail }) {
  const cautions = job.cautions.length ? job.cautions : DEFAULT_CAUTIONS;
  return (
    <div className="page job-sheet">
      <div className="job-sheet__screen-only">
        <Link to={paths.job.href(job.id)} className="back-link">
          <i className="pi pi-arrow-left" aria-hidden="true" /> {job.number}
        </Link>
        <Button type="button" label="Print" icon="pi pi-print" onClick={() => window.print()} />
      </div>
      <article className="sheet" aria-label={`Job sheet ${job.number}`}>
        <header className="sheet__head">
          <div>
            <p className="sheet__kicker">Job sheet · {job.branchCode}</p>
            <h1 className="sheet__title">{job.number}</h1>
          </div>
          <div className="sheet__when">
            <p className="strong">{formatRun(job.startOn, job.durationDays)}</p>
            <p>{job.crewName ?? 'No crew yet'}</p>
          </div>
        </header>
        <section className="sheet__grid">
          <div>
            <h2 className="sheet__h">Homeowner</h2>
            <p className="strong">{job.homeownerName}</p>
            <p>
              {job.addressLine1}
              <br />
              {job.city}, {job.state} {job.postalCode}
            </p>
            <p>{job.phonePrimary ?? ''}</p>
          </div>
          <div>
            <h2 className="sheet__h">811 ticket</h2>
            <p>
              No. <strong>{job.locate.ticketNumber ?? '________'}</strong>
            </p>
            <p>Filed {formatDayLong(job.locate.filedOn)}</p>
            <p>
              Dig from <strong>{formatDayLong(job.locate.earliestDigOn)}</strong>
            </p>
            <p>Expires {formatDayLong(job.locate.expiresOn)}</p>
          </div>
          <div>
            <h2 className="sheet__h">Permit</h2>
            <p>
              {job.permit.needed === null
                ? 'Not decided'
                : job.permit.needed
                  ? `No. ${job.permit.number ?? '________'}`
                  : 'Not needed'}
            </p>
            {job.permit.needed ? <p>Issued {formatDayLong(job.permit.issuedOn, '________')}</p> : null}
          </div>
        </section>
        <section>
          <h2 className="sheet__h">Plan</h2>
          <table className="sheet__table">
            <thead>
              <tr>
                <th scope="col">Item</th>
                <th scope="col" className="numeric">
                  Qty
                </th>
                <th scope="col">Unit</th>
              </tr>
            </thead>
            <tbody>
              {job.plan.map((l) => (
                <tr key={`${l.code}-${l.description}`}>
                  <td>{l.description}</td>
                  <td className="numeric">{formatQty(l.quantity)}</td>
                  <td>{formatUnit(l.unit)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
        <section className="sheet__cautions">
          <h2 className="sheet__h">Safety</h2>
          <ul>
            {cautions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </section>
        {kindsOf(job).map((k) => (
          <section key={k} className="sheet__log">
            <h2 className="sheet__h">{KIND_LABELS[k]} log (copy into the app when there is signal)</h2>
            <table className="sheet__table sheet__table--blank">
              <thead>
                <tr>
                  <th scope="col">No.</th>
                  <th scope="col">Wall / ft along</th>
                  <th scope="col">Depth ft</th>
                  {k === 'injection' ? (
                    <>
                      <th scope="col">lb</th>
                      <th scope="col">Stop: surface / lift / qty / other</th>
                    </>
                  ) : k === 'push_pier' ? (
                    <th scope="col">Final psi</th>
                  ) : (
                    <>
                      <th scope="col">Torque ft·lb</th>
                      <th scope="col">Design load lb</th>
                    </>
                  )}
                  <th scope="col">Note</th>
                </tr>
              </thead>
              <tbody>
                {Array.from({ length: BLANK_ROWS }, (_, i) => (
                  <tr key={i}>
                    <td>&nbsp;</td>
                    <td />
                    <td />
                    <td />
                    {k !== 'push_pier' ? <td /> : null}
                    <td />
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        ))}
        <footer className="sheet__foot">
          <span>Crew lead signature ____________________</span>
          <span>Date __________</span>
        </footer>
      </article>
    </div>
  );
}
