import { useRef, useState } from 'react';
import type { CSSProperties, DragEvent } from 'react';
import { Link } from 'react-router';
import { Button } from 'primereact/button';
import { addCalendarDays, type CalendarJob, type CalendarResponse, type JobSummary } from '@loambook/common';
import { paths } from '@/app/paths';
import { daysBetween, daysFrom, formatDay, formatPersonHours, formatRun, isWeekend } from '../job-format';

/** On the board the branch is known: 'MRW-J2612-002' shows as 'J2612-002' (the full number is in its name). */
const shortNumber = (n: string) => n.replace(/^[A-Z]{2,5}-(?=.)/, '');

/** What a drag carries: the job and how many days it takes. */
interface Dragged {
  jobId: string;
  number: string;
  durationDays: number;
  /** Which of the job's days was grabbed: dropping keeps that day under the pointer. */
  grabbedDay: number;
}

const DRAG_TYPE = 'application/x-loambook-job';

export interface BoardMove {
  jobId: string;
  number: string;
  crewId: string;
  startOn: string;
  durationDays: number;
}

interface ScheduleBoardProps {
  calendar: CalendarResponse;
  today: string;
  /** Moves are allowed (the manager, the owner). */
  editable: boolean;
  busyJobId: string | null;
  onMove: (move: BoardMove) => void;
  onEdit: (job: { jobId: string; crewId: string | null }) => void;
}

interface Placed {
  job: CalendarJob;
  lane: number;
  col: number;
  span: number;
  clippedStart: boolean;
  clippedEnd: boolean;
}

/** Lays a crew's jobs out in lanes: a job that overlaps an earlier one goes below it. */
function place(
  jobs: CalendarJob[],
  from: string,
  to: string,
  days: string[],
): { placed: Placed[]; lanes: number } {
  const sorted = [...jobs].sort((a, b) => (a.startOn < b.startOn ? -1 : a.startOn > b.startOn ? 1 : 0));
  const laneEnds: string[] = [];
  const placed: Placed[] = [];
  for (const job of sorted) {
    const end = addCalendarDays(job.startOn, job.durationDays - 1);
    if (end < from || job.startOn > to) continue;
    let lane = laneEnds.findIndex((e) => e < job.startOn);
    if (lane === -1) {
      lane = laneEnds.length;
      laneEnds.push(end);
    } else laneEnds[lane] = end;
    const first = job.startOn < from ? from : job.startOn;
    const last = end > to ? to : end;
    const col = days.indexOf(first);
    const span = days.indexOf(last) - col + 1;
    placed.push({ job, lane, col, span, clippedStart: job.startOn < from, clippedEnd: end > to });
  }
  return { placed, lanes: Math.max(1, laneEnds.length) };
}

/**
 * The branch's weeks: a row per crew, a column per day, each job a block across its days. A block can be
 * dragged to another crew or day; the same move is in the quick edit that a click, Enter or a tap opens.
 */
