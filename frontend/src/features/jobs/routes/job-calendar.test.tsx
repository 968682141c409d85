import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor } from '@loambook/common';
import { routes } from '@/app/router';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { CREW_A, CREW_B, JOB_ID, makeCalendar, makeJob, OTHER_JOB_ID } from '../testing/fixtures';

function setUp(schedule: Parameters<typeof fakeApi>[0][string]) {
  const manager = makeUser('branch_manager');
  signInAs(manager);
  const api = fakeApi({
    'GET /api/auth/me': { body: { user: manager, rules: defineRulesFor(manager) } },
    'GET /api/branches': { body: [makeBranch()] },
    'GET /api/jobs/calendar': { body: makeCalendar() },
    [`PUT /api/jobs/${JOB_ID}/schedule`]: schedule,
  });
  renderApp(null, { routes, initialEntry: '/jobs/calendar?week=2026-12-07' });
  return api;
}

describe('crew calendar', () => {
  it('labels a conflict in words, on the blocks and on the crew', async () => {
    setUp({ body: makeJob() });
    const block = await screen.findByRole('button', { name: /MRW-J-0042, Marisol Ebbing/ });
    expect(block).toHaveAccessibleName(/conflict: this crew has another job on these days/);
    expect(within(block).getByText('Conflict: crew double-booked')).toBeInTheDocument();
    expect(screen.getByText('2 jobs overlap')).toBeInTheDocument();
    // The other (one-day) job's clock shows in words too, short on its narrow block.
    const other = screen.getByRole('button', { name: /MRW-J-0043, Dorrit Vane/ });
    expect(other).toHaveAccessibleName(/a clock is due soon/);
    expect(within(other).getByText('Due soon')).toBeInTheDocument();
    expect(within(other).getByText('Conflict')).toBeInTheDocument();
  });

  it('moves a job when its block is dragged to another crew’s day', async () => {
    const { calls } = setUp({ body: makeJob({ crewId: CREW_B, crewName: 'Crew 2', startOn: '2026-12-14' }) });
    const block = await screen.findByTestId(`block-${JOB_ID}`);
    const target = screen.getByTestId(`cell-${CREW_B}-2026-12-14`);
    fireEvent.dragStart(block);
    fireEvent.dragOver(target);
    fireEvent.drop(target);
    await waitFor(() => expect(calls.some((c) => c.method === 'PUT')).toBe(true));
    const put = calls.find((c) => c.method === 'PUT')!;
    expect(put.path).toBe(`/api/jobs/${JOB_ID}/schedule`);
    expect(put.body).toEqual({ crewId: CREW_B, startOn: '2026-12-14', durationDays: 2 });
  });

  it('does the same move from the quick edit, for the keyboard and touch', async () => {
    const { calls } = setUp({ body: makeJob({ durationDays: 3 }) });
    await userEvent.click(await screen.findByRole('button', { name: /MRW-J-0042, Marisol Ebbing/ }));
    const dialog = await screen.findByRole('dialog');
    const days = within(dialog).getByLabelText('Working days');
    await userEvent.clear(days);
    await userEvent.type(days, '3');
    const first = within(dialog).getByLabelText('First day');
    fireEvent.change(first, { target: { value: '2026-12-10' } });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save schedule' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'PUT')).toBe(true));
    expect(calls.find((c) => c.method === 'PUT')!.body).toEqual({
      crewId: CREW_A,
      startOn: '2026-12-10',
      durationDays: 3,
    });
  });

  it('says why the server refused a move (409 with a code)', async () => {
    setUp({
      status: 409,
      body: errorBody(
        'JOB.INSIDE_CANCELLATION_WINDOW',
        'The homeowner may cancel until Fri 2026-12-04; the job can start on Sat 2026-12-05 at the earliest.',
      ),
    });
    const block = await screen.findByTestId(`block-${JOB_ID}`);
    const target = screen.getByTestId(`cell-${CREW_A}-2026-12-07`);
    fireEvent.dragStart(block);
    fireEvent.drop(target);
    const alerts = await screen.findAllByText('The homeowner can still cancel.');
    expect(alerts.length).toBeGreaterThan(0);
    expect(screen.getAllByText(/can start on Sat 2026-12-05 at the earliest/).length).toBeGreaterThan(0);
  });

  it('says what a job waiting for a crew needs from its plan, in person-hours, and invents nothing', async () => {
    const manager = makeUser('branch_manager');
    signInAs(manager);
    const waiting = makeJob({ status: 'unscheduled', crewId: null, startOn: null, durationDays: 1 });
    fakeApi({
      'GET /api/auth/me': { body: { user: manager, rules: defineRulesFor(manager) } },
      'GET /api/branches': { body: [makeBranch()] },
      'GET /api/jobs/calendar': {
        body: makeCalendar({
          unscheduled: [
            { ...waiting, estimatedLabourHours: '24.00' },
            { ...waiting, id: OTHER_JOB_ID, number: 'MRW-J-0043', estimatedLabourHours: null },
          ],
        }),
      },
    });
    renderApp(null, { routes, initialEntry: '/jobs/calendar?week=2026-12-07' });
    expect(await screen.findByTestId(`needs-${JOB_ID}`)).toHaveTextContent('24 person-hours');
    const other = screen.getByTestId(`unscheduled-${OTHER_JOB_ID}`);
    expect(within(other).queryByText(/day|hour/)).not.toBeInTheDocument();
    const list = screen.getByRole('region', { name: /Waiting for a crew/ });
    expect(within(list).queryByText('1 day')).not.toBeInTheDocument();
  });

  it('opens on the first branch by code for the owner, and keeps the branch picked in the address', async () => {
    const owner = makeUser('owner');
    signInAs(owner);
    const mrw = makeBranch();
    const ald = makeBranch({ id: BRANCH_IDS.ald, code: 'ALD', name: 'Alderbrook' });
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: owner, rules: defineRulesFor(owner) } },
      // The server's order is not the calendar's: the first branch is the first by code.
      'GET /api/branches': { body: [mrw, ald] },
      'GET /api/jobs/calendar': (req) => ({
        body: makeCalendar({ branchId: req.query.get('branchId') ?? '' }),
      }),
    });
    const { router } = renderApp(null, { routes, initialEntry: '/jobs/calendar?week=2026-12-07' });
    await screen.findByTestId(`block-${JOB_ID}`);
    expect(screen.queryByText('Choose a branch')).not.toBeInTheDocument();
    const calendarCalls = () => calls.filter((c) => c.path === '/api/jobs/calendar');
    expect(calendarCalls()[0]!.query.get('branchId')).toBe(BRANCH_IDS.ald);
    expect(screen.getByText(/ALD · Alderbrook\. Days are on the branch’s calendar/)).toBeInTheDocument();

    const pointer = userEvent.setup({ pointerEventsCheck: 0 });
    await pointer.click(screen.getByLabelText('Calendar of'));
    // PrimeReact's list sits in an overlay jsdom counts as hidden.
    await pointer.click(await screen.findByRole('option', { name: 'MRW · Marrowfield', hidden: true }));
    await waitFor(() => expect(router.state.location.search).toContain('branch=MRW'));
    // The week stays as it was; the calendar is now Marrowfield's.
    expect(router.state.location.search).toContain('week=2026-12-07');
    await waitFor(() => expect(calendarCalls().at(-1)!.query.get('branchId')).toBe(BRANCH_IDS.mrw));
    expect(await screen.findByText(/MRW · Marrowfield\. Days are/)).toBeInTheDocument();
  });

  it('opens on the branch the address names (a reload keeps the choice)', async () => {
    const owner = makeUser('owner');
    signInAs(owner);
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: owner, rules: defineRulesFor(owner) } },
      'GET /api/branches': {
        body: [makeBranch(), makeBranch({ id: BRANCH_IDS.ald, code: 'ALD', name: 'Alderbrook' })],
      },
      'GET /api/jobs/calendar': { body: makeCalendar() },
    });
    renderApp(null, { routes, initialEntry: '/jobs/calendar?week=2026-12-07&branch=MRW' });
    await screen.findByTestId(`block-${JOB_ID}`);
    const first = calls.find((c) => c.path === '/api/jobs/calendar')!;
    expect(first.query.get('branchId')).toBe(BRANCH_IDS.mrw);
  });
});
