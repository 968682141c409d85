import { formatUsd, money, type JobDetail } from '@loambook/common';
import { formatQty, formatUnit } from '../job-format';

/** The signed option's lines, copied onto the job: what the crew is to install. */
export function PlanSection({ job, showMoney }: { job: JobDetail; showMoney: boolean }) {
  const counts = [
    { label: 'Injection points', value: job.planned.injectionPoints },
    { label: 'Push piers', value: job.planned.pushPiers },
    { label: 'Helical piles', value: job.planned.helicalPiles },
    { label: 'Material (lb)', value: job.planned.materialLb },
  ].filter((c) => !money(c.value || '0').isZero());
  return (
    <section className="job-section" aria-labelledby="plan-title">
      <h2 id="plan-title" className="job-section__title">
        <i className="pi pi-list-check" aria-hidden="true" /> Plan
      </h2>
      {counts.length ? (
        <dl className="plan-counts">
          {counts.map((c) => (
            <div key={c.label} className="plan-counts__item">
              <dt>{c.label}</dt>
              <dd>{formatQty(c.value)}</dd>
            </div>
          ))}
          {job.estimatedLabourHours ? (
            <div className="plan-counts__item">
              <dt>Labour (person-hours)</dt>
              <dd>{formatQty(job.estimatedLabourHours)}</dd>
            </div>
          ) : null}
        </dl>
      ) : null}
      {job.plan.length === 0 ? (
        <p className="muted">The signed option had no lines.</p>
      ) : (
        <div className="table-scroll">
          <table className="plain-table">
            <thead>
              <tr>
                <th scope="col">Item</th>
                <th scope="col" className="numeric">
                  Quantity
                </th>
                <th scope="col">Unit</th>
                {showMoney ? (
                  <th scope="col" className="numeric">
                    Price
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {job.plan.map((l) => (
                <tr key={`${l.code}-${l.description}`}>
                  <td>
                    <span>{l.description}</span> <span className="muted">{l.code}</span>
                  </td>
                  <td className="numeric">{formatQty(l.quantity)}</td>
                  <td>{formatUnit(l.unit)}</td>
                  {showMoney ? (
                    <td className="numeric">{formatUsd(money(l.unitPrice).times(money(l.quantity)))}</td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
