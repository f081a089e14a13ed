import { z } from 'zod';
import { OutdoorAssessmentSchema } from './outdoor';
import { ProductionEstimateSchema } from './production';

/** A point or size in millimetres, [x, y, z]. */
export const Vec3MmSchema = z.tuple([z.number(), z.number(), z.number()]);

/** A named model direction that should point up during the print. */
export const AxisUpSchema = z.enum(['+z', '-z', '+x', '-x', '+y', '-y']);
/** A named up direction (see {@link AxisUpSchema}). */
export type AxisUp = z.infer<typeof AxisUpSchema>;

/** Build orientation: a named up direction, or an explicit row-major 3×3 rotation (p' = R·p). */
export const BuildOrientationSchema = z.union([AxisUpSchema, z.object({ rotation: z.array(z.number()).length(9) })]);
/** A build orientation (see {@link BuildOrientationSchema}). */
export type BuildOrientation = z.infer<typeof BuildOrientationSchema>;

/** Axis-aligned bounds of the part in build orientation. */
export const BoundingBoxSchema = z.object({ minMm: Vec3MmSchema, maxMm: Vec3MmSchema, sizeMm: Vec3MmSchema });
/** Bounds (see {@link BoundingBoxSchema}). */
export type BoundingBox = z.infer<typeof BoundingBoxSchema>;

/** Edge counts behind the watertight verdict. */
export const EdgeReportSchema = z.object({
  /** Edges used by one triangle only (holes, gaps). */
  openEdges: z.number().int(),
  /** Edges used by more than two triangles. */
  nonManifoldEdges: z.number().int(),
  /** Edges shared by two triangles listed in the same direction (flipped winding). */
  misorientedEdges: z.number().int(),
});

/** Downward faces steeper than the threshold: they need support. */
export const OverhangReportSchema = z.object({
  /** Threshold in degrees from vertical (a wall is 0°, a ceiling 90°). */
  thresholdDeg: z.number(),
  areaMm2: z.number(),
  faceCount: z.number().int(),
  /** One bit per triangle (bit i of byte i>>3, least significant first): 1 = overhang face, for the viewer. */
  facesBitsetBase64: z.string(),
});

/** A flat downward region held at both ends by walls below it. */
export const BridgeSchema = z.object({
  /** Shorter horizontal extent of the region: the length the extruded line must span. */
  spanMm: z.number(),
  areaMm2: z.number(),
  zMm: z.number(),
  centerMm: Vec3MmSchema,
  status: z.enum(['ok', 'warn', 'fail']),
});
/** A bridge (see {@link BridgeSchema}). */
export type Bridge = z.infer<typeof BridgeSchema>;

/** Bridges found and the limits they were judged by. */
export const BridgeReportSchema = z.object({
  warnSpanMm: z.number(),
  failSpanMm: z.number(),
  maxSpanMm: z.number(),
  /** Where the limits come from. */
  limitsSource: z.string(),
  regions: z.array(BridgeSchema),
});

/** Thinnest wall, measured by rays cast inward from sampled surface points. */
export const ThinWallReportSchema = z.object({
  minMm: z.number(),
  /** 5th percentile of the sampled thicknesses: less sensitive to knife edges and corners than the minimum. */
  p5Mm: z.number(),
  /** Where the minimum was found (build orientation). */
  atMm: Vec3MmSchema,
  samples: z.number().int(),
});

/** The geometry part of the print-readiness report, in build orientation. */
export const GeometryReportSchema = z.object({
  triangles: z.number().int(),
  vertices: z.number().int(),
  volumeMm3: z.number(),
  surfaceAreaMm2: z.number(),
  /** Faces pointing up (normal z > 0), projected onto the plate: the area top skins cover. */
  upFacingAreaMm2: z.number(),
  /** Faces pointing down (normal z < 0), projected onto the plate: the area bottom skins cover. */
  downFacingAreaMm2: z.number(),
  bbox: BoundingBoxSchema,
  /** Every edge shared by exactly two triangles listed in opposite directions. */
  watertight: z.boolean(),
  edges: EdgeReportSchema,
  /** Connected parts (by shared vertices). */
  components: z.number().int(),
  overhang: OverhangReportSchema,
  /** Downward faces lying on the build plate. */
  bedContactAreaMm2: z.number(),
  /** Plate area the part claims: its x-y bounding box in build orientation. */
  footprintMm2: z.number(),
  /** Volume between overhang faces and the plate or the part below, by vertical rays. */
  supportVolumeMm3: z.number(),
  /** Grid pitch of the support rays. */
  supportSamplePitchMm: z.number(),
  bridges: BridgeReportSchema,
  thinnestWall: ThinWallReportSchema.nullable(),
  /** The rotation applied (row-major 3×3) before the part was lowered onto the plate. */
  rotation: z.array(z.number()).length(9),
});
/** The geometry report (see {@link GeometryReportSchema}). */
export type GeometryReport = z.infer<typeof GeometryReportSchema>;

