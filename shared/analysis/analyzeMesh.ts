import type { IndexedMesh } from '../schemas/mesh';
import type { AnalysisOutdoor, AnalysisReport, BuildOrientation, GeometryReport } from '../schemas/analysis';
import type { CostRates, Material, PrinterProfile, PrintSettings } from '../schemas/production';
import { estimateProduction } from '../production/estimateProduction';
import { assessOutdoor } from '../thermal/assessOutdoor';
import { analyzeGeometry, type GeometryOptions } from './analyzeGeometry';
import { buildPlateFit } from './buildPlateFit';
import { componentSizesMm, fitPartSizes, fitParts } from './fitParts';
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
 * The print-readiness report of a part: geometry in build orientation (searched when `up` is 'auto'), fit and
 * copies on the printer's plate, the production estimate (mass, filament, time, energy, cost) and the outdoor
 * fitness in the chosen material and colour (shared/thermal/assessOutdoor.ts).
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
  const { report: geometry, overhangMask, oriented } = analyzeGeometry(mesh, { ...options.geometry, up, overhangDeg });
  const { printer, material } = options;
  const spacingMm = options.plateSpacingMm ?? 10;
  const buildVolumeMm: [number, number, number] = [
    printer.buildVolumeMm.x,
    printer.buildVolumeMm.y,
    printer.buildVolumeMm.z,
  ];
  const fit =
    options.partTriangles && options.partTriangles.length > 1
      ? { ...fitParts(oriented, options.partTriangles, buildVolumeMm, spacingMm), turnedOnPlate: false }
      : geometry.components > 1
        ? { ...fitPartSizes(componentSizesMm(oriented), buildVolumeMm, spacingMm), turnedOnPlate: false }
        : buildPlateFit(geometry.bbox.sizeMm, buildVolumeMm, spacingMm);
  const production = estimateProduction(
    {
      volumeMm3: Math.max(0, geometry.volumeMm3),
      surfaceAreaMm2: geometry.surfaceAreaMm2,
      heightMm: geometry.bbox.sizeMm[2],
      supportVolumeMm3: geometry.supportVolumeMm3,
      bboxSizeMm: geometry.bbox.sizeMm,
      footprintMm2: geometry.footprintMm2,
      upFacingAreaMm2: geometry.upFacingAreaMm2,
      downFacingAreaMm2: geometry.downFacingAreaMm2,
    },
    printer,
    material,
    options.settings,
    options.rates,
  );
  const outdoor = outdoorFor(geometry, options);
  const report: AnalysisReport = {
    ...geometry,
    up: requested,
    orientationSearch: search,
    buildPlate: {
      printerId: printer.id,
      buildVolumeMm,
      fits: fit.fits,
      copiesPerPlate: fit.copiesPerPlate,
      spacingMm,
      turnedOnPlate: fit.turnedOnPlate,
    },
    materialId: material.id,
    production,
    outdoor,
    warnings: [...warningsFor(geometry, fit.fits, printer), ...outdoorWarnings(outdoor, material)],
  };
  return { report, overhangMask, oriented };
}

function outdoorFor(g: GeometryReport, options: AnalyzeMeshOptions): AnalysisOutdoor {
  const { material, printer, settings } = options;
  const given = options.wallThicknessMm;
  const measured = g.thinnestWall && g.thinnestWall.p5Mm > 0 ? g.thinnestWall.p5Mm : null;
  const wallThicknessMm = given ?? measured;
  const assessment = assessOutdoor({
    material,
    colourId: options.colourId ?? material.colours[0]!.id,
    wall:
      wallThicknessMm === null
        ? undefined
        : {
            wallThicknessMm,
            wallLoops: settings.wallLoops,
            lineWidthMm: printer.lineWidthMm,
            infillPct: settings.infillPct,
          },
  });
  return {
    ...assessment,
    wallThicknessMm,
    wallThicknessFrom: given !== undefined ? 'options' : measured !== null ? 'measured' : null,
  };
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
