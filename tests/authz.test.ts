/**
 * The authorization table: every API route with the roles allowed. Each route is called as every role and as
 * nobody; allowed roles must get 2xx, other roles 403, nobody 401 (2xx for public routes).
 * Add one row for each route you add. Access rules are our own product decision (PRODUCT.md roles): no outside source.
 */
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../shared/schemas/auth';
import { demoPersonId } from '../server/db/seedDemo';
import { eq } from 'drizzle-orm';
import { families, farmDispatches, farmRuns, jobDeadLetters, people, studios } from '../server/db/schema';
import { listCatalogueVariants } from '../server/services/catalogue';
import { planRun } from '../shared/planning/planRun';
import { loadProductionCatalogue } from '../server/services/productionCatalogue';
import {
  acknowledgeAll,
  computeNow,
  createTestFamily,
  familyInState,
  oncePerApp,
  pngBytes,
  smallFamilyBody,
} from './familiesFixtures';
import { listRoutes } from './setup/listRoutes';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { ensureSalesFixture, FIXTURE_SKUS } from './salesFixtures';
import { useTestApp, type TestApp } from './setup/testApp';
import { box, geomToMesh, toBinaryStl } from './meshFixtures';
import { paymentsOf } from '../server/payments/paymentRuntime';
import { getRow } from '../server/services/orderQueries';
import { checkoutBody, newShopOrder, sellableSkus, startShopTest, type ShopTest } from './shopFixtures';
import { listShopProducts } from '../server/services/shopCatalogue';

/** SKUs on sale, looked up by the path of the shop rows before their body is built. */
let shopSkus: readonly string[] = [];
/** A path that first looks up the SKUs on sale (other rows may have retired the seeded family). */
function withShopSkus(path: string): (t: TestApp) => Promise<string> {
  return async (t) => {
    shopSkus = await sellableSkus(t);
    return path;
  };
}

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
  /** A public route that authenticates by signature: the status an unsigned call gets from everyone (never 401/403). */
  publicStatus?: number;
  /** Extra request headers (a signed webhook); a function gets the test app and the body it will send. */
  headers?: (t: TestApp, body: unknown) => Record<string, string>;
  /** The status allowed callers get when it is not 2xx (a probe refused after the role check, e.g. 400). */
  allowedStatus?: number;
  /** A multipart file upload instead of a JSON body. */
  attach?: { field: string; filename: string; bytes: () => Promise<Buffer> };
}

