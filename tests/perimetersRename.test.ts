/**
 * "Perimeters" is the trade's word for the solid outlines of a printed wall. Recipes saved under the earlier key
 * (`wallLoops`) stay readable: the schema takes the old key on read, and migration 0010 rewrites stored recipes.
 */
import { readFileSync } from 'node:fs';
import { PGlite } from '@electric-sql/pglite';
import { describe, expect, it } from 'vitest';
import { PrintRecipeSchema } from '../shared/schemas/wallRecipe';
import { FamilyCreateSchema } from '../shared/schemas/familySpec';

describe('perimeters in a print recipe', () => {
  it('reads the earlier key and prefers the new one when both are present', () => {
    expect(PrintRecipeSchema.parse({ wallLoops: 3, infillPct: 20 })).toEqual({ perimeters: 3, infillPct: 20 });
    expect(PrintRecipeSchema.parse({ wallLoops: 3, perimeters: 4, infillPct: null })).toEqual({
      perimeters: 4,
      infillPct: null,
    });
    expect(PrintRecipeSchema.parse({})).toEqual({ perimeters: null, infillPct: null });
    expect(PrintRecipeSchema.safeParse({ perimeters: 0 }).success).toBe(false);
  });

  it('keeps a family body sent with the earlier key', () => {
    const body = FamilyCreateSchema.parse({
      code: 'PRM',
      name: 'Perimeter test',
      templateId: 'gable-box',
      baseParams: {},
      axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [28] }],
      supportBudgetMm3: 12_000,
      printerId: 'rowan-farm-06',
      materialId: 'pla',
      region: 'europe',
      printRecipe: { wallLoops: 2, infillPct: 23 },
    });
    expect(body.printRecipe).toEqual({ perimeters: 2, infillPct: 23 });
  });

  it('migration 0010 rewrites stored recipes to the new key', async () => {
    const sql = readFileSync(new URL('../drizzle/0010_naive_gamma_corps.sql', import.meta.url), 'utf8');
    const update = sql
      .split('--> statement-breakpoint')
      .map((s) => s.trim())
      .find((s) => s.startsWith('UPDATE'))!;
    const db = new PGlite();
    await db.exec(`CREATE TABLE "family_revisions" (id int, "print_recipe" jsonb NOT NULL);
      INSERT INTO "family_revisions" VALUES
        (1, '{"wallLoops":2,"infillPct":23}'), (2, '{"wallLoops":null,"infillPct":null}'), (3, '{"perimeters":4,"infillPct":10}');`);
    await db.exec(update);
    const rows = await db.query<{ id: number; print_recipe: unknown }>(
      'SELECT id, print_recipe FROM family_revisions ORDER BY id',
    );
    expect(rows.rows.map((r) => r.print_recipe)).toEqual([
      { perimeters: 2, infillPct: 23 },
      { perimeters: null, infillPct: null },
      { perimeters: 4, infillPct: 10 },
    ]);
    await db.close();
    // A fresh PGlite takes a while to start on a loaded machine.
  }, 120_000);
});
