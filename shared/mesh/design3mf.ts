import { layoutUnitOnPlates } from '../analysis/plateLayout';
import type { IndexedMesh } from '../schemas/mesh';
import { write3mfParts, type ThreeMfMaterial, type ThreeMfPart } from './write3mf';

/** Gap between plates when a unit's parts need several plates and the package shows them side by side (mm). */
export const PLATE_GAP_MM = 20;

/** A generated design as {@link design3mf} needs it (a `generate()` result has these fields). */
export interface Design3mfInput {
  template: { id: string; version: number };
  /** All parts one after another, in build orientation, mm. */
  mesh: IndexedMesh;
  /** Part names in mesh order (`floor-plug` is written "floor plug"). */
  partNames: string[];
  /** Triangles of each part, in mesh order. */
  partTriangles: number[];
}

/** What the design is printed on and in. */
export interface Design3mfChoice {
  /** Build volume [x, y, z] of the printer whose plate the parts are laid on. */
  buildVolumeMm: readonly number[];
  /** Material and colour (base materials entry); none when omitted. */
  material?: ThreeMfMaterial;
  /** Gap between parts on a plate (mm). */
  spacingMm?: number;
}

/**
 * The mesh of one part: the part's triangles with only the vertices they use, renumbered in first-use order.
 * @param mesh - all parts one after another
 * @param firstTriangle - the part's first triangle
 * @param triangleCount - the part's triangles
 */
export function extractPart(mesh: IndexedMesh, firstTriangle: number, triangleCount: number): IndexedMesh {
  const map = new Map<number, number>();
  const indices = new Uint32Array(triangleCount * 3);
  const positions: number[] = [];
  for (let i = 0; i < triangleCount * 3; i++) {
    const source = mesh.indices[firstTriangle * 3 + i];
    let target = map.get(source);
    if (target === undefined) {
      target = map.size;
      map.set(source, target);
      positions.push(mesh.positions[source * 3], mesh.positions[source * 3 + 1], mesh.positions[source * 3 + 2]);
    }
    indices[i] = target;
  }
  return { positions: Float32Array.from(positions), indices };
}

/** Moves a mesh so its bounding box starts at the origin; returns the moved mesh and its size. */
function toOrigin(mesh: IndexedMesh): { mesh: IndexedMesh; sizeMm: [number, number, number] } {
  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  const p = mesh.positions;
  for (let i = 0; i < p.length; i++) {
    const axis = i % 3;
    if (p[i] < min[axis]) min[axis] = p[i];
    if (p[i] > max[axis]) max[axis] = p[i];
  }
  const positions = new Float32Array(p.length);
  for (let i = 0; i < p.length; i++) positions[i] = p[i] - min[i % 3];
  return { mesh: { positions, indices: mesh.indices }, sizeMm: [max[0] - min[0], max[1] - min[1], max[2] - min[2]] };
}

/**
 * The design as a 3MF package: each part its own named object ("body", "floor plug") with its vertices moved to the
 * origin, the material and colour as the core's base materials, and one build item per part whose transform places
 * it where the plate rule lays it ({@link layoutUnitOnPlates}): together on one plate when a set fits, otherwise
 * each part on a plate of its own, the plates side by side along x with a {@link PLATE_GAP_MM} gap. Metadata says
 * which layout it is.
 * @param design - the generated design
 * @param choice - printer build volume and material
 */
export function design3mf(design: Design3mfInput, choice: Design3mfChoice): Uint8Array {
  let first = 0;
  const pieces = design.partTriangles.map((count) => {
    const piece = toOrigin(extractPart(design.mesh, first, count));
    first += count;
    return piece;
  });
  const layout = layoutUnitOnPlates(
    pieces.map((piece) => piece.sizeMm),
    choice.buildVolumeMm,
    choice.spacingMm,
  );
  const plateStep = choice.buildVolumeMm[0] + PLATE_GAP_MM;
  const parts: ThreeMfPart[] = pieces.map((piece, i) => {
    const place = layout.placements[i];
    const x = place.xMm + place.plate * plateStep;
    // A turned part: rotate 90° about z (x' = -y, y' = x) and shift it back onto its footprint.
    const transform = place.turned
      ? [0, 1, 0, -1, 0, 0, 0, 0, 1, x + piece.sizeMm[1], place.yMm, 0]
      : [1, 0, 0, 0, 1, 0, 0, 0, 1, x, place.yMm, 0];
    return { name: (design.partNames[i] ?? `part ${i + 1}`).replace(/[-_]/g, ' '), mesh: piece.mesh, transform };
  });
  const plates =
    layout.layout === 'together'
      ? 'all parts on one build plate'
      : `${layout.plates} build plates, one part on each (shown side by side)`;
  return write3mfParts(parts, {
    material: choice.material,
    metadata: {
      Title: `${design.template.id} v${design.template.version}`,
      Application: 'Nestwright',
      Description: `Parts laid out for a ${choice.buildVolumeMm.slice(0, 2).join(' × ')} mm plate: ${plates}.`,
    },
  });
}
