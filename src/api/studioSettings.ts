/** The admin settings screen's API: studio name, print settings and rates, printers and materials. */
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
} from '../../shared/schemas/studioSettings';
import { api } from './client';
import { StoredSalesSettingsSchema } from './sales';
import type { SalesSettings } from '../../shared/schemas/sales';

const NameSchema = z.object({ name: z.string() });

/** The studio's name. */
export async function getStudioName(): Promise<string> {
  return (await api('/settings/studio', { schema: NameSchema })).name;
}

/** Saves the studio's name. @param name - the new name */
export async function saveStudioName(name: string): Promise<string> {
  return (await api('/settings/studio', { method: 'PUT', body: { name }, schema: NameSchema })).name;
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
