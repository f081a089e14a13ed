/** Printers and materials the family features use: the database rows, checked by the shared schemas. */
import { eq } from 'drizzle-orm';
import {
  MaterialSchema,
  PrinterProfileSchema,
  type Material,
  type PrinterProfile,
} from '../../shared/schemas/production';
import type { Queryable } from '../db/client';
import { materials, printerProfiles } from '../db/schema';

/** Every printer profile, by id. @param db - database */
export async function loadPrinters(db: Queryable): Promise<Map<string, PrinterProfile>> {
  const rows = await db.select().from(printerProfiles);
  return new Map(rows.map((row) => [row.id, PrinterProfileSchema.parse({ ...row.data, id: row.id, name: row.name })]));
}

/** Every material, by id. @param db - database */
export async function loadMaterials(db: Queryable): Promise<Map<string, Material>> {
  const rows = await db.select().from(materials);
  return new Map(rows.map((row) => [row.id, MaterialSchema.parse({ ...row.data, id: row.id, name: row.name })]));
}

/**
 * One printer profile, or undefined.
 * @param db - database
 * @param id - printer id
 */
export async function findPrinter(db: Queryable, id: string): Promise<PrinterProfile | undefined> {
  const [row] = await db.select().from(printerProfiles).where(eq(printerProfiles.id, id));
  return row ? PrinterProfileSchema.parse({ ...row.data, id: row.id, name: row.name }) : undefined;
}
