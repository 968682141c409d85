// Sending proposals and signing contracts: the findings in words, the notices and cautions a contract
// carries, the notice-of-cancellation form, and the wire shapes.
export * from './findings-summary';
export * from './signing-rules';
export * from './cancellation-form';
export * from './api-types';
