/**
 * What every section of the admin settings screen does the same way: check a form against a shared schema before
 * sending it (the first problem, in words, beside the section), save, and keep what was typed when it is refused.
 */
import { ref } from 'vue';
import { useMessage } from 'naive-ui';
import type { ZodType } from 'zod';
import { ApiError } from '../../api/ApiError';

/** Singular words for the lists a settings form holds, so a problem says which entry it is about. */
const ENTRY_WORDS: Record<string, string> = {
  finishes: 'Finish',
  colours: 'Colour',
  quantityBreaks: 'Quantity break',
  dimDivisors: 'Shipping divisor',
  zones: 'Shipping zone',
  weightBandsKg: 'Weight band',
  ratesMinor: 'Price',
  countries: 'Country',
};

/**
 * A problem for people: the schema's own sentence, led by the list entry it is about ("Finish 2: Name is
 * required."), so the admin finds it among several alike.
 * @param path - the issue's path
 * @param message - the issue's message (the shared human messages)
 */
export function problemInWords(path: readonly PropertyKey[], message: string): string {
  const where: string[] = [];
  path.forEach((part, i) => {
    const next = path[i + 1];
    if (typeof part === 'string' && typeof next === 'number' && ENTRY_WORDS[part])
      where.push(`${ENTRY_WORDS[part]} ${next + 1}`);
  });
  return where.length ? `${where.join(', ')}: ${message}` : message;
}

/** One section's problem, saving state, check and save. */
export function useSettingsSection() {
  const message = useMessage();
  const problem = ref('');
  const saving = ref(false);

  /**
   * The parsed value, or null after putting the first problem beside the section.
   * @param schema - a shared schema
   * @param value - what the form holds
   */
  function checked<T>(schema: ZodType<T>, value: unknown): T | null {
    const result = schema.safeParse(value);
    if (result.success) {
      problem.value = '';
      return result.data;
    }
    const issue = result.error.issues[0];
    problem.value = issue ? problemInWords(issue.path, issue.message) : 'Check the values.';
    return null;
  }

  /**
   * Runs a save; its answer is shown as a success message, a refusal (in words from the server) beside the
   * section. The form's values are left as they are either way.
   * @param work - the save, returning what to tell the admin
   */
  async function run(work: () => Promise<string>): Promise<boolean> {
    saving.value = true;
    try {
      message.success(await work());
      problem.value = '';
      return true;
    } catch (err) {
      problem.value = err instanceof ApiError || err instanceof Error ? err.message : 'The change could not be saved.';
      return false;
    } finally {
      saving.value = false;
    }
  }

  return { problem, saving, checked, run };
}
