/**
 * The studio as the shop knows it (name and locale), asked once per page load and shared by every shop screen. The
 * router waits for it before the first shop screen, so prices are written in the studio's locale from the start.
 */
import { getShopStudio } from '../../api/shop';
import { setFormatLocale } from '../../../shared/format/locale';
import type { StudioFacts } from '../../../shared/schemas/studioFacts';

let known: StudioFacts | null = null;
let asking: Promise<StudioFacts | null> | null = null;

/** The studio's name and locale once learnt, or null while unknown. */
export function shopStudio(): StudioFacts | null {
  return known;
}

/**
 * Learns the studio's name and locale (once; a failed request is asked again next time) and makes the locale the
 * one prices are written in. Never throws: the shop works with the default locale and no name when it fails.
 */
export function loadShopStudio(): Promise<StudioFacts | null> {
  asking ??= getShopStudio()
    .then((studio) => {
      known = studio;
      setFormatLocale(studio.locale);
      return studio;
    })
    .catch(() => {
      asking = null;
      return null;
    });
  return asking;
}
