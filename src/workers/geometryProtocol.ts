import type { IndexedMesh } from '../../shared/schemas/mesh';
import type { NestBoxFacts } from '../../shared/schemas/nestbox';
import type { BirdFitResult, Region } from '../../shared/schemas/birdfit';
import type {
  CostRates,
  Material,
  MaterialColour,
  PrinterProfile,
  PrintSettings,
  ProductionEstimate,
} from '../../shared/schemas/production';
import type { OutdoorAssessment } from '../../shared/schemas/outdoor';
import type { LiveLimits } from '../../templates/lib/liveLimits';
import type { BuildQuality } from '../../templates/lib/BuildContext';

/** What the design is to be made with: the chosen printer, material and colour, and the settings and rates. */
export interface ProductionChoice {
  printer: PrinterProfile;
  material: Material;
  /** One of `material.colours`. */
  colour: MaterialColour;
  settings: PrintSettings;
  rates: CostRates;
}

/** A request to the geometry worker: build one template at one parameter set. */
export interface GeometryRequest {
  /** Increasing number; the page keeps only the answer to its latest request. */
  requestId: number;
  templateId: string;
  /** Raw parameters in millimetres (validated by the worker with the template's parseParams). */
  params: Record<string, unknown>;
  /** Printer, material, colour, settings and rates the figures use (plain objects, copied to the worker). */
  production: ProductionChoice;
  /** Bird-fit region; both regions when omitted. */
  region?: Region;
  /** The parameter the person just changed: a refusal it causes names it (see parseParams). */
  moved?: string;
  /** `draft` while a slider is held (coarser, no hash, no figures); `full` (the default) otherwise. */
  quality?: BuildQuality;
}

/**
 * A request to the figures worker: analyse one full-quality mesh. It only ever analyses the newest request it has
 * (older ones are answered `skipped`), and it runs beside the geometry worker, so it never delays the next build.
 */
export interface FiguresRequest {
  requestId: number;
  mesh: IndexedMesh;
  facts: NestBoxFacts;
  partTriangles: number[];
  production: ProductionChoice;
  region?: Region;
}

/** The key figures beside the model; a figure is null when its engine is not available. */
export interface DesignFigures {
  volumeMm3: number;
  surfaceAreaMm2: number | null;
  /** The whole mesh as laid out for printing (parts side by side): not a product size. */
  boundingBoxMm: [number, number, number];
  /** The assembled product's size (its body), as the catalogue and spec sheet show it. */
  assembledSizeMm?: [number, number, number];
  triangleCount: number;
  bodyCount: number | null;
  overhangAreaMm2: number | null;
  supportVolumeMm3: number | null;
  fitsPrinter: boolean | null;
  /** How one unit's parts go on plates (shared/analysis/plateRule.ts); null when not assessed. */
  plate?: { layout: 'together' | 'separate' | 'none'; platesPerUnit: number; text: string; tag: string } | null;
  /** Mass, print time, cost of one unit on the chosen printer, material and settings. */
  production: ProductionEstimate | null;
  /**
   * Outdoor fitness in the chosen material and colour: sunlit roof and wall against the heat-deflection temperature,
   * the wall's thermal resistance beside a pine board, and the cautions.
   */
  outdoor: OutdoorAssessment | null;
  /** Species the design suits and the guidance warnings, each with its source. */
  birdFit: BirdFitResult | null;
  /** Engines that could not run, with the reason (shown as a note, never hidden). */
  unavailable: string[];
}

/**
 * The geometry worker answers each request with `limits` and then `mesh` (built, hashed when full) or an error; the
 * figures worker answers a full mesh with `figures` (analysis), or `skipped` when a newer mesh arrived before the
 * analysis began, or an error (`ok: false`).
 */
export type GeometryResponse =
  | {
      requestId: number;
      ok: true;
      stage: 'mesh';
      templateVersion: number;
      /** `draft` while a slider is held: no hash, no figures; the full build replaces it on release. */
      quality: BuildQuality;
      mesh: IndexedMesh;
      facts: NestBoxFacts;
      /** sha256 of the exported mesh content, hex; null for a draft (a hash is only ever of the full mesh). */
      sha256: string | null;
      /** Part names in mesh order ("body", "floor-plug"). */
      partNames: string[];
      /** Triangles of each part: the mesh holds the parts one after another. */
      partTriangles: number[];
      /** Per-triangle overhang flags, as the figures' analysis computes them (1 = beyond the self-supporting angle). */
      overhangMask: Uint8Array;
      /** Milliseconds spent building, validating and hashing. */
      buildMs: number;
    }
  | {
      requestId: number;
      ok: true;
      stage: 'figures';
      figures: DesignFigures;
      /** Per-triangle overhang flags (1 = beyond the self-supporting angle), or null. */
      overhangMask: Uint8Array | null;
      /** Milliseconds spent on the analysis. */
      analysisMs: number;
    }
  | { requestId: number; ok: true; stage: 'skipped' }
  | {
      requestId: number;
      ok: true;
      /** Sent first, before the build: each numeric parameter's live range given the others. */
      stage: 'limits';
      limits: LiveLimits;
    }
  | {
      requestId: number;
      ok: false;
      /** The parameter at fault when the error is about input. */
      field?: string;
      message: string;
    };
