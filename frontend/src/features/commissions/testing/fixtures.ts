import type {
  CommissionPlanView,
  CommissionStatementDetail,
  ContractCommissionSplitsView,
} from '@loambook/common';
import { BRANCH_IDS } from '@/testing/render';

// Invented people and figures. The contract is the backend tests' default plan: net 5,420.00; at a flat 8 %
// the commission is 433.60, half (216.80) at each milestone (backend/test/commissions.e2e-spec.ts).

export const CONTRACT_ID = 'c0000000-0000-4000-8000-000000000001';
export const LEAD_ID = 'l0000000-0000-4000-8000-000000000001';
export const STATEMENT_ID = 's0000000-0000-4000-8000-000000000001';
export const SELLER_ID = '00000000-0000-4000-8000-000000000003';
export const OTHER_SELLER_ID = '00000000-0000-4000-8000-000000000013';

export function makePlan(overrides: Partial<CommissionPlanView> = {}): CommissionPlanView {
  return {
    id: 'p0000000-0000-4000-8000-000000000001',
    branchId: BRANCH_IDS.mrw,
    branchCode: 'MRW',
    name: 'Marrowfield flat',
    basis: 'net_price',
    rate: { kind: 'flat', ratePct: '8' },
    firstMilestonePct: '50',
    effectiveFrom: '2026-06-01',
    active: true,
    inUse: false,
    createdAt: '2026-06-01T12:00:00.000Z',
    updatedAt: '2026-06-01T12:00:00.000Z',
    ...overrides,
  };
}

export function makeSplitsView(
  overrides: Partial<ContractCommissionSplitsView> = {},
): ContractCommissionSplitsView {
  return {
    contractId: CONTRACT_ID,
    leadId: LEAD_ID,
    branchId: BRANCH_IDS.mrw,
    plan: { id: 'p0000000-0000-4000-8000-000000000001', name: 'Marrowfield flat' },
    stored: false,
    earned: false,
    cancelled: false,
    splits: [
      { salespersonId: SELLER_ID, salespersonName: 'Ana Seller', sharePct: '100', monthVolumeBefore: '0.00' },
    ],
    preview: {
      base: '5420.00',
      grossMarginPct: '51.22',
      total: '433.60',
      parts: [
        {
          salespersonId: SELLER_ID,
          sharePct: '100',
          effectiveRatePct: '8',
          amount: '433.60',
          milestones: [
            { milestone: 'deposit_cleared_window_closed', amount: '216.80' },
            { milestone: 'job_completed', amount: '216.80' },
          ],
        },
      ],
    },
    eligible: [
      { id: SELLER_ID, name: 'Ana Seller' },
      { id: OTHER_SELLER_ID, name: 'Ben Seller' },
    ],
    ...overrides,
  };
}

export function makeStatement(overrides: Partial<CommissionStatementDetail> = {}): CommissionStatementDetail {
  return {
    id: STATEMENT_ID,
    branchId: BRANCH_IDS.mrw,
    branchCode: 'MRW',
    salespersonId: SELLER_ID,
    salespersonName: 'Ana Seller',
    periodStart: '2026-07-01',
    periodEnd: '2026-07-15',
    status: 'draft',
    earned: '216.80',
    clawedBack: '0.00',
    carriedIn: '0.00',
    net: '216.80',
    payable: '216.80',
    carriedOut: '0.00',
    lineCount: 1,
    approvedAt: null,
    approvedByName: null,
    paidAt: null,
    paidOn: null,
    paidReference: null,
    paidByName: null,
    paidJournalEntryId: null,
    lines: [
      {
        id: 'line-1',
        contractId: CONTRACT_ID,
        leadId: LEAD_ID,
        homeownerName: 'Jordan Example',
        milestone: 'deposit_cleared_window_closed',
        kind: 'earning',
        amount: '216.80',
        effectiveOn: '2026-07-09',
        journalEntryId: 'je-1',
      },
    ],
    ...overrides,
  };
}
