// The double-entry ledger: chart of accounts, reason codes, posting builders, the balance check and the
// trial balance. See postings.ts for the treatment of the processing fee on a refund.
export * from './accounts';
export * from './reasons';
export * from './posting';
export * from './postings';
export * from './trial-balance';
export * from './api-types';
