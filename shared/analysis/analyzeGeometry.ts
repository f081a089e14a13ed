import type { IndexedMesh } from '../schemas/mesh';
import type { BuildOrientation, GeometryReport } from '../schemas/analysis';
import { findBridges, type BridgeOptions } from './findBridges';
import { encodeFaceBitset } from './faceBitset';
import { DEFAULT_OVERHANG_DEG, measureMesh } from './measureMesh';
import { meshTopology } from './meshTopology';
import { orientMesh, rotationFor } from './orientMesh';
import { supportVolume } from './supportVolume';
import { thinnestWall } from './thinnestWall';
import { TriangleBvh } from './TriangleBvh';

/** Options of the geometry analysis. */
export interface GeometryOptions {
  /** Which model direction points up, or a rotation (default '+z'). */
  up?: BuildOrientation;
  /** Overhang threshold, degrees from vertical (default 45; Mazlan et al., J. Adv. Ind. Tech. & Appl. (UTHM), 2020). */
  overhangDeg?: number;
  /** Ray budget of the support estimate (default 200,000). */
  supportMaxRays?: number;
  /** Sample budget of the wall-thickness rays (default 20,000). */
  wallSamples?: number;
  /** Bridge thresholds. */
  bridges?: BridgeOptions;
}

/** The geometry report with the per-face overhang mask kept as bytes for the viewer. */
export interface GeometryAnalysis {
  report: GeometryReport;
  /** 1 per overhang triangle (same order as the input mesh). */
  overhangMask: Uint8Array;
  /** The mesh in build orientation. */
  oriented: IndexedMesh;
}

/**
 * Print-readiness geometry of a mesh in a build orientation: size, volume, area, watertightness, parts, overhangs,
 * bed contact, support volume, bridges and thinnest wall.
 * @param mesh - the part in model coordinates, mm
 * @param options - orientation, thresholds and sample budgets
 * @returns the JSON-able report, the overhang mask and the oriented mesh
 */
export function analyzeGeometry(mesh: IndexedMesh, options: GeometryOptions = {}): GeometryAnalysis {
  const up = options.up ?? '+z';
  const overhangDeg = options.overhangDeg ?? DEFAULT_OVERHANG_DEG;
  const oriented = orientMesh(mesh, up);
  const m = measureMesh(oriented, overhangDeg);
  const topology = meshTopology(oriented);
  const support = supportVolume(oriented, m.overhangMask, m.minMm, m.maxMm, { maxRays: options.supportMaxRays });
  const warnSpanMm = options.bridges?.warnSpanMm ?? 10;
  const failSpanMm = options.bridges?.failSpanMm ?? 20;
  const bridges = findBridges(oriented, topology.neighbours, m.minMm[2], {
    ...options.bridges,
    warnSpanMm,
    failSpanMm,
  });
  const wall =
    topology.openEdges === 0 && m.triangles > 0
      ? thinnestWall(oriented, new TriangleBvh(oriented), m.surfaceAreaMm2, options.wallSamples)
      : null;
  const size: [number, number, number] = [m.maxMm[0] - m.minMm[0], m.maxMm[1] - m.minMm[1], m.maxMm[2] - m.minMm[2]];
  const report: GeometryReport = {
    triangles: m.triangles,
    vertices: (oriented.positions.length / 3) | 0,
    volumeMm3: m.volumeMm3,
    surfaceAreaMm2: m.surfaceAreaMm2,
    upFacingAreaMm2: m.upFacingAreaMm2,
    downFacingAreaMm2: m.downFacingAreaMm2,
    bbox: { minMm: m.minMm, maxMm: m.maxMm, sizeMm: size },
    watertight: topology.watertight,
    edges: {
      openEdges: topology.openEdges,
      nonManifoldEdges: topology.nonManifoldEdges,
      misorientedEdges: topology.misorientedEdges,
    },
    components: topology.components,
    overhang: {
      thresholdDeg: overhangDeg,
      areaMm2: m.overhangAreaMm2,
      faceCount: m.overhangFaceCount,
      facesBitsetBase64: encodeFaceBitset(m.overhangMask),
    },
    bedContactAreaMm2: m.bedContactAreaMm2,
    footprintMm2: size[0] * size[1],
    supportVolumeMm3: support.supportVolumeMm3,
    supportSamplePitchMm: support.pitchMm,
    bridges: {
      warnSpanMm,
      failSpanMm,
      maxSpanMm: bridges.length ? bridges[0].spanMm : 0,
      limitsSource: 'from memory: no published bridge limit found; 10 mm warn / 20 mm fail',
      regions: bridges,
    },
    thinnestWall: wall,
    rotation: [...rotationFor(up)],
  };
  return { report, overhangMask: m.overhangMask, oriented };
}