/** A run request over a seeded published variant (its SKU is filled in by {@link planPath}). */
const PLAN_BODY = {
  items: [{ sku: 'seeded', quantity: 5 }],
  printerId: 'rowan-farm-06',
  startDate: '2099-03-02',
  finishBy: '2099-03-20',
};

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
  {
    // A real change would end the demo people's other sessions (the cached agents), so the probe sends a wrong
    // current password: only a signed-in caller gets as far as that check (the change itself: peopleAccount.test.ts).
    method: 'post',
    route: '/api/auth/password',
    allowed: 'signed-in',
    body: { currentPassword: 'not-the-demo-password', newPassword: 'a-new-long-password' },
    allowedStatus: 400,
  },
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
  { method: 'post', route: '/api/people/:id/deactivate', path: probePersonPath('deactivate'), allowed: ['admin'] },
  { method: 'post', route: '/api/people/:id/reactivate', path: probePersonPath('reactivate'), allowed: ['admin'] },
  {
    method: 'post',
    route: '/api/people/:id/reset-password',
    path: probePersonPath('reset-password'),
    allowed: ['admin'],
  },
  { method: 'get', route: '/api/home/todo', allowed: 'signed-in' },
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
  // Templates: any signed-in person reads them; exports (print files) are for designers.
  { method: 'get', route: '/api/templates', allowed: 'signed-in' },
  {
    method: 'post',
    route: '/api/templates/:id/limits',
    path: () => '/api/templates/round-pod/limits',
    allowed: 'signed-in',
    body: { params: { wallThicknessMm: 12 } },
  },
  {
    method: 'post',
    route: '/api/exports',
    allowed: ['designer'],
    body: { templateId: 'gable-box', params: { entryHoleDiameterMm: 28 }, format: 'stl' },
  },
  // Families: designers build, catalogue managers review; the state-changing rows get a family in the right state.
  { method: 'get', route: '/api/families', allowed: ['designer', 'catalogue_manager'] },
  {
    method: 'post',
    route: '/api/families',
    allowed: ['designer'],
    body: () => smallFamilyBody(),
  },
  {
    method: 'get',
    route: '/api/families/:id',
    path: seededFamilyPath('HGB'),
    allowed: ['designer', 'catalogue_manager'],
  },
  {
    method: 'patch',
    route: '/api/families/:id',
    path: draftFamilyPath,
    allowed: ['designer'],
    body: { name: 'Renamed Test Gable' },
  },
  { method: 'post', route: '/api/families/:id/compute', path: computeFamilyPath, allowed: ['designer'] },
  { method: 'post', route: '/api/families/:id/cancel', path: cancelFamilyPath, allowed: ['designer'] },
  {
    method: 'get',
    route: '/api/families/:id/progress',
    path: seededFamilyPath('HGB', '/progress'),
    allowed: ['designer', 'catalogue_manager'],
  },
  {
    method: 'get',
    route: '/api/families/:id/variants',
    path: seededFamilyPath('HGB', '/variants'),
    allowed: ['designer', 'catalogue_manager'],
  },
  {
    method: 'post',
    route: '/api/families/:id/acknowledgements',
    path: ackFamilyPath,
    allowed: ['designer'],
    body: {
      acknowledgements: [
        { code: 'thin-walls', text: 'Walls are 10 mm printed PLA; listing carries the heat caution.' },
      ],
    },
  },
  { method: 'post', route: '/api/families/:id/submit', path: submittableFamilyPath, allowed: ['designer'], body: {} },
  {
    method: 'post',
    route: '/api/families/:id/approve',
    path: seededFamilyPath('CAF', '/approve'),
    allowed: ['catalogue_manager'],
    body: { comment: 'Looks right.' },
  },
  {
    method: 'post',
    route: '/api/families/:id/return',
    path: inReviewFamilyPath,
    allowed: ['catalogue_manager'],
    body: { comments: 'Please add a photo of the floor plug.' },
  },
  {
    method: 'post',
    route: '/api/families/:id/publish',
    path: approvedFamilyPath,
    allowed: ['catalogue_manager'],
    body: {},
  },
  {
    method: 'post',
    route: '/api/families/:id/retire',
    path: seededFamilyPath('HGB', '/retire'),
    allowed: ['catalogue_manager'],
    body: {},
  },
  {
    method: 'get',
    route: '/api/families/:id/diff',
    path: seededFamilyPath('HGB', '/diff?from=1&to=1'),
    allowed: ['designer', 'catalogue_manager'],
  },
  {
    method: 'get',
    route: '/api/families/:id/audit',
    path: seededFamilyPath('HGB', '/audit'),
    allowed: ['designer', 'catalogue_manager'],
  },
  {
    method: 'post',
    route: '/api/families/:id/photos',
    path: seededFamilyPath('MGB', '/photos'),
    allowed: ['designer'],
    attach: { field: 'photo', filename: 'sample.png', bytes: () => pngBytes() },
  },
  { method: 'get', route: '/api/catalogue', allowed: ['sales', 'catalogue_manager', 'designer'] },
  { method: 'get', route: '/api/photos/:id', path: photoPath(''), allowed: 'signed-in' },
  { method: 'get', route: '/api/photos/:id/thumb', path: photoPath('/thumb'), allowed: 'signed-in' },
  { method: 'get', route: '/api/mail/messages', allowed: ['admin'] },
  { method: 'get', route: '/api/jobs/dead-letters', allowed: ['admin'] },
  {
    method: 'post',
    route: '/api/jobs/dead-letters/:id/retry',
    path: async (t) => `/api/jobs/dead-letters/${await newDeadLetter(t)}/retry`,
    allowed: ['admin'],
  },
  {
    method: 'post',
    route: '/api/jobs/dead-letters/:id/discard',
    path: async (t) => `/api/jobs/dead-letters/${await newDeadLetter(t)}/discard`,
    allowed: ['admin'],
  },
  // Print-readiness analysis of an uploaded mesh: designers.
  {
    method: 'post',
    route: '/api/analyses',
    allowed: ['designer'],
    attach: {
      field: 'file',
      filename: 'cube.stl',
      bytes: async () => Buffer.from(toBinaryStl(geomToMesh(box([0, 0, 0], [20, 20, 20])))),
    },
  },
  // Sales: spec sheets, price lists, quotes (sales and catalogue managers); settings (read: + admin, write: admin).
  {
    method: 'get',
    route: '/api/variants/:sku/spec-sheet.pdf',
    path: salesPath(() => `/api/variants/${FIXTURE_SKUS[0]}/spec-sheet.pdf`),
    allowed: ['sales', 'catalogue_manager'],
  },
  {
    method: 'get',
    route: '/api/families/:id/spec-sheet.pdf',
    path: salesPath((familyId) => `/api/families/${familyId}/spec-sheet.pdf`),
    allowed: ['sales', 'catalogue_manager'],
  },
  { method: 'get', route: '/api/price-list.csv', allowed: ['sales', 'catalogue_manager'] },
  { method: 'get', route: '/api/price-list.xlsx', allowed: ['sales', 'catalogue_manager'] },
  { method: 'get', route: '/api/quotes', allowed: ['sales', 'catalogue_manager'] },
  {
    method: 'post',
    route: '/api/quotes',
    path: salesPath(() => '/api/quotes'),
    allowed: ['sales', 'catalogue_manager'],
    body: (role: Role | null) => ({
      lines: [{ sku: FIXTURE_SKUS[0], quantity: 10 }],
      deliveryDate: '2099-01-31',
      customerName: `Authz ${role ?? 'nobody'}`,
    }),
  },
  {
    method: 'put',
    route: '/api/quotes/:id',
    path: salesQuotePath,
    allowed: ['sales', 'catalogue_manager'],
    body: { lines: [{ sku: FIXTURE_SKUS[0], quantity: 12 }], deliveryDate: '2099-01-31', customerName: 'Authz edit' },
  },
  {
    method: 'post',
    route: '/api/quotes/:id/copy',
    path: async (t) => `${await salesQuotePath(t)}/copy`,
    allowed: ['sales', 'catalogue_manager'],
  },
  {
    method: 'post',
    route: '/api/quotes/:id/status',
    path: async (t) => `${await salesQuotePath(t)}/status`,
    allowed: ['sales', 'catalogue_manager'],
    body: { status: 'sent' },
  },
  {
    method: 'get',
    route: '/api/quotes/:id.pdf',
    path: async (t) => `${await salesQuotePath(t)}.pdf`,
    allowed: ['sales', 'catalogue_manager'],
  },
  { method: 'get', route: '/api/quotes/:id', path: salesQuotePath, allowed: ['sales', 'catalogue_manager'] },
  { method: 'get', route: '/api/settings/sales', allowed: ['sales', 'catalogue_manager', 'admin'] },
  { method: 'put', route: '/api/settings/sales', allowed: ['admin'], body: DEFAULT_SALES_SETTINGS },
  // Studio settings (admin): the studio's name, print settings and rates, printers, materials with their colours.
  { method: 'get', route: '/api/settings/studio', allowed: ['admin'] },
  {
    method: 'put',
    route: '/api/settings/studio',
    allowed: ['admin'],
    body: { name: 'Fernhollow Studio', locale: 'en-GB' },
  },
  { method: 'get', route: '/api/settings/production', allowed: ['admin'] },
  {
    method: 'put',
    route: '/api/settings/production',
    allowed: ['admin'],
    body: { settings: DEFAULT_SETTINGS, rates: DEFAULT_RATES },
  },
  {
    method: 'put',
    route: '/api/settings/printers/:id',
    path: () => `/api/settings/printers/${DEFAULT_PRINTERS[0].id}`,
    allowed: ['admin'],
    body: DEFAULT_PRINTERS[0],
  },
  {
    method: 'put',
    route: '/api/settings/materials/:id',
    path: () => `/api/settings/materials/${DEFAULT_MATERIALS[0].id}`,
    allowed: ['admin'],
    body: DEFAULT_MATERIALS[0],
  },
  // Removing: each call gets a printer or material of its own that no family uses, so the admin's call succeeds.
  { method: 'delete', route: '/api/settings/printers/:id', path: spareProfilePath('printers'), allowed: ['admin'] },
  { method: 'delete', route: '/api/settings/materials/:id', path: spareProfilePath('materials'), allowed: ['admin'] },
  // Production catalogue: the design editor's printers, materials, settings and rates (anyone signed in).
  { method: 'get', route: '/api/production', allowed: 'signed-in' },
  // Print farm: notices (public, signed: an unsigned call is 400 for everyone), exceptions (operations), demand and
  // run planning (operations and catalogue managers); admins may do all of it.
  { method: 'post', route: '/api/webhooks/farm', allowed: 'public', publicStatus: 400, body: { noticeId: 'x' } },
  { method: 'get', route: '/api/farm/exceptions', allowed: ['operations', 'admin'] },
  {
    method: 'post',
    route: '/api/farm/dispatches/:id/redispatch',
    path: heldDispatchPath('/redispatch'),
    allowed: ['operations', 'admin'],
    body: {},
  },
  {
    method: 'post',
    route: '/api/farm/dispatches/:id/withdraw',
    path: heldDispatchPath('/withdraw'),
    allowed: ['operations', 'admin'],
    body: { reason: 'authorization probe' },
  },
  { method: 'get', route: '/api/farm/demand', allowed: ['operations', 'catalogue_manager', 'admin'] },
  { method: 'get', route: '/api/farm/variants', allowed: ['operations', 'catalogue_manager', 'admin'] },
  {
    method: 'post',
    route: '/api/farm/plans',
    path: planPath('/api/farm/plans'),
    allowed: ['operations', 'catalogue_manager', 'admin'],
    body: PLAN_BODY,
  },
  { method: 'get', route: '/api/farm/runs', allowed: ['operations', 'catalogue_manager', 'admin'] },
  {
    method: 'get',
    route: '/api/farm/print-files/:meshSha256.stl',
    path: async (t) => `/api/farm/print-files/${(await listCatalogueVariants(t.ctx))[0]?.sha256 ?? '0'.repeat(64)}.stl`,
    allowed: ['operations', 'catalogue_manager', 'admin'],
  },
  {
    method: 'post',
    route: '/api/farm/runs',
    path: planPath('/api/farm/runs'),
    allowed: ['operations', 'catalogue_manager', 'admin'],
    body: PLAN_BODY,
  },
  // Shop: public. Orders: operations and admin.
  { method: 'get', route: '/api/shop/studio', allowed: 'public' },
  { method: 'get', route: '/api/shop/products', allowed: 'public' },
  {
    method: 'get',
    route: '/api/shop/products/:slug',
    path: async (t) => `/api/shop/products/${(await listShopProducts(t.ctx)).products[0]?.slug ?? 'none'}`,
    allowed: 'public',
  },
  {
    method: 'post',
    route: '/api/shop/quote',
    path: withShopSkus('/api/shop/quote'),
    allowed: 'public',
    body: () => ({ country: 'GB', items: checkoutBody(undefined, shopSkus).items }),
  },
  {
    method: 'post',
    route: '/api/shop/checkout',
    allowed: 'public',
    path: withShopSkus('/api/shop/checkout'),
    body: (role: Role | null) => checkoutBody(`authz-${role ?? 'nobody'}@example.test`, shopSkus),
  },
  { method: 'get', route: '/api/shop/orders/:token', path: customerOrderPath, allowed: 'public' },
  { method: 'get', route: '/api/shop/photos/:id', path: shopPhotoPath(''), allowed: 'public' },
  { method: 'get', route: '/api/shop/photos/:id/thumb', path: shopPhotoPath('/thumb'), allowed: 'public' },
  {
    method: 'get',
    route: '/api/shop/variants/:sku/model.stl',
    path: async (t) => `/api/shop/variants/${(await sellableSkus(t))[0]}/model.stl`,
    allowed: 'public',
  },
  {
    method: 'get',
    route: '/api/shop/variants/:sku/spec-sheet.pdf',
    path: async (t) => `/api/shop/variants/${(await sellableSkus(t))[0]}/spec-sheet.pdf`,
    allowed: 'public',
  },
  {
    method: 'post',
    route: '/api/webhooks/payments',
    allowed: 'public',
    body: () => ({
      id: `evt_authz_${Math.random().toString(36).slice(2)}`,
      object: 'event',
      type: 'payment_intent.created',
      data: { object: {} },
    }),
    headers: (t, body) => ({
      'Stripe-Signature': paymentsOf(t.ctx).client.webhooks.generateTestHeaderString({
        payload: JSON.stringify(body),
        secret: paymentsOf(t.ctx).webhookSecret,
      }),
    }),
  },
  { method: 'get', route: '/api/orders', allowed: ['operations', 'admin'] },
  { method: 'get', route: '/api/orders/export.csv', allowed: ['operations', 'admin'] },
  {
    method: 'get',
    route: '/api/orders/:id',
    path: async (t) => `/api/orders/${await newShopOrder(t)}`,
    allowed: ['operations', 'admin'],
  },
  {
    method: 'post',
    route: '/api/orders/:id/transition',
    path: async (t) => `/api/orders/${await newShopOrder(t, true)}/transition`,
    allowed: ['operations', 'admin'],
    body: { to: 'in_production' },
  },
  {
    method: 'post',
    route: '/api/orders/:id/clear-flag',
    path: async (t) => `/api/orders/${await newShopOrder(t, 'short')}/clear-flag`,
    allowed: ['operations', 'admin'],
    body: { note: 'authorization probe' },
  },
  {
    method: 'post',
    route: '/api/orders/:id/cancel',
    path: async (t) => `/api/orders/${await newShopOrder(t)}/cancel`,
    allowed: ['operations', 'admin'],
    body: { reason: 'authorization probe' },
  },
];

