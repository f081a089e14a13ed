/**
 * Time spent inside manifold-3d calls, summed over the life of the process (or worker). The preview bench reads it
 * before and after a build to print the kernel's share of the build; templates never read it.
 */
let spentMs = 0;

/**
 * Runs one manifold-3d call and adds its duration to the kernel clock. The kernel evaluates booleans lazily, so the
 * calls that force evaluation (status, getMesh, volume, bounds) are timed as well as the ones that build solids.
 * @param call - the kernel call
 */
export function inKernel<T>(call: () => T): T {
  const started = performance.now();
  try {
    return call();
  } finally {
    spentMs += performance.now() - started;
  }
}

/** Milliseconds spent inside manifold-3d calls so far in this process or worker. */
export function kernelTimeMs(): number {
  return spentMs;
}
