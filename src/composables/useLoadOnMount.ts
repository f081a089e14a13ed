import { onMounted, ref, type Ref } from 'vue';

/** A value read from the server, with its loading state. */
export interface LoadedValue<T> {
  /** The last value read; `initial` until the first good read. */
  data: Ref<T>;
  /** True while a read is running (and before the first one). */
  loading: Ref<boolean>;
  /** Message of the last failed read; null after a good one. */
  error: Ref<string | null>;
  /** Reads again (for "Try again" and after changes). */
  load: () => Promise<void>;
}

/**
 * Reads a value when the component mounts and keeps its loading and error state; a failed read keeps the last value
 * and sets `error` to the failure's message. Must be called from a component's setup.
 * @param read - fetches the value
 * @param initial - value before the first good read
 */
export function useLoadOnMount<T>(read: () => Promise<T>, initial: T): LoadedValue<T> {
  const data = ref(initial) as Ref<T>;
  const loading = ref(true);
  const error = ref<string | null>(null);

  async function load(): Promise<void> {
    loading.value = true;
    try {
      error.value = null;
      data.value = await read();
    } catch (err) {
      error.value = err instanceof Error ? err.message : String(err);
    } finally {
      loading.value = false;
    }
  }
  onMounted(load);

  return { data, loading, error, load };
}
