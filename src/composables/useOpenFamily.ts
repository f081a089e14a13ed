import { computed, onMounted, ref, watch, type ComputedRef, type Ref } from 'vue';
import { useRoute } from 'vue-router';
import type { Family } from '../../shared/schemas/family';
import type { ParameterDescription } from '../../templates/types';
import { findTemplateSummary } from '../api/templates';
import { useFamiliesStore } from '../stores/families';

/** The family named by the route's `:id`, with its loading state and its template's parameter labels. */
export interface OpenFamily {
  /** The route's family id. */
  id: ComputedRef<string>;
  /** True until the first load has ended. */
  loading: Ref<boolean>;
  /** Message of the last failed load; null after a good one. */
  error: Ref<string | null>;
  /** Parameter labels of the family's template, by parameter key (empty when the template could not be read). */
  axisLabels: Ref<Record<string, string>>;
  /** The parameter descriptions (labels, units) of the family's template; empty when it could not be read. */
  parameters: Ref<ParameterDescription[]>;
  /** The open family once the store holds it; null before. */
  family: ComputedRef<Family | null>;
  /** Opens (or reopens) the family and reads its template's labels. */
  load: () => Promise<void>;
}

/**
 * Opens the family of the current route in the families store when the view mounts and whenever the id changes.
 * Must be called from a component's setup.
 */
export function useOpenFamily(): OpenFamily {
  const route = useRoute();
  const families = useFamiliesStore();
  const id = computed(() => String(route.params.id));
  const loading = ref(true);
  const error = ref<string | null>(null);
  const axisLabels = ref<Record<string, string>>({});
  const parameters = ref<ParameterDescription[]>([]);
  const family = computed<Family | null>(() => (families.current?.id === id.value ? families.current : null));

  async function load(): Promise<void> {
    try {
      error.value = null;
      const opened = await families.open(id.value);
      const template = await findTemplateSummary(opened.templateId).catch(() => undefined);
      parameters.value = template?.parameters ?? [];
      axisLabels.value = Object.fromEntries(parameters.value.map((param) => [param.key, param.label]));
    } catch (err) {
      error.value = err instanceof Error ? err.message : String(err);
    } finally {
      loading.value = false;
    }
  }
  onMounted(load);
  watch(id, load);

  return { id, loading, error, axisLabels, parameters, family, load };
}
