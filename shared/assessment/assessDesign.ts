/**
 * One assessment of a design, used by the editor's live figures (src/workers/computeDesignFigures.ts), the analysis
 * of uploaded and exported meshes (shared/analysis/analyzeMesh.ts) and the family jobs (server/jobs): geometry in
 * build orientation, fit and copies on the printer's plate, the production estimate, outdoor fitness in the chosen
 * material and colour, and bird fit when the template reports its facts.
 *
 * Two steps, so that the family jobs can measure one geometry once and assess it in every material and colour:
 * {@link measureDesign} (geometry only, with the sample budgets) and {@link assessDesign} (everything that depends on
 * the printer, material, colour, settings and rates).
 */
import type { IndexedMesh } from '../schemas/mesh';
import type { GeometryReport } from '../schemas/analysis';
import type { BirdFitResult, Region } from '../schemas/birdfit';
import type { NestBoxFacts } from '../schemas/nestbox';
import type { OutdoorAssessment } from '../schemas/outdoor';
import type {
  CostRates,
  Material,
  PrinterProfile,
  PrintSettings,
  ProductionEstimate,
  ProductionInput,
} from '../schemas/production';
import { analyzeGeometry, type GeometryOptions } from '../analysis/analyzeGeometry';
import { componentSizesMm, fitPartSizes, partSizesMm, type PartsFit } from '../analysis/fitParts';
import { assembledSizeMm, plateRule, type PlateRule } from '../analysis/plateRule';
import { assessBirdFit } from '../birdfit/assessBirdFit';
import { estimateProduction } from '../production/estimateProduction';
import { assessOutdoor } from '../thermal/assessOutdoor';

/** What the assessment needs of a design's geometry, measured in build orientation. */
export interface DesignMeasure {
  volumeMm3: number;
  surfaceAreaMm2: number;
  upFacingAreaMm2: number;
  downFacingAreaMm2: number;
  footprintMm2: number;
  bboxSizeMm: [number, number, number];
  supportVolumeMm3: number;
  /** Size of each printable part in build orientation (one entry for a single part). */
  partSizesMm: Array<[number, number, number]>;
  /**
   * Names of the parts in words; omitted for a template's parts (body, floor plug). A file's separate shells are
   * `part 1`, `part 2`, … since nothing says what they are.
   */
  partNames?: string[];
  /** 5th percentile of the sampled wall thickness, mm; null when not measured. */
  thinnestWallMm: number | null;
}

/** How to measure a mesh: orientation, overhang threshold, sample budgets and bridge limits. */
export interface MeasureDesignOptions {
  /** Triangles of each part when the mesh holds several parts one after another (as `generate()` returns them). */
  partTriangles?: readonly number[];
  /** Orientation, overhang threshold and the sample budgets (support rays, wall samples). */
  geometry?: GeometryOptions;
}

/** A measured mesh: the measure, the full geometry report, the overhang mask and the mesh in build orientation. */
export interface MeasuredDesign {
  measure: DesignMeasure;
  report: GeometryReport;
  overhangMask: Uint8Array;
  oriented: IndexedMesh;
}

/**
 * Measures a mesh in build orientation with the given sample budgets. Parts: the listed parts when `partTriangles`
 * is given, else the mesh's connected parts (nested inner shells left out) when there are several, else the mesh.
 * @param mesh - the design in model coordinates, mm
 * @param options - parts, orientation and sample budgets
 */
