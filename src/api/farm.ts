/** Calls of the farm area: demand, run plans and runs, the exceptions queue and its actions. */
import {
  DemandResponseSchema,
  DispatchSchema,
  FarmExceptionsResponseSchema,
  FarmRunListSchema,
  FarmRunSchema,
  PlanResponseSchema,
  PlannableVariantListSchema,
  type PlannableVariant,
  type DemandResponse,
  type Dispatch,
  type FarmExceptionsResponse,
  type FarmRun,
  type PlanRequest,
  type PlanResponse,
  type RedispatchRequest,
} from '../../shared/schemas/fulfilment';
import { api } from './client';

/** Paid units per variant per week, and unit costs on demand and in a run. @param weeks - weeks to show */
export function getDemand(weeks: number): Promise<DemandResponse> {
  return api(`/farm/demand?weeks=${weeks}`, { schema: DemandResponseSchema });
}

/** Plans a run (nothing is stored). @param body - variants, quantities, printer and dates */
export function planRun(body: PlanRequest): Promise<PlanResponse> {
  return api('/farm/plans', { method: 'POST', body, schema: PlanResponseSchema });
}

/** Sends a plan to the farm as one run work order. @param body - the same request the plan was made from */
export function sendRun(body: PlanRequest): Promise<FarmRun> {
  return api('/farm/runs', { method: 'POST', body, schema: FarmRunSchema });
}

/** Runs sent so far, newest first. */
export async function listRuns(): Promise<FarmRun[]> {
  return (await api('/farm/runs', { schema: FarmRunListSchema })).runs;
}

/** Held and waiting dispatches. */
export function getFarmExceptions(): Promise<FarmExceptionsResponse> {
  return api('/farm/exceptions', { schema: FarmExceptionsResponseSchema });
}

/**
 * Sends a held dispatch again, with a corrected address when given.
 * @param id - the dispatch
 * @param body - address and note
 */
export function redispatch(id: number, body: RedispatchRequest): Promise<Dispatch> {
  return api(`/farm/dispatches/${id}/redispatch`, { method: 'POST', body, schema: DispatchSchema });
}

/**
 * Withdraws a held dispatch at the farm for good (before a refund).
 * @param id - the dispatch
 * @param reason - why
 */
export function withdrawDispatch(id: number, reason: string): Promise<Dispatch> {
  return api(`/farm/dispatches/${id}/withdraw`, { method: 'POST', body: { reason }, schema: DispatchSchema });
}

/** Published variants a run can print. */
export async function listPlannableVariants(): Promise<PlannableVariant[]> {
  return (await api('/farm/variants', { schema: PlannableVariantListSchema })).variants;
}
