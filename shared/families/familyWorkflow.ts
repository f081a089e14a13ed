import type { Role } from '../schemas/auth';
import type { FamilyAction, FamilyState } from '../schemas/familySpec';

/** One workflow transition: the states it starts from, where it goes and who may take it. */
export interface Transition {
  from: readonly FamilyState[];
  to: FamilyState;
  role: Role;
  /** Audit action name. */
  audit: string;
}

/**
 * The review workflow: draft -> in_review -> approved -> published -> retired; return sends a family in review (or
 * approved but not yet published) back to draft with comments. Only catalogue managers approve, return, publish and
 * retire; designers submit.
 */
export const FAMILY_TRANSITIONS: Readonly<Record<FamilyAction, Transition>> = {
  submit: { from: ['draft'], to: 'in_review', role: 'designer', audit: 'family.submitted' },
  approve: { from: ['in_review'], to: 'approved', role: 'catalogue_manager', audit: 'family.approved' },
  return: { from: ['in_review', 'approved'], to: 'draft', role: 'catalogue_manager', audit: 'family.returned' },
  publish: { from: ['approved'], to: 'published', role: 'catalogue_manager', audit: 'family.published' },
  retire: { from: ['published'], to: 'retired', role: 'catalogue_manager', audit: 'family.retired' },
};

/**
 * Why an action is not allowed from a state, or null when it is.
 * @param action - the workflow action
 * @param state - the revision's current state
 */
export function transitionRefusal(action: FamilyAction, state: FamilyState): string | null {
  const transition = FAMILY_TRANSITIONS[action];
  if (transition.from.includes(state)) return null;
  return `cannot ${action} a family that is ${state.replace('_', ' ')}; ${action} is allowed from ${transition.from
    .map((from) => from.replace('_', ' '))
    .join(' or ')}`;
}

/**
 * The actions a person with these roles may take on a revision in this state.
 * @param state - the revision's state
 * @param roles - the person's roles
 */
export function allowedActions(state: FamilyState, roles: readonly Role[]): FamilyAction[] {
  return (Object.keys(FAMILY_TRANSITIONS) as FamilyAction[]).filter(
    (action) => roles.includes(FAMILY_TRANSITIONS[action].role) && transitionRefusal(action, state) === null,
  );
}
