import { beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { CompleteJobInput } from '@loambook/common';
import { fakeApi } from '@/testing/fake-api';
import { makeUser, renderApp, signInAs } from '@/testing/render';
import { beforeSurvey, CREW_LEAD_ID, JOB_ID, makeJob } from '../testing/fixtures';
import { CHECKLIST_ITEMS, CompletionWizard } from './completion-wizard';

// jsdom has no canvas: a context that draws nothing, and a fixed PNG for the export.
const PNG =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==';

beforeEach(() => {
  const noop = () => undefined;
  const ctx = {
    beginPath: noop,
    arc: noop,
    fill: noop,
    moveTo: noop,
    lineTo: noop,
    stroke: noop,
    clearRect: noop,
  };
  vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(ctx as never);
  vi.spyOn(HTMLCanvasElement.prototype, 'toDataURL').mockReturnValue(PNG);
});

function renderWizard() {
  signInAs(makeUser('crew_lead', { id: CREW_LEAD_ID }));
  const job = makeJob({ status: 'in_progress' });
  const api = fakeApi({
    [`POST /api/jobs/${JOB_ID}/complete`]: {
      body: { ...job, status: 'completed', completedAt: '2026-12-09T20:00:00.000Z' },
    },
  });
  const onCompleted = vi.fn();
  renderApp(
    <CompletionWizard
      job={job}
      before={beforeSurvey()}
      onCompleted={onCompleted}
      onCancel={() => undefined}
    />,
  );
  return { ...api, onCompleted };
}

async function toSignOff() {
  // 1. Checklist: every item answered.
  await userEvent.click(screen.getByRole('button', { name: /Next/ }));
  expect(await screen.findByText('6 items are not answered yet.')).toBeInTheDocument();
  for (const item of CHECKLIST_ITEMS) {
    const group = screen.getByRole('radiogroup', { name: new RegExp(item.label) });
    await userEvent.click(within(group).getByLabelText('Yes'));
  }
  await userEvent.click(screen.getByRole('button', { name: /Next/ }));
  // 2. Re-survey: the inspection's points, new readings.
  expect(await screen.findByRole('heading', { name: '2. Re-survey' })).toBeInTheDocument();
  await userEvent.type(screen.getByLabelText('Elevation (in) for point B'), '-0.25');
  await userEvent.type(screen.getByLabelText('Elevation (in) for point C'), '-0.5');
  await userEvent.click(screen.getByRole('button', { name: /Next/ }));
  // 3. Before and after, side by side.
  expect(await screen.findByText('Before (inspection)')).toBeInTheDocument();
  expect(screen.getByText('After (completion)')).toBeInTheDocument();
  // C went from -1.50 to -0.5: raised by 1.00 in.
  expect(screen.getByText('+1.00')).toBeInTheDocument();
  await userEvent.click(screen.getByRole('button', { name: /Next/ }));
  expect(await screen.findByRole('heading', { name: '4. Homeowner sign-off' })).toBeInTheDocument();
}

describe('completion with the homeowner', () => {
  it('refuses to go on without the homeowner’s signature, and sends nothing', async () => {
    const { calls } = renderWizard();
    await toSignOff();
    await userEvent.click(screen.getByRole('button', { name: /Next/ }));
    expect(
      await screen.findByText('The homeowner’s signature is needed to complete the job.'),
    ).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: '4. Homeowner sign-off' })).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);
  });

  it('completes with the checklist, the re-survey and the signature', async () => {
    const { calls, onCompleted } = renderWizard();
    await toSignOff();
    const pad = screen.getByRole('img', { name: 'Signature pad' });
    fireEvent.pointerDown(pad, { pointerId: 1, clientX: 10, clientY: 20, button: 0, pointerType: 'touch' });
    fireEvent.pointerMove(pad, { pointerId: 1, clientX: 60, clientY: 30, pointerType: 'touch' });
    fireEvent.pointerUp(pad, { pointerId: 1, clientX: 60, clientY: 30, pointerType: 'touch' });
    await userEvent.click(screen.getByRole('button', { name: /Next/ }));
    expect(await screen.findByText(/Signed by Marisol Ebbing/)).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Complete the job' }));
    await waitFor(() => expect(onCompleted).toHaveBeenCalled());
    const body = calls.find((c) => c.method === 'POST')!.body as CompleteJobInput;
    expect(body.signaturePng).toBe(PNG);
    expect(body.homeownerName).toBe('Marisol Ebbing');
    expect(Object.values(body.checklist).every((v) => v === true)).toBe(true);
    expect(body.resurvey).toEqual([
      { label: 'A', xFt: '0.00', yFt: '0.00', elevationIn: '0', isReference: true },
      { label: 'B', xFt: '30.00', yFt: '0.00', elevationIn: '-0.25', isReference: false },
      { label: 'C', xFt: '30.00', yFt: '20.00', elevationIn: '-0.5', isReference: false },
    ]);
  });
});
