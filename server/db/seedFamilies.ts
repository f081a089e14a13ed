/**
 * Demo families of the invented Fernhollow Studio: one published, one in review, one draft, so the family screens,
 * the review queue and the catalogue show real, computed products. Published and in-review variants are computed
 * here (inline, a few seconds); the draft is left for the designer to compute.
 */
import { eq } from 'drizzle-orm';
import type { Person } from '../../shared/schemas/auth';
import type { FamilyCreate } from '../../shared/schemas/familySpec';
import type { GateWarningCode } from '../../shared/schemas/gate';
import { FamilyCreateSchema } from '../../shared/schemas/familySpec';
import { FARM_PRINTER_ID } from '../../shared/production/defaults';
import { computeRevision } from '../jobs/computeRevision';
import { computeVariantGeometry } from '../jobs/variantGeometry';
import { EnvSchema } from '../env';
import { acknowledgeWarnings, createFamily } from '../services/families/familyCommands';
import { currentRevisionId, getFamily } from '../services/families/familyQueries';
import { transitionFamily } from '../services/families/familyTransitions';
import type { FamilyContext } from '../services/families/loadFamily';
import type { Db } from './client';
import { people } from './schema';
import { DEMO_PEOPLE } from './seedDemo';
import { registerSeedStep } from './seedRegistry';

/** The studio's written answers to bird-fit and outdoor warnings (our own wording for the demo). */
const DEMO_ACKNOWLEDGEMENTS: Partial<Record<GateWarningCode, string>> = {
  'thin-walls':
    'Walls are 8.5 to 9 mm of printed PLA with infill cells kept under 6 mm, thinner than 15 mm timber though they insulate about as well by conduction; every listing carries the heat caution and advises a shaded, north-to-east facing spot.',
  'hole-too-high-for-cavity':
    'Checked against the species table: the hole sits close to the roof in the smallest cavity; the listing names the species it suits and we will deepen the cavity in the next revision.',
  'admits-starlings': 'Sold for regions where starlings are native only; the listing says so.',
  'admits-house-sparrows': 'The listing says which regions should avoid this entry size.',
  perch: 'The perch is left off in every variant of this family.',
  'outdoor-heat':
    'The darker colours can pass the PLA heat-deflection temperature in full sun: their listings say to hang the box in shade, facing north to east, and offer the light colours for sunny sites.',
};

/**
 * The studio's targets for a small garden box (its own figures): at most 34 EUR to make, 10 h on the farm, 850 g of
 * plastic, and walls at least as good as 15 mm of pine, the thinnest timber wall European guidance accepts (British
 * Trust for Ornithology, "Nest boxes: your essential guide": walls at least 15 mm).
 */
const HEDGEROW_TARGETS: FamilyCreate['targets'] = {
  maxUnitCostCents: 3400,
  maxPrintHours: 10,
  maxMassG: 850,
  minInsulation: { kind: 'pine-board', boardMm: 15 },
};

