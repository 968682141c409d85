import '../jobs.css';
import { useState } from 'react';
import { useSearchParams } from 'react-router';
import { Button } from 'primereact/button';
import { Card } from 'primereact/card';
import { SelectButton } from 'primereact/selectbutton';
import { addCalendarDays, type Branch, type JobSummary } from '@loambook/common';
import { ApiErrorMessage } from '@/components/api-error-message';
import { EmptyState } from '@/components/empty-state';
import { TableSkeleton } from '@/components/loading';
import { useNotify } from '@/components/notify';
import { PageHeader } from '@/components/page-header';
import { useMediaQuery } from '@/lib/use-media-query';
import { useAppAbility } from '@/features/auth/ability';
import { useBranches } from '@/features/branches/api/get-branches';
import { useCurrentBranch } from '@/features/branches/current-branch';
import { Select } from '@/components/select';
import { useCalendar } from '../api/get-calendar';
import { useScheduleJob } from '../api/schedule-job';
import { RefusalMessage } from '../components/refusal-message';
import { ScheduleBoard, UnscheduledList, type BoardMove } from '../components/schedule-board';
import { ScheduleDialog, type ScheduleTarget } from '../components/schedule-dialog';
import { formatDay, mondayOf, todayFor } from '../job-format';
import { refusalOf } from '../refusals';

const SPANS = [
  { label: '1 week', value: 1 },
  { label: '2 weeks', value: 2 },
];

/**
 * The branch the calendar shows. The calendar is one branch's crews, so "All branches" in the switcher
 * (the owner's, the bookkeeper's) does not leave it empty: it shows the branch named in the address
 * (?branch=MRW, the last one picked on this screen), else the first branch by code.
 */
function calendarBranch(
  current: Branch | null,
  branches: readonly Branch[],
  param: string | null,
): Branch | null {
  if (current) return current;
  const named = param ? branches.find((b) => b.code === param || b.id === param) : undefined;
  return named ?? branches[0] ?? null;
}

