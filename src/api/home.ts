import { TodoResponseSchema, type TodoItem } from '../../shared/schemas/todo';
import { api } from './client';

/**
 * What waits for the signed-in person: the to-do counts of the roles they hold.
 * @returns the counts, in role order
 */
export async function fetchTodo(): Promise<TodoItem[]> {
  return (await api('/home/todo', { schema: TodoResponseSchema })).items;
}