/** One candidate build orientation and how it scored. */
export const OrientationCandidateSchema = z.object({
  /** e.g. "face -z down", "edge +x-y down", "corner +x+y-z down". */
  label: z.string(),
  kind: z.enum(['face', 'edge', 'corner']),
  /** The model direction that faces the build plate. */
  downVector: Vec3MmSchema,
  /** Pass as `{ rotation }` to orient the part this way. */
  rotation: z.array(z.number()).length(9),
  supportVolumeMm3: z.number(),
  heightMm: z.number(),
  footprintMm2: z.number(),
  bedContactAreaMm2: z.number(),
  overhangAreaMm2: z.number(),
  /** 1 = best. */
  rank: z.number().int(),
  /** Why it ranks where it does, compared with the best. */
  reason: z.string(),
});
/** A scored orientation (see {@link OrientationCandidateSchema}). */
export type OrientationCandidate = z.infer<typeof OrientationCandidateSchema>;

/** The result of the orientation search. */
export const OrientationSearchSchema = z.object({
  best: OrientationCandidateSchema,
  /** All candidates, best first. */
  candidates: z.array(OrientationCandidateSchema),
  /** How the candidates were compared. */
  method: z.string(),
});
/** An orientation search result (see {@link OrientationSearchSchema}). */
export type OrientationSearch = z.infer<typeof OrientationSearchSchema>;

/** Whether and how often the part fits on the chosen printer. */
export const BuildPlateReportSchema = z.object({
  printerId: z.string(),
  buildVolumeMm: Vec3MmSchema,
  fits: z.boolean(),
  /**
   * Complete units on one plate (every part together); when the parts need plates of their own, the copies of the
   * part that fits fewest. 0 when it does not fit. `layout` and `platesPerUnit` say which.
   */
  copiesPerPlate: z.number().int(),
  spacingMm: z.number(),
  /** True when the copies are turned 90° about z to fit more. */
  turnedOnPlate: z.boolean(),
  /** The plate rule (shared/analysis/plateRule.ts): parts together on a plate, each on its own plates, or too big. */
  layout: z.enum(['together', 'separate', 'none']),
  /** Plates one unit needs: 1 together, one per part when separate, 0 when it does not fit. */
  platesPerUnit: z.number().int(),
  /** The rule in words, as every screen shows it. */
  plateText: z.string(),
  /** Size of each separate part in build orientation. */
  partSizesMm: z.array(Vec3MmSchema),
  /** The assembled product's size (its largest part, the body), never the layout of the parts side by side. */
  assembledSizeMm: Vec3MmSchema,
});
/** A build plate report (see {@link BuildPlateReportSchema}). */
export type BuildPlateReport = z.infer<typeof BuildPlateReportSchema>;

/** Outdoor fitness of the part in the chosen material and colour, with the wall thickness it was judged by. */
export const AnalysisOutdoorSchema = OutdoorAssessmentSchema.extend({
  /** Wall thickness used for the thermal resistance; null when none is known (nothing given, open mesh). */
  wallThicknessMm: z.number().nullable(),
  /**
   * Where that thickness comes from: `options` (given by the caller, e.g. NestBoxFacts.wallThicknessMm) or
   * `measured` (5th percentile of the thinnest-wall rays).
   */
  wallThicknessFrom: z.enum(['options', 'measured']).nullable(),
});
/** The outdoor section of the report (see {@link AnalysisOutdoorSchema}). */
export type AnalysisOutdoor = z.infer<typeof AnalysisOutdoorSchema>;

/** The full print-readiness report: geometry, build plate, production, outdoor fitness and any orientation search. */
export const AnalysisReportSchema = GeometryReportSchema.extend({
  /** The orientation the report was computed in ('auto' was resolved by the search). */
  up: z.union([BuildOrientationSchema, z.literal('auto')]),
  orientationSearch: OrientationSearchSchema.nullable(),
  buildPlate: BuildPlateReportSchema,
  materialId: z.string(),
  production: ProductionEstimateSchema,
  /** Sol-air roof and wall temperatures against the material's heat-deflection temperature, and the wall's insulation. */
  outdoor: AnalysisOutdoorSchema,
  /** Things a person should look at before printing. */
  warnings: z.array(z.string()),
});
/** The full report (see {@link AnalysisReportSchema}). */
export type AnalysisReport = z.infer<typeof AnalysisReportSchema>;

/** The options of an analysis request (multipart form fields arrive as text, so numbers are coerced). */
export const AnalysisRequestSchema = z.object({
  up: z.enum([...AxisUpSchema.options, 'auto']).default('+z'),
  printerId: z.string().trim().min(1).max(64).optional(),
  materialId: z.string().trim().min(1).max(64).optional(),
  /** One of the material's colour ids (its first colour when omitted). */
  colourId: z.string().trim().min(1).max(64).optional(),
  infillPct: z.coerce.number().min(0).max(100).optional(),
  overhangDeg: z.coerce.number().min(0).max(89).optional(),
});
/** An analysis request (see {@link AnalysisRequestSchema}). */
export type AnalysisRequest = z.infer<typeof AnalysisRequestSchema>;
