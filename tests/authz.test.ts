/**
 * The authorization table: every API route with the roles allowed. Each route is called as every role and as
 * nobody; allowed roles must get 2xx, other roles 403, nobody 401 (2xx for public routes).
 * Add one row for each route you add. Access rules are our own product decision (PRODUCT.md roles): no outside source.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../shared/schemas/auth';
import { demoPersonId } from '../server/db/seedDemo';
import { listRoutes } from './setup/listRoutes';
import { makeTestApp, type TestApp } from './setup/testApp';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** One route in the table. */
interface AuthzRow {
  method: Method;
  /** The route pattern as mounted, e.g. `/api/people/:id`. */
  route: string;
  /** The path to call when the route has parameters (a function can look up a seeded id). Default: `route`. */
  path?: (t: TestApp) => Promise<string> | string;
  /** `public`: anyone; `signed-in`: any role; or the roles allowed (admin does NOT imply the others). */
  allowed: 'public' | 'signed-in' | Role[];
  /** A valid body; a function gets the calling role so bodies can be unique (e.g. e-mails). */
  body?: unknown | ((role: Role | null) => unknown);
  /** The call ends the session (sign-out): use a fresh agent for it. */
  consumesSession?: boolean;
}

/** Every API route. Keep in the order of server/app.ts. */
const ROUTES: AuthzRow[] = [
  { method: 'get', route: '/api/health', allowed: 'public' },
  { method: 'get', route: '/api/auth/me', allowed: 'signed-in' },
  // sign-in is public by nature; its own tests (auth.test.ts) cover wrong passwords
  {
    method: 'post',
    route: '/api/auth/sign-in',
    allowed: 'public',
    body: { email: 'ada@fernhollow.test', password: 'fernhollow-demo' },
    consumesSession: true,
  },
  { method: 'post', route: '/api/auth/sign-out', allowed: 'public', consumesSession: true },
  { method: 'get', route: '/api/people', allowed: ['admin'] },
  {
    method: 'post',
    route: '/api/people',
    allowed: ['admin'],
    body: (role: Role | null) => ({
      email: `authz-${role ?? 'nobody'}@fernhollow.test`,
      name: 'Authz Probe',
      roles: ['sales'],
      password: 'a-long-enough-password',
    }),
  },
  {
    method: 'patch',
    route: '/api/people/:id',
    path: async (t) => `/api/people/${await demoPersonId(t.ctx.db, 'sales')}`,
    allowed: ['admin'],
    body: { name: 'Ada Quill' },
  },
  { method: 'get', route: '/api/presets', allowed: ['designer'] },
  {
    method: 'post',
    route: '/api/presets',
    allowed: ['designer'],
    body: (role: Role | null) => ({ templateId: 'gable-box', name: `Authz ${role ?? 'nobody'}`, params: {} }),
  },
  { method: 'get', route: '/api/presets/:id', path: designerPresetPath, allowed: ['designer'] },
  {
    method: 'patch',
    route: '/api/presets/:id',
    path: designerPresetPath,
    allowed: ['designer'],
    body: (role: Role | null) => ({ name: `Authz renamed ${role ?? 'nobody'}` }),
  },
  { method: 'delete', route: '/api/presets/:id', path: designerPresetPath, allowed: ['designer'] },
];

/** A new preset of the demo designer (one per call, so a delete in one case does not affect the next). */
async function designerPresetPath(t: TestApp): Promise<string> {
  const designer = await t.agent('designer');
  const res = await designer
    .post('/api/presets')
    .send({ templateId: 'gable-box', name: `Authz probe ${crypto.randomUUID()}`, params: {} });
  if (res.status !== 201) throw new Error(`Could not create a preset: ${res.status} ${JSON.stringify(res.body)}`);
  return `/api/presets/${res.body.id as string}`;
}

const CALLERS: Array<Role | null> = [...ROLES, null];

/** The status class a caller must get on a row. */
function expected(row: AuthzRow, caller: Role | null): '2xx' | 401 | 403 {
  if (row.allowed === 'public') return '2xx';
  if (caller === null) return 401;
  if (row.allowed === 'signed-in') return '2xx';
  return row.allowed.includes(caller) ? '2xx' : 403;
}

let t: TestApp;
beforeAll(async () => {
  t = await makeTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('authorization table', () => {
  const cases = ROUTES.flatMap((row) =>
    CALLERS.map((caller) => ({ row, caller, label: `${row.method.toUpperCase()} ${row.route} as ${caller ?? 'nobody'}` })),
  );
  it.each(cases)('$label', async ({ row, caller }) => {
    const agent = await t.agent(caller, { fresh: row.consumesSession });
    const path = row.path ? await row.path(t) : row.route;
    const body = typeof row.body === 'function' ? (row.body as (role: Role | null) => unknown)(caller) : row.body;
    let request = agent[row.method](path);
    if (body !== undefined) request = request.send(body as object);
    const res = await request;
    const want = expected(row, caller);
    if (want === '2xx') {
      expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(200);
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    } else {
      expect(res.status, JSON.stringify(res.body)).toBe(want);
      expect(res.body.error.code).toBe(want === 401 ? 'unauthenticated' : 'forbidden');
    }
  });

  it('names every route the app mounts, and only those', () => {
    const mounted = listRoutes(t.app).map((route) => `${route.method} ${route.path}`);
    const table = ROUTES.map((row) => `${row.method.toUpperCase()} ${row.route}`);
    expect(new Set(table).size, 'a route is listed twice').toBe(table.length);
    const notInTable = mounted.filter((route) => !table.includes(route));
    const notMounted = table.filter((route) => !mounted.includes(route));
    expect(notInTable, 'mounted routes missing from ROUTES: add a row for each').toEqual([]);
    expect(notMounted, 'rows in ROUTES that the app does not mount').toEqual([]);
  });
});
