import { seededRandom } from './seededRandom';
import { Solid } from './Solid';

/** Size and texture of a bark-covered upright cylinder. */
export interface BarkTubeOptions {
  /** Radius of the smooth cylinder the bark is carved into (the ridges' outer radius). */
  radiusMm: number;
  heightMm: number;
  /** Depth of the furrows; 0 gives a smooth cylinder. */
  barkDepthMm: number;
  /** Pattern seed. */
  seed: number;
  /** Points round the circumference. */
  segments: number;
  /** Vertical spacing of the mesh rows. */
  rowMm: number;
}

/**
 * A solid upright cylinder (z from 0 to height) whose side carries a bark pattern: furrows that wander as they run
 * up the trunk. The radial change per millimetre of height stays well under 1, so no face is more than 45° from
 * vertical and the texture prints without support (source: 45° self-supporting rule, Mazlan et al., J. Adv. Ind. Tech. & Appl. (UTHM), 2020).
 * @param options - size, texture depth, seed and resolution
 */
export function barkTube(options: BarkTubeOptions): Solid {
  const { radiusMm: R, heightMm: H, barkDepthMm: depth, segments: n } = options;
  const random = seededRandom(options.seed);
  const ridges = 9 + Math.floor(random() * 5);
  const phase1 = random() * Math.PI * 2;
  const phase2 = random() * Math.PI * 2;
  const wobble = Array.from({ length: ridges }, () => 0.6 + random() * 0.8);
  const rows = Math.max(2, Math.ceil(H / options.rowMm));
  const radius = (theta: number, z: number): number => {
    const drift = 0.9 * Math.sin(z / 30 + phase1) + 0.35 * Math.sin(z / 12 + phase2);
    const ridge = Math.floor(((theta / (2 * Math.PI)) * ridges + 10 * ridges) % ridges);
    const wave = Math.sin(ridges * theta + drift);
    // Sharpen the furrows: flat-topped plates with narrow cracks between them.
    const furrow = Math.max(0, wave) ** 3 * wobble[ridge];
    return R - depth * Math.min(1, furrow);
  };
  const vertexCount = n * (rows + 1) + 2;
  const positions = new Float32Array(vertexCount * 3);
  for (let k = 0; k <= rows; k++) {
    const z = (H * k) / rows;
    for (let i = 0; i < n; i++) {
      const theta = (2 * Math.PI * i) / n;
      const r = radius(theta, z);
      const at = (k * n + i) * 3;
      positions[at] = r * Math.cos(theta);
      positions[at + 1] = r * Math.sin(theta);
      positions[at + 2] = z;
    }
  }
  const bottom = n * (rows + 1);
  const top = bottom + 1;
  positions.set([0, 0, 0], bottom * 3);
  positions.set([0, 0, H], top * 3);
  const indices = new Uint32Array((rows * n * 2 + 2 * n) * 3);
  let at = 0;
  const tri = (a: number, b: number, c: number): void => {
    indices[at++] = a;
    indices[at++] = b;
    indices[at++] = c;
  };
  for (let k = 0; k < rows; k++) {
    for (let i = 0; i < n; i++) {
      const a = k * n + i;
      const b = k * n + ((i + 1) % n);
      tri(a, b, b + n);
      tri(a, b + n, a + n);
    }
  }
  for (let i = 0; i < n; i++) {
    tri(bottom, (i + 1) % n, i);
    tri(top, rows * n + i, rows * n + ((i + 1) % n));
  }
  return Solid.fromMesh(positions, indices);
}