/** A new dead letter of a job type this version has (one per call, so a retry in one case does not affect the next). */
async function newDeadLetter(t: TestApp): Promise<number> {
  const [row] = await t.ctx.db
    .insert(jobDeadLetters)
    .values({ jobName: 'checkout.expire', jobId: randomUUID(), data: {}, error: 'authorization probe', attempts: 4 })
    .returning({ id: jobDeadLetters.id });
  return row.id;
}

/** A new preset of the demo designer (one per call, so a delete in one case does not affect the next). */
async function designerPresetPath(t: TestApp): Promise<string> {
  const designer = await t.agent('designer');
  const res = await designer
    .post('/api/presets')
    .send({ templateId: 'gable-box', name: `Authz probe ${crypto.randomUUID()}`, params: {} });
  if (res.status !== 201) throw new Error(`Could not create a preset: ${res.status} ${JSON.stringify(res.body)}`);
  return `/api/presets/${res.body.id as string}`;
}

/** `/api/families/<id><suffix>` of a seeded demo family (HGB published, CAF in review, MGB draft). */
function seededFamilyPath(code: string, suffix = ''): (t: TestApp) => Promise<string> {
  return async (t) => {
    const [row] = await t.ctx.db.select({ id: families.id }).from(families).where(eq(families.code, code));
    return `/api/families/${row.id}${suffix}`;
  };
}

