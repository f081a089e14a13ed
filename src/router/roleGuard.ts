import type { NavigationGuardWithThis, RouteLocationRaw } from 'vue-router';
import { useSessionStore } from '../stores/session';

/**
 * Route guard: shop routes pass without looking up the session; other public routes pass; signed-out people go to /sign-in?next=<where they wanted to go>;
 * a signed-in person lacking the roles of any matched route record goes to the Forbidden view (with `from`);
 * a signed-in person opening /sign-in goes to `next` or home.
 */
export const roleGuard: NavigationGuardWithThis<undefined> = async (to): Promise<true | RouteLocationRaw> => {
  // The shop never needs to know who is signed in: asking would cost a customer a request (and a 401 in the console).
  if (to.meta.shop) return true;
  const session = useSessionStore();
  await session.load();
  if (to.meta.public) {
    if (to.name === 'sign-in' && session.signedIn) return safeNext(to.query.next);
    return true;
  }
  if (!session.signedIn) return { name: 'sign-in', query: to.fullPath === '/' ? {} : { next: to.fullPath } };
  const allowed = to.matched.every((record) => !record.meta.roles || session.hasRole(...record.meta.roles));
  if (!allowed) {
    return { name: 'forbidden', query: { from: to.fullPath }, replace: true };
  }
  return true;
};

/**
 * A same-origin path from the `next` query, or home; anything else (absolute URLs, `//host`) is ignored.
 * @param next - the raw query value
 */
export function safeNext(next: unknown): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}
