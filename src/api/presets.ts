import { z } from 'zod';
import {
  PresetListSchema,
  PresetSchema,
  type Preset,
  type PresetCreate,
  type PresetUpdate,
} from '../../shared/schemas/preset';
import { api } from './client';

/**
 * The signed-in designer's presets, newest change first.
 * @param templateId - only presets of this template when given
 */
export async function listPresets(templateId?: string): Promise<Preset[]> {
  const query = templateId ? `?templateId=${encodeURIComponent(templateId)}` : '';
  const answer = await api(`/presets${query}`, { schema: PresetListSchema });
  return answer.presets;
}

/**
 * One preset of the signed-in designer.
 * @param id - preset id
 */
export function getPreset(id: string): Promise<Preset> {
  return api(`/presets/${encodeURIComponent(id)}`, { schema: PresetSchema });
}

/**
 * Saves a new preset (409 when the name is taken for this template, 400 naming a bad parameter).
 * @param body - template, name, parameters and optional thumbnail
 */
export function createPreset(body: PresetCreate): Promise<Preset> {
  return api('/presets', { method: 'POST', body, schema: PresetSchema });
}

/**
 * Renames a preset or stores new parameters / a new thumbnail.
 * @param id - preset id
 * @param body - the fields to change
 */
export function updatePreset(id: string, body: PresetUpdate): Promise<Preset> {
  return api(`/presets/${encodeURIComponent(id)}`, { method: 'PATCH', body, schema: PresetSchema });
}

/**
 * Deletes a preset.
 * @param id - preset id
 */
export async function deletePreset(id: string): Promise<void> {
  await api(`/presets/${encodeURIComponent(id)}`, { method: 'DELETE', schema: z.unknown() });
}