const draftFamily = oncePerApp((t) => createTestFamily(t));
const computeFamily = oncePerApp((t) => createTestFamily(t));
const ackFamily = oncePerApp((t) => createTestFamily(t));
const submittableFamily = oncePerApp(async (t) => {
  const family = await createTestFamily(t);
  await computeNow(t, family.id);
  return acknowledgeAll(t, family.id);
});
const inReviewFamily = oncePerApp((t) => familyInState(t, 'in_review'));
const approvedFamily = oncePerApp((t) => familyInState(t, 'approved'));
const photo = oncePerApp(async (t) => {
  const path = await seededFamilyPath('MGB', '/photos')(t);
  const res = await (await t.agent('designer')).post(path).attach('photo', await pngBytes(), 'sample.png');
  if (res.status !== 201) throw new Error(`Could not upload a photo: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.photo as { id: string };
});

/** A printer or material no family uses, added by the admin for one call; its settings path. */
function spareProfilePath(kind: 'printers' | 'materials'): (t: TestApp) => Promise<string> {
  let count = 0;
  return async (t) => {
    count += 1;
    const base = kind === 'printers' ? DEFAULT_PRINTERS[0] : DEFAULT_MATERIALS[0];
    const id = `spare-${kind}-${count}`;
    const res = await (await t.agent('admin')).put(`/api/settings/${kind}/${id}`).send({ ...base, id, name: id });
    if (res.status !== 201) throw new Error(`Could not add a spare profile: ${res.status} ${JSON.stringify(res.body)}`);
    return `/api/settings/${kind}/${id}`;
  };
}

async function draftFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await draftFamily(t)).id}`;
}
async function computeFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await computeFamily(t)).id}/compute`;
}
async function cancelFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await computeFamily(t)).id}/cancel`;
}
async function ackFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await ackFamily(t)).id}/acknowledgements`;
}
async function submittableFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await submittableFamily(t)).id}/submit`;
}
async function inReviewFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await inReviewFamily(t)).id}/return`;
}
async function approvedFamilyPath(t: TestApp): Promise<string> {
  return `/api/families/${(await approvedFamily(t)).id}/publish`;
}
const shopPhoto = oncePerApp(async (t) => {
  const [onSale] = await listCatalogueVariants(t.ctx);
  const path = `/api/families/${onSale.family.id}/photos`;
  const res = await (await t.agent('designer')).post(path).attach('photo', await pngBytes(), 'sample.png');
  if (res.status !== 201) throw new Error(`Could not upload a shop photo: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.photo as { id: string };
});
function shopPhotoPath(suffix: string): (t: TestApp) => Promise<string> {
  return async (t) => `/api/shop/photos/${(await shopPhoto(t)).id}${suffix}`;
}
async function customerOrderPath(t: TestApp): Promise<string> {
  return `/api/shop/orders/${(await getRow(t.ctx.db, await newShopOrder(t))).customerToken}`;
}
function photoPath(suffix: string): (t: TestApp) => Promise<string> {
  return async (t) => `/api/photos/${(await photo(t)).id}${suffix}`;
}

