import type { Knex } from 'knex';
import * as foundation from './20261201000000_foundation';
import * as selling from './20261202000000_selling';
import * as proposalPricing from './20261202014000_proposal_pricing';
import * as signing from './20261202016000_signing';
import * as jobs from './20261203000000_jobs';
import * as jobsCore from './20261203010000_jobs_core';
import * as fieldLog from './20261203020000_field_log';
import * as jobPhotoClientId from './20261203030000_job_photo_client_id';
import * as ledger from './20261203200000_ledger';
import * as payments from './20261203300000_payments';
import * as commissions from './20261203400000_commissions';
import * as reconciliation from './20261203500000_reconciliation';
import * as ledgerChecksByIndex from './20261203600000_ledger_checks_by_index';

/**
 * Every migration, in order. Listed here (not found on disk) so that the compiled server and the tests,
 * which run from TypeScript source, apply exactly the same list. Add a new migration at the end; once
 * shipped, never edit or reorder one.
 */
export const MIGRATIONS: ReadonlyArray<readonly [string, Knex.Migration]> = [
  ['20261201000000_foundation', foundation],
  ['20261202000000_selling', selling],
  ['20261202014000_proposal_pricing', proposalPricing],
  ['20261202016000_signing', signing],
  ['20261203000000_jobs', jobs],
  ['20261203010000_jobs_core', jobsCore],
  ['20261203020000_field_log', fieldLog],
  ['20261203030000_job_photo_client_id', jobPhotoClientId],
  ['20261203200000_ledger', ledger],
  ['20261203300000_payments', payments],
  ['20261203400000_commissions', commissions],
  ['20261203500000_reconciliation', reconciliation],
  ['20261203600000_ledger_checks_by_index', ledgerChecksByIndex],
];
