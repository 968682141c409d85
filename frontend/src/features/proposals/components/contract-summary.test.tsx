import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { NotifyProvider } from '@/components/notify';
import { makeContractView } from '@/testing/contract-view';
import { ContractSummary } from './contract-summary';

const contract = makeContractView({
  option: { position: 1, title: 'Stabilise the slab' },
  cancellableUntil: '2026-12-05T05:59:59.999Z',
});

describe('contract summary', () => {
  it('gives the signing time on the branch’s clock with its zone, whatever the computer’s zone', () => {
    // 18:29 UTC on 1 December is 12:29 pm in Chicago (CST, UTC−6: IANA tz database).
    render(
      <NotifyProvider>
        <ContractSummary contract={contract} timeZone="America/Chicago" />
      </NotifyProvider>,
    );
    expect(screen.getAllByText(/Dec 1, 2026, 12:29\s?PM CST/).length).toBeGreaterThan(0);
  });
});
