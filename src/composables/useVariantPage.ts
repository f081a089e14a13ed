import { computed, onMounted, ref, watch } from 'vue';
import type { DataTableSortState } from 'naive-ui';
import type { Variant, VariantVerdict } from '../../shared/schemas/variant';
import { listVariants, type VariantQuery } from '../api/families';

/** What the variant table reads (its props): the family, revision, reload trigger and the row just computed. */
export interface VariantPageOptions {
  familyId: string;
  /** Revision to show; the current one when omitted. */
  revision?: number;
  /** Bump to reload the current page. */
  refreshKey?: number;
  /** Open every row's report. */
  expandAll?: boolean;
  /** The variant a running computation just finished, with a sequence number: its row is refetched at once. */
  justComputed?: { sku: string; seq: number } | null;
}

/**
 * The page of variants the server filters, sorts and pages for the variant table: the rows, total and loading state,
 * the verdict filter, the SKU search (debounced), the sort and the page, reloaded when any of them changes; a row whose
 * result just arrived is refetched alone. A later load wins over an earlier one still on its way.
 * @param options - the table's props (reactive)
 */
export function useVariantPage(options: VariantPageOptions) {
  const rows = ref<Variant[]>([]);
  const total = ref(0);
  const loading = ref(false);
  const error = ref<string | null>(null);
  const page = ref(1);
  const pageSize = ref(10);
  const verdict = ref<VariantVerdict | null>(null);
  const search = ref('');
  const sort = ref<{ key: NonNullable<VariantQuery['sort']>; dir: 'asc' | 'desc' }>({ key: 'index', dir: 'asc' });
  const expanded = ref<string[]>([]);
  let request = 0;

  async function load(): Promise<void> {
    const mine = ++request;
    loading.value = true;
    try {
      const answer = await listVariants(options.familyId, {
        revision: options.revision,
        verdict: verdict.value ?? undefined,
        q: search.value.trim() || undefined,
        sort: sort.value.key,
        dir: sort.value.dir,
        page: page.value,
        pageSize: pageSize.value,
      });
      if (mine !== request) return;
      rows.value = answer.variants;
      total.value = answer.total;
      error.value = null;
      if (options.expandAll) expanded.value = answer.variants.map((variant) => variant.id);
    } catch (err) {
      if (mine === request) error.value = err instanceof Error ? err.message : String(err);
    } finally {
      if (mine === request) loading.value = false;
    }
  }

  onMounted(load);
  watch(() => [options.refreshKey, options.revision], load);

  /** Refetches one row (a variant whose result just arrived) and puts it in place; other rows stay as they are. */
  async function refreshRow(sku: string): Promise<void> {
    if (!rows.value.some((row) => row.sku === sku)) return;
    const mine = request;
    try {
      const answer = await listVariants(options.familyId, { revision: options.revision, q: sku, pageSize: 50 });
      const fresh = answer.variants.find((variant) => variant.sku === sku);
      // A full reload started meanwhile has the newer rows.
      if (!fresh || mine !== request) return;
      rows.value = rows.value.map((row) => (row.sku === sku ? fresh : row));
    } catch {
      // The row stays as it was; the full reload at the end of the computation brings it.
    }
  }
  watch(
    () => options.justComputed?.seq,
    () => {
      if (options.justComputed) void refreshRow(options.justComputed.sku);
    },
  );
  watch([verdict, pageSize], () => {
    page.value = 1;
    void load();
  });
  let searchTimer: ReturnType<typeof setTimeout> | undefined;
  watch(search, () => {
    clearTimeout(searchTimer);
    searchTimer = setTimeout(() => {
      page.value = 1;
      void load();
    }, 250);
  });

  const SORTABLE: Record<string, NonNullable<VariantQuery['sort']>> = {
    sku: 'sku',
    verdict: 'verdict',
    cost: 'costCents',
    support: 'supportVolumeMm3',
    time: 'printTimeMin',
  };

  function onSort(state: DataTableSortState | DataTableSortState[] | null): void {
    const one = Array.isArray(state) ? state[0] : state;
    const key = one && one.order ? SORTABLE[String(one.columnKey)] : undefined;
    sort.value = key ? { key, dir: one!.order === 'descend' ? 'desc' : 'asc' } : { key: 'index', dir: 'asc' };
    void load();
  }

  function sortOrder(columnKey: string): 'ascend' | 'descend' | false {
    return SORTABLE[columnKey] === sort.value.key ? (sort.value.dir === 'asc' ? 'ascend' : 'descend') : false;
  }

  const pagination = computed(() => ({
    page: page.value,
    pageSize: pageSize.value,
    itemCount: total.value,
    pageSizes: [10, 25, 50, 100],
    showSizePicker: true,
    prefix: ({ itemCount }: { itemCount: number | undefined }) => `${itemCount ?? 0} variants`,
  }));

  return {
    rows,
    total,
    loading,
    error,
    page,
    pageSize,
    verdict,
    search,
    expanded,
    load,
    onSort,
    sortOrder,
    pagination,
  };
}
