import { describe, expect, it } from 'vitest';
import type { Role } from '../roles';
import { approvalDecision, combineDecisions, mayApprove, type ApprovalDecision } from './approval';

// A branch's settings for the matrix: margin floor 35%, salesperson may give up to 10% off, the branch
// manager up to 20% (invented settings, like the demo branches').
const branch = { marginFloorPct: '35', discountAuthority: { salesperson: '10', branch_manager: '20' } };

const NONE: ApprovalDecision = { needsApproval: false, approver: 'none', reasons: [] };
const manager = (...reasons: ApprovalDecision['reasons']): ApprovalDecision => ({
  needsApproval: true,
  approver: 'branch_manager',
  reasons,
});
const owner = (...reasons: ApprovalDecision['reasons']): ApprovalDecision => ({
  needsApproval: true,
  approver: 'owner',
  reasons,
});
const M = 'MARGIN_BELOW_FLOOR' as const;
const D = 'DISCOUNT_BEYOND_AUTHORITY' as const;

describe('approvalDecision: the approval matrix', () => {
  // role × discount (within the salesperson's 10% / between 10% and the manager's 20% / beyond 20%)
  //      × margin (above the 35% floor / below it). Every row written out by hand.
  it.each([
    ['salesperson', '5', '40', NONE],
    ['salesperson', '5', '30', manager(M)],
    ['salesperson', '15', '40', manager(D)],
    ['salesperson', '15', '30', manager(M, D)],
    ['salesperson', '25', '40', owner(D)],
    ['salesperson', '25', '30', owner(M, D)],
    ['branch_manager', '5', '40', NONE],
    ['branch_manager', '5', '30', owner(M)], // a manager does not approve their own exception
    ['branch_manager', '15', '40', NONE], // within the manager's own authority
    ['branch_manager', '15', '30', owner(M)],
    ['branch_manager', '25', '40', owner(D)],
    ['branch_manager', '25', '30', owner(M, D)],
    ['owner', '5', '40', NONE],
    ['owner', '5', '30', NONE],
    ['owner', '15', '40', NONE],
    ['owner', '15', '30', NONE],
    ['owner', '25', '40', NONE],
    ['owner', '25', '30', NONE],
  ] as [Role, string, string, ApprovalDecision][])(
    '%s, %s%% off, margin %s%% → %j',
    (role, discountPct, grossMarginPct, expected) => {
      expect(approvalDecision({ ...branch, role, discountPct, grossMarginPct })).toEqual(expected);
    },
  );

  it.each([
    // equal to a limit counts as within
    ['salesperson', '10', '35', NONE],
    ['salesperson', '10.00', '35.00', NONE],
    ['branch_manager', '20', '35', NONE],
    ['salesperson', '20', '35', manager(D)],
    // a hundredth beyond is beyond
    ['salesperson', '10.01', '35', manager(D)],
    ['salesperson', '10', '34.99', manager(M)],
    ['salesperson', '20.01', '35', owner(D)],
    ['branch_manager', '20.01', '35', owner(D)],
    // no margin at all (nothing charged) is below any floor
    ['salesperson', '0', null, manager(M)],
    // a loss is below the floor
    ['salesperson', '0', '-12.5', manager(M)],
    // roles that make no proposals are held to the salesperson's authority
    ['bookkeeper', '15', '40', manager(D)],
    ['crew_lead', '5', '40', NONE],
  ] as [Role, string, string | null, ApprovalDecision][])(
    'edge: %s, %s%% off, margin %s → %j',
    (role, discountPct, grossMarginPct, expected) => {
      expect(approvalDecision({ ...branch, role, discountPct, grossMarginPct })).toEqual(expected);
    },
  );

  it('a zero floor and zero authority: any discount needs the manager, any loss too', () => {
    const strict = { marginFloorPct: '0', discountAuthority: { salesperson: '0', branch_manager: '0' } };
    expect(
      approvalDecision({ ...strict, role: 'salesperson', discountPct: '0', grossMarginPct: '0' }),
    ).toEqual(NONE);
    expect(
      approvalDecision({ ...strict, role: 'salesperson', discountPct: '0.01', grossMarginPct: '50' }),
    ).toEqual(owner(D));
  });
});

describe('combineDecisions', () => {
  it('takes the highest approver and every reason, in a fixed order', () => {
    expect(combineDecisions([NONE, manager(D), owner(M)])).toEqual(owner(M, D));
    expect(combineDecisions([manager(M), NONE])).toEqual(manager(M));
    expect(combineDecisions([NONE, NONE])).toEqual(NONE);
    expect(combineDecisions([])).toEqual(NONE);
  });
});

describe('mayApprove', () => {
  it.each([
    ['owner', 'owner', true],
    ['owner', 'branch_manager', true],
    ['branch_manager', 'branch_manager', true],
    ['branch_manager', 'owner', false],
    ['salesperson', 'branch_manager', false],
    ['bookkeeper', 'branch_manager', false],
  ] as const)('%s deciding a request for %s → %s', (role, approver, expected) => {
    expect(mayApprove(role, approver)).toBe(expected);
  });
});
