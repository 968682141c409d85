// Scope calculators: pure functions, decimal strings in and out. See each file for its sources.
export { CalculatorInputError, StatePackMissingError } from './errors';
export type { CalculatorIssue } from './errors';
export { CalcDecimal, parseStrictDecimal, formatCalcDecimal } from './decimal';
export type { CalcDecimalValue, StrictDecimalOptions, StrictDecimalResult } from './decimal';
export { CAUTION_CALL_811, CAUTION_ISOCYANATES, CAUTION_LIFTING, CAUTION_ENGINEER } from './cautions';
export { MAX_POINTS_PER_RUN } from './point-count';
export {
  injectionPlan,
  DEFAULT_INJECTION_SPACING_FT,
  DEFAULT_INJECTION_DEPTH_FT,
  DEFAULT_LB_PER_POINT,
  DEFAULT_LB_PER_DRUM_SET,
} from './injection-plan';
export type { InjectionPlanInput, InjectionPlanResult } from './injection-plan';
export { pierPlan } from './pier-plan';
export type { PierPlanInput, PierPlanResult } from './pier-plan';
export {
  helicalCapacity,
  HELICAL_SHAFTS,
  DEFAULT_KT_PER_FT,
  HELICAL_FACTOR_OF_SAFETY,
  HELICAL_SOURCES,
} from './helical-capacity';
export type { HelicalShaft, HelicalCapacityInput, HelicalCapacityResult } from './helical-capacity';
export {
  settlement,
  settlementBandFor,
  SETTLEMENT_BANDS,
  SETTLEMENT_CAUTION,
  SETTLEMENT_NEIGHBOUR_FACTOR,
  SETTLEMENT_MAX_POINTS,
} from './settlement';
export type {
  SettlementBand,
  SettlementBandCode,
  SettlementInput,
  SettlementPair,
  SettlementPointInput,
  SettlementResult,
} from './settlement';
