import type { IndexedMesh } from '../schemas/mesh';
import type { OrientationCandidate, OrientationSearch } from '../schemas/analysis';
import { measureMesh } from './measureMesh';
import { AXIS_UP_ROTATIONS, orientMesh, rotationDownTo, type Rotation3 } from './orientMesh';
import { supportVolume } from './supportVolume';

/** Options of the orientation search. */
export interface OrientationSearchOptions {
  /** Overhang threshold, degrees from vertical (default 45). */
  overhangDeg?: number;
  /** Rays per candidate for the support estimate (default 20,000). */
  maxRaysPerCandidate?: number;
}

type Direction = [number, number, number];

const METHOD =
  'Each of 26 directions of the part (6 faces, 12 edges, 8 corners of its bounding cube) is put on the plate in ' +
  'turn. A candidate that rests on less than 1 % of its footprint (and under 25 mm²), such as a box on a corner, ' +
  'is unstable and ranks after every stable one. Candidates are ranked by support volume; supports within 0.5 % of ' +
  'the part volume (or 10 mm³) count as equal and are ranked by height (within 0.5 mm equal), then by smaller ' +
  'plate footprint (more copies per plate), then by larger bed contact (adhesion).';

/** Rests on too little of the plate to stay put without a brim or support (common practice, no source). */
function unstable(c: { bedContactAreaMm2: number; footprintMm2: number }): boolean {
  return c.bedContactAreaMm2 < Math.min(25, 0.01 * c.footprintMm2);
}

/**
 * Scores 26 candidate build orientations by support volume, then height, then plate footprint, and returns
 * the best with every score and a reason. Orientations that stand on a point or an edge rank last (see METHOD).
 * @param mesh - the part in model coordinates
 * @param options - overhang threshold and ray budget
 * @returns the best orientation, all candidates best first, and the method
 */
export function searchOrientation(mesh: IndexedMesh, options: OrientationSearchOptions = {}): OrientationSearch {
  const overhangDeg = options.overhangDeg ?? 45;
  const maxRays = options.maxRaysPerCandidate ?? 20_000;
  const scored: Omit<OrientationCandidate, 'rank' | 'reason'>[] = [];
  let partVolume = 0;
  for (const { down, kind } of candidateDirections()) {
    const rotation = kind === 'face' ? faceRotation(down) : rotationDownTo(down);
    const oriented = orientMesh(mesh, { rotation });
    const m = measureMesh(oriented, overhangDeg);
    partVolume = Math.abs(m.volumeMm3);
    const support = supportVolume(oriented, m.overhangMask, m.minMm, m.maxMm, { maxRays });
    scored.push({
      label: `${kind} ${directionName(down)} down`,
      kind,
      downVector: normalise(down),
      rotation: [...rotation],
      supportVolumeMm3: support.supportVolumeMm3,
      heightMm: m.maxMm[2] - m.minMm[2],
      footprintMm2: (m.maxMm[0] - m.minMm[0]) * (m.maxMm[1] - m.minMm[1]),
      bedContactAreaMm2: m.bedContactAreaMm2,
      overhangAreaMm2: m.overhangAreaMm2,
    });
  }
  const supportTol = Math.max(10, 0.005 * partVolume);
  const compare = (a: (typeof scored)[number], b: (typeof scored)[number]): number => {
    if (unstable(a) !== unstable(b)) return unstable(a) ? 1 : -1;
    if (Math.abs(a.supportVolumeMm3 - b.supportVolumeMm3) > supportTol) return a.supportVolumeMm3 - b.supportVolumeMm3;
    if (Math.abs(a.heightMm - b.heightMm) > 0.5) return a.heightMm - b.heightMm;
    if (Math.abs(a.footprintMm2 - b.footprintMm2) > 0.01 * Math.max(a.footprintMm2, b.footprintMm2)) {
      return a.footprintMm2 - b.footprintMm2;
    }
    return b.bedContactAreaMm2 - a.bedContactAreaMm2;
  };
  const ranked = [...scored].sort(compare);
  const top = ranked[0];
  const candidates: OrientationCandidate[] = ranked.map((c, i) => ({
    ...c,
    rank: i + 1,
    reason: i === 0 ? bestReason(c) : reasonAgainst(c, top, supportTol),
  }));
  return { best: candidates[0], candidates, method: METHOD };
}

function candidateDirections(): { down: Direction; kind: OrientationCandidate['kind'] }[] {
  const out: { down: Direction; kind: OrientationCandidate['kind'] }[] = [];
  for (let x = -1; x <= 1; x++) {
    for (let y = -1; y <= 1; y++) {
      for (let z = -1; z <= 1; z++) {
        const nonZero = Math.abs(x) + Math.abs(y) + Math.abs(z);
        if (nonZero === 0) continue;
        out.push({ down: [x, y, z], kind: nonZero === 1 ? 'face' : nonZero === 2 ? 'edge' : 'corner' });
      }
    }
  }
  // faces first and the part as modelled (-z down) first of all, so ties go to the plainest orientation
  const order = { face: 0, edge: 1, corner: 2 };
  const asModelled = (d: Direction): number => (d[0] === 0 && d[1] === 0 && d[2] === -1 ? 0 : 1);
  return out.sort((a, b) => order[a.kind] - order[b.kind] || asModelled(a.down) - asModelled(b.down));
}

/** For a face direction, the axis rotation whose up is the opposite face (keeps the part square to the plate). */
function faceRotation(down: Direction): Rotation3 {
  const axis = down[0] ? 'x' : down[1] ? 'y' : 'z';
  const sign = down[0] + down[1] + down[2] > 0 ? '-' : '+';
  return AXIS_UP_ROTATIONS[`${sign}${axis}` as keyof typeof AXIS_UP_ROTATIONS];
}

function directionName(d: Direction): string {
  return ['x', 'y', 'z'].map((name, i) => (d[i] > 0 ? `+${name}` : d[i] < 0 ? `-${name}` : '')).join('');
}

function normalise(d: Direction): Direction {
  const len = Math.hypot(d[0], d[1], d[2]);
  return [d[0] / len, d[1] / len, d[2] / len];
}

function cm3(mm3: number): string {
  return `${(mm3 / 1000).toFixed(1)} cm³`;
}

function bestReason(c: Omit<OrientationCandidate, 'rank' | 'reason'>): string {
  return `least support (${cm3(c.supportVolumeMm3)}), height ${c.heightMm.toFixed(1)} mm, footprint ${(c.footprintMm2 / 100).toFixed(0)} cm²`;
}

function reasonAgainst(
  c: Omit<OrientationCandidate, 'rank' | 'reason'>,
  best: Omit<OrientationCandidate, 'rank' | 'reason'>,
  supportTol: number,
): string {
  if (unstable(c) && !unstable(best)) {
    return `rests on only ${c.bedContactAreaMm2.toFixed(1)} mm² of the plate: unstable without a brim or support`;
  }
  const extra = c.supportVolumeMm3 - best.supportVolumeMm3;
  if (Math.abs(extra) > supportTol) return `${cm3(extra)} more support than the best`;
  const taller = c.heightMm - best.heightMm;
  if (Math.abs(taller) > 0.5) return `same support, ${taller.toFixed(1)} mm taller`;
  const wider = c.footprintMm2 - best.footprintMm2;
  if (Math.abs(wider) > 0.01 * Math.max(c.footprintMm2, best.footprintMm2)) {
    return `same support and height, footprint ${(wider / 100).toFixed(1)} cm² larger`;
  }
  return `as good as the best (less or equal bed contact: ${(c.bedContactAreaMm2 / 100).toFixed(1)} cm²)`;
}
