import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { CatalogueQuery, CatalogueVariant } from '../../shared/schemas/catalogue';
import { listCatalogue } from '../api/catalogue';

/** The published catalogue as sales and catalogue managers browse it. */
export const useCatalogueStore = defineStore('catalogue', () => {
  const variants = ref<CatalogueVariant[]>([]);
  const loading = ref(false);
  const error = ref<string | null>(null);
  let lastRequest = 0;

  /**
   * Loads the published variants matching the query; an older answer arriving late is dropped.
   * @param query - search text and filters
   */
  async function load(query: CatalogueQuery = {}): Promise<void> {
    const request = ++lastRequest;
    loading.value = true;
    error.value = null;
    try {
      const answer = await listCatalogue(query);
      if (request === lastRequest) variants.value = answer;
    } catch (err) {
      if (request === lastRequest) error.value = err instanceof Error ? err.message : String(err);
    } finally {
      if (request === lastRequest) loading.value = false;
    }
  }

  return { variants, loading, error, load };
});
