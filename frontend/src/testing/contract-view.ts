import type { ContractView } from '@loambook/common';

/**
 * A signed contract as GET /api/leads/:id/contract answers it: signed in person on 1 December 2026, inside
 * its cancellation window (last day 4 December). Tests override what they look at.
 */
export function makeContractView(overrides: Partial<ContractView> = {}): ContractView {
  const id = overrides.id ?? 'contract-1';
  return {
    id,
    status: 'signed',
    proposalId: 'prop-1',
    proposalVersion: 1,
    optionId: 'opt-1',
    option: { position: 2, title: 'Push piers on the east wall' },
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
    cancellableUntil: '2026-12-05T04:59:59.999Z',
    windowOpen: true,
    notices: [],
    pdfUrl: `/api/contracts/${id}/pdf`,
    pdfStored: true,
    cancellation: null,
    canCancel: true,
    createdAt: '2026-12-01T18:29:00.000Z',
    ...overrides,
  };
}
