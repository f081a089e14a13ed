/** The client's role-aware route guard and area registry, with a memory-history router and a stubbed `/api/auth/me`. */
import { createPinia, setActivePinia } from 'pinia';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { defineComponent } from 'vue';
import { createMemoryHistory, createRouter, type RouteRecordRaw, type Router } from 'vue-router';
import type { Person, Role } from '../shared/schemas/auth';
import { AREAS, areasFor } from '../src/router/areas';
import { roleGuard, safeNext } from '../src/router/roleGuard';

const Blank = defineComponent({ render: () => null });
const ROUTES: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: Blank, meta: { public: true } },
  { path: '/', name: 'home', component: Blank },
  { path: '/admin/people', component: Blank, meta: { roles: ['admin'] } },
  { path: '/review', component: Blank, meta: { roles: ['catalogue_manager'] } },
  { path: '/forbidden', name: 'forbidden', component: Blank },
];

function stubMe(person: Person | null): void {
  vi.stubGlobal('fetch', async () =>
    person
      ? new Response(JSON.stringify({ person, studioName: 'Fernhollow Studio', locale: 'en-GB' }), { status: 200 })
      : new Response(JSON.stringify({ error: { code: 'unauthorized', message: 'Sign in first.' } }), { status: 401 }),
  );
}

function person(roles: Role[]): Person {
  return { id: 'p1', email: 'someone@fernhollow.test', name: 'Some One', roles };
}

function newRouter(): Router {
  const router = createRouter({ history: createMemoryHistory(), routes: ROUTES });
  router.beforeEach(roleGuard);
  return router;
}

beforeEach(() => {
  setActivePinia(createPinia());
});
afterEach(() => {
  vi.unstubAllGlobals();
});

describe('roleGuard', () => {
  it('sends a signed-out visitor to sign in, remembering where they were going', async () => {
    stubMe(null);
    const router = newRouter();
    await router.push('/admin/people');
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.next).toBe('/admin/people');
  });

  it('lets a person with the role in, and shows Forbidden to one without', async () => {
    stubMe(person(['admin']));
    const adminRouter = newRouter();
    await adminRouter.push('/admin/people');
    expect(adminRouter.currentRoute.value.path).toBe('/admin/people');

    setActivePinia(createPinia());
    stubMe(person(['designer']));
    const designerRouter = newRouter();
    await designerRouter.push('/admin/people');
    expect(designerRouter.currentRoute.value.name).toBe('forbidden');
    expect(designerRouter.currentRoute.value.query.from).toBe('/admin/people');
  });

  it('does not let admin stand in for the other roles (issue 2: admin holds only what it is given)', async () => {
    stubMe(person(['admin']));
    const router = newRouter();
    await router.push('/review');
    expect(router.currentRoute.value.name).toBe('forbidden');
  });

  it('accepts any one of several roles', async () => {
    stubMe(person(['sales', 'catalogue_manager']));
    const router = newRouter();
    await router.push('/review');
    expect(router.currentRoute.value.path).toBe('/review');
  });

  it('sends a signed-in person away from the sign-in page to `next` or home', async () => {
    stubMe(person(['designer']));
    const router = newRouter();
    await router.push('/sign-in?next=/admin/people');
    // next is followed, and the guard then applies the roles of the page it leads to
    expect(router.currentRoute.value.name).toBe('forbidden');
    await router.push('/sign-in');
    expect(router.currentRoute.value.path).toBe('/');
  });
});

describe('safeNext', () => {
  it('keeps same-origin paths and refuses anything that could leave the site', () => {
    expect(safeNext('/admin/people?x=1')).toBe('/admin/people?x=1');
    for (const bad of ['//evil.test/x', 'https://evil.test', 'javascript:alert(1)', '', undefined, ['/a']]) {
      expect(safeNext(bad)).toBe('/');
    }
  });
});

describe('areasFor', () => {
  it('gives each role only the areas that name it, in registry order', () => {
    for (const role of ['designer', 'catalogue_manager', 'sales', 'admin'] as const) {
      const areas = areasFor([role]);
      expect(areas.every((area) => area.roles.includes(role))).toBe(true);
      expect(areas.map((a) => a.id)).toEqual(AREAS.filter((a) => a.roles.includes(role)).map((a) => a.id));
    }
    expect(areasFor(['admin']).map((a) => a.id)).toContain('people');
    expect(areasFor(['designer']).map((a) => a.id)).not.toContain('people');
    expect(areasFor([])).toEqual([]);
  });

  it('has unique ids and paths that start with a slash', () => {
    expect(new Set(AREAS.map((a) => a.id)).size).toBe(AREAS.length);
    expect(AREAS.every((a) => a.path.startsWith('/') && a.roles.length > 0)).toBe(true);
  });
});
