import { describe, expect, it } from 'vitest';
import { asSubject, defineAbilityFor, type Action, type SubjectFields, type SubjectType } from './abilities';
import { branchScope } from './scope';
import type { Role } from '../roles';

const NORTH = 'b-north';
const SOUTH = 'b-south';
const me = (role: Role, branchIds = [NORTH]) => ({ id: 'u-me', role, branchIds });

type Case<K extends SubjectType = SubjectType> = [Role, Action, K, SubjectFields[K], boolean];

// The role descriptions of issue #2: owner everything; manager own branches; salesperson own leads in own
// branches; bookkeeper money across branches, read-only on sales; crew lead the jobs of their crew.
const cases: Case[] = [
  ['owner', 'update', 'Branch', { id: SOUTH }, true],
  ['owner', 'delete', 'User', { id: 'x', role: 'owner', branchIds: [] }, true],
  ['branch_manager', 'read', 'Branch', { id: NORTH }, true],
  ['branch_manager', 'read', 'Branch', { id: SOUTH }, false],
  ['branch_manager', 'update', 'Branch', { id: NORTH }, false],
  ['branch_manager', 'read', 'User', { id: 'x', role: 'salesperson', branchIds: [SOUTH, NORTH] }, true],
  ['branch_manager', 'read', 'User', { id: 'x', role: 'salesperson', branchIds: [SOUTH] }, false],
  ['branch_manager', 'create', 'User', { id: 'x', role: 'salesperson', branchIds: [NORTH] }, true],
  ['branch_manager', 'create', 'User', { id: 'x', role: 'crew_lead', branchIds: [NORTH] }, true],
  ['branch_manager', 'create', 'User', { id: 'x', role: 'bookkeeper', branchIds: [NORTH] }, false],
  ['branch_manager', 'create', 'User', { id: 'x', role: 'branch_manager', branchIds: [NORTH] }, false],
  ['branch_manager', 'update', 'Lead', { branchId: NORTH, salespersonId: 'someone' }, true],
  ['branch_manager', 'update', 'Lead', { branchId: SOUTH, salespersonId: 'someone' }, false],
  ['salesperson', 'update', 'Lead', { branchId: NORTH, salespersonId: 'u-me' }, true],
  ['salesperson', 'read', 'Lead', { branchId: NORTH, salespersonId: 'someone' }, false],
  ['salesperson', 'read', 'Lead', { branchId: SOUTH, salespersonId: 'u-me' }, false],
  ['salesperson', 'create', 'Lead', { branchId: NORTH, salespersonId: null }, true],
  ['salesperson', 'read', 'User', { id: 'u-me', role: 'salesperson', branchIds: [NORTH] }, true],
  ['salesperson', 'read', 'User', { id: 'x', role: 'salesperson', branchIds: [NORTH] }, false],
  ['salesperson', 'read', 'JournalEntry', { branchId: NORTH }, false],
  ['bookkeeper', 'read', 'Lead', { branchId: SOUTH, salespersonId: 'x' }, true],
  ['bookkeeper', 'update', 'Lead', { branchId: SOUTH, salespersonId: 'x' }, false],
  ['bookkeeper', 'create', 'JournalEntry', { branchId: SOUTH }, true],
  ['bookkeeper', 'read', 'User', { id: 'x', role: 'salesperson', branchIds: [NORTH] }, false],
  ['branch_manager', 'read', 'CommissionPlan', { branchId: NORTH }, true],
  ['branch_manager', 'read', 'CommissionPlan', { branchId: null }, true],
  ['branch_manager', 'read', 'CommissionPlan', { branchId: SOUTH }, false],
  ['branch_manager', 'update', 'CommissionPlan', { branchId: NORTH }, false],
  ['salesperson', 'read', 'CommissionPlan', { branchId: NORTH }, false],
  ['crew_lead', 'read', 'Job', { branchId: NORTH, salespersonId: 'x', crewLeadId: 'u-me' }, true],
  ['crew_lead', 'read', 'Job', { branchId: NORTH, salespersonId: 'x', crewLeadId: 'other' }, false],
  ['crew_lead', 'read', 'Lead', { branchId: NORTH, salespersonId: 'x' }, false],
];

describe('defineAbilityFor', () => {
  it.each(cases)('%s may %s %s %j → %s', (role, action, type, record, expected) => {
    const ability = defineAbilityFor(me(role));
    expect(ability.can(action, asSubject(type, record as never) as never)).toBe(expected);
  });

  it('only the owner may create branches or see the user admin of every branch', () => {
    const roles: Role[] = ['owner', 'branch_manager', 'salesperson', 'bookkeeper', 'crew_lead'];
    expect(roles.filter((r) => defineAbilityFor(me(r)).can('create', 'Branch'))).toEqual(['owner']);
  });
});

describe('branchScope', () => {
  it.each([
    ['owner', 'admin', null],
    ['bookkeeper', 'money', null],
    ['bookkeeper', 'admin', [NORTH]],
    ['branch_manager', 'sales', [NORTH]],
    ['salesperson', 'sales', [NORTH]],
  ] as const)('%s / %s → %j', (role, family, expected) => {
    expect(branchScope(me(role), family)).toEqual(expected);
  });
});
