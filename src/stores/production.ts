import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import type { ProductionCatalogue } from '../../shared/schemas/production';
import { getProductionCatalogue } from '../api/production';

/** The production catalogue (printers, materials, settings, rates), loaded once per session and shared by views. */
export const useProductionStore = defineStore('production', () => {
  const catalogue = shallowRef<ProductionCatalogue | null>(null);
  const error = ref<string | null>(null);
  let loading: Promise<void> | null = null;

  const printers = computed(() => catalogue.value?.printers ?? []);
  const materials = computed(() => catalogue.value?.materials ?? []);

  /**
   * Loads the catalogue the first time it is asked for; later calls share that load. A failed load may be retried.
   * @returns when the catalogue (or its error) is in the store
   */
  function ensureLoaded(): Promise<void> {
    if (catalogue.value) return Promise.resolve();
    loading ??= getProductionCatalogue()
      .then((answer) => {
        catalogue.value = answer;
        error.value = null;
      })
      .catch((err: unknown) => {
        error.value = err instanceof Error ? err.message : String(err);
      })
      .finally(() => {
        loading = null;
      });
    return loading;
  }

  /**
   * Loads the catalogue again (after an admin changed printers, materials, settings or rates).
   * @returns when the fresh catalogue (or its error) is in the store
   */
  async function reload(): Promise<void> {
    catalogue.value = null;
    await ensureLoaded();
  }

  /**
   * A printer as people know it: its name, or the id until the catalogue has loaded (loading starts here).
   * @param id - a printer profile id
   */
  function printerName(id: string): string {
    if (!catalogue.value) void ensureLoaded();
    return printers.value.find((printer) => printer.id === id)?.name ?? id;
  }

  return { catalogue, printers, materials, error, ensureLoaded, reload, printerName };
});
