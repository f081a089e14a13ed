import { z } from 'zod';

/** The one error shape every API route answers with. */
export const ApiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
/** The one error shape every API route answers with. */
export type ApiError = z.infer<typeof ApiErrorSchema>;
