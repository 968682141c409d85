import { describe, expect, it } from 'vitest';
import { act, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type {
  DayNoteInput,
  InstallEntry,
  InstallEntryInput,
  InstallLogResponse,
  JobDetail,
} from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { apiRowSender, FieldQueueProvider, sessionUserId } from '../offline/field-queue';
import { memoryQueueStorage, queuedBase, RowQueue, type QueueStorage } from '../offline/row-queue';
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
    [`POST /api/jobs/${JOB_ID}/log/day-notes`]: (req) => {
      const body = req.body as DayNoteInput;
      return {
        status: 201,
        body: { ...body, id: `note-${body.clientRowId}`, writtenByName: 'crew_lead person', createdAt: '' },
      };
    },
  });
  return { ...api, state };
}

function renderField(storage: QueueStorage = memoryQueueStorage()) {
  const lead = makeUser('crew_lead', { id: CREW_LEAD_ID });
  signInAs(lead);
  const queue = new RowQueue(storage, apiRowSender, sessionUserId);
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

  it('shows, and does not send, the rows another person left on this phone; the numbers go on after them', async () => {
    const { calls } = fieldApi(makeJob({ status: 'in_progress' }));
    const storage = memoryQueueStorage();
    const hollis = { id: '00000000-0000-4000-8000-0000000000aa', name: 'Hollis Varga' };
    const base = queuedBase(JOB_ID, hollis);
    await storage.put({
      ...base,
      type: 'entry',
      body: {
        clientRowId: base.clientRowId,
        kind: 'injection',
        number: 1,
        pounds: '10',
        stopReason: 'surface_return',
        loggedAt: '2026-12-08T14:00:00.000Z',
      },
    });
    const { queue } = renderField(storage);
    expect(
      await screen.findByText('1 row entered by Hollis Varga is waiting for them to sign in again.'),
    ).toBeInTheDocument();
    // Point 1 is Hollis's: this crew lead's next one is point 2.
    expect(await screen.findByRole('button', { name: 'Save point 2' })).toBeInTheDocument();
    await act(async () => {
      await queue.flush();
      window.dispatchEvent(new Event('online'));
    });
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);
    expect(await storage.all()).toHaveLength(1);
    // Nothing of this person's waits; Hollis's row is not theirs to discard.
    expect(screen.getByText('Every row is sent')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Discard/ })).not.toBeInTheDocument();
  });

  it('takes the day’s labour as people × hours on site, shows the person-hours and lets them be corrected', async () => {
    const { calls } = fieldApi(makeJob({ status: 'in_progress' }));
    renderField();
    const form = await screen.findByRole('form', { name: 'Day note' });
    await userEvent.type(within(form).getByLabelText('People on site'), '3');
    await userEvent.type(within(form).getByLabelText('Hours on site'), '8');
    // Person-hours: 3 people × 8 h = 24 (one person working one hour is one person-hour).
    expect(within(form).getByLabelText('Person-hours')).toHaveValue('24');
    expect(within(form).getByTestId('person-hours-sum')).toHaveTextContent('3 people × 8 h = 24');
    await userEvent.click(within(form).getByRole('button', { name: 'Save day note' }));
    await waitFor(() => expect(calls.some((c) => c.path.endsWith('/log/day-notes'))).toBe(true));
    expect(calls.find((c) => c.path.endsWith('/log/day-notes'))!.body).toMatchObject({
      crewSize: 3,
      labourHours: '24',
    });

    // Next day one of the three left at noon: 3 × 8 = 24, corrected to 20 by hand.
    await userEvent.type(within(form).getByLabelText('Hours on site'), '8');
    const total = within(form).getByLabelText('Person-hours');
    await userEvent.clear(total);
    await userEvent.type(total, '20');
    expect(within(form).getByRole('button', { name: 'Use 24' })).toBeInTheDocument();
    await userEvent.click(within(form).getByRole('button', { name: 'Save day note' }));
    await waitFor(() =>
      expect(calls.filter((c) => c.path.endsWith('/log/day-notes')).map((c) => c.body)).toHaveLength(2),
    );
    expect(calls.filter((c) => c.path.endsWith('/log/day-notes'))[1]!.body).toMatchObject({
      crewSize: 3,
      labourHours: '20',
    });
  });

  /** The shaft the form's select shows (its label; the options are in the DOM too). */
  const shownShaft = (form: HTMLElement) => form.querySelector('.p-dropdown-label')?.textContent;

  const helicalJob = (planDescription: string) =>
    makeJob({
      status: 'in_progress',
      planned: { injectionPoints: '0', pushPiers: '0', helicalPiles: '4', materialLb: '0' },
      plan: [
        {
          code: 'HELICAL',
          description: planDescription,
          category: 'helical_piles',
          unit: 'each',
          quantity: '4',
          unitCost: '900.00',
          unitPrice: '2000.00',
        },
      ],
    });

  it('starts a pile on the shaft of the last pile logged on the job, not a fixed one', async () => {
    fieldApi(helicalJob('Helical pile, 2-7/8 in round shaft'), {
      ...emptyLog(),
      entries: [
        stored({
          clientRowId: 'c1',
          kind: 'helical_pile',
          number: 1,
          torqueFtLb: '4000',
          shaft: '1.5in-square',
          designLoadLb: '18000',
          loggedAt: '2026-12-08T14:00:00.000Z',
        }),
      ],
    });
    renderField();
    const form = await screen.findByRole('form', { name: /Log helical pile/ });
    // The plan says 2⅞ in round; once the log is in, the last pile's shaft wins.
    await waitFor(() => expect(shownShaft(form)).toBe('1½ in square'));
    expect(within(form).getByText('As pile 1, the last one logged.')).toBeInTheDocument();
    // Kt = 10 /ft for a 1.5 in square shaft (ICC-ES AC358 default, secondary); Qu = Kt × T (Hoyt &
    // Clemence 1989, secondary); allowable = Qu / 2 (IBC 1810.3.3.1.9, memory): 3,000 → 30,000 → 15,000 lb.
    // (The 2⅞ in round default, Kt 9, would have shown 13,500 lb.)
    await userEvent.type(within(form).getByLabelText('Final torque'), '3000');
    await userEvent.type(within(form).getByLabelText('Design load'), '18000');
    expect(await within(form).findByTestId('capacity')).toHaveTextContent('Allowable capacity 15,000 lb');
  });

  it('before the first pile, takes the shaft the plan names; with none named, asks for it', async () => {
    fieldApi(helicalJob('Helical pile, 1-1/2" square shaft, with bracket'));
    const first = renderField();
    let form = await screen.findByRole('form', { name: /Log helical pile/ });
    expect(shownShaft(form)).toBe('1½ in square');
    expect(within(form).getByText('As the plan names it.')).toBeInTheDocument();
    first.unmount();

    fieldApi(helicalJob('Helical pile, installed to torque, with bracket'));
    renderField();
    form = await screen.findByRole('form', { name: /Log helical pile/ });
    await userEvent.type(within(form).getByLabelText('Final torque'), '3000');
    await userEvent.type(within(form).getByLabelText('Design load'), '18000');
    await userEvent.type(within(form).getByLabelText('Depth reached'), '22');
    // No shaft known: no capacity is guessed, and the row needs one.
    expect(within(form).queryByTestId('capacity')).not.toBeInTheDocument();
    await userEvent.click(within(form).getByRole('button', { name: 'Save pile 1' }));
    expect(await within(form).findByText(/Choose the pile’s shaft/)).toBeInTheDocument();
  });

  it('offers Start as the server allows it (can.start)', async () => {
    fieldApi(
      makeJob({
        status: 'scheduled',
        can: { schedule: false, editPermits: false, start: false, log: false, complete: false },
      }),
    );
    const first = renderField();
    expect(await screen.findByText('Safety on this job')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Start job' })).not.toBeInTheDocument();
    first.unmount();

    fieldApi(
      makeJob({
        status: 'scheduled',
        can: { schedule: false, editPermits: false, start: true, log: false, complete: false },
      }),
    );
    renderField();
    expect(await screen.findByRole('button', { name: 'Start job' })).toBeInTheDocument();
  });
});