export function measureDesign(mesh: IndexedMesh, options: MeasureDesignOptions = {}): MeasuredDesign {
  const { report, overhangMask, oriented } = analyzeGeometry(mesh, options.geometry);
  const parts = options.partTriangles
    ? partSizesMm(oriented, options.partTriangles)
    : report.components > 1
      ? componentSizesMm(oriented)
      : [report.bbox.sizeMm];
  return {
    measure: {
      volumeMm3: report.volumeMm3,
      surfaceAreaMm2: report.surfaceAreaMm2,
      upFacingAreaMm2: report.upFacingAreaMm2,
      downFacingAreaMm2: report.downFacingAreaMm2,
      footprintMm2: report.footprintMm2,
      bboxSizeMm: report.bbox.sizeMm,
      supportVolumeMm3: report.supportVolumeMm3,
      partSizesMm: parts,
      ...(!options.partTriangles && parts.length > 1 ? { partNames: parts.map((_, i) => `part ${i + 1}`) } : {}),
      thinnestWallMm: report.thinnestWall ? report.thinnestWall.p5Mm : null,
    },
    report,
    overhangMask,
    oriented,
  };
}

/** The printer, material, colour, print settings and cost rates a design is assessed for. */
export interface DesignChoice {
  printer: PrinterProfile;
  material: Material;
  /** One of the material's colour ids; the material's first colour when omitted. */
  colourId?: string | null;
  settings: PrintSettings;
  rates: CostRates;
  /** A finish (coating) id whose minutes and materials go into the cost. */
  finishId?: string | null;
}

/** What the assessment knows beside the geometry. */
export interface AssessDesignOptions {
  /** The template's bird-facing facts; bird fit is assessed only with them. */
  facts?: NestBoxFacts;
  /** Bird-fit region; both regions when null or omitted. */
  region?: Region | null;
  /**
   * The designed wall thickness (the facts' when omitted); without either the outdoor wall uses the measured
   * thinnest-wall 5th percentile.
   */
  wallThicknessMm?: number;
  /** Gap between copies on the plate (default 10 mm: common practice, no source). */
  plateSpacingMm?: number;
}

/** Outdoor fitness with the wall thickness it used and where that came from. */
export type DesignOutdoor = OutdoorAssessment & {
  wallThicknessMm: number | null;
  wallThicknessFrom: 'options' | 'measured' | null;
};

/** The assessment of one design for one production choice. */
export interface DesignAssessment {
  /** Fit of every part and copies per plate; `turnedOnPlate` for a single part turned 90° on the plate. */
  fit: PartsFit & { turnedOnPlate: boolean; spacingMm: number; buildVolumeMm: [number, number, number] };
  /** How one unit's parts go on plates (shared/analysis/plateRule.ts): the figure every screen shows. */
  plate: PlateRule;
  /** The assembled product's size (the body), never the print layout's. */
  assembledSizeMm: [number, number, number];
  production: ProductionEstimate;
  /** Null when it could not be assessed (see `outdoorProblem`). */
  outdoor: DesignOutdoor | null;
  /** Why there is no outdoor assessment, e.g. the colour is not one of the material's. */
  outdoorProblem: string | null;
  /** Null without the template's facts. */
  birdFit: BirdFitResult | null;
}

/**
 * The production-estimate input of a measured design (a negative volume, from a mesh wound inside out, counts as 0).
 * @param measure - the measured geometry
 * @param heightMm - the printed height (the tallest part)
 */
export function productionInputOf(measure: DesignMeasure, heightMm: number): ProductionInput {
  return {
    volumeMm3: Math.max(0, measure.volumeMm3),
    surfaceAreaMm2: measure.surfaceAreaMm2,
    heightMm,
    supportVolumeMm3: measure.supportVolumeMm3,
    bboxSizeMm: measure.bboxSizeMm,
    footprintMm2: measure.footprintMm2,
    upFacingAreaMm2: measure.upFacingAreaMm2,
    downFacingAreaMm2: measure.downFacingAreaMm2,
  };
}

/**
 * The printed side wall for the outdoor insulation figure: the wall thickness, the settings' perimeters and infill
 * and the printer's line width.
 * @param wallThicknessMm - the wall's thickness, mm
 * @param choice - the printer and settings it is printed with
 */
