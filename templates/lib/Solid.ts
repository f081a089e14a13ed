import type { Manifold, SimplePolygon, Vec3 } from 'manifold-3d';
import { kernel } from './kernel';
import { inKernel } from './kernelClock';
import { track } from './scope';

/** A 2D outline: counter-clockwise [x, y] points. */
export type Outline = [number, number][];

/**
 * A thin, chainable wrapper round a manifold-3d solid whose every intermediate result is tracked by the surrounding
 * `scoped()` call and freed with it. Templates build with it; the result always stays closed and manifold.
 */
export class Solid {
  /** @param manifold - the kernel solid (tracked on construction) */
  constructor(readonly manifold: Manifold) {
    track(manifold);
  }

  /** Box of the given size with its minimum corner at `min` (default the origin). */
  static box(size: Vec3, min: Vec3 = [0, 0, 0]): Solid {
    return new Solid(inKernel(() => track(kernel().Manifold.cube(size, false)).translate(min)));
  }

  /** Cylinder along +z from z = 0 to `heightMm`; `topRadiusMm` makes a cone frustum. */
  static cylinder(heightMm: number, radiusMm: number, segments: number, topRadiusMm = radiusMm): Solid {
    return new Solid(inKernel(() => kernel().Manifold.cylinder(heightMm, radiusMm, topRadiusMm, segments, false)));
  }

  /** Sphere centred on the origin. */
  static sphere(radiusMm: number, segments: number): Solid {
    return new Solid(inKernel(() => kernel().Manifold.sphere(radiusMm, segments)));
  }

  /** Extrudes outlines in the xy plane along +z from 0 to `heightMm` (holes wound clockwise or by even-odd). */
  static extrude(outlines: Outline[], heightMm: number): Solid {
    return new Solid(inKernel(() => kernel().Manifold.extrude(outlines as SimplePolygon[], heightMm)));
  }

  /**
   * Extrudes an outline along an axis between two coordinates. The outline is drawn in the plane across the axis:
   * (y, z) for `x`, (x, z) for `y`, (x, y) for `z`; every mapping is a proper rotation, so winding stays outward.
   */
  static prism(outline: Outline, axis: 'x' | 'y' | 'z', startMm: number, endMm: number): Solid {
    const length = endMm - startMm;
    return new Solid(
      inKernel(() => {
        const raw = track(kernel().Manifold.extrude([outline] as SimplePolygon[], length));
        if (axis === 'z') return raw.translate([0, 0, startMm]);
        if (axis === 'x') return raw.transform([0, 1, 0, 0, 0, 0, 1, 0, 1, 0, 0, 0, startMm, 0, 0, 1]);
        return raw.transform([1, 0, 0, 0, 0, 0, 1, 0, 0, -1, 0, 0, 0, endMm, 0, 1]);
      }),
    );
  }

  /** A solid from a closed, outward-wound triangle mesh (flat xyz positions, three indices per triangle). */
  static fromMesh(positions: Float32Array, indices: Uint32Array): Solid {
    const { Manifold, Mesh } = kernel();
    return new Solid(
      inKernel(() => new Manifold(new Mesh({ numProp: 3, vertProperties: positions, triVerts: indices }))),
    );
  }

  /** Revolves an outline given in the (r, z) half plane, r ≥ 0, about the z axis. */
  static revolve(outline: Outline, segments: number): Solid {
    return new Solid(inKernel(() => kernel().Manifold.revolve([outline] as SimplePolygon[], segments)));
  }

  /** Convex hull of points. */
  static hull(points: Vec3[]): Solid {
    return new Solid(inKernel(() => kernel().Manifold.hull(points)));
  }

  /** Union of many solids (empty input gives an empty solid). */
  static union(solids: Solid[]): Solid {
    return new Solid(inKernel(() => kernel().Manifold.union(solids.map((solid) => solid.manifold))));
  }

  translate(x: number, y: number, z: number): Solid {
    return new Solid(inKernel(() => this.manifold.translate([x, y, z])));
  }

  /** Rotates by Euler angles in degrees (x, then y, then z). */
  rotate(x: number, y: number, z: number): Solid {
    return new Solid(inKernel(() => this.manifold.rotate([x, y, z])));
  }

  scale(x: number, y: number, z: number): Solid {
    return new Solid(inKernel(() => this.manifold.scale([x, y, z])));
  }

  add(...others: Solid[]): Solid {
    return others.length === 0 ? this : Solid.union([this, ...others]);
  }

  subtract(...others: Solid[]): Solid {
    if (others.length === 0) return this;
    const tool = Solid.union(others);
    return new Solid(inKernel(() => this.manifold.subtract(tool.manifold)));
  }

  intersect(other: Solid): Solid {
    return new Solid(inKernel(() => this.manifold.intersect(other.manifold)));
  }

  /** Moves every vertex with `move(vertex)` in place; callers keep the result free of self-intersection. */
  warp(move: (vertex: Vec3) => void): Solid {
    return new Solid(inKernel(() => this.manifold.warp(move)));
  }

  /** Splits every edge into `n` pieces so a later warp has vertices to move. */
  refine(n: number): Solid {
    return new Solid(inKernel(() => this.manifold.refine(n)));
  }

  /** Enclosed volume in mm³. */
  volumeMm3(): number {
    return inKernel(() => this.manifold.volume());
  }

  /** Axis-aligned bounds. */
  bounds(): { min: Vec3; max: Vec3 } {
    return inKernel(() => this.manifold.boundingBox());
  }

  /** Moves the solid so its lowest point rests on z = 0. */
  onPlate(): Solid {
    return this.translate(0, 0, -this.bounds().min[2]);
  }
}
