/**
 * The state of the quote form: the fields, loading a quote to edit, the catalogue price of each line, the estimate
 * shown while typing, field messages that go when their value changes, and saving. The totals are an estimate from
 * the same arithmetic the server uses; the server prices the quote when it is saved.
 */
import { computed, onMounted, reactive, ref, watch } from 'vue';
import { useRoute, useRouter } from 'vue-router';
import { quoteTotals } from '../../shared/quotes/quoteTotals';
import { isQuoteEditable } from '../../shared/quotes/quoteStatus';
import {
  QUOTE_DEFAULT_VALID_DAYS,
  QuoteInputSchema,
  type Quote,
  type QuoteInputBody,
} from '../../shared/schemas/quote';
import type { QuantityBreak } from '../../shared/schemas/sales';
import { addDays, formatMoney } from '../../shared/format';
import { ApiError } from '../api/ApiError';
import { getQuote } from '../api/quotes';
import { getSalesSettings } from '../api/sales';
import { useCatalogueStore } from '../stores/catalogue';
import { useQuotesStore } from '../stores/quotes';

/** One line as the form holds it. */
export interface QuoteLineForm {
  key: number;
  sku: string | null;
  quantity: number | null;
  /** Agreed unit price in currency units; null = the break price. */
  unitPrice: number | null;
}

let nextKey = 1;
const newLine = (sku: string | null = null): QuoteLineForm => ({ key: nextKey++, sku, quantity: 50, unitPrice: null });

/** Currency units as cents (null stays null). */
export const toCents = (amount: number | null): number | null => (amount === null ? null : Math.round(amount * 100));

/** The value at a dotted path (`lines.0.quantity`) of a body. */
function valueAt(value: unknown, path: string): unknown {
  return path
    .split('.')
    .reduce<unknown>((v, key) => (v && typeof v === 'object' ? (v as Record<string, unknown>)[key] : undefined), value);
}

