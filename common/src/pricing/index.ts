// Price book, option pricing, approval rules and the commission preview. See each file for its sources.
export * from './price-book';
export * from './price-option';
export * from './approval';
export * from './commission';
export * from './api-types';
