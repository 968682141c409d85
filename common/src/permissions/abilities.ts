import {
  AbilityBuilder,
  createMongoAbility,
  subject as tagSubject,
  type ForcedSubject,
  type MongoAbility,
  type RawRuleOf,
} from '@casl/ability';
import type { Role } from '../roles';

/**
 * The one place where Loambook says who may do what. The server enforces these rules (a route guard
 * for the action and subject type, instance checks in services, SQL filters on lists); the screens get
 * the same rules at sign-in and use them only to hide or disable what the server would refuse.
 */
export type Action = 'manage' | 'create' | 'read' | 'update' | 'delete' | 'approve';

/** Subject types, and the fields their conditions look at. */
export interface SubjectFields {
  Branch: { id: string };
  User: { id: string; role: Role; branchIds: string[] };
  Lead: { branchId: string; salespersonId: string | null };
  Inspection: { branchId: string; salespersonId: string | null };
  Proposal: { branchId: string; salespersonId: string | null };
  Contract: { branchId: string; salespersonId: string | null };
  PriceBook: { branchId: string };
  Job: { branchId: string; salespersonId: string | null; crewLeadId: string | null };
  Payment: { branchId: string };
  JournalEntry: { branchId: string };
  CommissionPlan: { branchId: string | null };
  CommissionStatement: { branchId: string; salespersonId: string };
  Reconciliation: { branchId: string | null };
}
export type SubjectType = keyof SubjectFields;
type TaggedSubject = { [K in SubjectType]: K | (ForcedSubject<K> & SubjectFields[K]) }[SubjectType];
export type Subjects = TaggedSubject | 'all';

export type AppAbility = MongoAbility<[Action, Subjects]>;

/** Tags a plain record with its subject type, for an instance check: `ability.can('read', asSubject('Lead', row))`. */
export function asSubject<K extends SubjectType>(type: K, record: SubjectFields[K]) {
  return tagSubject(type, { ...record });
}
export type AppRule = RawRuleOf<AppAbility>;

/** What the rules need to know about the person signed in. */
export interface AbilityUser {
  id: string;
  role: Role;
  branchIds: string[];
}

const SALES_RECORDS = ['Lead', 'Inspection', 'Proposal', 'Contract'] as const;
const MONEY_RECORDS = ['Payment', 'JournalEntry', 'CommissionStatement', 'Reconciliation'] as const;

export function defineRulesFor(user: AbilityUser): AppRule[] {
  const { can, rules } = new AbilityBuilder<AppAbility>(createMongoAbility);
  const ownBranches = { $in: user.branchIds };

  // Everyone may read their own user record.
  can('read', 'User', { id: user.id });

  switch (user.role) {
    case 'owner':
      can('manage', 'all');
      break;

    case 'branch_manager':
      can('read', 'Branch', { id: ownBranches });
      can('read', 'User', { branchIds: { $elemMatch: ownBranches } });
      // Invites and edits are limited to these roles; the service also checks every branch named.
      can(['create', 'update'], 'User', { role: { $in: ['salesperson', 'crew_lead'] } });
      for (const s of SALES_RECORDS) can('manage', s, { branchId: ownBranches });
      can('manage', 'PriceBook', { branchId: ownBranches });
      can('manage', 'Job', { branchId: ownBranches });
      can('read', 'Payment', { branchId: ownBranches });
      can('read', 'CommissionStatement', { branchId: ownBranches });
      // The plans that pay their people: their branches' own and the company-wide default (branchId null).
      can('read', 'CommissionPlan', { branchId: { $in: [...user.branchIds, null] } });
      break;

    case 'salesperson':
      can('read', 'Branch', { id: ownBranches });
      for (const s of SALES_RECORDS) {
        can('create', s, { branchId: ownBranches });
        can(['read', 'update'], s, { branchId: ownBranches, salespersonId: user.id });
      }
      can('read', 'PriceBook', { branchId: ownBranches });
      can('read', 'Job', { branchId: ownBranches, salespersonId: user.id });
      can('read', 'CommissionStatement', { salespersonId: user.id });
      break;

    case 'bookkeeper':
      can('read', 'Branch');
      for (const s of SALES_RECORDS) can('read', s);
      can('read', 'Job');
      can('read', 'PriceBook');
      for (const s of MONEY_RECORDS) can('manage', s);
      can('read', 'CommissionPlan');
      break;

    case 'crew_lead':
      can('read', 'Branch', { id: ownBranches });
      can(['read', 'update'], 'Job', { branchId: ownBranches, crewLeadId: user.id });
      break;
  }
  return rules;
}

export function abilityFromRules(rules: AppRule[]): AppAbility {
  return createMongoAbility<AppAbility>(rules);
}

export function defineAbilityFor(user: AbilityUser): AppAbility {
  return abilityFromRules(defineRulesFor(user));
}
