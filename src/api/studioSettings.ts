/** The admin settings screen's API: studio name and locale, print settings and rates, printers and materials. */
import { z } from 'zod';
import {
  MaterialSchema,
  PrinterProfileSchema,
  type Material,
  type PrinterProfile,
} from '../../shared/schemas/production';
import {
  StoredProductionSettingsSchema,
  type ProductionSettings,
  type StoredProductionSettings,
  type StudioUpdate,
} from '../../shared/schemas/studioSettings';
import { StudioFactsSchema, type StudioFacts } from '../../shared/schemas/studioFacts';
import { api } from './client';
import { StoredSalesSettingsSchema } from './sales';
import type { SalesSettings } from '../../shared/schemas/sales';

/** The studio's name and locale. */
export function getStudio(): Promise<StudioFacts> {
  return api('/settings/studio', { schema: StudioFactsSchema });
}

/** Saves the studio's name and locale. @param studio - the new name and locale */
export function saveStudio(studio: StudioUpdate): Promise<StudioFacts> {
  return api('/settings/studio', { method: 'PUT', body: studio, schema: StudioFactsSchema });
}

/** Removes a printer profile (refused with 409 while a family uses it). @param id - its identifier */
export async function removePrinter(id: string): Promise<void> {
  await api(`/settings/printers/${encodeURIComponent(id)}`, { method: 'DELETE', schema: z.unknown() });
}

/** Removes a material with its colours (refused with 409 while a family uses it). @param id - its identifier */
export async function removeMaterial(id: string): Promise<void> {
  await api(`/settings/materials/${encodeURIComponent(id)}`, { method: 'DELETE', schema: z.unknown() });
}

/** The studio's print settings and cost rates. */
export async function getProductionSettings(): Promise<StoredProductionSettings> {
  return api('/settings/production', { schema: StoredProductionSettingsSchema });
}

/** Saves the print settings and cost rates. @param input - both */
export async function saveProductionSettings(input: ProductionSettings): Promise<StoredProductionSettings> {
  return api('/settings/production', { method: 'PUT', body: input, schema: StoredProductionSettingsSchema });
}

/** Adds or changes a printer profile. @param printer - the profile */
export async function savePrinter(printer: PrinterProfile): Promise<PrinterProfile> {
  return api(`/settings/printers/${encodeURIComponent(printer.id)}`, {
    method: 'PUT',
    body: printer,
    schema: PrinterProfileSchema,
  });
}

/** Adds or changes a material with its colours. @param material - the material */
export async function saveMaterial(material: Material): Promise<Material> {
  return api(`/settings/materials/${encodeURIComponent(material.id)}`, {
    method: 'PUT',
    body: material,
    schema: MaterialSchema,
  });
}

/** Saves the sales settings (admin). @param settings - the complete settings */
export async function saveSalesSettings(settings: SalesSettings): Promise<z.infer<typeof StoredSalesSettingsSchema>> {
  return api('/settings/sales', { method: 'PUT', body: settings, schema: StoredSalesSettingsSchema });
}
