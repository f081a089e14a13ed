/** The home page's to-do counts: what waits for the signed-in person, per role they hold. */
import { z } from 'zod';
import { RoleSchema } from './auth';

/** One count on the home page, with where to deal with it. */
export const TodoItemSchema = z.object({
  /** Stable key, e.g. `designer.sent_back`. */
  key: z.string(),
  /** The role this belongs to. */
  role: RoleSchema,
  /** What is counted, written for people, e.g. "Families sent back to you". */
  label: z.string(),
  count: z.number().int().nonnegative(),
  /** Client path of the screen where the work is done. */
  path: z.string(),
});
/** One to-do count. */
export type TodoItem = z.infer<typeof TodoItemSchema>;

/** Answer of `GET /api/home/todo`: the counts for every role the person holds, in role order. */
export const TodoResponseSchema = z.object({ items: z.array(TodoItemSchema) });
/** Answer of `GET /api/home/todo`. */
export type TodoResponse = z.infer<typeof TodoResponseSchema>;
