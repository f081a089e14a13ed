import type { GenerateResult } from '../../templates/generate';
import { DEFAULT_PRINTERS } from '../../shared/production/defaults';
import type { DesignFigures } from './geometryProtocol';

/**
 * The figures beside the model for one generated design on one printer, and the per-triangle overhang mask for the
 * viewer. Engines that are not available yet are listed in `unavailable` rather than faked.
 * @param result - the generated design (mesh in build orientation, facts)
 * @param printerId - printer profile id (falls back to the first default printer)
 */
export function computeDesignFigures(
  result: GenerateResult,
  printerId: string,
): { figures: DesignFigures; overhangMask: Uint8Array | null } {
  const printer = DEFAULT_PRINTERS.find((item) => item.id === printerId) ?? DEFAULT_PRINTERS[0];
  const size = boundingSizeMm(result.mesh.positions);
  const plate = printer.buildVolumeMm;
  return {
    figures: {
      volumeMm3: result.volumeMm3,
      surfaceAreaMm2: null,
      boundingBoxMm: size,
      triangleCount: result.triangles,
      bodyCount: result.partCount,
      overhangAreaMm2: null,
      supportVolumeMm3: null,
      fitsPrinter: size[0] <= plate.x && size[1] <= plate.y && size[2] <= plate.z,
      production: null,
      birdFit: null,
      unavailable: ['print-readiness analysis', 'bird-fit guidance'],
    },
    overhangMask: null,
  };
}

/**
 * Size of the axis-aligned bounding box of a position array.
 * @param positions - x, y, z per vertex in millimetres
 */
export function boundingSizeMm(positions: Float32Array): [number, number, number] {
  if (positions.length === 0) return [0, 0, 0];
  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < positions.length; i += 3) {
    for (let axis = 0; axis < 3; axis++) {
      const value = positions[i + axis];
      if (value < min[axis]) min[axis] = value;
      if (value > max[axis]) max[axis] = value;
    }
  }
  return [max[0] - min[0], max[1] - min[1], max[2] - min[2]];
}
