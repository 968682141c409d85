import type { SettlementPair, SettlementPointInput } from '@loambook/common';

/*
 * A plan sketch of the survey: each point where it was read, coloured by its elevation. Our own scale:
 * the lowest reading in clay red, the middle in sand, the highest in green; a settled corner shows up as
 * the red end. North (y) is drawn up. The numbers are for drawing only; every figure comes from the
 * calculator.
 */
const LOW = [176, 67, 47];
const MID = [232, 217, 181];
const HIGH = [60, 125, 107];

function mix(a: number[], b: number[], t: number): string {
  const c = a.map((v, i) => Math.round(v + ((b[i] ?? v) - v) * t));
  return `rgb(${c[0]}, ${c[1]}, ${c[2]})`;
}

export function elevationColour(z: number, min: number, max: number): string {
  if (max <= min) return mix(MID, MID, 0);
  const t = (z - min) / (max - min);
  return t < 0.5 ? mix(LOW, MID, t * 2) : mix(MID, HIGH, (t - 0.5) * 2);
}

const W = 360;
const H = 260;
const PAD = 34;

interface SurveyPlanProps {
  points: SettlementPointInput[];
  referenceLabel: string | null;
  worstPair: SettlementPair | null;
}

export function SurveyPlan({ points, referenceLabel, worstPair }: SurveyPlanProps) {
  if (points.length === 0) return null;
  const xs = points.map((p) => Number(p.xFt));
  const ys = points.map((p) => Number(p.yFt));
  const zs = points.map((p) => Number(p.elevationIn));
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const [minZ, maxZ] = [Math.min(...zs), Math.max(...zs)];
  const spanX = maxX - minX || 1;
  const spanY = maxY - minY || 1;
  // One scale for both axes, so the plan keeps its shape.
  const scale = Math.min((W - 2 * PAD) / spanX, (H - 2 * PAD) / spanY);
  const offX = (W - spanX * scale) / 2;
  const offY = (H - spanY * scale) / 2;
  const px = (x: number) => offX + (x - minX) * scale;
  const py = (y: number) => H - (offY + (y - minY) * scale);
  const at = new Map(points.map((p, i) => [p.label, { x: px(xs[i]!), y: py(ys[i]!) }]));
  const a = worstPair ? at.get(worstPair.a) : undefined;
  const b = worstPair ? at.get(worstPair.b) : undefined;

  return (
    <figure className="survey-plan">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        role="img"
        aria-label={`Plan sketch of ${points.length} survey points, coloured from the lowest (${minZ} in) to the highest (${maxZ} in)`}
        className="survey-plan__svg"
      >
        <rect x="1" y="1" width={W - 2} height={H - 2} rx="8" className="survey-plan__paper" />
        {a && b ? <line x1={a.x} y1={a.y} x2={b.x} y2={b.y} className="survey-plan__worst" /> : null}
        {points.map((p, i) => {
          const x = px(xs[i]!);
          const y = py(ys[i]!);
          return (
            <g key={p.label}>
              {p.label === referenceLabel ? (
                <circle cx={x} cy={y} r="13" className="survey-plan__ref" />
              ) : null}
              <circle
                cx={x}
                cy={y}
                r="9"
                fill={elevationColour(zs[i]!, minZ, maxZ)}
                className="survey-plan__dot"
              />
              <text x={x} y={y - 15} textAnchor="middle" className="survey-plan__label">
                {p.label}
              </text>
              <text x={x} y={y + 22} textAnchor="middle" className="survey-plan__value">
                {p.elevationIn}
              </text>
            </g>
          );
        })}
        <text x={W - 10} y={18} textAnchor="end" className="survey-plan__north">
          ↑ N (y)
        </text>
      </svg>
      <figcaption className="survey-plan__legend">
        <span>{minZ} in</span>
        <span className="survey-plan__scale" aria-hidden="true" />
        <span>{maxZ} in</span>
        <span className="muted">· ringed: reference{worstPair ? ' · dashed: worst pair' : ''}</span>
      </figcaption>
    </figure>
  );
}
