/**
 * The editable content of a variant family: review states and actions, the family code, the axes of the variant
 * matrix and the spec a designer edits (create and update bodies).
 *
 * SKU scheme (see shared/families/sku.ts): `FH-<family code>-<one segment per axis, in axis order>`, each segment the
 * code of that variant's value on the axis: numbers as digits with `P` for the decimal point (`32`, `27P5`), words
 * as their first four letters or digits upper-cased (`none` -> `NONE`, `shingles` -> `SHIN`, `moss-green` -> `MOSS`),
 * booleans `Y`/`N`. A segment depends only on the value, so a variant keeps its SKU as long as the family keeps its
 * code and its axis order; two values of one axis with the same code are rejected (400 naming the field).
 * Example: family code `HGB`, axes entry 25/28/32 x trim none/shingles x colour sand/moss-green ->
 * `FH-HGB-28-SHIN-SAND`.
 */
import { z } from 'zod';
import { fieldLabel } from './humanMessages';
import { RegionSchema } from './birdfit';
import { PrintRecipeSchema, ProductionTargetsSchema } from './wallRecipe';

/** Most variants one family may have; more is refused with a message naming the count. */
export const FAMILY_MAX_VARIANTS = 500;

/** Prefix of every SKU (the demo studio's mark). */
export const SKU_PREFIX = 'FH';

/** A SKU as the scheme above writes it, e.g. `FH-HGB-28-SHIN-SAND`. */
export const SkuSchema = z
  .string()
  .regex(/^FH-[A-Z0-9]{2,6}(-[A-Z0-9]{1,8})*$/, 'A SKU looks like FH-HGB-28-SHIN-SAND.');

/** Review states of a family revision, in workflow order. */
export const FAMILY_STATES = ['draft', 'in_review', 'approved', 'published', 'retired'] as const;
/** A review state: draft -> in_review -> approved -> published -> retired; return sends in_review back to draft. */
export const FamilyStateSchema = z.enum(FAMILY_STATES);
/** A review state (see {@link FamilyStateSchema}). */
export type FamilyState = z.infer<typeof FamilyStateSchema>;

/** Human labels of the states. */
export const FAMILY_STATE_LABELS: Record<FamilyState, string> = {
  draft: 'Draft',
  in_review: 'In review',
  approved: 'Approved',
  published: 'Published',
  retired: 'Retired',
};

/** Workflow actions recorded in the audit log and offered as buttons. */
export const FamilyActionSchema = z.enum(['submit', 'approve', 'return', 'publish', 'retire']);
/** A workflow action (see {@link FamilyActionSchema}). */
export type FamilyAction = z.infer<typeof FamilyActionSchema>;

/** Short code of a family inside its SKUs: 2–6 upper-case letters or digits, unique per studio. */
export const FamilyCodeSchema = z
  .string()
  .trim()
  .regex(/^[A-Z0-9]{2,6}$/, 'The family code must be 2 to 6 capital letters or digits, such as HGB.');

/** A value on a parameter axis: a number (mm, degrees, count), a choice word or a boolean. */
export const AxisValueSchema = z.union([z.number(), z.string().min(1).max(40), z.boolean()]);
/** A value on an axis (see {@link AxisValueSchema}). */
export type AxisValue = z.infer<typeof AxisValueSchema>;

/** Keys of the non-geometric axes. */
export const ATTRIBUTE_KEYS = ['colour', 'material', 'finish'] as const;
/** A non-geometric axis key. */
export const AttributeKeySchema = z.enum(ATTRIBUTE_KEYS);
/** A non-geometric axis key (see {@link AttributeKeySchema}). */
export type AttributeKey = z.infer<typeof AttributeKeySchema>;

/** Values of attribute axes are ids: lower-case words joined by hyphens, e.g. `moss-green`, `uv-clear-coat`. */
export const AttributeValueSchema = z
  .string()
  .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'A value must be lower-case letters, digits and dashes, such as uv-clear-coat.')
  .max(40);

function noDuplicates(values: readonly unknown[], ctx: z.RefinementCtx): void {
  const seen = new Set<string>();
  values.forEach((value, index) => {
    const key = JSON.stringify(value);
    if (seen.has(key))
      ctx.addIssue({
        code: 'custom',
        path: [index],
        message: `The value ${key} is listed twice (a duplicate): remove one.`,
      });
    seen.add(key);
  });
}

/** A parameter axis: a template parameter and the listed values it takes (checked with the template's ranges). */
export const ParamAxisSchema = z.object({
  kind: z.literal('param'),
  /** A parameter key of the pinned template, e.g. `entryHoleDiameterMm`. */
  key: z.string().min(1).max(64),
  /** Optional display label (defaults to the template's label). */
  label: z.string().max(80).optional(),
  values: z.array(AxisValueSchema).min(1, 'Give the axis at least one value.').max(50).superRefine(noDuplicates),
});
/** A parameter axis (see {@link ParamAxisSchema}). */
export type ParamAxis = z.infer<typeof ParamAxisSchema>;

