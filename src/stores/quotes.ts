import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Quote, QuoteCreate, QuoteSummary } from '../../shared/schemas/quote';
import { createQuote, getQuote, listQuotes } from '../api/quotes';
import { ApiError } from '../api/ApiError';

/** Wholesale quotes: the list, the one open in the detail screen, and making new ones. */
export const useQuotesStore = defineStore('quotes', () => {
  const quotes = ref<QuoteSummary[]>([]);
  const loading = ref(false);
  const error = ref<string | null>(null);
  const current = ref<Quote | null>(null);

  /** Loads the list. */
  async function load(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      quotes.value = await listQuotes();
    } catch (err) {
      error.value = err instanceof ApiError ? err.message : 'The quotes could not be loaded.';
    } finally {
      loading.value = false;
    }
  }

  /**
   * Loads one quote into `current`.
   * @param id - quote id
   */
  async function open(id: string): Promise<void> {
    current.value = null;
    error.value = null;
    try {
      current.value = await getQuote(id);
    } catch (err) {
      error.value = err instanceof ApiError ? err.message : 'The quote could not be loaded.';
    }
  }

  /**
   * Makes a quote, puts it at the top of the list and returns it; errors are thrown to the form.
   * @param body - SKU, quantity, delivery date, customer
   */
  async function create(body: QuoteCreate): Promise<Quote> {
    const quote = await createQuote(body);
    current.value = quote;
    await load();
    return quote;
  }

  return { quotes, loading, error, current, load, open, create };
});
