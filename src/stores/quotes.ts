import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Quote, QuoteInputBody, QuoteStatus, QuoteSummary } from '../../shared/schemas/quote';
import { copyQuote, createQuote, getQuote, listQuotes, setQuoteStatus, updateQuote } from '../api/quotes';
import { ApiError } from '../api/ApiError';

/** Wholesale quotes: the list, the one open in the detail screen, and making, changing and copying them. */
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

  /** Keeps `current` and the list in step with a quote the server answered with. */
  async function settle(quote: Quote): Promise<Quote> {
    current.value = quote;
    await load();
    return quote;
  }

  /**
   * Saves a new quote (no id) or the changes to one; errors are thrown to the form.
   * @param id - the quote to change, or null for a new one
   * @param body - the whole quote
   */
  async function save(id: string | null, body: QuoteInputBody): Promise<Quote> {
    return settle(id ? await updateQuote(id, body) : await createQuote(body));
  }

  /**
   * Copies a quote into a new draft; errors are thrown.
   * @param id - the quote to copy
   */
  async function copy(id: string): Promise<Quote> {
    return settle(await copyQuote(id));
  }

  /**
   * Moves a quote to another state; errors are thrown.
   * @param id - quote id
   * @param status - the new state
   */
  async function changeStatus(id: string, status: QuoteStatus): Promise<Quote> {
    return settle(await setQuoteStatus(id, status));
  }

  return { quotes, loading, error, current, load, open, save, copy, changeStatus };
});
