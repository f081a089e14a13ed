import type { Manifold } from 'manifold-3d';

/**
 * A small least-recently-used store of finished kernel solids, kept across builds (the editor's geometry worker
 * holds one), so a sub-solid whose parameters did not change is not rebuilt. The entries hold WebAssembly memory
 * outside any `scoped()` call: an evicted entry is freed here, and {@link SolidCache.clear} frees them all.
 */
export class SolidCache {
  private readonly entries = new Map<string, Manifold>();
  /** Look-ups answered from the store, and look-ups that had to build (for the bench and the tests). */
  readonly counts = { hits: 0, misses: 0 };

  /** @param maxEntries - how many sub-solids to keep (a template has a handful, each at two qualities) */
  constructor(private readonly maxEntries = 24) {}

  /**
   * The stored solid for this key, marked as the most recently used, or undefined.
   * @param key - template, version, quality, sub-solid name and the values it depends on
   */
  get(key: string): Manifold | undefined {
    const found = this.entries.get(key);
    if (found === undefined) {
      this.counts.misses++;
      return undefined;
    }
    this.counts.hits++;
    this.entries.delete(key);
    this.entries.set(key, found);
    return found;
  }

  /**
   * Stores a solid the cache now owns (it frees it on eviction), evicting the least recently used beyond the limit.
   * @param key - as for {@link SolidCache.get}
   * @param solid - a kernel solid not tracked by any `scoped()` call
   */
  set(key: string, solid: Manifold): void {
    this.entries.get(key)?.delete();
    this.entries.delete(key);
    this.entries.set(key, solid);
    while (this.entries.size > this.maxEntries) {
      const [oldest, stale] = this.entries.entries().next().value as [string, Manifold];
      stale.delete();
      this.entries.delete(oldest);
    }
  }

  /** Number of stored solids. */
  get size(): number {
    return this.entries.size;
  }

  /** Frees every stored solid. */
  clear(): void {
    for (const solid of this.entries.values()) solid.delete();
    this.entries.clear();
  }
}
