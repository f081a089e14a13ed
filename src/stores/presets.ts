import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { Preset, PresetCreate, PresetUpdate } from '../../shared/schemas/preset';
import * as presetsApi from '../api/presets';

/** The signed-in designer's presets: list, load, save, rename, delete. */
export const usePresetsStore = defineStore('presets', () => {
  const presets = ref<Preset[]>([]);
  const loading = ref(false);
  const loaded = ref(false);

  /** Presets grouped by template id, each group newest change first. */
  const byTemplate = computed(() => {
    const groups = new Map<string, Preset[]>();
    for (const preset of presets.value) {
      const group = groups.get(preset.templateId) ?? [];
      group.push(preset);
      groups.set(preset.templateId, group);
    }
    return groups;
  });

  function upsert(preset: Preset): void {
    const index = presets.value.findIndex((item) => item.id === preset.id);
    if (index >= 0) presets.value.splice(index, 1, preset);
    else presets.value.unshift(preset);
  }

  /** Loads every preset of the designer. */
  async function loadAll(): Promise<void> {
    loading.value = true;
    try {
      presets.value = await presetsApi.listPresets();
      loaded.value = true;
    } finally {
      loading.value = false;
    }
  }

  /**
   * Loads one preset (from the server, so a reload shows what was saved).
   * @param id - preset id
   */
  async function fetchOne(id: string): Promise<Preset> {
    const preset = await presetsApi.getPreset(id);
    upsert(preset);
    return preset;
  }

  /**
   * Saves a new preset.
   * @param body - template, name, parameters, thumbnail
   */
  async function create(body: PresetCreate): Promise<Preset> {
    const preset = await presetsApi.createPreset(body);
    upsert(preset);
    return preset;
  }

  /**
   * Changes a preset's name, parameters or thumbnail.
   * @param id - preset id
   * @param body - the fields to change
   */
  async function update(id: string, body: PresetUpdate): Promise<Preset> {
    const preset = await presetsApi.updatePreset(id, body);
    upsert(preset);
    return preset;
  }

  /**
   * Deletes a preset.
   * @param id - preset id
   */
  async function remove(id: string): Promise<void> {
    await presetsApi.deletePreset(id);
    presets.value = presets.value.filter((item) => item.id !== id);
  }

  return { presets, loading, loaded, byTemplate, loadAll, fetchOne, create, update, remove };
});