export function ScheduleBoard({ calendar, today, editable, busyJobId, onMove, onEdit }: ScheduleBoardProps) {
  const days = daysBetween(calendar.from, calendar.to);
  const dragged = useRef<Dragged | null>(null);
  const [dragging, setDragging] = useState(false);
  const [over, setOver] = useState<string | null>(null);

  const startDrag = (
    event: DragEvent<HTMLElement>,
    d: Omit<Dragged, 'grabbedDay'>,
    span: number,
    offsetDays = 0,
  ) => {
    let grabbedDay = offsetDays;
    const rect = event.currentTarget.getBoundingClientRect();
    if (rect.width > 0 && span > 1 && typeof event.clientX === 'number') {
      grabbedDay += Math.min(
        span - 1,
        Math.max(0, Math.floor(((event.clientX - rect.left) / rect.width) * span)),
      );
    }
    const payload: Dragged = { ...d, grabbedDay };
    dragged.current = payload;
    try {
      event.dataTransfer.setData(DRAG_TYPE, JSON.stringify(payload));
      event.dataTransfer.setData('text/plain', d.number);
      event.dataTransfer.effectAllowed = 'move';
    } catch {
      // some browsers refuse custom types: the ref above carries it
    }
    // Let the drop reach the day under the block (the blocks stop taking pointer events while dragging).
    window.setTimeout(() => setDragging(true), 0);
  };

  const endDrag = () => {
    dragged.current = null;
    setDragging(false);
    setOver(null);
  };

  const readDrag = (event: DragEvent<HTMLElement>): Dragged | null => {
    try {
      const raw = event.dataTransfer?.getData(DRAG_TYPE);
      if (raw) return JSON.parse(raw) as Dragged;
    } catch {
      // fall back to the ref
    }
    return dragged.current;
  };

  /**
   * The day under the pointer: from its position across the crew's row (a drop may land on another job's
   * block there), or from the day cell the event came from when there is no layout to measure.
   */
  const dayAt = (event: DragEvent<HTMLElement>): string | null => {
    const rect = event.currentTarget.getBoundingClientRect();
    if (rect.width > 0 && event.clientX > 0) {
      const i = Math.floor(((event.clientX - rect.left) / rect.width) * days.length);
      return days[Math.min(days.length - 1, Math.max(0, i))] ?? null;
    }
    const cell = (event.target as HTMLElement).closest<HTMLElement>('[data-day]');
    return cell?.dataset.day ?? null;
  };

  const dragOver = (event: DragEvent<HTMLElement>, crewId: string) => {
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'move';
    const day = dayAt(event);
    const key = day ? `${crewId}|${day}` : null;
    if (over !== key) setOver(key);
  };

  const drop = (event: DragEvent<HTMLElement>, crewId: string) => {
    event.preventDefault();
    const day = dayAt(event);
    const d = readDrag(event);
    endDrag();
    if (!d || !day) return;
    onMove({
      jobId: d.jobId,
      number: d.number,
      crewId,
      startOn: addCalendarDays(day, -d.grabbedDay),
      durationDays: d.durationDays,
    });
  };

  const gridStyle = { '--board-days': days.length } as CSSProperties;

  return (
    <div className={dragging ? 'board board--dragging' : 'board'} style={gridStyle}>
      <div className="board__scroll">
        <div className="board__head" aria-hidden="true">
          <div className="board__corner">Crew</div>
          <div className="board__days">
            {days.map((d) => (
              <div
                key={d}
                className={[
                  'board__day',
                  isWeekend(d) ? 'board__day--weekend' : '',
                  d === today ? 'board__day--today' : '',
                ].join(' ')}
              >
                <span className="board__weekday">{formatDay(d).split(' ')[0]}</span>
                <span className="board__date">{formatDay(d).split(' ').slice(1).join(' ')}</span>
                {d === today ? <span className="board__today-label">Today</span> : null}
              </div>
            ))}
          </div>
        </div>
        {calendar.crews.length === 0 ? (
          <p className="board__empty muted">No crews in this branch yet. Add one under Admin → Crews.</p>
        ) : null}
        <ul className="board__crews" aria-label="Crews">
          {calendar.crews.map((crew) => {
            const { placed, lanes } = place(crew.jobs, calendar.from, calendar.to, days);
            const overlaps = crew.jobs.filter((j) => j.conflict).length;
            return (
              <li key={crew.id} className="board__row" aria-label={`${crew.name}, lead ${crew.leadName}`}>
                <div className="board__crew">
                  <span className="board__crew-name">{crew.name}</span>
                  <span className="board__crew-lead muted">{crew.leadName}</span>
                  {overlaps ? (
                    <span className="job-flag job-flag--conflict">
                      <i className="pi pi-clone" aria-hidden="true" /> {overlaps} jobs overlap
                    </span>
                  ) : null}
                </div>
                <div
                  className="board__lanes"
                  style={{ gridTemplateRows: `repeat(${lanes}, minmax(4.4rem, auto))` }}
                  onDragOver={editable ? (e) => dragOver(e, crew.id) : undefined}
                  onDragLeave={
                    editable
                      ? (e) => {
                          if (!e.currentTarget.contains(e.relatedTarget as Node | null)) setOver(null);
                        }
                      : undefined
                  }
                  onDrop={editable ? (e) => drop(e, crew.id) : undefined}
                >
                  {days.map((d, i) => (
                    <div
                      key={d}
                      className={[
                        'board__cell',
                        isWeekend(d) ? 'board__cell--weekend' : '',
                        d === today ? 'board__cell--today' : '',
                        over === `${crew.id}|${d}` ? 'board__cell--over' : '',
                      ].join(' ')}
                      style={{ gridColumn: i + 1, gridRow: `1 / span ${lanes}` }}
                      data-testid={`cell-${crew.id}-${d}`}
                      data-day={d}
                    />
                  ))}
                  {placed.map(({ job, lane, col, span, clippedStart, clippedEnd }) => (
                    <div
                      key={job.jobId}
                      className={[
                        'board__job',
                        `board__job--${job.status}`,
                        job.conflict ? 'board__job--conflict' : '',
                        job.risk !== 'none' ? `board__job--risk-${job.risk}` : '',
                        busyJobId === job.jobId ? 'board__job--busy' : '',
                      ].join(' ')}
                      style={{ gridColumn: `${col + 1} / span ${span}`, gridRow: lane + 1 }}
                      draggable={editable && job.status !== 'completed' && job.status !== 'in_progress'}
                      onDragStart={(e) =>
                        startDrag(
                          e,
                          { jobId: job.jobId, number: job.number, durationDays: job.durationDays },
                          span,
                          clippedStart ? daysFrom(job.startOn, calendar.from) : 0,
                        )
                      }
                      onDragEnd={endDrag}
                      data-testid={`block-${job.jobId}`}
                    >
                      <button
                        type="button"
                        className="board__job-button"
                        onClick={() => onEdit({ jobId: job.jobId, crewId: crew.id })}
                        aria-label={`${job.number}, ${job.homeownerName}, ${formatRun(job.startOn, job.durationDays)}${
                          job.conflict ? ', conflict: this crew has another job on these days' : ''
                        }${job.risk === 'none' ? '' : job.risk === 'overdue' ? ', a clock is overdue' : ', a clock is due soon'}${editable ? '. Open the quick edit' : ''}`}
                      >
                        <span className="board__job-line">
                          {clippedStart ? <span aria-hidden="true">◂ </span> : null}
                          <span className="board__job-number" title={job.number}>
                            {shortNumber(job.number)}
                          </span>
                          {clippedEnd ? <span aria-hidden="true"> ▸</span> : null}
                        </span>
                        <span className="board__job-who">
                          {job.homeownerName} · {job.city}
                        </span>
                        {job.conflict ? (
                          <span className="board__job-conflict">
                            <i className="pi pi-clone" aria-hidden="true" />{' '}
                            {span > 1 ? 'Conflict: crew double-booked' : 'Conflict'}
                          </span>
                        ) : null}
                        {job.risk !== 'none' ? (
                          <span className="board__job-risk">
                            <i className="pi pi-clock" aria-hidden="true" />{' '}
                            {job.risk === 'overdue'
                              ? span > 1
                                ? 'Clock overdue'
                                : 'Overdue'
                              : span > 1
                                ? 'Clock due soon'
                                : 'Due soon'}
                          </span>
                        ) : null}
                        {job.status === 'in_progress' ? (
                          <span className="board__job-state">On site</span>
                        ) : null}
                        {job.status === 'completed' ? <span className="board__job-state">Done</span> : null}
                      </button>
                    </div>
                  ))}
                </div>
              </li>
            );
          })}
        </ul>
      </div>
    </div>
  );
}

