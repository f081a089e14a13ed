import Module from 'manifold-3d';
import type { ManifoldToplevel } from 'manifold-3d';

let loading: Promise<ManifoldToplevel> | undefined;
let loaded: ManifoldToplevel | undefined;

/**
 * Loads the manifold-3d WebAssembly kernel once (browser and Node). Templates do their booleans with it because
 * JSCAD's BSP booleans are slow on curved bodies and can leave T-junctions; manifold-3d guarantees manifold output.
 */
export function loadKernel(): Promise<ManifoldToplevel> {
  loading ??= Module().then((wasm) => {
    wasm.setup();
    loaded = wasm;
    return wasm;
  });
  return loading;
}

/** The loaded kernel; `build()` runs synchronously, so callers `await loadKernel()` first (generate() does). */
export function kernel(): ManifoldToplevel {
  if (!loaded) throw new Error('Geometry kernel not loaded: await loadKernel() before building a template');
  return loaded;
}
