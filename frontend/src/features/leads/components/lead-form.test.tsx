import { describe, expect, it } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor, type DuplicateCheckResponse } from '@loambook/common';
import { routes } from '@/app/router';
import { fakeApi } from '@/testing/fake-api';
import { makeBranch, makeUser, renderApp, signInAs } from '@/testing/render';

const MATCH_ID = '55555555-5555-4555-8555-555555555555';

describe('new lead form', () => {
  it('warns of a possible duplicate while the phone is typed, with a link to the lead', async () => {
    const salesperson = makeUser('salesperson');
    signInAs(salesperson);
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: salesperson, rules: defineRulesFor(salesperson) } },
      'GET /api/branches': { body: [makeBranch()] },
      'POST /api/leads/duplicate-check': (req) => {
        const body = req.body as { phone?: string };
        const found: DuplicateCheckResponse = body.phone
          ? {
              matches: [
                {
                  id: MATCH_ID,
                  homeownerName: 'Marisol Ebbing',
                  addressLine1: '18 Quarry Lane',
                  city: 'Marrowfield',
                  stage: 'inspected',
                  branchCode: 'MRW',
                  reasons: ['phone'],
                },
              ],
              otherBranchMatches: 2,
            }
          : { matches: [], otherBranchMatches: 0 };
        return { body: found };
      },
    });
    renderApp(null, { routes, initialEntry: '/leads/new' });

    await userEvent.type(await screen.findByLabelText('Name'), 'Marisol Ebbing');
    expect(screen.queryByText('Possible duplicate')).not.toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('Phone'), '555-0134');

    expect(await screen.findByText('Possible duplicate', {}, { timeout: 3000 })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Marisol Ebbing' })).toHaveAttribute(
      'href',
      `/leads/${MATCH_ID}`,
    );
    expect(screen.getByText(/2 more in other branches/)).toBeInTheDocument();
    expect(screen.getByText(/same phone/)).toBeInTheDocument();
    // Debounced: one check for the finished number, not one per key.
    const checks = calls.filter((c) => c.path === '/api/leads/duplicate-check');
    expect(checks.length).toBeLessThanOrEqual(2);
    expect(checks.at(-1)?.body).toEqual({ phone: '555-0134' });
  });

  it('needs a phone or an e-mail, and says so at the phone field', async () => {
    const salesperson = makeUser('salesperson');
    signInAs(salesperson);
    const { calls } = fakeApi({
      'GET /api/auth/me': { body: { user: salesperson, rules: defineRulesFor(salesperson) } },
      'GET /api/branches': { body: [makeBranch()] },
    });
    renderApp(null, { routes, initialEntry: '/leads/new' });
    await userEvent.type(await screen.findByLabelText('Name'), 'Marisol Ebbing');
    await userEvent.click(screen.getByRole('button', { name: 'Save lead' }));
    const phone = screen.getByLabelText('Phone');
    await waitFor(() => expect(phone).toHaveAttribute('aria-invalid', 'true'));
    expect(phone).toHaveAccessibleDescription(/Give a phone number or an e-mail address/);
    expect(calls.some((c) => c.method === 'POST' && c.path === '/api/leads')).toBe(false);
  });
});
