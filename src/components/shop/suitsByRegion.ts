import type { ShopBird } from '../../../shared/schemas/shop';

/** Regions of the species tables, as shop pages name them. */
const REGION_LABELS: Record<string, string> = { europe: 'In Europe', 'north-america': 'In North America' };

/** Suited species of one region, for a line such as "In Europe: Blue tit, Great tit". */
export interface RegionBirds {
  region: string;
  label: string;
  names: string[];
}

/**
 * Groups suited species by the region whose table they come from (a species suited in Europe may be unwanted in
 * North America, so the shop never lists them as one list).
 * @param birds - species with their regions
 */
export function suitsByRegion(birds: readonly ShopBird[]): RegionBirds[] {
  const groups = new Map<string, string[]>();
  for (const bird of birds) groups.set(bird.region, [...(groups.get(bird.region) ?? []), bird.name]);
  return [...groups.entries()].map(([region, names]) => ({ region, label: REGION_LABELS[region] ?? region, names }));
}