/** The quote form of the route (`quote-edit` with an id edits that quote; otherwise a new one). */
export function useQuoteForm() {
  const route = useRoute();
  const router = useRouter();
  const quotes = useQuotesStore();
  const catalogue = useCatalogueStore();

  const quoteId = computed(() => (route.name === 'quote-edit' ? String(route.params.id) : null));
  const form = reactive({
    customerName: '',
    deliveryDate: addDays(new Date(), 28) as string | null,
    validUntil: addDays(new Date(), QUOTE_DEFAULT_VALID_DAYS) as string | null,
    terms: '',
    taxRatePct: 0 as number | null,
    shipping: 0 as number | null,
    lines: [newLine(typeof route.query.sku === 'string' ? route.query.sku : null)] as QuoteLineForm[],
  });
  const fieldErrors = ref<Record<string, string>>({});
  const submitError = ref<string | null>(null);
  const saving = ref(false);
  const loadError = ref<string | null>(null);
  const original = ref<Quote | null>(null);
  const breaks = ref<QuantityBreak[]>([]);
  const ready = ref(quoteId.value === null);

  onMounted(async () => {
    void catalogue.load();
    const settings = getSalesSettings().catch(() => null);
    if (quoteId.value) {
      try {
        const quote = await getQuote(quoteId.value);
        original.value = quote;
        Object.assign(form, {
          customerName: quote.customerName,
          deliveryDate: quote.deliveryDate,
          validUntil: quote.validUntil,
          terms: quote.terms,
          taxRatePct: quote.taxRatePct,
          shipping: quote.shippingCents / 100,
          lines: quote.lines.map((line) => ({
            key: nextKey++,
            sku: line.sku,
            quantity: line.quantity,
            unitPrice: line.priceSetByHand ? line.unitPriceCents / 100 : null,
          })),
        });
      } catch (err) {
        loadError.value = err instanceof Error ? err.message : 'The quote could not be loaded.';
      }
      ready.value = true;
    }
    const stored = await settings;
    if (stored) {
      breaks.value = stored.settings.quantityBreaks;
      if (!quoteId.value) form.taxRatePct = stored.settings.shop.vatRatePct;
    }
  });

  const skuOptions = computed(() =>
    catalogue.variants.map((v) => ({
      label: `${v.sku} · ${v.family.name} · ${formatMoney(v.priceCents, v.currency)}`,
      value: v.sku,
    })),
  );
  const variantBySku = computed(() => new Map(catalogue.variants.map((v) => [v.sku, v])));
  const currency = computed(() => {
    const first = form.lines.find((line) => line.sku && variantBySku.value.has(line.sku));
    return first ? variantBySku.value.get(first.sku!)!.currency : (original.value?.currency ?? 'EUR');
  });

  /** The catalogue's price for a line at its quantity (list price less the largest break at or below it). */
  function breakPriceCents(line: QuoteLineForm): number | null {
    const variant = line.sku ? variantBySku.value.get(line.sku) : undefined;
    if (!variant || !line.quantity) return null;
    const applicable = breaks.value.filter((b) => b.minQuantity <= line.quantity!);
    const pct = applicable.length > 0 ? applicable[applicable.length - 1].discountPct : 0;
    return Math.round(variant.priceCents * (1 - pct / 100));
  }

  /** The estimate shown while typing; null when a line has no product or price yet. */
  const estimate = computed(() => {
    const priced = form.lines.map((line) => ({
      quantity: Number.isInteger(line.quantity) ? line.quantity! : 0,
      unitPriceCents: toCents(line.unitPrice) ?? breakPriceCents(line),
    }));
    if (priced.some((line) => line.unitPriceCents === null)) return null;
    return quoteTotals({
      lines: priced as Array<{ quantity: number; unitPriceCents: number }>,
      shippingCents: toCents(form.shipping) ?? 0,
      taxRatePct: form.taxRatePct ?? 0,
    });
  });

  function addLine(): void {
    form.lines.push(newLine());
  }
  function removeLine(index: number): void {
    form.lines.splice(index, 1);
    fieldErrors.value = {};
  }

  function body(): QuoteInputBody {
    return {
      customerName: form.customerName,
      deliveryDate: form.deliveryDate ?? '',
      validUntil: form.validUntil ?? '',
      terms: form.terms,
      taxRatePct: form.taxRatePct ?? 0,
      shippingCents: toCents(form.shipping) ?? 0,
      lines: form.lines.map((line) => ({
        sku: line.sku ?? '',
        quantity: line.quantity ?? undefined,
        unitPriceCents: toCents(line.unitPrice),
      })) as QuoteInputBody['lines'],
    };
  }

  // A field's message goes as soon as its value changes, so no older message stays beside a new value.
  watch(
    () => JSON.stringify(body()),
    (now, before) => {
      if (!before || Object.keys(fieldErrors.value).length === 0) return;
      const [next, prev] = [JSON.parse(now) as unknown, JSON.parse(before) as unknown];
      const kept = Object.fromEntries(
        Object.entries(fieldErrors.value).filter(
          ([path]) => JSON.stringify(valueAt(next, path)) === JSON.stringify(valueAt(prev, path)),
        ),
      );
      if (Object.keys(kept).length !== Object.keys(fieldErrors.value).length) {
        fieldErrors.value = kept;
        if (Object.keys(kept).length === 0) submitError.value = null;
      }
    },
  );

  async function submit(): Promise<void> {
    submitError.value = null;
    const parsed = QuoteInputSchema.safeParse(body());
    if (!parsed.success) {
      fieldErrors.value = Object.fromEntries(
        [...parsed.error.issues].reverse().map((issue) => [issue.path.map(String).join('.'), issue.message]),
      );
      submitError.value = 'Check the marked fields.';
      return;
    }
    fieldErrors.value = {};
    saving.value = true;
    try {
      const quote = await quotes.save(quoteId.value, body());
      await router.push({ name: 'quote-detail', params: { id: quote.id } });
    } catch (err) {
      if (err instanceof ApiError) fieldErrors.value = err.fieldErrors;
      submitError.value = err instanceof Error ? err.message : 'The quote could not be saved.';
    } finally {
      saving.value = false;
    }
  }

  return {
    form,
    original,
    ready,
    loadError,
    saving,
    submitError,
    loadingCatalogue: computed(() => catalogue.loading),
    skuOptions,
    currency,
    breakPriceCents,
    estimate,
    addLine,
    removeLine,
    submit,
    locked: computed(() => original.value !== null && !isQuoteEditable(original.value.status)),
    title: computed(() => (original.value ? `Edit quote ${original.value.reference}` : 'New quote')),
    errorOf: (path: string): string | undefined => fieldErrors.value[path],
    status: (path: string) => (fieldErrors.value[path] ? ('error' as const) : undefined),
  };
}
