/** Named queries for designers' presets; every query is scoped to the owner so others' presets stay invisible. */
import { and, desc, eq, ne } from 'drizzle-orm';
import type { Db } from '../db/client';
import { presets, type PresetRow } from '../db/schema';
import type { Preset } from '../../shared/schemas/preset';

/** Postgres' unique_violation SQLSTATE. */
const UNIQUE_VIOLATION = '23505';

/**
 * Turns a stored row into the API shape.
 * @param row - the database row
 */
export function presetFromRow(row: PresetRow): Preset {
  return {
    id: row.id,
    ownerId: row.ownerId,
    templateId: row.templateId,
    templateVersion: Number(row.templateVersion),
    name: row.name,
    params: row.params,
    thumbnail: row.thumbnailPng,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/**
 * Whether a database error is a unique-constraint violation (the per-owner, per-template name index).
 * @param err - anything thrown by a query (drizzle wraps the driver error in `cause`)
 */
export function isUniqueViolation(err: unknown): boolean {
  for (
    let current: unknown = err;
    current && typeof current === 'object';
    current = (current as { cause?: unknown }).cause
  ) {
    if ((current as { code?: unknown }).code === UNIQUE_VIOLATION) return true;
  }
  return false;
}

/**
 * The owner's presets, newest change first.
 * @param db - database
 * @param ownerId - the signed-in designer
 * @param templateId - only this template's presets when given
 */
export async function listPresets(db: Db, ownerId: string, templateId?: string): Promise<Preset[]> {
  const where = templateId
    ? and(eq(presets.ownerId, ownerId), eq(presets.templateId, templateId))
    : eq(presets.ownerId, ownerId);
  const rows = await db.select().from(presets).where(where).orderBy(desc(presets.updatedAt));
  return rows.map(presetFromRow);
}

/**
 * One preset if it belongs to the owner, otherwise undefined (others' presets are treated as missing).
 * @param db - database
 * @param ownerId - the signed-in designer
 * @param id - preset id
 */
export async function findPreset(db: Db, ownerId: string, id: string): Promise<Preset | undefined> {
  const [row] = await db
    .select()
    .from(presets)
    .where(and(eq(presets.id, id), eq(presets.ownerId, ownerId)))
    .limit(1);
  return row ? presetFromRow(row) : undefined;
}

/**
 * Whether the owner already has another preset of this template with this name.
 * @param db - database
 * @param ownerId - the signed-in designer
 * @param templateId - template id
 * @param name - the wanted name
 * @param exceptId - a preset to ignore (the one being renamed)
 */
export async function presetNameTaken(
  db: Db,
  ownerId: string,
  templateId: string,
  name: string,
  exceptId?: string,
): Promise<boolean> {
  const conditions = [eq(presets.ownerId, ownerId), eq(presets.templateId, templateId), eq(presets.name, name)];
  if (exceptId) conditions.push(ne(presets.id, exceptId));
  const rows = await db
    .select({ id: presets.id })
    .from(presets)
    .where(and(...conditions))
    .limit(1);
  return rows.length > 0;
}

/** Values of a new preset row. */
export interface NewPresetValues {
  ownerId: string;
  templateId: string;
  templateVersion: number;
  name: string;
  params: Record<string, unknown>;
  thumbnail: string | null;
}

/**
 * Inserts a preset.
 * @param db - database
 * @param values - the new preset
 */
export async function insertPreset(db: Db, values: NewPresetValues): Promise<Preset> {
  const [row] = await db
    .insert(presets)
    .values({
      ownerId: values.ownerId,
      templateId: values.templateId,
      templateVersion: String(values.templateVersion),
      name: values.name,
      params: values.params,
      thumbnailPng: values.thumbnail,
    })
    .returning();
  return presetFromRow(row);
}

/** Fields a preset update may change. */
export interface PresetChanges {
  name?: string;
  params?: Record<string, unknown>;
  templateVersion?: number;
  thumbnail?: string | null;
}

/**
 * Updates the owner's preset; undefined when it does not exist or is someone else's.
 * @param db - database
 * @param ownerId - the signed-in designer
 * @param id - preset id
 * @param changes - the fields to change
 */
export async function updatePreset(
  db: Db,
  ownerId: string,
  id: string,
  changes: PresetChanges,
): Promise<Preset | undefined> {
  const [row] = await db
    .update(presets)
    .set({
      ...(changes.name !== undefined && { name: changes.name }),
      ...(changes.params !== undefined && { params: changes.params }),
      ...(changes.templateVersion !== undefined && { templateVersion: String(changes.templateVersion) }),
      ...(changes.thumbnail !== undefined && { thumbnailPng: changes.thumbnail }),
      updatedAt: new Date(),
    })
    .where(and(eq(presets.id, id), eq(presets.ownerId, ownerId)))
    .returning();
  return row ? presetFromRow(row) : undefined;
}

/**
 * Deletes the owner's preset.
 * @param db - database
 * @param ownerId - the signed-in designer
 * @param id - preset id
 * @returns whether a preset was deleted
 */
export async function deletePreset(db: Db, ownerId: string, id: string): Promise<boolean> {
  const rows = await db
    .delete(presets)
    .where(and(eq(presets.id, id), eq(presets.ownerId, ownerId)))
    .returning({ id: presets.id });
  return rows.length > 0;
}
