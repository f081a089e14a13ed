import type { GeometryReport } from '../schemas/analysis';
import type { ProductionInput } from '../schemas/production';

/**
 * The production-estimate input read off a geometry report (mesh already in build orientation).
 * @param report - the geometry report
 * @param heightMm - the printed height (default: the report's bounding-box height; pass the tallest part's height
 *   when parts print separately)
 * @returns volume, areas, support volume, bounding box and height for {@link estimateProduction}
 */
export function productionInputFromGeometry(report: GeometryReport, heightMm = report.bbox.sizeMm[2]): ProductionInput {
  return {
    volumeMm3: report.volumeMm3,
    surfaceAreaMm2: report.surfaceAreaMm2,
    heightMm,
    supportVolumeMm3: report.supportVolumeMm3,
    bboxSizeMm: report.bbox.sizeMm,
    footprintMm2: report.footprintMm2,
    upFacingAreaMm2: report.upFacingAreaMm2,
    downFacingAreaMm2: report.downFacingAreaMm2,
  };
}
