import { defineStore } from 'pinia';
import { computed, ref, watch } from 'vue';
import { MAX_LINE_QUANTITY } from '../../shared/schemas/shop';

/** One line of the cart as the browser keeps it (the price is for display; the server prices the order). */
export interface CartLine {
  sku: string;
  slug: string;
  productName: string;
  priceMinor: number;
  currency: string;
  quantity: number;
}

const STORAGE_KEY = 'nestwright.shop.cart';

function readStored(): CartLine[] {
  try {
    const parsed: unknown = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? '[]');
    if (!Array.isArray(parsed)) return [];
    return parsed.filter(
      (line): line is CartLine =>
        typeof line?.sku === 'string' && Number.isInteger(line?.quantity) && line.quantity > 0,
    );
  } catch {
    return [];
  }
}

/** The shop cart, kept in localStorage so it survives reloads. */
export const useCartStore = defineStore('cart', () => {
  const lines = ref<CartLine[]>(readStored());
  watch(lines, (value) => localStorage.setItem(STORAGE_KEY, JSON.stringify(value)), { deep: true });
  const count = computed(() => lines.value.reduce((sum, line) => sum + line.quantity, 0));
  const subtotalMinor = computed(() => lines.value.reduce((sum, line) => sum + line.priceMinor * line.quantity, 0));

  /** Adds units of a variant (to its line when it is there). @param line - the variant @param quantity - how many */
  function add(line: Omit<CartLine, 'quantity'>, quantity: number): void {
    const existing = lines.value.find((l) => l.sku === line.sku);
    if (existing) existing.quantity = Math.min(MAX_LINE_QUANTITY, existing.quantity + quantity);
    else lines.value.push({ ...line, quantity: Math.min(MAX_LINE_QUANTITY, quantity) });
  }

  /** Sets a line's quantity (1–50). @param sku - the line @param quantity - how many */
  function setQuantity(sku: string, quantity: number): void {
    const line = lines.value.find((l) => l.sku === sku);
    if (line && Number.isInteger(quantity)) line.quantity = Math.max(1, Math.min(MAX_LINE_QUANTITY, quantity));
  }

  /** Removes a line. @param sku - the line */
  function remove(sku: string): void {
    lines.value = lines.value.filter((l) => l.sku !== sku);
  }

  /** Empties the cart (after a paid order). */
  function clear(): void {
    lines.value = [];
  }

  return { lines, count, subtotalMinor, add, setQuantity, remove, clear };
});