export function printedWallOf(wallThicknessMm: number, choice: Pick<DesignChoice, 'printer' | 'settings'>) {
  return {
    wallThicknessMm,
    perimeters: choice.settings.perimeters,
    lineWidthMm: choice.printer.lineWidthMm,
    infillPct: choice.settings.infillPct,
  };
}

/**
 * Assesses a measured design for one printer, material, colour, settings and rates: plate fit, production estimate,
 * outdoor fitness and (with the template's facts) bird fit.
 * @param measure - the measured geometry ({@link measureDesign}, or the family worker's stored measure)
 * @param choice - printer, material, colour, settings and rates
 * @param options - facts, region, designed wall thickness and plate spacing
 */
export function assessDesign(
  measure: DesignMeasure,
  choice: DesignChoice,
  options: AssessDesignOptions = {},
): DesignAssessment {
  const { printer, material } = choice;
  const spacingMm = options.plateSpacingMm ?? 10;
  const buildVolumeMm: [number, number, number] = [
    printer.buildVolumeMm.x,
    printer.buildVolumeMm.y,
    printer.buildVolumeMm.z,
  ];
  const partsFit = fitPartSizes(measure.partSizesMm, buildVolumeMm, spacingMm);
  const fit = {
    ...partsFit,
    turnedOnPlate: partsFit.parts.length === 1 ? partsFit.parts[0].turnedOnPlate : false,
    spacingMm,
    buildVolumeMm,
  };
  const production = estimateProduction(
    productionInputOf(measure, partsFit.heightMm),
    printer,
    material,
    choice.settings,
    choice.rates,
    choice.finishId,
  );

  const given = options.wallThicknessMm ?? options.facts?.wallThicknessMm;
  const measured = measure.thinnestWallMm !== null && measure.thinnestWallMm > 0 ? measure.thinnestWallMm : null;
  const wallThicknessMm = given ?? measured;
  const colourId = choice.colourId ?? material.colours[0]?.id;
  let outdoor: DesignOutdoor | null = null;
  let outdoorProblem: string | null = null;
  if (!colourId || !material.colours.some((colour) => colour.id === colourId)) {
    outdoorProblem = `the colour ${colourId ?? '(none)'} is not one of ${material.name}'s colours`;
  } else {
    try {
      outdoor = {
        ...assessOutdoor({
          material,
          colourId,
          wall: wallThicknessMm === null ? undefined : printedWallOf(wallThicknessMm, choice),
        }),
        wallThicknessMm,
        wallThicknessFrom: given !== undefined ? 'options' : measured !== null ? 'measured' : null,
      };
    } catch (err) {
      outdoorProblem = err instanceof Error ? err.message : String(err);
    }
  }

  // The thin-wall warning quotes the same insulation figure the outdoor section shows, in the chosen material.
  const birdFit = options.facts
    ? assessBirdFit(options.facts, {
        ...(options.region ? { region: options.region } : {}),
        wall: {
          materialName: material.name,
          polymerK: material.thermalConductivityWmK,
          ratioToPine:
            wallThicknessMm === options.facts.wallThicknessMm ? (outdoor?.wallResistance?.ratioToPine ?? null) : null,
        },
      })
    : null;
  const plate = plateRule(measure.partSizesMm, buildVolumeMm, spacingMm, measure.partNames);
  return {
    fit,
    plate,
    assembledSizeMm: assembledSizeMm(measure.partSizesMm, measure.bboxSizeMm),
    production,
    outdoor,
    outdoorProblem,
    birdFit,
  };
}

/**
 * The outdoor assessment without the wall-thickness bookkeeping, as the editor's figures and the variant reports
 * store it.
 * @param outdoor - the assessment's outdoor section
 */
export function plainOutdoor(outdoor: DesignOutdoor): OutdoorAssessment {
  const copy: Partial<DesignOutdoor> = { ...outdoor };
  delete copy.wallThicknessMm;
  delete copy.wallThicknessFrom;
  return copy as OutdoorAssessment;
}