const CALLERS: Array<Role | null> = [...ROLES, null];

/** The status class a caller must get on a row. */
function expected(row: AuthzRow, caller: Role | null): '2xx' | number {
  if (row.allowed === 'public') return row.publicStatus ?? '2xx';
  if (caller === null) return 401;
  if (row.allowed === 'signed-in') return row.allowedStatus ?? '2xx';
  return row.allowed.includes(caller) ? (row.allowedStatus ?? '2xx') : 403;
}

const t = useTestApp();
let shop: ShopTest;
beforeAll(async () => {
  shop = await startShopTest(t);
});
afterAll(async () => {
  await shop?.close();
});

describe('authorization table', () => {
  const cases = ROUTES.flatMap((row) =>
    CALLERS.map((caller) => ({
      row,
      caller,
      label: `${row.method.toUpperCase()} ${row.route} as ${caller ?? 'nobody'}`,
    })),
  );
  it.each(cases)('$label', async ({ row, caller }) => {
    const agent = await t.agent(caller, { fresh: row.consumesSession });
    const path = row.path ? await row.path(t) : row.route;
    const body = typeof row.body === 'function' ? (row.body as (role: Role | null) => unknown)(caller) : row.body;
    let request = agent[row.method](path);
    if (row.attach) request = request.attach(row.attach.field, await row.attach.bytes(), row.attach.filename);
    if (row.headers) request = request.set(row.headers(t, body));
    if (body !== undefined) request = request.send(body as object);
    const res = await request;
    const want = expected(row, caller);
    if (want === '2xx') {
      expect(res.status, JSON.stringify(res.body)).toBeGreaterThanOrEqual(200);
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    } else {
      expect(res.status, JSON.stringify(res.body)).toBe(want);
      if (want === 401 || want === 403)
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

/** `/api/people/<id>/<action>` of a new person made for this call, so no demo person's session is touched. */
function probePersonPath(action: string): (t: TestApp) => Promise<string> {
  return async (t) => {
    const [row] = await t.ctx.db
      .insert(people)
      .values({
        email: `probe-${crypto.randomUUID()}@fernhollow.test`,
        name: 'Authz Probe',
        passwordHash: 'not-a-hash',
        roles: ['sales'],
        studioId: (await t.ctx.db.select({ id: studios.id }).from(studios).limit(1))[0].id,
      })
      .returning();
    return `/api/people/${row.id}/${action}`;
  };
}

/** A path that needs the published sales fixture family (tests/salesFixtures.ts) in the test database. */
function salesPath(build: (familyId: string) => string): (t: TestApp) => Promise<string> {
  return async (t) => build((await ensureSalesFixture(t.ctx.db)).familyId);
}

/** `/api/quotes/<id>` of a new quote made by the demo sales person. */
async function salesQuotePath(t: TestApp): Promise<string> {
  await ensureSalesFixture(t.ctx.db);
  const res = await (
    await t.agent('sales')
  )
    .post('/api/quotes')
    .send({ lines: [{ sku: FIXTURE_SKUS[0], quantity: 3 }], deliveryDate: '2099-01-31', customerName: 'Authz probe' });
  if (res.status !== 201) throw new Error(`Could not create a quote: ${res.status} ${JSON.stringify(res.body)}`);
  return `/api/quotes/${res.body.id as string}`;
}

/** Fills PLAN_BODY's SKU with the first published variant of the seed, then answers `path`. */
function planPath(path: string): (t: TestApp) => Promise<string> {
  return async (t) => {
    const [variant] = await listCatalogueVariants(t.ctx, {});
    PLAN_BODY.items[0].sku = variant.sku;
    PLAN_BODY.printerId = (await loadProductionCatalogue(t.ctx.db)).printers[0].id;
    return path;
  };
}

/** `/api/farm/dispatches/<id><suffix>` of a new held dispatch of a new run (never at a farm). */
function heldDispatchPath(suffix: string): (t: TestApp) => Promise<string> {
  return async (t) => {
    const runId = crypto.randomUUID();
    const plan = planRun([], {
      buildVolumeMm: [220, 220, 250],
      plateWarmUpMin: 6,
      machineRateCentsPerHour: 50,
      averagePowerW: 110,
      electricityCentsPerKwh: 30,
      labourCentsPerHour: 2500,
      failureRatePct: 5,
      hoursPerDay: 20,
      startDate: '2099-03-02',
      finishBy: '2099-03-09',
      currency: 'EUR',
    });
    await t.ctx.db.insert(farmRuns).values({ id: runId, name: `RUN-authz-${runId}`, items: [], plan });
    const [row] = await t.ctx.db
      .insert(farmDispatches)
      .values({ runId, idempotencyKey: `authz:${runId}`, status: 'held', holdMessage: 'authorization probe' })
      .returning();
    return `/api/farm/dispatches/${row.id}${suffix}`;
  };
}
