import { SalesSettingsSchema } from '../../shared/schemas/sales';
import { z } from 'zod';
import { api } from './client';
import { fetchFile } from './fetchFile';

/** A generated document fetched from the server, ready to offer as a download. */
export interface SalesDocument {
  blob: Blob;
  fileName: string;
}

/** Paths (under /api) of the sales documents. */
export const salesDocumentPaths = {
  /** @param sku - a published variant's SKU */
  variantSpecSheet: (sku: string) => `/variants/${encodeURIComponent(sku)}/spec-sheet.pdf`,
  /** @param familyId - a published family's id */
  familySpecSheet: (familyId: string) => `/families/${encodeURIComponent(familyId)}/spec-sheet.pdf`,
  priceListCsv: () => '/price-list.csv',
  priceListXlsx: () => '/price-list.xlsx',
  /** @param quoteId - a saved quote's id */
  quotePdf: (quoteId: string) => `/quotes/${encodeURIComponent(quoteId)}.pdf`,
} as const;

/**
 * Fetches a generated document (PDF, CSV, XLSX); error answers are thrown as {@link ApiError}.
 * @param path - path under `/api` (see {@link salesDocumentPaths})
 */
export async function fetchSalesDocument(path: string): Promise<SalesDocument> {
  const file = await fetchFile(`/api${path}`);
  return { blob: file.blob, fileName: file.fileName ?? path.split('/').pop() ?? 'document' };
}

/** Answer of `GET /api/settings/sales`. */
export const StoredSalesSettingsSchema = z.object({ settings: SalesSettingsSchema, updatedAt: z.string().nullable() });

/** The studio's sales settings (divisors with their dates, packaging, farm, quantity breaks). */
export async function getSalesSettings(): Promise<z.infer<typeof StoredSalesSettingsSchema>> {
  return api('/settings/sales', { schema: StoredSalesSettingsSchema });
}
