/** Saving one part of the sales settings: the section's draft over the last saved settings, checked and sent whole. */
import { SalesSettingsSchema, type SalesSettings } from '../../../shared/schemas/sales';
import * as settingsApi from '../../api/studioSettings';
import type { useSettingsSection } from './useSettingsSection';

/**
 * Checks the saved sales settings with one part replaced by the section's draft and saves them.
 * @param section - the section's check and save
 * @param saved - the sales settings as last saved (other sections' unsaved drafts are not sent)
 * @param part - the part's values as typed
 * @param done - what to tell the admin
 * @returns the saved settings, or null when refused (the draft stays as typed)
 */
export async function saveSalesPart(
  section: ReturnType<typeof useSettingsSection>,
  saved: SalesSettings,
  part: Partial<Record<keyof SalesSettings, unknown>>,
  done: string,
): Promise<SalesSettings | null> {
  const input = section.checked(SalesSettingsSchema, { ...saved, ...part });
  if (!input) return null;
  let result: SalesSettings | null = null;
  await section.run(async () => {
    result = (await settingsApi.saveSalesSettings(input)).settings;
    return done;
  });
  return result;
}
