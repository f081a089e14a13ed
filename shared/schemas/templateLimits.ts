import { z } from 'zod';

/** Body of `POST /api/templates/:id/limits`: the current parameter values (partial; defaults fill the rest). */
export const TemplateLimitsRequestSchema = z.object({
  params: z.record(z.string(), z.unknown()).default({}),
});

/** The range one numeric parameter may take given the others, in the parameter's own unit. */
export const LiveLimitSchema = z.object({ min: z.number(), max: z.number() });

/** Answer of `POST /api/templates/:id/limits`: a live range for every numeric parameter of the template. */
export const TemplateLimitsResponseSchema = z.object({ limits: z.record(z.string(), LiveLimitSchema) });

/** Request body type. */
export type TemplateLimitsRequest = z.infer<typeof TemplateLimitsRequestSchema>;
/** Response type. */
export type TemplateLimitsResponse = z.infer<typeof TemplateLimitsResponseSchema>;
