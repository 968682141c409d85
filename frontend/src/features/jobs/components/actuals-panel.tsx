import { formatUsd, money, type JobActuals } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { useActuals } from '../api/get-actuals';
import { formatPoints, formatQty } from '../job-format';

function drift(a: JobActuals): string | null {
  if (!a.actualMarginPct || !a.estimatedMarginPct) return null;
  return money(a.actualMarginPct).minus(money(a.estimatedMarginPct)).toString();
}

function pct(v: string | null): string {
  return v === null ? '—' : `${v}%`;
}

/** Estimate against what the log shows: cost and margin, material, piers, labour, line by line. */
export function ActualsPanel({ jobId, completed }: { jobId: string; completed: boolean }) {
  const actuals = useActuals(jobId);
  return (
    <section className="job-section" aria-labelledby="actuals-title">
      <h2 id="actuals-title" className="job-section__title">
        <i className="pi pi-chart-bar" aria-hidden="true" />{' '}
        {completed ? 'Actual against estimate' : 'Actual so far'}
      </h2>
      {actuals.isPending ? (
        <TableSkeleton rows={3} label="Loading actuals" />
      ) : actuals.isError ? (
        <ApiErrorMessage error={actuals.error} />
      ) : (
        <ActualsBody a={actuals.data} completed={completed} />
      )}
    </section>
  );
}

function ActualsBody({ a, completed }: { a: JobActuals; completed: boolean }) {
  const d = drift(a);
  const worse = d !== null && money(d).isNegative();
  return (
    <>
      <div className="margin-compare">
        <div className="margin-compare__item">
          <span className="margin-compare__label">Estimated margin</span>
          <span className="margin-compare__value">{pct(a.estimatedMarginPct)}</span>
          <span className="muted">
            {formatUsd(a.estimatedGrossProfit)} on {formatUsd(a.price)}
          </span>
        </div>
        <div className={`margin-compare__item${worse ? ' margin-compare__item--worse' : ''}`}>
          <span className="margin-compare__label">{completed ? 'Actual margin' : 'Margin at this rate'}</span>
          <span className="margin-compare__value" data-testid="actual-margin">
            {pct(a.actualMarginPct)}
          </span>
          <span className="muted">{formatUsd(a.actualGrossProfit)}</span>
        </div>
        <div className={`margin-compare__item${worse ? ' margin-compare__item--worse' : ''}`}>
          <span className="margin-compare__label">Drift</span>
          <span className="margin-compare__value">{formatPoints(d)}</span>
          <span className="muted">
            {d === null ? '' : worse ? 'Cost ran over the estimate' : 'At or under the estimated cost'}
          </span>
        </div>
      </div>
      <div className="table-scroll">
        <table className="plain-table">
          <caption className="visually-hidden">Estimate and actual</caption>
          <thead>
            <tr>
              <th scope="col" />
              <th scope="col" className="numeric">
                Estimate
              </th>
              <th scope="col" className="numeric">
                Actual
              </th>
            </tr>
          </thead>
          <tbody>
            <tr>
              <th scope="row">Cost</th>
              <td className="numeric">{formatUsd(a.estimatedCost)}</td>
              <td className="numeric">{formatUsd(a.actualCost)}</td>
            </tr>
            <tr>
              <th scope="row">Material (lb)</th>
              <td className="numeric">{formatQty(a.material.plannedLb)}</td>
              <td className="numeric">{formatQty(a.material.usedLb)}</td>
            </tr>
            {a.injectionPoints ? (
              <tr>
                <th scope="row">Injection points</th>
                <td className="numeric">{formatQty(a.injectionPoints.planned)}</td>
                <td className="numeric">{a.injectionPoints.installed}</td>
              </tr>
            ) : null}
            <tr>
              <th scope="row">Piers and piles</th>
              <td className="numeric">{formatQty(a.piers.planned)}</td>
              <td className="numeric">{a.piers.installed}</td>
            </tr>
            <tr>
              <th scope="row">
                Labour (person-hours)
                <span className="actuals-note muted">
                  Everyone’s hours added up: the day notes against the plan’s labour lines
                </span>
              </th>
              <td className="numeric">{formatQty(a.labour.estimatedHours)}</td>
              <td className="numeric">{formatQty(a.labour.actualHours)}</td>
            </tr>
          </tbody>
        </table>
      </div>
      {a.lines.length ? (
        <details className="actuals-lines">
          <summary>Line by line</summary>
          <div className="table-scroll">
            <table className="plain-table">
              <thead>
                <tr>
                  <th scope="col">Item</th>
                  <th scope="col" className="numeric">
                    Planned
                  </th>
                  <th scope="col" className="numeric">
                    Actual
                  </th>
                  <th scope="col" className="numeric">
                    Unit cost
                  </th>
                  <th scope="col" className="numeric">
                    Planned cost
                  </th>
                  <th scope="col" className="numeric">
                    Actual cost
                  </th>
                </tr>
              </thead>
              <tbody>
                {a.lines.map((l) => (
                  <tr key={`${l.code}-${l.description}`}>
                    <td>{l.description}</td>
                    <td className="numeric">{formatQty(l.plannedQty)}</td>
                    <td className="numeric">{formatQty(l.actualQty)}</td>
                    <td className="numeric">{formatUsd(l.unitCost)}</td>
                    <td className="numeric">{formatUsd(l.plannedCost)}</td>
                    <td className="numeric">{formatUsd(l.actualCost)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      ) : null}
    </>
  );
}
