import { Message } from 'primereact/message';
import { CAUTION_CALL_811, CAUTION_ENGINEER, CAUTION_ISOCYANATES, CAUTION_LIFTING } from '@loambook/common';

/** The cautions of the trade, always shown on the job: the server's list when it sends one, else all four. */
export const DEFAULT_CAUTIONS = [CAUTION_CALL_811, CAUTION_ISOCYANATES, CAUTION_LIFTING, CAUTION_ENGINEER];

const ICONS: [string, string][] = [
  ['811', 'pi-phone'],
  ['isocyanate', 'pi-shield'],
  ['Lifting', 'pi-arrow-up'],
  ['engineer', 'pi-building'],
];

function iconFor(text: string): string {
  return ICONS.find(([k]) => text.includes(k))?.[1] ?? 'pi-exclamation-triangle';
}

export function JobCautions({ cautions, compact = false }: { cautions?: string[]; compact?: boolean }) {
  const list = cautions?.length ? cautions : DEFAULT_CAUTIONS;
  return (
    <section
      className={compact ? 'job-cautions job-cautions--compact' : 'job-cautions'}
      aria-labelledby="job-cautions-title"
    >
      <h2 id="job-cautions-title" className="job-section__title">
        <i className="pi pi-exclamation-triangle" aria-hidden="true" /> Before and during the work
      </h2>
      <ul className="job-cautions__list">
        {list.map((c) => (
          <li key={c} className="job-cautions__item">
            <i className={`pi ${iconFor(c)}`} aria-hidden="true" />
            <span>{c}</span>
          </li>
        ))}
      </ul>
      {compact ? null : (
        <Message
          severity="info"
          className="w-full"
          text="Local codes and the engineer of record prevail over anything on this page."
        />
      )}
    </section>
  );
}