/** Signed jobs with no crew yet: drag one onto a crew's day, or open its quick edit. */
export function UnscheduledList({
  jobs,
  editable,
  onSchedule,
}: {
  jobs: JobSummary[];
  editable: boolean;
  onSchedule: (job: JobSummary) => void;
}) {
  return (
    <section className="unscheduled" aria-labelledby="unscheduled-title">
      <h2 id="unscheduled-title" className="job-section__title">
        Waiting for a crew <span className="count-pill">{jobs.length}</span>
      </h2>
      {jobs.length === 0 ? (
        <p className="muted unscheduled__empty">Every signed job is on the calendar.</p>
      ) : (
        <>
          {editable ? (
            <p className="muted unscheduled__tip">Drag a job onto a crew’s first day, or use Schedule.</p>
          ) : null}
          <ul className="unscheduled__list">
            {jobs.map((job) => (
              <li
                key={job.id}
                className="unscheduled__item"
                draggable={editable}
                onDragStart={(e) => {
                  const payload: Dragged = {
                    jobId: job.id,
                    number: job.number,
                    durationDays: job.durationDays,
                    grabbedDay: 0,
                  };
                  try {
                    e.dataTransfer.setData(DRAG_TYPE, JSON.stringify(payload));
                    e.dataTransfer.setData('text/plain', job.number);
                    e.dataTransfer.effectAllowed = 'move';
                  } catch {
                    // ignored: the drop reads the same from the data transfer in every browser we support
                  }
                }}
                data-testid={`unscheduled-${job.id}`}
              >
                <div className="unscheduled__head">
                  <Link to={paths.job.href(job.id)} className="unscheduled__number">
                    {job.number}
                  </Link>
                  {/* What the job needs, from its plan (the days depend on the crew it goes to). */}
                  {job.estimatedLabourHours ? (
                    <span className="muted" data-testid={`needs-${job.id}`}>
                      {formatPersonHours(job.estimatedLabourHours)}
                    </span>
                  ) : null}
                </div>
                <span>{job.homeownerName}</span>
                <span className="muted">
                  {job.addressLine1}, {job.city}
                </span>
                {editable ? (
                  <Button
                    type="button"
                    label="Schedule…"
                    icon="pi pi-calendar-plus"
                    size="small"
                    outlined
                    onClick={() => onSchedule(job)}
                    aria-label={`Schedule ${job.number}`}
                  />
                ) : null}
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
