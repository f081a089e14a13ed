/**
 * What the printer and material sections of the settings screen do alike: pick a saved profile or start a new one,
 * save it (checked against its shared schema first) and remove it, then read the production catalogue again so
 * every picker sees the change. The section keeps the parts it edits apart (a printer's build volume, a material's
 * colours) and says how they go back into the profile.
 */
import { computed, ref, type ComputedRef, type Ref } from 'vue';
import type { ZodType } from 'zod';
import { CatalogueIdSchema } from '../../../shared/schemas/studioSettings';
import { useProductionStore } from '../../stores/production';
import { NEW_PROFILE } from './settingsFields';
import { useSettingsSection } from './useSettingsSection';

/** The section's own words and calls. */
export interface ProfileEditorOptions<P extends { id: string; name: string }> {
  /** The saved profiles, from the production store. */
  profiles: () => readonly P[];
  /** Fields a new profile starts with empty (it copies the other figures of the first saved one). */
  blank: Record<string, unknown>;
  /** The schema a profile is checked against before it is sent. */
  schema: ZodType<P>;
  /** Takes the parts the section edits apart out of a picked profile. */
  split?: (profile: Record<string, unknown>) => void;
  /** The profile as the form holds it, with those parts put back. */
  join?: (profile: Record<string, unknown>) => Record<string, unknown>;
  /** Checks the section's own parts before the schema: a problem in words, or null. */
  problemOf?: () => string | null;
  /** Sends a checked profile. */
  save: (profile: P) => Promise<unknown>;
  /** Removes a saved profile by identifier. */
  remove: (id: string) => Promise<unknown>;
  /** What to tell the admin once a profile is saved. */
  savedMessage: (profile: P) => string;
}

/** One kind of profile's editor: what ProfileCard.vue and the section's own fields work with. */
export interface ProfileEditor {
  /** The problem in words beside the section, or empty. */
  problem: Ref<string>;
  saving: Ref<boolean>;
  /** The picked profile's identifier, or NEW_PROFILE. */
  picked: Ref<string>;
  /** The profile as the form holds it (the section's own parts apart). */
  profile: Ref<Record<string, unknown>>;
  /** The saved profiles, for the picker. */
  profiles: ComputedRef<readonly { id: string; name: string }[]>;
  pick(id: string): void;
  /** A text field of the profile. */
  text(key: string): string;
  setText(key: string, value: string): void;
  save(): Promise<void>;
  remove(): Promise<void>;
}

/**
 * The editor of one kind of profile.
 * @param options - the section's schema, parts, calls and words
 */
export function useProfileEditor<P extends { id: string; name: string }>(
  options: ProfileEditorOptions<P>,
): ProfileEditor {
  const production = useProductionStore();
  const { problem, saving, checked, run } = useSettingsSection();
  const picked = ref<string>(NEW_PROFILE);
  const profile = ref<Record<string, unknown>>({});

  /**
   * Shows a saved profile, or a new one (NEW_PROFILE) with the first one's figures and no identifier or name.
   * @param id - the profile's identifier
   */
  function pick(id: string): void {
    picked.value = id;
    problem.value = '';
    const saved = options.profiles();
    const found = saved.find((p) => p.id === id) ?? saved[0];
    const base: Record<string, unknown> = found ? { ...found } : {};
    if (id === NEW_PROFILE) Object.assign(base, options.blank);
    profile.value = base;
    options.split?.(base);
  }

  /** Shows the first saved profile, or a new one when there is none. */
  function pickFirst(): void {
    pick(options.profiles()[0]?.id ?? NEW_PROFILE);
  }
  pickFirst();

  const text = (key: string): string => String(profile.value[key] ?? '');
  const setText = (key: string, value: string): void => {
    profile.value = { ...profile.value, [key]: value };
  };

  /** Checks and saves the profile; a refusal stays beside the section and the form keeps what was typed. */
  async function save(): Promise<void> {
    if (checked(CatalogueIdSchema, profile.value.id) === null) return;
    const own = options.problemOf?.() ?? null;
    if (own !== null) {
      problem.value = own;
      return;
    }
    const input = checked(options.schema, options.join ? options.join(profile.value) : profile.value);
    if (!input) return;
    await run(async () => {
      await options.save(input);
      await production.reload();
      pick(input.id);
      return options.savedMessage(input);
    });
  }

  /** Removes the picked profile (the server refuses in words while a family uses it, or for the last one). */
  async function remove(): Promise<void> {
    const name = text('name');
    await run(async () => {
      await options.remove(picked.value);
      await production.reload();
      pickFirst();
      return `${name} removed.`;
    });
  }

  const profiles = computed(() => options.profiles());
  return { problem, saving, picked, profile, profiles, pick, text, setText, save, remove };
}
