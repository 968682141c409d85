import { Skeleton } from 'primereact/skeleton';
import { formatUsd, MAIN_LINE, money, type LeadStage, type StageTotal } from '@loambook/common';
import { stageLabel } from '../lead-format';

const ENDINGS: readonly LeadStage[] = ['lost', 'cancelled'];

interface StageStripProps {
  /** Count and value per stage (the server leaves out stages with none). */
  stages: StageTotal[] | undefined;
  selected: LeadStage[];
  onToggle: (stage: LeadStage) => void;
  onClear: () => void;
}

/**
 * The line a lead travels, from first call to paid in full, with how many leads and how much work sit
 * at each stage; below it the totals, and lost and cancelled leads, off the line. A stage is a filter: click it to see
 * only those leads, click again to let go.
 */
export function StageStrip({ stages, selected, onToggle, onClear }: StageStripProps) {
  if (!stages) {
    return (
      <div className="stage-strip" aria-busy="true" aria-label="Stages">
        <div className="stage-strip__line">
          {Array.from({ length: 6 }, (_, i) => (
            <Skeleton key={i} height="4.6rem" width="8.5rem" className="stage-strip__skeleton" />
          ))}
        </div>
      </div>
    );
  }
  const byStage = new Map(stages.map((s) => [s.stage, s]));
  const allCount = stages.reduce((n, s) => n + s.count, 0);
  const allValue = stages.reduce((sum, s) => sum.plus(money(s.value)), money('0'));

  const segment = (stage: LeadStage) => {
    const total = byStage.get(stage);
    const count = total?.count ?? 0;
    const value = total?.value ?? '0.00';
    const pressed = selected.includes(stage);
    const ending = ENDINGS.includes(stage);
    const leads = count === 1 ? '1 lead' : `${count} leads`;
    return (
      <li key={stage} className={ending ? undefined : 'stage-strip__item'}>
        <button
          type="button"
          className={[
            ending ? 'stage-chip' : 'stage-strip__stage',
            pressed ? (ending ? 'stage-chip--on' : 'stage-strip__stage--on') : '',
            count === 0 ? 'stage--empty' : '',
          ]
            .filter(Boolean)
            .join(' ')}
          aria-pressed={pressed}
          aria-label={`${stageLabel(stage)}: ${leads}, ${formatUsd(value)}`}
          onClick={() => onToggle(stage)}
        >
          <span className={ending ? 'stage-chip__label' : 'stage-strip__label'}>{stageLabel(stage)}</span>
          <span className={ending ? 'stage-chip__count' : 'stage-strip__count'}>{count}</span>
          <span className={ending ? 'stage-chip__value' : 'stage-strip__value'}>{formatUsd(value)}</span>
        </button>
      </li>
    );
  };

  return (
    <nav className="stage-strip" aria-label="Stages">
      <ol className="stage-strip__line">{MAIN_LINE.map(segment)}</ol>
      <ul className="stage-strip__extras">
        <li>
          <button
            type="button"
            className={['stage-chip', selected.length ? '' : 'stage-chip--on'].filter(Boolean).join(' ')}
            aria-pressed={selected.length === 0}
            aria-label={`All stages: ${allCount === 1 ? '1 lead' : `${allCount} leads`}, ${formatUsd(allValue)}`}
            onClick={onClear}
          >
            <span className="stage-chip__label">All stages</span>
            <span className="stage-chip__count">{allCount}</span>
            <span className="stage-chip__value">{formatUsd(allValue)}</span>
          </button>
        </li>
        <li className="stage-strip__endings-label" aria-hidden="true">
          Closed without a sale
        </li>
        {ENDINGS.map(segment)}
      </ul>
    </nav>
  );
}
