import { describe, expect, it } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEventBase from '@testing-library/user-event';
import {
  defineRulesFor,
  SETTLEMENT_CAUTION,
  type AuthUser,
  type Inspection,
  type InspectionPhoto,
} from '@loambook/common';
import { routes } from '@/app/router';
import { fakeApi, type FakeRequest } from '@/testing/fake-api';
import { BRANCH_IDS, makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

// Dialogs animate in with pointer-events: none for a moment.
const userEvent = userEventBase.setup({ pointerEventsCheck: 0 });

const ID = '77777777-7777-4777-8777-777777777777';
const salesperson = makeUser('salesperson');

const inspection = (overrides: Partial<Inspection> = {}): Inspection => ({
  id: ID,
  leadId: 'lead-7',
  branchId: BRANCH_IDS.mrw,
  salespersonId: salesperson.id,
  inspector: { id: salesperson.id, name: salesperson.name },
  status: 'booked',
  scheduledAt: '2026-12-03T14:00:00.000Z',
  scheduledLocal: '2026-12-03T09:00',
  scheduledUtcOffset: '-05:00',
  timezone: 'America/New_York',
  durationMinutes: 90,
  findings: {},
  missingFindings: [],
  summary: null,
  completedAt: null,
  photoCount: 1,
  surveyPointCounts: { inspection: 0, completion: 0 },
  lead: {
    id: 'lead-7',
    homeownerName: 'Oswin Tarrant',
    addressLine1: '4 Marl Pit Road',
    city: 'Marrowfield',
    state: 'FL',
    postalCode: '32901',
    stage: 'inspection_booked',
  },
  createdAt: '2026-12-01T12:00:00.000Z',
  updatedAt: '2026-12-01T12:00:00.000Z',
  ...overrides,
});

const photo: InspectionPhoto = {
  id: 'photo-1',
  inspectionId: ID,
  contentType: 'image/jpeg',
  sizeBytes: 120_000,
  caption: 'NE corner crack',
  storageKey: 'k',
  thumbnailKey: null,
  thumbnailNote: 'No preview in this test',
  contentUrl: '/api/photos/photo-1/content',
  thumbnailUrl: null,
  uploadedBy: { id: salesperson.id, name: salesperson.name },
  createdAt: '2026-12-03T14:30:00.000Z',
};

function renderInspection(
  view: Inspection,
  extra: Record<string, (req: FakeRequest) => { status?: number; body?: unknown }> = {},
  user: AuthUser = salesperson,
) {
  signInAs(user);
  const api = fakeApi({
    'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    'GET /api/branches': { body: [makeBranch()] },
    [`GET /api/inspections/${ID}`]: { body: view },
    [`GET /api/inspections/${ID}/survey`]: {
      body: {
        inspectionId: ID,
        kind: 'inspection',
        referenceLabel: null,
        points: [],
        result: null,
        caution: SETTLEMENT_CAUTION,
      },
    },
    [`GET /api/inspections/${ID}/photos`]: { body: [photo] },
    ...extra,
  });
  renderApp(null, { routes, initialEntry: `/inspections/${ID}` });
  return api.calls;
}

describe('changing a booked inspection', () => {
  it('reschedules on the branch clock: the form starts at the booked time and sends the new one', async () => {
    const calls = renderInspection(inspection(), {
      [`PATCH /api/inspections/${ID}`]: (req) => ({
        body: inspection({ scheduledLocal: (req.body as { scheduledAt: string }).scheduledAt }),
      }),
    });
    await userEvent.click(await screen.findByRole('button', { name: 'Reschedule' }));
    const dialog = await screen.findByRole('dialog', { name: 'Reschedule inspection' });
    const date = within(dialog).getByLabelText(/^Date/);
    const time = within(dialog).getByLabelText(/^Time/);
    expect(date).toHaveValue('2026-12-03');
    expect(time).toHaveValue('09:00');
    expect(within(dialog).getByLabelText(/Duration/)).toHaveValue('90');

    // The same time is not a reschedule.
    await userEvent.click(within(dialog).getByRole('button', { name: 'Reschedule' }));
    expect(await within(dialog).findByText(/booked for already/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'PATCH')).toBe(false);

    await userEvent.clear(date);
    await userEvent.type(date, '2026-12-05');
    await userEvent.clear(time);
    await userEvent.type(time, '13:30');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Reschedule' }));
    await waitFor(() =>
      expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({
        scheduledAt: '2026-12-05T13:30',
        durationMinutes: 90,
      }),
    );
    expect(await screen.findByText('Inspection rescheduled')).toBeInTheDocument();
  });

  it('shows the server’s refusal of a time on the time field', async () => {
    renderInspection(inspection(), {
      [`PATCH /api/inspections/${ID}`]: () => ({
        status: 400,
        body: {
          code: 'VALIDATION.FAILED',
          message: 'Some fields need attention.',
          details: [{ field: 'scheduledAt', message: 'That time does not exist on the branch’s clock.' }],
        },
      }),
    });
    await userEvent.click(await screen.findByRole('button', { name: 'Reschedule' }));
    const dialog = await screen.findByRole('dialog', { name: 'Reschedule inspection' });
    await userEvent.clear(within(dialog).getByLabelText(/^Time/));
    await userEvent.type(within(dialog).getByLabelText(/^Time/), '10:00');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Reschedule' }));
    expect(await within(dialog).findByText('That time does not exist on the branch’s clock.')).toBeVisible();
  });

  it('cancels only after the confirmation, with the reason for the timeline', async () => {
    const calls = renderInspection(inspection(), {
      [`POST /api/inspections/${ID}/cancel`]: () => ({ body: inspection({ status: 'cancelled' }) }),
    });
    await userEvent.click(await screen.findByRole('button', { name: 'Cancel inspection' }));
    const dialog = await screen.findByRole('dialog', { name: 'Cancel this inspection?' });
    expect(dialog).toHaveTextContent('the lead goes back to New');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Keep it booked' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(calls.some((c) => c.method === 'POST')).toBe(false);

    await userEvent.click(screen.getByRole('button', { name: 'Cancel inspection' }));
    const again = await screen.findByRole('dialog', { name: 'Cancel this inspection?' });
    await userEvent.type(within(again).getByLabelText(/Reason/), 'Homeowner away this week');
    await userEvent.click(within(again).getByRole('button', { name: 'Cancel inspection' }));
    await waitFor(() =>
      expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ reason: 'Homeowner away this week' }),
    );
    expect(await screen.findByText('Inspection cancelled')).toBeInTheDocument();
  });

  it('offers neither once the inspection is completed, but still lets a caption be corrected', async () => {
    const calls = renderInspection(
      inspection({ status: 'completed', completedAt: '2026-12-03T16:00:00.000Z' }),
      {
        'PATCH /api/photos/photo-1': (req) => ({
          body: { ...photo, caption: (req.body as { caption: string | null }).caption },
        }),
      },
    );
    const edit = await screen.findByRole('button', { name: 'Edit caption of photo 1: NE corner crack' });
    expect(screen.queryByRole('button', { name: 'Reschedule' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Cancel inspection' })).not.toBeInTheDocument();

    await userEvent.click(edit);
    const dialog = await screen.findByRole('dialog', { name: 'Edit caption' });
    const caption = within(dialog).getByLabelText(/Caption/);
    expect(caption).toHaveValue('NE corner crack');
    await userEvent.clear(caption);
    await userEvent.type(caption, 'Diagonal crack, NE corner');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save caption' }));
    await waitFor(() =>
      expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({
        caption: 'Diagonal crack, NE corner',
      }),
    );
    expect(await screen.findByText('Diagonal crack, NE corner')).toBeInTheDocument();
  });

  it('removes a caption when it is emptied', async () => {
    const calls = renderInspection(inspection(), {
      'PATCH /api/photos/photo-1': () => ({ body: { ...photo, caption: null } }),
    });
    await userEvent.click(
      await screen.findByRole('button', { name: 'Edit caption of photo 1: NE corner crack' }),
    );
    const dialog = await screen.findByRole('dialog', { name: 'Edit caption' });
    await userEvent.clear(within(dialog).getByLabelText(/Caption/));
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save caption' }));
    await waitFor(() => expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({ caption: null }));
  });

  it('shows no change buttons to a bookkeeper, who can only look', async () => {
    renderInspection(inspection(), {}, makeUser('bookkeeper'));
    expect(await screen.findByText(/Read only/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Reschedule' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Edit caption/ })).not.toBeInTheDocument();
  });
});
