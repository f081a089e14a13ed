/**
 * Hooks other features hang on order transitions (fulfilment sends a paid order to the farm). A hook runs inside
 * the transaction that changes the state, so what it writes (an outbox row, say) commits or rolls back with it.
 */
import type { OrderState } from '../../shared/schemas/order';
import type { Queryable } from '../db/client';
import type { OrderRow } from '../db/schema';

/** What a hook receives. */
export interface OrderTransitionEvent {
  /** The open transaction. */
  tx: Queryable;
  /** The order after the change. */
  order: OrderRow;
  from: OrderState;
  to: OrderState;
}

/** A hook; throwing aborts the transition. */
export type OrderTransitionHook = (event: OrderTransitionEvent) => Promise<void> | void;

const hooks: OrderTransitionHook[] = [];

/**
 * Runs `hook` after every order transition, inside its transaction (e.g. `if (event.to === 'paid') ...`).
 * @param hook - the hook
 * @returns a function that removes it again
 */
export function onOrderTransition(hook: OrderTransitionHook): () => void {
  hooks.push(hook);
  return () => {
    const at = hooks.indexOf(hook);
    if (at >= 0) hooks.splice(at, 1);
  };
}

/**
 * Runs every hook for one transition, in registration order.
 * @param event - the transition
 */
export async function runOrderTransitionHooks(event: OrderTransitionEvent): Promise<void> {
  for (const hook of hooks) await hook(event);
}
