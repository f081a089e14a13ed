import type { Manifold } from 'manifold-3d';
import type { BuildQuality } from './BuildContext';

/**
 * A small least-recently-used store of finished kernel solids, kept across builds (the editor's geometry worker
 * holds one), so a sub-solid whose parameters did not change is not rebuilt. Draft and full solids are kept in two
 * pools of the same size, so a drag (many drafts) never evicts the full solids a release or the next slider needs.
 * The entries hold WebAssembly memory outside any `scoped()` call: an evicted entry is freed here, and
 * {@link SolidCache.clear} frees them all.
 */
export class SolidCache {
  private readonly pools: Record<BuildQuality, Map<string, Manifold>> = { draft: new Map(), full: new Map() };
  /** Look-ups answered from the store, and look-ups that had to build (for the bench and the tests). */
  readonly counts = { hits: 0, misses: 0 };

  /**
   * @param maxEntries - how many sub-solids to keep per quality (a template has a handful); 12 keeps the 24 solids in
   * all that one shared pool held before
   */
  constructor(private readonly maxEntries = 12) {}

  /**
   * The stored solid for this key, marked as the most recently used, or undefined.
   * @param key - template, version, quality, sub-solid name and the values it depends on
   * @param quality - the pool to look in
   */
  get(key: string, quality: BuildQuality = 'full'): Manifold | undefined {
    const pool = this.pools[quality];
    const found = pool.get(key);
    if (found === undefined) {
      this.counts.misses++;
      return undefined;
    }
    this.counts.hits++;
    pool.delete(key);
    pool.set(key, found);
    return found;
  }

  /**
   * Stores a solid the cache now owns (it frees it on eviction), evicting the least recently used of its pool beyond
   * the limit.
   * @param key - as for {@link SolidCache.get}
   * @param solid - a kernel solid not tracked by any `scoped()` call
   * @param quality - the pool to keep it in
   */
  set(key: string, solid: Manifold, quality: BuildQuality = 'full'): void {
    const pool = this.pools[quality];
    pool.get(key)?.delete();
    pool.delete(key);
    pool.set(key, solid);
    while (pool.size > this.maxEntries) {
      const [oldest, stale] = pool.entries().next().value as [string, Manifold];
      stale.delete();
      pool.delete(oldest);
    }
  }

  /** Number of stored solids, both pools. */
  get size(): number {
    return this.pools.draft.size + this.pools.full.size;
  }

  /** Frees every stored solid. */
  clear(): void {
    for (const pool of Object.values(this.pools)) {
      for (const solid of pool.values()) solid.delete();
      pool.clear();
    }
  }
}