export default function JobCalendarRoute() {
  const ability = useAppAbility();
  const notify = useNotify();
  const current = useCurrentBranch();
  const branchesQuery = useBranches();
  const [params, setParams] = useSearchParams();
  const branch = calendarBranch(current.branch, current.branches, params.get('branch'));
  const branchId = branch?.id ?? null;
  /** The switcher says "All branches": the calendar picks its branch itself, kept in the address. */
  const picksOwnBranch = current.branchId === null && current.branches.length > 1;
  const today = todayFor(branch?.timezone);
  const weekParam = params.get('week');
  const from = mondayOf(weekParam && /^\d{4}-\d{2}-\d{2}$/.test(weekParam) ? weekParam : today);
  // Two weeks where the screen is wide enough to read them; one elsewhere (the choice stays in the address).
  const roomy = useMediaQuery('(min-width: 1500px)');
  const weeksParam = params.get('weeks');
  const weeks = weeksParam === '1' ? 1 : weeksParam === '2' ? 2 : roomy ? 2 : 1;
  const to = addCalendarDays(from, weeks * 7 - 1);
  const calendar = useCalendar(branchId ? { branchId, from, to } : null);
  const schedule = useScheduleJob();
  const editable = ability.can('manage', 'Job');

  const [editing, setEditing] = useState<ScheduleTarget | null>(null);
  const [refusal, setRefusal] = useState<unknown>(null);
  const [busyJobId, setBusyJobId] = useState<string | null>(null);

  const pickBranch = (code: string) =>
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        next.set('branch', code);
        return next;
      },
      { replace: true },
    );

  const go = (week: string | null, w = weeks) =>
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        if (week) next.set('week', week);
        else next.delete('week');
        next.set('weeks', String(w));
        return next;
      },
      { replace: true },
    );

  const move = async (m: BoardMove) => {
    setRefusal(null);
    setBusyJobId(m.jobId);
    try {
      const job = await schedule.mutateAsync({
        id: m.jobId,
        input: { crewId: m.crewId, startOn: m.startOn, durationDays: m.durationDays },
      });
      notify.success(
        `${job.number} moved`,
        `${job.crewName ?? 'Crew'} from ${formatDay(job.startOn)}. The homeowner gets an e-mail with the new days.${
          job.conflict ? ' The crew has another job on some of these days.' : ''
        }`,
      );
    } catch (error) {
      setRefusal(error);
      const r = refusalOf(error);
      notify.error(`${m.number} not moved: ${r.title}`, r.message);
    } finally {
      setBusyJobId(null);
    }
  };

  const crewsForDialog = calendar.data?.crews ?? [];
  const openEdit = ({ jobId, crewId }: { jobId: string; crewId: string | null }) => {
    const crew = calendar.data?.crews.find((c) => c.id === crewId);
    const job = crew?.jobs.find((j) => j.jobId === jobId);
    if (!job) return;
    if (!editable) return;
    setEditing({
      id: job.jobId,
      number: job.number,
      homeownerName: job.homeownerName,
      crewId: crewId,
      startOn: job.startOn,
      durationDays: job.durationDays,
    });
  };
  const openUnscheduled = (job: JobSummary) =>
    setEditing({
      id: job.id,
      number: job.number,
      homeownerName: job.homeownerName,
      crewId: job.crewId,
      startOn: job.startOn,
      durationDays: job.durationDays,
      estimatedLabourHours: job.estimatedLabourHours ?? null,
    });

  return (
    <div className="page page--wide jobs-page">
      <PageHeader
        title="Crew calendar"
        description={
          branch
            ? `${branch.code} · ${branch.name}. Days are on the branch’s calendar. ${
                editable ? 'Drag a job to another crew or day, or click it for the quick edit.' : ''
              }`
            : 'A branch’s crews and their days.'
        }
      />
      {!branchId ? (
        branchesQuery.isPending ? (
          <TableSkeleton label="Loading the branches" rows={3} />
        ) : (
          <Card className="content-card">
            <EmptyState icon="pi-building" title="No branch to show">
              The calendar shows one branch’s crews, and there is no branch you may see yet.
            </EmptyState>
          </Card>
        )
      ) : (
        <>
          <div className="calendar-toolbar" role="toolbar" aria-label="Branch and weeks">
            {picksOwnBranch ? (
              <span className="calendar-toolbar__branch">
                <label htmlFor="calendar-branch" className="calendar-toolbar__label strong">
                  Calendar of
                </label>
                <Select
                  inputId="calendar-branch"
                  value={branch?.code ?? null}
                  options={current.branches.map((b) => ({ value: b.code, label: `${b.code} · ${b.name}` }))}
                  onChange={(e) => (e.value ? pickBranch(e.value as string) : undefined)}
                />
              </span>
            ) : null}
            <Button
              type="button"
              icon="pi pi-chevron-left"
              label="Previous week"
              outlined
              onClick={() => go(addCalendarDays(from, -7))}
            />
            <Button type="button" label="This week" outlined onClick={() => go(null)} />
            <Button
              type="button"
              icon="pi pi-chevron-right"
              iconPos="right"
              label="Next week"
              outlined
              onClick={() => go(addCalendarDays(from, 7))}
            />
            <span className="calendar-toolbar__range strong" aria-live="polite">
              {formatDay(from)} – {formatDay(to)}, {to.slice(0, 4)}
            </span>
            <SelectButton
              value={weeks}
              options={SPANS}
              onChange={(e) => (e.value ? go(weekParam, e.value as number) : undefined)}
              aria-label="How many weeks"
              allowEmpty={false}
            />
          </div>
          <div aria-live="assertive">
            {refusal ? <RefusalMessage error={refusal} className="w-full" /> : null}
          </div>
          <div className="calendar-layout">
            <Card className="content-card calendar-layout__board">
              {calendar.isPending ? (
                <TableSkeleton label="Loading the calendar" rows={5} />
              ) : calendar.isError ? (
                <ApiErrorMessage error={calendar.error} />
              ) : (
                <ScheduleBoard
                  calendar={calendar.data}
                  today={today}
                  editable={editable}
                  busyJobId={busyJobId}
                  onMove={(m) => void move(m)}
                  onEdit={openEdit}
                />
              )}
              <p className="board__legend muted">
                <span className="legend-swatch legend-swatch--conflict" aria-hidden="true" /> Hatched with
                “Conflict”: the crew has two jobs on the same day. It is allowed; check the crew can do both.
              </p>
            </Card>
            <Card className="content-card calendar-layout__side">
              {calendar.data ? (
                <UnscheduledList
                  jobs={calendar.data.unscheduled}
                  editable={editable}
                  onSchedule={openUnscheduled}
                />
              ) : null}
            </Card>
          </div>
          {editable ? (
            <ScheduleDialog
              job={editing}
              crews={crewsForDialog}
              defaultStartOn={today}
              onClose={() => setEditing(null)}
              onDone={(job, what) => {
                setEditing(null);
                setRefusal(null);
                notify.success(
                  what === 'scheduled' ? `${job.number} scheduled` : `${job.number} unscheduled`,
                  what === 'scheduled'
                    ? `${job.crewName ?? 'Crew'} from ${formatDay(job.startOn)}. The homeowner gets an e-mail.`
                    : 'It is back in the list of jobs waiting for a crew.',
                );
              }}
            />
          ) : null}
        </>
      )}
    </div>
  );
}
