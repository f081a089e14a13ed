import type { IndexedMesh } from '../schemas/mesh';

/** Options of {@link shadedViewSvg}. */
export interface ShadedViewOptions {
  /** Body colour, #rrggbb. */
  colourHex: string;
  /** Turn of the camera from straight in front, towards the right side (default 35°). */
  azimuthDeg?: number;
  /** Camera height above the horizon (default 22°). */
  elevationDeg?: number;
  /** Width of the SVG in pixels; the height follows the part (default 600). */
  widthPx?: number;
}

/**
 * A shaded parallel view of a part standing upright (+z up, front facing −y), as SVG: faces turned away from the
 * camera are dropped, the rest painted far to near with diffuse light from the upper left, in the part's colour.
 * Painter's order can misorder a few faces on concave parts; it is a picture for a document, not a measurement.
 * @param mesh - the part in millimetres
 * @param options - colour, camera angles and size
 * @returns an SVG document
 */
export function shadedViewSvg(mesh: IndexedMesh, options: ShadedViewOptions): string {
  const az = ((options.azimuthDeg ?? 35) * Math.PI) / 180;
  const el = ((options.elevationDeg ?? 22) * Math.PI) / 180;
  const widthPx = options.widthPx ?? 600;
  // Camera basis: forward looks from the front-right, above, towards the part.
  const fwd = [-Math.sin(az) * Math.cos(el), Math.cos(az) * Math.cos(el), -Math.sin(el)];
  const right = [Math.cos(az), Math.sin(az), 0];
  const up = [
    right[1] * fwd[2] - right[2] * fwd[1],
    right[2] * fwd[0] - right[0] * fwd[2],
    right[0] * fwd[1] - right[1] * fwd[0],
  ];
  const light = normalise([-0.45, -0.7, 0.8]);
  const [r0, g0, b0] = hexToRgb(options.colourHex);

  const p = mesh.positions;
  const idx = mesh.indices;
  const faces: Array<{ depth: number; pts: number[]; shade: number }> = [];
  let minU = Infinity,
    maxU = -Infinity,
    minV = Infinity,
    maxV = -Infinity;
  for (let t = 0; t < idx.length; t += 3) {
    const a = idx[t] * 3,
      b = idx[t + 1] * 3,
      c = idx[t + 2] * 3;
    const e1 = [p[b] - p[a], p[b + 1] - p[a + 1], p[b + 2] - p[a + 2]];
    const e2 = [p[c] - p[a], p[c + 1] - p[a + 1], p[c + 2] - p[a + 2]];
    const n = normalise([e1[1] * e2[2] - e1[2] * e2[1], e1[2] * e2[0] - e1[0] * e2[2], e1[0] * e2[1] - e1[1] * e2[0]]);
    if (dot(n, fwd) >= 0) continue;
    const pts: number[] = [];
    let depth = 0;
    for (const v of [a, b, c]) {
      const q = [p[v], p[v + 1], p[v + 2]];
      const u = dot(q, right);
      const w = dot(q, up);
      pts.push(u, w);
      depth += dot(q, fwd);
      minU = Math.min(minU, u);
      maxU = Math.max(maxU, u);
      minV = Math.min(minV, w);
      maxV = Math.max(maxV, w);
    }
    faces.push({ depth, pts, shade: 0.45 + 0.55 * Math.max(0, dot(n, light)) });
  }
  faces.sort((f, g) => g.depth - f.depth);
  const marginMm = Math.max(maxU - minU, maxV - minV) * 0.04;
  const scale = widthPx / (maxU - minU + 2 * marginMm || 1);
  const heightPx = Math.round((maxV - minV + 2 * marginMm) * scale);
  const x = (u: number) => ((u - minU + marginMm) * scale).toFixed(1);
  const y = (v: number) => ((maxV - v + marginMm) * scale).toFixed(1);
  const polys = faces.map((f) => {
    const fill = `rgb(${Math.round(r0 * f.shade)},${Math.round(g0 * f.shade)},${Math.round(b0 * f.shade)})`;
    const points = `${x(f.pts[0])},${y(f.pts[1])} ${x(f.pts[2])},${y(f.pts[3])} ${x(f.pts[4])},${y(f.pts[5])}`;
    return `<polygon points="${points}" fill="${fill}" stroke="${fill}" stroke-width="0.6" stroke-linejoin="round"/>`;
  });
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${widthPx}" height="${heightPx}" viewBox="0 0 ${widthPx} ${heightPx}">` +
    polys.join('') +
    '</svg>'
  );
}

function dot(a: number[], b: number[]): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

function normalise(v: number[]): number[] {
  const length = Math.hypot(v[0], v[1], v[2]) || 1;
  return [v[0] / length, v[1] / length, v[2] / length];
}

function hexToRgb(hex: string): [number, number, number] {
  const value = Number.parseInt(hex.replace('#', ''), 16);
  return [(value >> 16) & 255, (value >> 8) & 255, value & 255];
}
