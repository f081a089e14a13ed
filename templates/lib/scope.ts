/** Anything that holds WebAssembly memory and must be freed by hand. */
export interface Deletable {
  delete(): void;
}

let current: Deletable[] | undefined;

/**
 * Registers a kernel object with the innermost {@link scoped} call, which frees it when it returns.
 * @param object - a manifold-3d object
 */
export function track<T extends Deletable>(object: T): T {
  current?.push(object);
  return object;
}

/**
 * Runs `body` and then frees every kernel object tracked while it ran, so repeated builds do not grow WebAssembly
 * memory. Whatever `body` returns must be plain JavaScript data, not a kernel object.
 * @param body - the work to run
 */
export function scoped<T>(body: () => T): T {
  const outer = current;
  const mine: Deletable[] = [];
  current = mine;
  try {
    return body();
  } finally {
    current = outer;
    for (const object of mine) object.delete();
  }
}