const FAMILIES: Array<{ body: FamilyCreate; target: 'published' | 'in_review' | 'draft' }> = [
  {
    target: 'published',
    body: {
      code: 'HGB',
      name: 'Hedgerow Gable',
      description: 'Pitched-roof box for small hole-nesting birds of gardens and hedgerows, in three entry sizes.',
      templateId: 'gable-box',
      // The wall recipe the optimizer finds for "at least as good as 15 mm pine" on the farm's 0.6 mm profile:
      // 8.5 mm walls, 2 perimeters, 23 % infill (the least that keeps 0.68 mm lines' air cells within 6 mm).
      baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125, wallThicknessMm: 8.5 },
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [25, 28, 32] },
        { kind: 'param', key: 'trimStyle', values: ['none', 'shingles'] },
        { kind: 'attribute', key: 'colour', values: ['sand', 'moss-green'] },
      ],
      supportBudgetMm3: 12_000,
      printerId: FARM_PRINTER_ID,
      materialId: 'pla',
      region: 'europe',
      targets: HEDGEROW_TARGETS,
      printRecipe: { perimeters: 2, infillPct: 23 },
    },
  },
  {
    target: 'in_review',
    body: {
      code: 'CAF',
      name: 'Copse A-frame',
      description: 'Steep A-frame with shingle trim and a landing dowel on the build plate.',
      templateId: 'a-frame',
      // The optimizer's recipe for "at least as good as 15 mm pine" on the farm's 0.6 mm profile is 8.5 mm walls,
      // 2 perimeters, 23 % infill; its 32 mm hole then needs more support than the family's budget, so 9 mm.
      baseParams: { wallThicknessMm: 9 },
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32] },
        { kind: 'attribute', key: 'colour', values: ['bark-brown', 'sand'] },
      ],
      supportBudgetMm3: 10_000,
      printerId: FARM_PRINTER_ID,
      materialId: 'pla',
      region: 'europe',
      targets: {
        maxUnitCostCents: 3000,
        maxPrintHours: 9,
        maxMassG: 700,
        minInsulation: { kind: 'pine-board', boardMm: 15 },
      },
      printRecipe: { perimeters: 2, infillPct: 23 },
    },
  },
  {
    target: 'draft',
    body: {
      code: 'MGB',
      name: 'Meadow Gable',
      description: 'A brighter gable box with an optional UV clear coat, still being worked on.',
      templateId: 'gable-box',
      baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125, wallThicknessMm: 8.5 },
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32] },
        { kind: 'attribute', key: 'finish', values: ['none', 'uv-clear-coat'] },
        { kind: 'attribute', key: 'colour', values: ['white', 'sand'] },
      ],
      supportBudgetMm3: 12_000,
      printerId: FARM_PRINTER_ID,
      materialId: 'pla',
      region: 'europe',
      // The same targets as the Hedgerow Gable: the clear coat's hand work is what the designer still has to fit in.
      targets: HEDGEROW_TARGETS,
      printRecipe: { perimeters: 2, infillPct: 23 },
    },
  },
];

async function demoPerson(db: Db, email: string): Promise<Person> {
  const [row] = await db.select().from(people).where(eq(people.email, email));
  if (!row) throw new Error(`Demo person ${email} is not seeded yet`);
  return { id: row.id, email: row.email, name: row.name, roles: row.roles };
}

/**
 * Adds the demo families, computing and reviewing them as far as each one's target state.
 * @param db - a database with the demo people and production defaults
 * @param log - progress lines
 */
export async function seedFamilies(db: Db, log: (line: string) => void): Promise<void> {
  const ctx: FamilyContext = { db, log, env: EnvSchema.parse({ NODE_ENV: 'development' }) };
  const designer = await demoPerson(db, DEMO_PEOPLE.find((p) => p.roles.includes('designer'))!.email);
  const manager = await demoPerson(db, DEMO_PEOPLE.find((p) => p.roles.includes('catalogue_manager'))!.email);
  for (const { body, target } of FAMILIES) {
    const started = performance.now();
    const family = await createFamily(ctx, designer, FamilyCreateSchema.parse(body));
    if (target !== 'draft') {
      await computeRevision(db, await currentRevisionId(ctx, family.id), {
        geometry: computeVariantGeometry,
        isCancelled: () => false,
      });
      const computed = await acknowledgeForDemo(ctx, designer, family.id);
      await transitionFamily(ctx, designer, family.id, 'submit');
      if (target === 'published') {
        await transitionFamily(ctx, manager, family.id, 'approve', {
          comment: 'Checked the matrix and the photos of the 28 mm sample.',
        });
        await transitionFamily(ctx, manager, family.id, 'publish');
      }
      log(
        `  demo family ${body.code}: ${computed} variants computed, ${target} (${Math.round(performance.now() - started)} ms)`,
      );
    } else log(`  demo family ${body.code}: draft, not computed`);
  }
}

/** Acknowledges every warning the gate asks for with the studio's text; returns the variant count. */
async function acknowledgeForDemo(ctx: FamilyContext, designer: Person, id: string): Promise<number> {
  const family = await getFamily(ctx, id, designer);
  const acks = family.gate.warnings
    .filter((warning) => warning.severity === 'warning')
    .map((warning) => ({
      code: warning.code,
      text: DEMO_ACKNOWLEDGEMENTS[warning.code] ?? `Reviewed: ${warning.message}`,
    }));
  if (acks.length > 0) await acknowledgeWarnings(ctx, designer, id, { acknowledgements: acks });
  return family.variantCount;
}

registerSeedStep({
  name: 'demo-families',
  demo: true,
  async run({ db, log }) {
    await seedFamilies(db, log);
  },
});