/** A non-geometric axis: colour (material colour ids), material (material ids) or finish (free ids). */
export const AttributeAxisSchema = z.object({
  kind: z.literal('attribute'),
  key: AttributeKeySchema,
  label: z.string().max(80).optional(),
  values: z.array(AttributeValueSchema).min(1, 'Give the axis at least one value.').max(50).superRefine(noDuplicates),
});
/** A non-geometric axis (see {@link AttributeAxisSchema}). */
export type AttributeAxis = z.infer<typeof AttributeAxisSchema>;

/** One axis of the variant matrix. */
export const AxisSchema = z.discriminatedUnion('kind', [ParamAxisSchema, AttributeAxisSchema]);
/** One axis (see {@link AxisSchema}). */
export type Axis = z.infer<typeof AxisSchema>;

/** The axes of a family: at most 6, each key once. */
export const AxesSchema = z
  .array(AxisSchema)
  .max(6, 'at most 6 axes')
  .superRefine((axes, ctx) => {
    const seen = new Set<string>();
    axes.forEach((axis, index) => {
      if (seen.has(axis.key))
        ctx.addIssue({
          code: 'custom',
          path: [index, 'key'],
          message: `${fieldLabel([axis.key])} has two axes (a duplicate axis): merge their values into one.`,
        });
      seen.add(axis.key);
    });
  });

/** A variant's non-geometric attributes (material always set: the axis value or the family default). */
export const VariantAttributesSchema = z.object({
  colour: z.string().nullable(),
  material: z.string(),
  finish: z.string().nullable(),
});
/** A variant's attributes (see {@link VariantAttributesSchema}). */
export type VariantAttributes = z.infer<typeof VariantAttributesSchema>;

/** The part of a family a designer edits (one revision's content). */
export const FamilySpecSchema = z.object({
  name: z.string().trim().min(1, 'Give the family a name.').max(80),
  description: z.string().max(2000).default(''),
  templateId: z.string().min(1).max(64),
  /** Parameters shared by every variant (missing keys take the template defaults). */
  baseParams: z.record(z.string(), AxisValueSchema).default({}),
  axes: AxesSchema,
  /** Largest support volume a variant may need, mm³. */
  supportBudgetMm3: z.number().nonnegative().max(10_000_000),
  /** Printer every variant must fit and is priced on (a printer_profiles id; the demo farm's 0.6 mm profile). */
  printerId: z.string().min(1).default('rowan-farm-06'),
  /** Material when there is no material axis. */
  materialId: z.string().min(1).default('pla'),
  /** Region for the bird-fit rules; both regions when null. */
  region: RegionSchema.nullable().default(null),
  /** Unit cost, print hours, mass and wall insulation every variant must meet (unset targets are not checked). */
  targets: ProductionTargetsSchema.prefault({}),
  /** Perimeters and infill every variant prints with (null: the studio's print settings). */
  printRecipe: PrintRecipeSchema.prefault({}),
});
/** A family's editable content (see {@link FamilySpecSchema}). */
export type FamilySpec = z.infer<typeof FamilySpecSchema>;

/** Body of `POST /api/families` (the template version is pinned to the current one). */
export const FamilyCreateSchema = FamilySpecSchema.extend({ code: FamilyCodeSchema });
/** Body of `POST /api/families`. */
export type FamilyCreate = z.input<typeof FamilyCreateSchema>;

/**
 * Body of `PATCH /api/families/:id`: any spec fields. `templateVersion: 'latest'` re-pins to the current template
 * version. `expectedLock` (from {@link Family.lock}) makes a stale edit a 409.
 */
export const FamilyUpdateSchema = z
  .object({
    name: FamilySpecSchema.shape.name,
    description: z.string().max(2000),
    templateId: FamilySpecSchema.shape.templateId,
    templateVersion: z.literal('latest'),
    baseParams: z.record(z.string(), AxisValueSchema),
    axes: AxesSchema,
    supportBudgetMm3: FamilySpecSchema.shape.supportBudgetMm3,
    printerId: z.string().min(1),
    materialId: z.string().min(1),
    region: RegionSchema.nullable(),
    targets: ProductionTargetsSchema,
    printRecipe: PrintRecipeSchema,
    expectedLock: z.number().int().nonnegative(),
  })
  .partial()
  .strict();
/** Body of `PATCH /api/families/:id`. */
export type FamilyUpdate = z.infer<typeof FamilyUpdateSchema>;
