import { inKernel } from './kernelClock';
import type { SolidCache } from './SolidCache';
import { Solid } from './Solid';

/**
 * How finely a template builds: `full` for exports, hashes, figures that are shown as final, and the release of a
 * slider; `draft` while a slider is held (fewer segments on curves, a coarser bark texture, shingles as slabs).
 */
export type BuildQuality = 'draft' | 'full';

/** Parameter values a sub-solid may depend on. */
type ParamValue = number | boolean | string;

/**
 * What a template's `build` gets beside its parameters: the quality to build at, and `reuse`, which returns a
 * sub-solid from the cache when the parameters it declares it depends on are unchanged.
 */
export class BuildContext {
  /**
   * @param quality - draft or full
   * @param scopeKey - template id and version, so two templates never share an entry
   * @param cache - kept across builds by the caller (the editor's worker); none means every sub-solid is built
   */
  constructor(
    readonly quality: BuildQuality,
    private readonly scopeKey = '',
    private readonly cache?: SolidCache,
  ) {}

  /** Whether this is a draft build. */
  get draft(): boolean {
    return this.quality === 'draft';
  }

  /**
   * Picks a resolution by quality.
   * @param full - value for a full build
   * @param draft - value for a draft build
   */
  pick<T>(full: T, draft: T): T {
    return this.quality === 'draft' ? draft : full;
  }

  /**
   * A sub-solid that depends only on the listed parameters. `make` receives just those parameters and must read
   * nothing else that varies (constants and the quality are fine): the cache key is their values. The solid is
   * evaluated before it is used further, with or without a cache, so a reused sub-solid gives the same mesh bytes as
   * a cold build.
   * @param name - the sub-solid's name, unique within the template
   * @param params - the template's parsed parameters
   * @param keys - the parameters the sub-solid depends on
   * @param make - builds the sub-solid from those parameters
   */
  reuse<P extends Record<string, ParamValue>, K extends keyof P & string>(
    name: string,
    params: P,
    keys: readonly K[],
    make: (picked: Pick<P, K>) => Solid,
  ): Solid {
    const picked = {} as Pick<P, K>;
    for (const key of keys) picked[key] = params[key];
    const key = `${this.scopeKey}|${this.quality}|${name}|${JSON.stringify(keys.map((k) => [k, params[k]]))}`;
    const stored = this.cache?.get(key, this.quality);
    if (stored) return new Solid(inKernel(() => stored.translate([0, 0, 0])));
    const solid = make(picked);
    inKernel(() => solid.manifold.status());
    // A second handle on the same evaluated solid, owned by the cache (not freed with the build's scope).
    if (this.cache)
      this.cache.set(
        key,
        inKernel(() => solid.manifold.translate([0, 0, 0])),
        this.quality,
      );
    return solid;
  }
}
