/**
 * Helpers for the family tests and the authorization table: small families created through the API, computed by the
 * real job runner (worker thread), and walked through the workflow.
 */
import sharp from 'sharp';
import type { FamilyCreate, FamilyState } from '../shared/schemas/familySpec';
import type { Family } from '../shared/schemas/family';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { currentRevisionId } from '../server/services/families/familyQueries';
import type { TestApp } from './setup/testApp';

let codeCounter = 0;

/** A code no other test family uses (2–6 upper-case letters or digits). */
export function uniqueCode(): string {
  codeCounter += 1;
  return `T${(process.pid % 1000).toString(36).toUpperCase()}${codeCounter.toString(36).toUpperCase()}`.slice(0, 6);
}

/**
 * A one-geometry family body: the gable box at a 28 mm entry in sand, which fits the farm's 0.6 mm printer (each part
 * measured in the seed) and needs about 2.3 cm³ of support.
 * @param overrides - fields to change
 */
export function smallFamilyBody(overrides: Partial<FamilyCreate> = {}): FamilyCreate {
  return {
    code: uniqueCode(),
    name: 'Test Gable',
    templateId: 'gable-box',
    baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125 },
    axes: [
      { kind: 'param', key: 'entryHoleDiameterMm', values: [28] },
      { kind: 'attribute', key: 'colour', values: ['sand'] },
    ],
    supportBudgetMm3: 12_000,
    printerId: 'rowan-farm-06',
    materialId: 'pla',
    region: 'europe',
    ...overrides,
  };
}

/**
 * Creates a family as the demo designer.
 * @param t - the test app
 * @param body - the create body (a small family by default)
 */
export async function createTestFamily(t: TestApp, body: FamilyCreate = smallFamilyBody()): Promise<Family> {
  const res = await (await t.agent('designer')).post('/api/families').send(body);
  if (res.status !== 201) throw new Error(`create family: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.family as Family;
}

/**
 * Computes the family's current revision with the real job runner and waits for it.
 * @param t - the test app
 * @param id - family id
 */
export async function computeNow(t: TestApp, id: string): Promise<void> {
  const jobs = familyJobs(t.ctx);
  await jobs.enqueue(await currentRevisionId(t.ctx, id));
  await jobs.idle();
}

/**
 * Acknowledges every bird-fit warning the gate asks for, as the designer.
 * @param t - the test app
 * @param id - family id
 */
export async function acknowledgeAll(t: TestApp, id: string): Promise<Family> {
  const designer = await t.agent('designer');
  const family = (await designer.get(`/api/families/${id}`)).body.family as Family;
  const codes = family.gate.warnings.filter((w) => w.severity === 'warning').map((w) => w.code);
  if (codes.length === 0) return family;
  const res = await designer
    .post(`/api/families/${id}/acknowledgements`)
    .send({ acknowledgements: codes.map((code) => ({ code, text: `Reviewed ${code} for the test family.` })) });
  if (res.status !== 200) throw new Error(`acknowledge: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.family as Family;
}

/**
 * A new small family walked through the real workflow to `state` (computed, acknowledged, submitted...).
 * @param t - the test app
 * @param state - the state wanted
 */
export async function familyInState(t: TestApp, state: FamilyState): Promise<Family> {
  const family = await createTestFamily(t);
  if (state === 'draft') return family;
  await computeNow(t, family.id);
  await acknowledgeAll(t, family.id);
  const steps: Array<['designer' | 'catalogue_manager', string]> = [['designer', 'submit']];
  if (state !== 'in_review') steps.push(['catalogue_manager', 'approve']);
  if (state === 'published' || state === 'retired') steps.push(['catalogue_manager', 'publish']);
  if (state === 'retired') steps.push(['catalogue_manager', 'retire']);
  let last: Family = family;
  for (const [role, action] of steps) {
    const res = await (await t.agent(role)).post(`/api/families/${family.id}/${action}`).send({});
    if (res.status !== 200) throw new Error(`${action}: ${res.status} ${JSON.stringify(res.body)}`);
    last = res.body.family as Family;
  }
  return last;
}

/**
 * A small real PNG (a 64 × 48 gradient) made with sharp.
 * @param width - pixels
 * @param height - pixels
 */
export async function pngBytes(width = 64, height = 48): Promise<Buffer> {
  const raw = Buffer.alloc(width * height * 3);
  for (let i = 0; i < width * height; i++) {
    raw[i * 3] = (i % width) * 4;
    raw[i * 3 + 1] = Math.floor(i / width) * 5;
    raw[i * 3 + 2] = 120;
  }
  return sharp(raw, { raw: { width, height, channels: 3 } })
    .png()
    .toBuffer();
}

/**
 * Memoises an async fixture per test app (authz rows call their path function once per caller).
 * @param make - builds the value
 */
export function oncePerApp<T>(make: (t: TestApp) => Promise<T>): (t: TestApp) => Promise<T> {
  const cache = new WeakMap<TestApp, Promise<T>>();
  return (t) => {
    let value = cache.get(t);
    if (!value) {
      value = make(t);
      cache.set(t, value);
    }
    return value;
  };
}
