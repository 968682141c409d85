import { describe, expect, it } from 'vitest';
import { act, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { InstallEntry, InstallEntryInput, InstallLogResponse, JobDetail } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { apiRowSender, FieldQueueProvider } from '../offline/field-queue';
import { memoryQueueStorage, RowQueue } from '../offline/row-queue';
import { CREW_LEAD_ID, emptyLog, JOB_ID, makeJob } from '../testing/fixtures';
import JobFieldRoute from './job-field';

function stored(body: InstallEntryInput, extra: Partial<InstallEntry> = {}): InstallEntry {
  return {
    location: null,
    locationFt: null,
    depthFt: null,
    pounds: null,
    finalPressurePsi: null,
    torqueFtLb: null,
    designLoadLb: null,
    note: null,
    ...body,
    shaft: body.shaft ?? null,
    stopReason: body.stopReason ?? null,
    id: `srv-${body.number}`,
    capacityUltimateLb: null,
    capacityAllowableLb: null,
    belowDesignLoad: null,
    loggedByName: 'crew_lead person',
    photoCount: 0,
    ...extra,
  } as InstallEntry;
}

/** The API for one job in progress: a log that keeps each clientRowId once, and a switch for the signal. */
function fieldApi(job: JobDetail, log: InstallLogResponse = emptyLog()) {
  const state = { online: true, log };
  const api = fakeApi({
    [`GET /api/jobs/${JOB_ID}`]: { body: job },
    [`GET /api/jobs/${JOB_ID}/log`]: () => ({ body: state.log }),
    [`POST /api/jobs/${JOB_ID}/log/entries`]: (req) => {
      if (!state.online) throw new TypeError('Failed to fetch');
      const body = req.body as InstallEntryInput;
      const known = state.log.entries.find((e) => e.clientRowId === body.clientRowId);
      if (known) return { status: 200, body: known };
      const row = stored(body);
      state.log = { ...state.log, entries: [...state.log.entries, row] };
      return { status: 201, body: row };
    },
  });
  return { ...api, state };
}

function renderField() {
  const lead = makeUser('crew_lead', { id: CREW_LEAD_ID });
  signInAs(lead);
  const queue = new RowQueue(memoryQueueStorage(), apiRowSender);
  const utils = renderApp(null, {
    routes: [
      {
        path: '/jobs/:jobId/field',
        element: (
          <FieldQueueProvider queue={queue}>
            <JobFieldRoute />
          </FieldQueueProvider>
        ),
      },
    ],
    initialEntry: `/jobs/${JOB_ID}/field`,
  });
  return { ...utils, queue };
}

async function logInjection(pounds: string, reason: RegExp) {
  const form = screen.getByRole('form', { name: /Log injection point/ });
  await userEvent.type(within(form).getByLabelText('Pounds pumped'), pounds);
  await userEvent.click(within(form).getByLabelText(reason));
  await userEvent.click(within(form).getByRole('button', { name: /^Save point/ }));
}

describe('the crew lead’s install log', () => {
  it('keeps a row entered without signal, shows it waiting, and sends it when the browser is back online', async () => {
    const { state, calls } = fieldApi(
      makeJob({ status: 'in_progress', startedAt: '2026-12-08T13:00:00.000Z' }),
    );
    const { queue } = renderField();

    await screen.findByRole('form', { name: /Log injection point/ });
    expect(screen.getByRole('button', { name: 'Save point 1' })).toBeInTheDocument();
    await logInjection('14.5', /Material came back to the surface/);
    await waitFor(() => expect(state.log.entries).toHaveLength(1));
    // The next point number follows on.
    expect(await screen.findByRole('button', { name: 'Save point 2' })).toBeInTheDocument();
    expect(await screen.findByText('Every row is sent')).toBeInTheDocument();

    // The signal drops while the second point is logged.
    state.online = false;
    await logInjection('9', /Planned quantity reached/);
    expect(await screen.findByText('Waiting to send (1)')).toBeInTheDocument();
    const rows = screen.getAllByTestId('log-row');
    expect(rows).toHaveLength(2);
    expect(within(rows[0]!).getByText('Point 2')).toBeInTheDocument();
    expect(within(rows[0]!).getByText('Waiting to send')).toBeInTheDocument();
    expect(queue.snapshot()).toHaveLength(1);
    expect(state.log.entries).toHaveLength(1);

    // Back online: the browser says so, and the row goes.
    state.online = true;
    await act(async () => {
      window.dispatchEvent(new Event('online'));
    });
    await waitFor(() => expect(state.log.entries).toHaveLength(2));
    expect(await screen.findByText('Every row is sent')).toBeInTheDocument();
    expect(queue.snapshot()).toHaveLength(0);
    expect(state.log.entries.map((e) => [e.number, e.pounds, e.stopReason])).toEqual([
      [1, '14.5', 'surface_return'],
      [2, '9', 'planned_quantity'],
    ]);
    // Two sends of point 2 at most (the failed one and the good one), one row on the server.
    const posts = calls.filter((c) => c.method === 'POST' && c.path.endsWith('/log/entries'));
    expect(new Set(posts.map((p) => (p.body as InstallEntryInput).clientRowId)).size).toBe(2);
  });

  it('resends on the retry button too', async () => {
    const { state } = fieldApi(makeJob({ status: 'in_progress' }));
    renderField();
    await screen.findByRole('form', { name: /Log injection point/ });
    state.online = false;
    await logInjection('11', /Lift seen/);
    expect(await screen.findByText('Waiting to send (1)')).toBeInTheDocument();
    state.online = true;
    await userEvent.click(screen.getByRole('button', { name: 'Send now' }));
    await waitFor(() => expect(state.log.entries).toHaveLength(1));
    expect(await screen.findByText('Every row is sent')).toBeInTheDocument();
  });

  it('flags a helical pile whose capacity from torque is below the design load', async () => {
    const job = makeJob({
      status: 'in_progress',
      planned: { injectionPoints: '0', pushPiers: '0', helicalPiles: '4', materialLb: '0' },
    });
    fieldApi(job, {
      ...emptyLog(),
      entries: [
        stored(
          {
            clientRowId: 'c1',
            kind: 'helical_pile',
            number: 1,
            torqueFtLb: '2500',
            shaft: '2.875in-round',
            designLoadLb: '15000',
            loggedAt: '2026-12-08T14:00:00.000Z',
          },
          { capacityUltimateLb: '22500', capacityAllowableLb: '11250', belowDesignLoad: true },
        ),
      ],
    });
    renderField();
    const form = await screen.findByRole('form', { name: /Log helical pile/ });
    // The stored pile from the server is flagged in the log.
    expect(await screen.findByText(/Below design load \(15,000 lb\)/)).toBeInTheDocument();

    // Kt = 9 /ft for a 2⅞ in round shaft (ICC-ES AC358 default, secondary); Qu = Kt × T (Hoyt & Clemence
    // 1989, secondary); allowable = Qu / 2 (IBC 1810.3.3.1.9, memory). 3,000 ft·lb → 27,000 → 13,500 lb.
    await userEvent.type(within(form).getByLabelText('Final torque'), '3000');
    await userEvent.type(within(form).getByLabelText('Design load'), '15000');
    const capacity = await within(form).findByTestId('capacity');
    expect(capacity).toHaveTextContent('Allowable capacity 13,500 lb');
    expect(capacity).toHaveTextContent('Below design load (15,000 lb)');

    // 4,000 ft·lb → 36,000 → 18,000 lb: enough.
    await userEvent.clear(within(form).getByLabelText('Final torque'));
    await userEvent.type(within(form).getByLabelText('Final torque'), '4000');
    expect(within(form).getByTestId('capacity')).toHaveTextContent('Allowable capacity 18,000 lb');
    expect(within(form).getByTestId('capacity')).toHaveTextContent('Meets the design load');
    expect(within(form).getByRole('button', { name: 'Save pile 2' })).toBeInTheDocument();
  });
});
