import { describe, expect, it } from 'vitest';
import { screen } from '@testing-library/react';
import { defineRulesFor } from '@loambook/common';
import { routes } from '@/app/router';
import { fakeApi } from '@/testing/fake-api';
import { makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';
import { JOB_ID, makeJob, SALESPERSON_ID } from '../testing/fixtures';

function renderJobAs(role: 'salesperson' | 'branch_manager', overrides: Parameters<typeof makeJob>[0] = {}) {
  const user = makeUser(role, role === 'salesperson' ? { id: SALESPERSON_ID } : {});
  signInAs(user);
  const readOnly = role === 'salesperson';
  fakeApi({
    'GET /api/auth/me': { body: { user, rules: defineRulesFor(user) } },
    'GET /api/branches': { body: [makeBranch()] },
    'GET /api/crews': { body: [] },
    [`GET /api/jobs/${JOB_ID}`]: {
      body: makeJob({
        can: {
          schedule: !readOnly,
          editPermits: !readOnly,
          start: !readOnly,
          log: !readOnly,
          complete: !readOnly,
        },
        startBlockers: [
          {
            code: 'JOB.INSIDE_CANCELLATION_WINDOW',
            message: 'The homeowner may cancel until Fri 2026-12-04.',
          },
        ],
        ...overrides,
      }),
    },
  });
  renderApp(null, { routes, initialEntry: `/jobs/${JOB_ID}` });
}

const EDIT_BUTTONS = [
  'Reschedule',
  'Field log',
  'Start job',
  'Edit permit',
  'Replace ticket',
  'Record an emergency waiver…',
];

describe('job page', () => {
  it('is read only for the salesperson: no edit buttons, the facts and the blockers in words', async () => {
    renderJobAs('salesperson');
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    expect(screen.getByText(/Read only: you follow this job/)).toBeInTheDocument();
    for (const name of EDIT_BUTTONS) expect(screen.queryByRole('button', { name })).not.toBeInTheDocument();
    expect(screen.getByText('The homeowner can still cancel')).toBeInTheDocument();
    expect(screen.getByTestId('earliest-dig')).toHaveTextContent('Mon Dec 7, 2026');
    // The print copy is for everyone.
    expect(screen.getByRole('button', { name: 'Job sheet' })).toBeInTheDocument();
  });

  it('gives the manager the edits, the waiver beside the window blocker', async () => {
    renderJobAs('branch_manager');
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    for (const name of EDIT_BUTTONS) expect(screen.getByRole('button', { name })).toBeInTheDocument();
  });

  it('shows Start as the server allows it (can.start), not from the role alone', async () => {
    // The manager may update the job, but the server answers that this job is not theirs to start now.
    renderJobAs('branch_manager', {
      can: { schedule: true, editPermits: true, start: false, log: false, complete: false },
    });
    expect(await screen.findByRole('heading', { name: 'Marisol Ebbing' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Field log' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Start job' })).not.toBeInTheDocument();
  });

  it('counts labour in person-hours on the plan', async () => {
    renderJobAs('branch_manager', {
      plan: [
        {
          code: 'CREW-HOUR',
          description: 'Installer labour',
          category: 'mobilisation',
          unit: 'hour',
          quantity: '24',
          unitCost: '65.00',
          unitPrice: '125.00',
        },
      ],
      estimatedLabourHours: '24.00',
    });
    expect(await screen.findByText('Labour (person-hours)')).toBeInTheDocument();
    expect(screen.getByRole('cell', { name: 'person-hour' })).toBeInTheDocument();
  });
});
