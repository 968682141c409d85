// Invented records for the component tests of proposals, approvals and signing.
import {
  FTC_429_BUYER_STATEMENT,
  SIGNING_CAUTIONS,
  type ApprovalRequestView,
  type PriceBookItem,
  type ProposalDetail,
  type ProposalOption,
} from '@loambook/common';
import type { SigningDocumentData } from '@/features/signing/components/signing-document';
import { BRANCH_IDS } from '@/testing/render';

const at = '2026-12-01T15:00:00.000Z';

export function makeItem(overrides: Partial<PriceBookItem> = {}): PriceBookItem {
  return {
    id: '0d7c84cd-1b38-4af1-80f6-27c8c7f3bb3d',
    branchId: BRANCH_IDS.mrw,
    code: 'PU-POINT',
    description: 'Injection point setup: drill, drive rod, seal and patch',
    category: 'soil_stabilisation',
    unit: 'point',
    unitCost: '18.00',
    unitPrice: '45.00',
    active: true,
    inUse: false,
    createdAt: at,
    updatedAt: at,
    ...overrides,
  };
}

export const ITEMS = {
  point: makeItem(),
  lb: makeItem({
    id: '318f1bc5-f821-4bac-b26d-8b4341a5af52',
    code: 'PU-LB',
    description: 'Polyurethane soil-stabilisation material, injected, per lb',
    unit: 'lb',
    unitCost: '5.20',
    unitPrice: '11.50',
  }),
  mobilise: makeItem({
    id: '45a34458-e3ee-4607-91f6-1e8cd11de49b',
    code: 'MOBILISE',
    description: 'Mobilisation: crew, rig and equipment to site and back',
    category: 'mobilisation',
    unit: 'lump_sum',
    unitCost: '300.00',
    unitPrice: '600.00',
  }),
};

/** Figures as the API computed them for 9 points, 180 lb and mobilisation with 10% off (MRW, 6% on materials). */
export function makeOption(overrides: Partial<ProposalOption> = {}): ProposalOption {
  return {
    id: 'opt-1',
    position: 1,
    title: 'Stabilise the east wall',
    description: null,
    discount: { kind: 'percent', value: '10.00' },
    lines: [
      {
        id: 'line-1',
        position: 1,
        priceBookItemId: ITEMS.point.id,
        code: 'PU-POINT',
        description: ITEMS.point.description,
        category: 'soil_stabilisation',
        unit: 'point',
        quantity: '9',
        unitCost: '18.00',
        unitPrice: '45.00',
        quantitySource: 'injection-plan',
        lineCost: '162.00',
        lineList: '405.00',
      },
      {
        id: 'line-2',
        position: 2,
        priceBookItemId: ITEMS.lb.id,
        code: 'PU-LB',
        description: ITEMS.lb.description,
        category: 'soil_stabilisation',
        unit: 'lb',
        quantity: '180',
        unitCost: '5.20',
        unitPrice: '11.50',
        quantitySource: 'typed',
        lineCost: '936.00',
        lineList: '2070.00',
      },
      {
        id: 'line-3',
        position: 3,
        priceBookItemId: ITEMS.mobilise.id,
        code: 'MOBILISE',
        description: ITEMS.mobilise.description,
        category: 'mobilisation',
        unit: 'lump_sum',
        quantity: '1',
        unitCost: '300.00',
        unitPrice: '600.00',
        quantitySource: 'typed',
        lineCost: '300.00',
        lineList: '600.00',
      },
    ],
    totals: {
      costTotal: '1398.00',
      listTotal: '3075.00',
      discountTotal: '307.50',
      discountPct: '10.00',
      netTotal: '2767.50',
      materialsCostTotal: '1098.00',
      taxTotal: '65.88',
      taxBorneBy: 'contractor',
      customerTotal: '2767.50',
      grossProfit: '1303.62',
      grossMarginPct: '47.10',
      markupPct: '93.25',
    },
    approval: { needsApproval: true, approver: 'branch_manager', reasons: ['DISCOUNT_BEYOND_AUTHORITY'] },
    commission: { ratePct: '8', basis: 'net', amount: '221.40' },
    ...overrides,
  };
}

export function makeProposal(overrides: Partial<ProposalDetail> = {}): ProposalDetail {
  const options = overrides.options ?? [makeOption()];
  return {
    id: 'prop-1',
    leadId: 'lead-1',
    branchId: BRANCH_IDS.mrw,
    inspectionId: null,
    version: 1,
    previousId: null,
    status: 'draft',
    salespersonId: '00000000-0000-4000-8000-000000000003',
    notes: null,
    sentAt: null,
    createdBy: '00000000-0000-4000-8000-000000000003',
    createdAt: at,
    updatedAt: at,
    tax: { treatment: 'materials_cost', ratePct: '6' },
    options,
    approval: { needsApproval: true, approver: 'branch_manager', reasons: ['DISCOUNT_BEYOND_AUTHORITY'] },
    approvalRequest: null,
    versions: [{ id: 'prop-1', version: 1, status: 'draft', createdAt: at, sentAt: null }],
    editable: true,
    readOnly: false,
    canSubmit: true,
    ...overrides,
  };
}

