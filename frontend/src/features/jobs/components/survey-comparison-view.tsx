import { Message } from 'primereact/message';
import { money, SETTLEMENT_CAUTION, type SurveyComparison } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { TableSkeleton } from '@/components/loading';
import { useSurveyComparison } from '../api/get-survey-comparison';

type Point = SurveyComparison['before'][number];

function SurveyTable({
  title,
  points,
  maxDiff,
  ratio,
  band,
}: {
  title: string;
  points: Point[];
  maxDiff: string | null;
  ratio: string | null;
  band: string | null;
}) {
  return (
    <div className="survey-compare__side">
      <h3 className="survey-compare__title">{title}</h3>
      {points.length === 0 ? (
        <p className="muted">No readings.</p>
      ) : (
        <>
          <p className="survey-compare__figures">
            <span>
              Max differential <strong>{maxDiff === null ? '—' : `${maxDiff} in`}</strong>
            </span>
            <span>
              Worst pair <strong>{ratio ?? 'level'}</strong>
            </span>
          </p>
          {band ? <p className="muted survey-compare__band">{band}</p> : null}
          <table className="plain-table">
            <thead>
              <tr>
                <th scope="col">Point</th>
                <th scope="col" className="numeric">
                  X (ft)
                </th>
                <th scope="col" className="numeric">
                  Y (ft)
                </th>
                <th scope="col" className="numeric">
                  Elevation (in)
                </th>
              </tr>
            </thead>
            <tbody>
              {points.map((p) => (
                <tr key={p.label}>
                  <td>{p.label}</td>
                  <td className="numeric">{p.xFt}</td>
                  <td className="numeric">{p.yFt}</td>
                  <td className="numeric">{p.elevationIn}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}

/** The inspection's floor survey beside the re-survey at completion, and the change at each point. */
export function SurveyComparisonTables({ comparison }: { comparison: SurveyComparison }) {
  return (
    <>
      <div className="survey-compare">
        <SurveyTable
          title="Before (inspection)"
          points={comparison.before}
          maxDiff={comparison.beforeMaxDifferentialIn}
          ratio={comparison.beforeWorstRatio}
          band={comparison.beforeBand ?? null}
        />
        <SurveyTable
          title="After (completion)"
          points={comparison.after}
          maxDiff={comparison.afterMaxDifferentialIn}
          ratio={comparison.afterWorstRatio}
          band={comparison.afterBand ?? null}
        />
      </div>
      {comparison.changes.length ? (
        <div className="table-scroll">
          <table className="plain-table survey-changes">
            <caption className="survey-changes__caption">Change at each point measured both times</caption>
            <thead>
              <tr>
                <th scope="col">Point</th>
                <th scope="col" className="numeric">
                  Before (in)
                </th>
                <th scope="col" className="numeric">
                  After (in)
                </th>
                <th scope="col" className="numeric">
                  Change (in)
                </th>
              </tr>
            </thead>
            <tbody>
              {comparison.changes.map((c) => {
                let up = false;
                try {
                  up = money(c.changeIn).isPositive() && !money(c.changeIn).isZero();
                } catch {
                  up = false;
                }
                return (
                  <tr key={c.label}>
                    <td>{c.label}</td>
                    <td className="numeric">{c.beforeIn}</td>
                    <td className="numeric">{c.afterIn}</td>
                    <td className="numeric">
                      {up ? '+' : ''}
                      {c.changeIn}
                      {up ? <span className="muted"> raised</span> : null}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      ) : null}
      {comparison.sameReference === false ? (
        <p className="muted">
          The two surveys do not share their reference point: compare the overall spread, not point by point.
        </p>
      ) : null}
      <Message
        severity="info"
        className="w-full survey-compare__caution"
        text={comparison.caution ?? SETTLEMENT_CAUTION}
      />
    </>
  );
}

export function SurveyComparisonSection({ jobId }: { jobId: string }) {
  const comparison = useSurveyComparison(jobId);
  return (
    <section className="job-section" aria-labelledby="survey-compare-title">
      <h2 id="survey-compare-title" className="job-section__title">
        <i className="pi pi-sliders-h" aria-hidden="true" /> Floor survey, before and after
      </h2>
      {comparison.isPending ? (
        <TableSkeleton rows={3} label="Loading the surveys" />
      ) : comparison.isError ? (
        <ApiErrorMessage error={comparison.error} />
      ) : (
        <SurveyComparisonTables comparison={comparison.data} />
      )}
    </section>
  );
}
