import { Message } from 'primereact/message';
import { ProgressSpinner } from 'primereact/progressspinner';
import { Tag } from 'primereact/tag';
import { SETTLEMENT_CAUTION, type SettlementBandCode, type SettlementResult } from '@loambook/common';

const BAND_SEVERITY: Record<SettlementBandCode, 'success' | 'info' | 'warning' | 'danger'> = {
  'within-1/500': 'success',
  'beyond-1/500': 'info',
  'beyond-1/300': 'warning',
  'beyond-1/150': 'danger',
};

interface SettlementPanelProps {
  result: SettlementResult | null | undefined;
  /** A fresh figure is being worked out. */
  busy: boolean;
  /** Why there is no figure (fewer than two readings, a calculator refusal). */
  problem: string | null;
  /** Whether the figures shown are from unsaved readings. */
  live: boolean;
}

/** The screening figures of the survey: the spread, the worst neighbouring pair, the band, the tilt. */
export function SettlementPanel({ result, busy, problem, live }: SettlementPanelProps) {
  return (
    <section className="settlement" aria-labelledby="settlement-title" aria-live="polite" aria-busy={busy}>
      <div className="settlement__head">
        <h3 id="settlement-title" className="settlement__title">
          Settlement screening
        </h3>
        {busy ? (
          <ProgressSpinner
            style={{ width: '1.25rem', height: '1.25rem' }}
            strokeWidth="6"
            aria-label="Working it out"
          />
        ) : live && result ? (
          <span className="muted settlement__live">From the readings on screen</span>
        ) : null}
      </div>
      {problem ? <p className="muted">{problem}</p> : null}
      {result ? (
        <>
          <dl className="settlement__figures">
            <div className="settlement__figure">
              <dt>Max differential</dt>
              <dd>
                <span className="settlement__big">{result.maxDifferentialIn} in</span>
                <span className="muted">
                  {result.highest.label} ({result.highest.elevationIn}) to {result.lowest.label} (
                  {result.lowest.elevationIn})
                </span>
              </dd>
            </div>
            <div className="settlement__figure">
              <dt>Worst pair</dt>
              <dd>
                <span className="settlement__big" data-testid="worst-ratio">
                  {result.worstRatio ?? 'level'}
                </span>
                <span className="muted">
                  {result.worstPair.a}–{result.worstPair.b}: {result.worstPair.differentialIn} in over{' '}
                  {result.worstPair.distanceFt} ft
                </span>
              </dd>
            </div>
            <div className="settlement__figure">
              <dt>Overall tilt</dt>
              <dd>
                <span className="settlement__big">
                  {result.tiltPercent === null ? '—' : `${result.tiltPercent} %`}
                </span>
                <span className="muted">{result.tiltNote}</span>
              </dd>
            </div>
          </dl>
          <div className="settlement__band">
            <Tag value={result.worstRatio ?? 'level'} severity={BAND_SEVERITY[result.band.code]} />
            <div>
              <p className="settlement__band-label">{result.band.label}</p>
              <p className="settlement__band-source muted">Source: {result.band.source}</p>
            </div>
          </div>
          {result.warnings.map((w) => (
            <Message key={w} severity="warn" text={w} className="w-full settlement__warning" />
          ))}
          <details className="settlement__pairs">
            <summary>
              {result.pairs.length === 1
                ? '1 neighbouring pair compared'
                : `${result.pairs.length} neighbouring pairs compared`}
              , worst first
            </summary>
            <p className="muted settlement__rule">{result.neighbourRule}</p>
            <div className="settlement__pairs-scroll">
              <table className="pairs-table">
                <thead>
                  <tr>
                    <th scope="col">Pair</th>
                    <th scope="col" className="numeric">
                      Differential (in)
                    </th>
                    <th scope="col" className="numeric">
                      Distance (ft)
                    </th>
                    <th scope="col" className="numeric">
                      Ratio
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {result.pairs.map((p) => (
                    <tr key={`${p.a}|${p.b}`}>
                      <td>
                        {p.a}–{p.b}
                      </td>
                      <td className="numeric">{p.differentialIn}</td>
                      <td className="numeric">{p.distanceFt}</td>
                      <td className="numeric">
                        <span className={`ratio ratio--${BAND_SEVERITY[p.band.code]}`}>
                          {p.ratio ?? 'level'}
                        </span>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </details>
        </>
      ) : null}
      <Message
        severity="info"
        className="w-full settlement__caution"
        text={result?.caution ?? SETTLEMENT_CAUTION}
      />
    </section>
  );
}
