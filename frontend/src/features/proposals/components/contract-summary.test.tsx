import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import type { ContractView } from '@loambook/common';
import { NotifyProvider } from '@/components/notify';
import { ContractSummary } from './contract-summary';

const contract: ContractView = {
  id: 'contract-1',
  status: 'signed',
  proposalId: 'prop-1',
  proposalVersion: 1,
  optionId: 'opt-1',
  option: { position: 1, title: 'Stabilise the slab' },
  leadId: 'lead-1',
  branchId: 'branch-1',
  salespersonId: 'seller-1',
  homeownerName: 'Marisol Ebbing',
  price: '2767.50',
  tax: '0.00',
  depositAmount: '500.00',
  signedByName: 'Marisol Ebbing',
  signedAt: '2026-12-01T18:29:00.000Z',
  signedOn: '2026-12-01',
  signedIp: null,
  signedUserAgent: null,
  signedInPerson: true,
  cancellationStatement: 'You may cancel this transaction …',
  lastDayToCancel: '2026-12-04',
  cancellableUntil: '2026-12-05T05:59:59.999Z',
  windowOpen: true,
  notices: [],
  pdfUrl: '/api/contracts/contract-1/pdf',
  pdfStored: true,
  cancellation: null,
  canCancel: true,
  createdAt: '2026-12-01T18:29:00.000Z',
};

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
