import { type FamilyAction, type FamilyCreate, type FamilyUpdate } from '../../shared/schemas/familySpec';
import {
  ComputeStatusSchema,
  VariantListResponseSchema,
  type ComputeStatus,
  type VariantListResponse,
} from '../../shared/schemas/variant';
import {
  AuditListResponseSchema,
  RevisionDiffSchema,
  type FamilyAuditEvent,
  type ReturnDecision,
  type ReviewDecision,
  type RevisionDiff,
} from '../../shared/schemas/review';
import { type AcknowledgementsCreate } from '../../shared/schemas/gate';
import {
  FamilyListResponseSchema,
  FamilyResponseSchema,
  type Family,
  type FamilyListQuery,
  type FamilySummary,
} from '../../shared/schemas/family';
import { api } from './client';

/** Query of {@link listVariants} as the table sends it (every field optional). */
export type VariantQuery = Partial<{
  revision: number;
  verdict: 'pass' | 'warn' | 'fail';
  q: string;
  sort: 'index' | 'sku' | 'verdict' | 'costCents' | 'supportVolumeMm3' | 'printTimeMin';
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}>;

function familyPath(id: string, rest = ''): string {
  return `/families/${encodeURIComponent(id)}${rest}`;
}

function queryString(query: Record<string, string | number | undefined>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== '') params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

/**
 * Families the signed-in person may see, newest change first.
 * @param query - state filter and search text
 */
export async function listFamilies(query: FamilyListQuery = {}): Promise<FamilySummary[]> {
  const answer = await api(`/families${queryString(query)}`, { schema: FamilyListResponseSchema });
  return answer.families;
}

/**
 * One family with its current revision, gate, photos and the actions the person may take.
 * @param id - family id
 */
export async function getFamily(id: string): Promise<Family> {
  return (await api(familyPath(id), { schema: FamilyResponseSchema })).family;
}

/**
 * Creates a family (400 naming a bad field: unknown axis key, out-of-range value, empty axis, duplicates).
 * @param body - the family's content and code
 */
export async function createFamily(body: FamilyCreate): Promise<Family> {
  return (await api('/families', { method: 'POST', body, schema: FamilyResponseSchema })).family;
}

/**
 * Changes a family; a published one gets a new draft revision.
 * @param id - family id
 * @param body - the fields to change
 */
export async function updateFamily(id: string, body: FamilyUpdate): Promise<Family> {
  return (await api(familyPath(id), { method: 'PATCH', body, schema: FamilyResponseSchema })).family;
}

/**
 * Starts computing every variant of the current revision in the background.
 * @param id - family id
 */
export function startCompute(id: string): Promise<ComputeStatus> {
  return api(familyPath(id, '/compute'), { method: 'POST', body: {}, schema: ComputeStatusSchema });
}

/**
 * Cancels the running computation.
 * @param id - family id
 */
export function cancelCompute(id: string): Promise<ComputeStatus> {
  return api(familyPath(id, '/cancel'), { method: 'POST', body: {}, schema: ComputeStatusSchema });
}

/**
 * URL of the server-sent progress stream of a family's computation.
 * @param id - family id
 */
export function progressUrl(id: string): string {
  return `/api${familyPath(id, '/progress')}`;
}

/**
 * One page of a revision's variants, filtered and sorted by the server.
 * @param id - family id
 * @param query - revision, filter, sort and page
 */
export function listVariants(id: string, query: VariantQuery = {}): Promise<VariantListResponse> {
  return api(familyPath(id, `/variants${queryString(query)}`), { schema: VariantListResponseSchema });
}

/**
 * Stores written acknowledgements of bird-fit warnings for the current revision.
 * @param id - family id
 * @param body - one text per warning code
 */
export async function acknowledgeWarnings(id: string, body: AcknowledgementsCreate): Promise<Family> {
  return (await api(familyPath(id, '/acknowledgements'), { method: 'POST', body, schema: FamilyResponseSchema }))
    .family;
}

/** The body each workflow action takes. */
export interface TransitionBodies {
  submit: ReviewDecision;
  approve: ReviewDecision;
  return: ReturnDecision;
  publish: ReviewDecision;
  retire: ReviewDecision;
}

/**
 * Runs a workflow action (409 `gate_failed`, `invalid_state` or `state_changed` when it cannot happen now).
 * @param id - family id
 * @param action - submit, approve, return, publish or retire
 * @param body - the action's body: guards, and a note (`comments`, required, for return; `comment` otherwise)
 */
export async function transitionFamily<A extends FamilyAction>(
  id: string,
  action: A,
  body: TransitionBodies[A],
): Promise<Family> {
  return (await api(familyPath(id, `/${action}`), { method: 'POST', body, schema: FamilyResponseSchema })).family;
}

/**
 * What changed between two revisions.
 * @param id - family id
 * @param from - older revision number
 * @param to - newer revision number
 */
export function getRevisionDiff(id: string, from: number, to: number): Promise<RevisionDiff> {
  return api(familyPath(id, `/diff${queryString({ from, to })}`), { schema: RevisionDiffSchema });
}

/**
 * Who did what to the family and when, newest first.
 * @param id - family id
 */
export async function getAudit(id: string): Promise<FamilyAuditEvent[]> {
  return (await api(familyPath(id, '/audit'), { schema: AuditListResponseSchema })).events;
}
