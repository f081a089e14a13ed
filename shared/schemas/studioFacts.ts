/** What the app and the shop learn of the studio (kept apart from the settings schemas, so the shop loads little). */
import { z } from 'zod';

/** The studio's name and the locale (BCP 47 tag) figures are written in (`/api/settings/studio`, `/api/shop/studio`). */
export const StudioFactsSchema = z.object({ name: z.string(), locale: z.string() });
/** See {@link StudioFactsSchema}. */
export type StudioFacts = z.infer<typeof StudioFactsSchema>;
