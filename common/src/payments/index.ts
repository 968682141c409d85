// Payments (issue #5): the wire types of the payments API and the pure rules behind them (minor units,
// what a contract still owes, what a payment link may ask for, the state pack's deposit warning).
export * from './api-types';
export * from './payment-rules';
