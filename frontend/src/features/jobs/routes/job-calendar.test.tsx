import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor } from '@loambook/common';
import { routes } from '@/app/router';
import { errorBody, fakeApi } from '@/testing/fake-api';
import { makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { CREW_A, CREW_B, JOB_ID, makeCalendar, makeJob } from '../testing/fixtures';

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
});
