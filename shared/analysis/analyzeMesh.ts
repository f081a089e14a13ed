import type { IndexedMesh } from '../schemas/mesh';
import type { AnalysisOutdoor, AnalysisReport, BuildOrientation, GeometryReport } from '../schemas/analysis';
import type { CostRates, Material, PrinterProfile, PrintSettings } from '../schemas/production';
import { assessDesign, measureDesign } from '../assessment/assessDesign';
import type { GeometryOptions } from './analyzeGeometry';
import { searchOrientation } from './searchOrientation';

/** Everything the full report needs besides the mesh. */
export interface AnalyzeMeshOptions {
  /** Which model direction points up, a rotation, or 'auto' to search (default '+z'). */
  up?: BuildOrientation | 'auto';
  printer: PrinterProfile;
  material: Material;
  /** One of the material's colour ids for the outdoor assessment (default: the material's first colour). */
  colourId?: string;
  /**
   * The designed wall thickness when known (e.g. NestBoxFacts.wallThicknessMm); otherwise the outdoor assessment
   * uses the measured thinnest-wall 5th percentile.
   */
  wallThicknessMm?: number;
  settings: PrintSettings;
  rates: CostRates;
  /** Overhang threshold, degrees from vertical (default 45). */
  overhangDeg?: number;
  /** Gap between copies on the plate (default 10 mm: common practice, no source). */
  plateSpacingMm?: number;
  /**
   * Triangles of each separate part when the mesh holds several parts one after another (as `generate()` returns
   * them): each part is then fitted on its own and copies per plate count complete sets. Omitted: the mesh's
   * connected parts are fitted the same way (a single part: its bounding box).
   */
  partTriangles?: readonly number[];
  /** Sample budgets and bridge limits. */
  geometry?: Omit<GeometryOptions, 'up' | 'overhangDeg'>;
}

/** The full report with the overhang mask kept as bytes for the viewer. */
export interface MeshAnalysis {
  report: AnalysisReport;
  overhangMask: Uint8Array;
  /** The mesh in build orientation (resting on z = 0). */
  oriented: IndexedMesh;
}

/**
 * The print-readiness report of a part: geometry in build orientation (searched when `up` is 'auto'), then the one
 * design assessment (shared/assessment/assessDesign.ts): fit and copies on the printer's plate, the production
 * estimate (mass, filament, time, energy, cost) and the outdoor fitness in the chosen material and colour.
 * @param mesh - the part in model coordinates, mm
 * @param options - orientation, printer, material, colour, settings, rates and thresholds
 * @returns the JSON-able report, the overhang mask and the oriented mesh
 * @throws Error when the colour is not one of the material's colours
 */
export function analyzeMesh(mesh: IndexedMesh, options: AnalyzeMeshOptions): MeshAnalysis {
  const overhangDeg = options.overhangDeg ?? 45;
  const requested = options.up ?? '+z';
  const search = requested === 'auto' ? searchOrientation(mesh, { overhangDeg }) : null;
  const up: BuildOrientation = search ? { rotation: search.best.rotation } : (requested as BuildOrientation);
  const { printer, material } = options;
  const {
    measure,
    report: geometry,
    overhangMask,
    oriented,
  } = measureDesign(mesh, {
    partTriangles: options.partTriangles && options.partTriangles.length > 1 ? options.partTriangles : undefined,
    geometry: { ...options.geometry, up, overhangDeg },
  });
  const assessment = assessDesign(
    measure,
    { printer, material, colourId: options.colourId, settings: options.settings, rates: options.rates },
    { wallThicknessMm: options.wallThicknessMm, plateSpacingMm: options.plateSpacingMm },
  );
  const { fit, plate, production, outdoor } = assessment;
  if (!outdoor) throw new Error(assessment.outdoorProblem ?? 'outdoor fitness could not be assessed');
  const report: AnalysisReport = {
    ...geometry,
    up: requested,
    orientationSearch: search,
    buildPlate: {
      printerId: printer.id,
      buildVolumeMm: fit.buildVolumeMm,
      fits: fit.fits,
      copiesPerPlate: fit.copiesPerPlate,
      spacingMm: fit.spacingMm,
      turnedOnPlate: fit.turnedOnPlate,
      layout: plate.layout,
      platesPerUnit: plate.platesPerUnit,
      plateText: plate.text,
      partSizesMm: fit.partSizesMm,
      assembledSizeMm: assessment.assembledSizeMm,
    },
    materialId: material.id,
    production,
    outdoor,
    warnings: [...warningsFor(geometry, fit.fits, printer), ...outdoorWarnings(outdoor, material)],
  };
  return { report, overhangMask, oriented };
}

function outdoorWarnings(o: AnalysisOutdoor, material: Material): string[] {
  const hot = (['roof', 'wall'] as const).filter((name) => o[name].verdict === 'fail');
  if (hot.length === 0) return [];
  const parts = hot.map((name) => `${name} about ${o[name].solAirC.toFixed(0)} °C`);
  return [
    `Outdoors in full sun this colour passes ${material.name}'s heat-deflection temperature of ${o.heatDeflectionC} °C ` +
      `(${parts.join(', ')}): it may sag or warp. Choose a lighter colour or a shaded site; follow local advice on siting.`,
  ];
}

function warningsFor(g: GeometryReport, fits: boolean, printer: PrinterProfile): string[] {
  const out: string[] = [];
  if (!g.watertight) {
    out.push(
      `The mesh is not watertight (${g.edges.openEdges} open, ${g.edges.nonManifoldEdges} non-manifold, ` +
        `${g.edges.misorientedEdges} misoriented edges): volume, mass and cost are unreliable; repair it before printing.`,
    );
  }
  if (g.volumeMm3 < 0) out.push('The mesh is wound inside out (negative volume); its normals point inward.');
  if (!fits) {
    const [x, y, z] = g.bbox.sizeMm.map((v) => v.toFixed(0));
    out.push(
      `The part (${x} × ${y} × ${z} mm) does not fit ${printer.name}'s build volume; split it or choose another printer.`,
    );
  }
  if (g.supportVolumeMm3 > 0) {
    out.push(
      `Needs about ${(g.supportVolumeMm3 / 1000).toFixed(1)} cm³ of support under ${(g.overhang.areaMm2 / 100).toFixed(1)} cm² of overhang.`,
    );
  }
  for (const bridge of g.bridges.regions) {
    if (bridge.status === 'ok') continue;
    out.push(
      `A ${bridge.spanMm.toFixed(1)} mm bridge at z = ${bridge.zMm.toFixed(1)} mm is over the ${bridge.status === 'fail' ? g.bridges.failSpanMm : g.bridges.warnSpanMm} mm ` +
        `limit (a rule of thumb from memory, not a published value): it may sag.`,
    );
  }
  const twoLinesMm = 2 * printer.lineWidthMm;
  if (g.thinnestWall && g.thinnestWall.p5Mm < twoLinesMm) {
    out.push(
      `Some walls are thinner than two extrusion lines (${twoLinesMm.toFixed(2)} mm): 5th percentile ${g.thinnestWall.p5Mm.toFixed(2)} mm ` +
        `near (${g.thinnestWall.atMm.map((v) => v.toFixed(0)).join(', ')}) mm.`,
    );
  }
  if (g.components > 1) out.push(`The mesh has ${g.components} separate shells (parts, or a hollow inside a solid).`);
  return out;
}
