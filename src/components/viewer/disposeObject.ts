import type { Material, Object3D } from 'three';

/**
 * Disposes every geometry and material below an object (three.js frees GPU memory only on dispose()).
 * @param root - the object whose subtree is released; it is also removed from its parent
 */
export function disposeObject(root: Object3D): void {
  root.traverse((node) => {
    const holder = node as Object3D & { geometry?: { dispose(): void }; material?: Material | Material[] };
    holder.geometry?.dispose();
    const materials = Array.isArray(holder.material) ? holder.material : holder.material ? [holder.material] : [];
    for (const material of materials) material.dispose();
  });
  root.removeFromParent();
}
