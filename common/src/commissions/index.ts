// Commission rules: plans (basis, flat or tiered rate, step or bracket), splits to the cent, when a
// commission is earned or clawed back, semi-monthly statements. See each file for its rules and sources.
export {
  COMMISSION_ERROR_CODES,
  CommissionError,
  type CommissionErrorCode,
  type CommissionIssue,
} from './errors';
export {
  allocateByLargestRemainder,
  splitAmount,
  validateSplits,
  type CommissionSplitShare,
  type SplitPart,
} from './splits';
export {
  COMMISSION_MILESTONES,
  COMMISSION_PLAN_BASES,
  COMMISSION_TIER_MEASURES,
  COMMISSION_TIER_MODES,
  DEFAULT_FIRST_MILESTONE_PCT,
  computeCommission,
  contractGrossMarginPct,
  validateCommissionDeal,
  validateCommissionPlan,
  type CommissionBreakdown,
  type CommissionDeal,
  type CommissionMilestone,
  type CommissionPartBreakdown,
  type CommissionPlan,
  type CommissionPlanBasis,
  type CommissionRate,
  type CommissionSplit,
  type CommissionTier,
  type CommissionTierMeasure,
  type CommissionTierMode,
} from './plan';
export {
  COMMISSION_LINE_KINDS,
  commissionEventKey,
  commissionEvents,
  type CommissionContractFacts,
  type CommissionEvent,
  type CommissionLedgerLine,
  type CommissionLineKind,
} from './earning';
export {
  nextPayPeriod,
  payPeriodFor,
  statementLines,
  statementPeriodForLine,
  type ClosedStatementRef,
  type CommissionStatement,
  type PayPeriod,
  type StatementLineInput,
  type StatementOptions,
} from './statement';
export * from './api-types';