export function makeApprovalRequest(overrides: Partial<ApprovalRequestView> = {}): ApprovalRequestView {
  return {
    id: 'req-1',
    proposalId: 'prop-1',
    proposalVersion: 1,
    leadId: 'lead-1',
    homeownerName: 'Marisol Ebbing',
    branchId: BRANCH_IDS.mrw,
    branchName: 'Marrowfield',
    status: 'pending',
    approver: 'branch_manager',
    reasons: ['MARGIN_BELOW_FLOOR', 'DISCOUNT_BEYOND_AUTHORITY'],
    figures: {
      submitterRole: 'salesperson',
      marginFloorPct: '38',
      discountAuthority: { salesperson: '8', branch_manager: '18' },
      tax: { treatment: 'materials_cost', ratePct: '6' },
      options: [
        {
          optionId: 'opt-1',
          position: 1,
          title: 'Stabilise the east wall',
          // 15% off 3075.00 = 461.25; tax 6% of 1350.00 materials = 81.00 (paid by the branch);
          // profit 2613.75 − 1650.00 − 81.00 = 882.75; margin 882.75 / 2613.75 = 33.77%.
          costTotal: '1650.00',
          listTotal: '3075.00',
          discountTotal: '461.25',
          discountPct: '15.00',
          netTotal: '2613.75',
          taxTotal: '81.00',
          customerTotal: '2613.75',
          grossProfit: '882.75',
          grossMarginPct: '33.77',
          approver: 'branch_manager',
          reasons: ['MARGIN_BELOW_FLOOR', 'DISCOUNT_BEYOND_AUTHORITY'],
        },
      ],
    },
    requestedBy: { id: '00000000-0000-4000-8000-000000000003', name: 'Caleb Ferro' },
    requestedAt: at,
    decidedBy: null,
    decidedAt: null,
    decisionNote: null,
    canDecide: true,
    ...overrides,
  };
}

/** Two options: the cheaper one under Florida's $2,500 line (federal notice only), the other over it. */
export function makeSigningDoc(): SigningDocumentData {
  const notice = (code: string, title: string) => ({
    code,
    title,
    source: code === 'FTC_429' ? '16 CFR 429.1(a) and (b)' : 'F.S. 713.015',
    text: code === 'FTC_429' ? FTC_429_BUYER_STATEMENT : undefined,
    wordingFrom: 'The official text.',
    appliesBecause: 'Invented for the test.',
    ackRequired: true as const,
    wordingIncluded: code === 'FTC_429',
    wordingStatement: code === 'FTC_429' ? null : 'The full statutory wording must be given.',
  });
  const option = (id: string, position: number, title: string, total: string, notices: string[]) => ({
    id,
    position,
    title,
    description: null,
    lines: [
      {
        position: 1,
        code: 'PU-LB',
        description: 'Material, per lb',
        quantity: '100',
        unit: 'lb',
        unitPrice: '11.50',
        amount: '1150.00',
      },
    ],
    listTotal: total,
    discount: { kind: 'none' as const, value: '0' },
    discountTotal: '0.00',
    netTotal: total,
    tax: {
      treatment: 'materials_cost' as const,
      ratePct: '6',
      chargedToHomeowner: '0.00',
      label: 'No sales tax is added: the contractor pays the sales tax on the materials it buys',
    },
    customerTotal: total,
    requiredNotices: notices,
    deposit: null,
  });
  return {
    branch: {
      name: 'Marrowfield',
      addressLine1: '410 Quarrystone Way',
      city: 'Marrowfield',
      state: 'FL',
      postalCode: '32901',
      phone: '555-0100',
      timezone: 'America/New_York',
    },
    homeowner: { name: 'Marisol Ebbing', email: 'marisol@example.test', phone: null },
    property: { addressLine1: '18 Wicklow Bend', city: 'Marrowfield', state: 'FL', postalCode: '32901' },
    salesperson: { name: 'Caleb Ferro', email: 'caleb@example.test' },
    proposal: { version: 1, sentAt: at },
    findings: null,
    options: [
      option('opt-a', 1, 'Stabilise the east wall', '2150.00', ['FTC_429']),
      option('opt-b', 2, 'East and north walls', '4300.00', ['FTC_429', 'FL_713_015']),
    ],
    cautions: [...SIGNING_CAUTIONS],
    notices: [
      { ...notice('FTC_429', 'Buyer’s right to cancel'), optionIds: ['opt-a', 'opt-b'] },
      { ...notice('FL_713_015', 'Florida construction lien law disclosure'), optionIds: ['opt-b'] },
    ],
    cancellation: {
      statement: FTC_429_BUYER_STATEMENT,
      source: '16 CFR 429.1(a)',
      timezone: 'America/New_York',
      today: '2026-12-01',
      lastDayToCancelIfSignedToday: '2026-12-04',
      lastDayWeekday: 'Friday',
      cancellableUntilIfSignedToday: '2026-12-05T05:00:00.000Z',
      notes: [],
    },
  };
}
