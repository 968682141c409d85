import type { InjectionPlanResult, PierPlanResult } from '@loambook/common';
import { api } from '@/lib/api-client';

export interface InjectionPlanRequest {
  runLengthFt: string;
  spacingFt: string;
  closed: boolean;
}

export interface PierPlanRequest {
  runLengthFt: string;
  spacingFt: string;
  closed: boolean;
}

/** POST /api/calculators/injection-plan: points along the run, and the material at the planned lb per point. */
export function runInjectionPlan(input: InjectionPlanRequest): Promise<InjectionPlanResult> {
  return api.post<InjectionPlanResult>('/calculators/injection-plan', input);
}

/** POST /api/calculators/pier-plan: piers along the run at the design's spacing. */
export function runPierPlan(input: PierPlanRequest): Promise<PierPlanResult> {
  return api.post<PierPlanResult>('/calculators/pier-plan', input);
}
