/**
 * Family computation figures: building a 500-variant matrix with SKUs, the gate over 500 variants, and how long a
 * family takes end to end on the worker thread (start-up, per distinct geometry, per variant) against an in-memory
 * database with the real migrations.
 */
import { eq } from 'drizzle-orm';
import { evaluateFamilyGate } from '../shared/families/familyGate';
import { buildVariantMatrix } from '../shared/families/variantMatrix';
import type { Axis } from '../shared/schemas/familySpec';
import type { Variant } from '../shared/schemas/variant';
import { createContext } from '../server/context';
import { migrateDatabase, openDatabase } from '../server/db/client';
import { familyRevisions, familyVariants, people, studios } from '../server/db/schema';
import { seedProduction } from '../server/db/seedProduction';
import { hashPassword } from '../server/auth/password';
import { EnvSchema } from '../server/env';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { createFamily } from '../server/services/families/familyCommands';

function time<T>(fn: () => T): { value: T; ms: number } {
  const started = performance.now();
  const value = fn();
  return { value, ms: performance.now() - started };
}

/** Prints the figures. */
export default async function bench(): Promise<void> {
  const axes: Axis[] = [
    { kind: 'param', key: 'entryHoleDiameterMm', values: [25, 26, 27, 28, 29, 30, 31, 32, 33, 34] },
    { kind: 'param', key: 'trimStyle', values: ['none', 'shingles', 'boards'] },
    { kind: 'attribute', key: 'colour', values: ['white', 'sand', 'moss-green', 'bark-brown', 'black'] },
    { kind: 'attribute', key: 'finish', values: ['none', 'uv-clear-coat', 'matte'] },
  ];
  buildVariantMatrix({ familyCode: 'BEN', axes, baseParams: {}, materialId: 'pla' });
  const matrix = time(() => buildVariantMatrix({ familyCode: 'BEN', axes, baseParams: {}, materialId: 'pla' }));
  console.log(`variant matrix: ${matrix.value.length} variants with SKUs in ${matrix.ms.toFixed(2)} ms`);
  const fake: Variant[] = matrix.value.map((cell, i) => ({
    id: String(i),
    index: i,
    sku: cell.sku,
    variantKey: cell.variantKey,
    axisValues: cell.axisValues,
    params: cell.params,
    attributes: cell.attributes,
    status: 'done',
    sha256: null,
    cost: null,
    verdict: 'warn',
    reasons: [],
    error: null,
    report: {
      watertight: true,
      openEdges: 0,
      nonManifoldEdges: 0,
      fitsPrinter: true,
      supportVolumeMm3: i * 10,
    } as Variant['report'],
    birdFitWarnings: [{ code: 'thin-walls', severity: 'warning', message: 'thin', source: 'x' }],
  }));
  const gate = time(() =>
    evaluateFamilyGate({
      computeState: 'done',
      supportBudgetMm3: 3000,
      templateVersion: 1,
      currentTemplateVersion: 1,
      variants: fake,
      acknowledgements: [],
    }),
  );
  console.log(
    `family gate over ${fake.length} variants: ${gate.ms.toFixed(2)} ms (${gate.value.blockers.length} blockers)`,
  );

  const { pg, db } = await openDatabase();
  await migrateDatabase(db);
  await seedProduction(db);
  const [studio] = await db.insert(studios).values({ name: 'Bench' }).returning();
  const [person] = await db
    .insert(people)
    .values({
      email: 'bench@fernhollow.test',
      name: 'Bench',
      roles: ['designer'],
      studioId: studio.id,
      passwordHash: await hashPassword('bench-bench-bench'),
    })
    .returning();
  const ctx = createContext({ db, pg, env: EnvSchema.parse({ NODE_ENV: 'test' }), log: () => {} });
  const designer = { id: person.id, email: person.email, name: person.name, roles: person.roles };
  const family = await createFamily(ctx, designer, {
    code: 'BEN',
    name: 'Bench Gable',
    description: '',
    templateId: 'gable-box',
    baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125 },
    axes: [
      { kind: 'param', key: 'entryHoleDiameterMm', values: [25, 28, 32] },
      { kind: 'param', key: 'trimStyle', values: ['none', 'shingles'] },
      { kind: 'attribute', key: 'colour', values: ['sand', 'moss-green'] },
    ],
    supportBudgetMm3: 12_000,
    printerId: 'rowan-farm-06',
    materialId: 'pla',
    region: 'europe',
    targets: { maxUnitCostCents: null, maxPrintHours: null, maxMassG: null, minInsulation: null },
    printRecipe: { perimeters: null, infillPct: null },
  });
  const [revision] = await db.select().from(familyRevisions).where(eq(familyRevisions.familyId, family.id));
  const jobs = familyJobs(ctx);
  for (const round of ['cold worker', 'warm worker']) {
    const started = performance.now();
    let first = 0;
    const stop = jobs.subscribe(revision.id, (event) => {
      if (event.doneCount === 1 && !first) first = performance.now() - started;
    });
    await jobs.enqueue(revision.id);
    await jobs.idle();
    stop();
    const ms = performance.now() - started;
    const done = (await db.select().from(familyVariants).where(eq(familyVariants.revisionId, revision.id))).filter(
      (v) => v.status === 'done',
    );
    console.log(
      `family of ${done.length} variants (6 distinct geometries), ${round}: ${(ms / 1000).toFixed(2)} s in all, ` +
        `first variant after ${(first / 1000).toFixed(2)} s, ${(done.length / (ms / 1000)).toFixed(1)} variants/s`,
    );
  }
  await jobs.close();
  await pg.close();
}
