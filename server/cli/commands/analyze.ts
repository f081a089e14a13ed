/**
 * `npm run cli -- analyze --in FILE [--up +z|-z|+x|-x|+y|-y|auto] [--printer ID] [--material ID] [--colour ID]
 * [--infill PCT] [--json]`: the print-readiness report of an STL or 3MF file, with its outdoor fitness.
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { MeshFormatError } from '../../../shared/mesh/MeshFormatError';
import { parseMeshFile } from '../../../shared/mesh/parseMeshFile';
import { analyzeMesh } from '../../../shared/analysis/analyzeMesh';
import { AnalysisRequestSchema, type AnalysisReport } from '../../../shared/schemas/analysis';
import { EXIT_CODE, parseCliArgs } from '../parseCliArgs';
import { formatMinutes, formatMoney } from '../../../shared/format';
import {
  DEFAULT_MATERIALS,
  DEFAULT_PRINTERS,
  DEFAULT_RATES,
  DEFAULT_SETTINGS,
} from '../../../shared/production/defaults';

/** One line for the command list. */
export const summary = 'Print-readiness report of an STL or 3MF file (geometry, support, orientation, cost)';

const USAGE =
  'Usage: npm run cli -- analyze --in FILE [--up +z|-z|+x|-x|+y|-y|auto] [--printer ID] [--material ID] ' +
  '[--colour ID] [--infill PCT] [--overhang DEG] [--json]\n' +
  `Printers: ${DEFAULT_PRINTERS.map((p) => p.id).join(', ')}\nMaterials: ${DEFAULT_MATERIALS.map((m) => m.id).join(', ')}\n` +
  `Colours: ${DEFAULT_MATERIALS[0]!.colours.map((c) => c.id).join(', ')}\n` +
  "These are the built-in defaults a new database starts with; the studio's own apply to uploads on the server.\n";

/**
 * Reads the file, analyses it with the built-in printers and materials and prints the report (a table, or JSON).
 * The command needs no database and does not open one: a running server holds its PGlite data directory, so the CLI
 * uses the built-in defaults of shared/production, the values a new database is seeded with. A studio's own printers,
 * materials, settings and rates (edited on the admin settings screen) apply to uploads on the server.
 * @param argv - command-line arguments after the command name
 * @returns 0 on success, 1 for a file that is not a readable mesh, 2 for bad arguments
 */
export async function run(argv: string[]): Promise<number> {
  const values = parseCliArgs(
    {
      args: argv,
      options: {
        in: { type: 'string' },
        up: { type: 'string', default: '+z' },
        printer: { type: 'string' },
        material: { type: 'string' },
        colour: { type: 'string' },
        infill: { type: 'string' },
        overhang: { type: 'string' },
        json: { type: 'boolean', default: false },
      },
    },
    USAGE,
  );
  if (!values) return EXIT_CODE.usage;
  if (!values.in) {
    process.stderr.write(USAGE);
    return EXIT_CODE.usage;
  }
  const request = AnalysisRequestSchema.safeParse({
    up: values.up,
    printerId: values.printer,
    materialId: values.material,
    colourId: values.colour,
    infillPct: values.infill,
    overhangDeg: values.overhang,
  });
  if (!request.success) {
    const issue = request.error.issues[0];
    process.stderr.write(`--${String(issue.path[0] ?? '')}: ${issue.message}\n${USAGE}`);
    return EXIT_CODE.usage;
  }
  const printer = request.data.printerId
    ? DEFAULT_PRINTERS.find((p) => p.id === request.data.printerId)
    : DEFAULT_PRINTERS[0];
  const material = request.data.materialId
    ? DEFAULT_MATERIALS.find((m) => m.id === request.data.materialId)
    : DEFAULT_MATERIALS[0];
  if (!printer || !material) {
    process.stderr.write(`Unknown ${printer ? 'material' : 'printer'}.\n${USAGE}`);
    return EXIT_CODE.usage;
  }
  if (request.data.colourId !== undefined && !material.colours.some((c) => c.id === request.data.colourId)) {
    process.stderr.write(
      `Unknown colour for ${material.id}; choose one of ${material.colours.map((c) => c.id).join(', ')}.\n`,
    );
    return EXIT_CODE.usage;
  }
  const bytes = new Uint8Array(await readFile(values.in));
  let mesh;
  try {
    mesh = parseMeshFile(bytes, basename(values.in));
  } catch (err) {
    if (err instanceof MeshFormatError) {
      process.stderr.write(`${basename(values.in)}: ${err.message} (${err.reason})\n`);
      return EXIT_CODE.refused;
    }
    throw err;
  }
  const settings =
    request.data.infillPct === undefined
      ? DEFAULT_SETTINGS
      : { ...DEFAULT_SETTINGS, infillPct: request.data.infillPct };
  const { report } = analyzeMesh(mesh, {
    up: request.data.up,
    printer,
    material,
    colourId: request.data.colourId,
    settings,
    rates: DEFAULT_RATES,
    overhangDeg: request.data.overhangDeg,
  });
  process.stdout.write(
    values.json ? `${JSON.stringify(report, null, 2)}\n` : formatReport(report, basename(values.in)),
  );
  return EXIT_CODE.ok;
}

const mm = (v: number, digits = 1): string => `${v.toFixed(digits)} mm`;
const cm3 = (v: number): string => `${(v / 1000).toFixed(1)} cm³`;
const cm2 = (v: number): string => `${(v / 100).toFixed(1)} cm²`;
const celsiusFahrenheit = (c: number): string => `${c.toFixed(1)} °C (${((c * 9) / 5 + 32).toFixed(0)} °F)`;
const VERDICT_WORDS = { ok: 'ok', caution: 'close to the limit', fail: 'above the limit' } as const;

/**
 * The report as an aligned two-column table for people.
 * @param r - the report
 * @param name - the file name
 */
export function formatReport(r: AnalysisReport, name: string): string {
  const p = r.production;
  const rows: [string, string][] = [
    ['File', name],
    [
      'Orientation',
      r.orientationSearch
        ? `auto: ${r.orientationSearch.best.label}`
        : String(typeof r.up === 'string' ? `${r.up} up` : 'rotation'),
    ],
    ['Triangles', String(r.triangles)],
    ['Size, assembled (x × y × z)', r.buildPlate.assembledSizeMm.map((v) => v.toFixed(1)).join(' × ') + ' mm'],
    ...(r.buildPlate.partSizesMm.length > 1
      ? ([
          [
            'Parts',
            r.buildPlate.partSizesMm.map((size) => size.map((v) => v.toFixed(0)).join(' × ')).join('; ') + ' mm',
          ],
          ['Print layout of the file', r.bbox.sizeMm.map((v) => v.toFixed(1)).join(' × ') + ' mm'],
        ] as [string, string][])
      : []),
    ['Volume', cm3(r.volumeMm3)],
    ['Surface area', cm2(r.surfaceAreaMm2)],
    [
      'Watertight',
      r.watertight
        ? 'yes'
        : `no (${r.edges.openEdges} open, ${r.edges.nonManifoldEdges} non-manifold, ${r.edges.misorientedEdges} misoriented edges)`,
    ],
    ['Shells', String(r.components)],
    [`Overhang > ${r.overhang.thresholdDeg}°`, `${cm2(r.overhang.areaMm2)} (${r.overhang.faceCount} faces)`],
    ['Support volume', `${cm3(r.supportVolumeMm3)} (ray pitch ${mm(r.supportSamplePitchMm, 2)})`],
    ['Bed contact', cm2(r.bedContactAreaMm2)],
    [
      'Bridges',
      r.bridges.regions.length
        ? r.bridges.regions.map((b) => `${b.spanMm.toFixed(1)} mm ${b.status}`).join(', ')
        : 'none',
    ],
    [
      'Thinnest wall',
      r.thinnestWall
        ? `${mm(r.thinnestWall.minMm, 2)} (5th percentile ${mm(r.thinnestWall.p5Mm, 2)})`
        : 'not measured (open mesh)',
    ],
    ['Printer', `${r.buildPlate.printerId} (${r.buildPlate.buildVolumeMm.join(' × ')} mm)`],
    ['Build plates', r.buildPlate.plateText],
    ['Material', r.materialId],
    ['Mass', `${p.massG.toFixed(0)} g`],
    ['Filament', `${p.filamentLengthM.toFixed(1)} m`],
    ['Print time', formatMinutes(p.printTimeMin)],
    ['Energy', `${p.energyKwh.toFixed(2)} kWh`],
    ['Cost per unit', formatMoney(p.cost.totalCents, p.currency)],
    ['  material', formatMoney(p.cost.materialCents, p.currency)],
    ['  machine time', formatMoney(p.cost.machineTimeCents, p.currency)],
    ['  energy', formatMoney(p.cost.energyCents, p.currency)],
    ['  support removal', formatMoney(p.cost.supportLabourCents, p.currency)],
    ['  handling', formatMoney(p.cost.handlingLabourCents, p.currency)],
    ['  coating and packing', formatMoney(p.cost.postProcessingCents, p.currency)],
    ['  packaging', formatMoney(p.cost.packagingCents, p.currency)],
    ['  failure allowance', formatMoney(p.cost.failureAllowanceCents, p.currency)],
    ['Outdoor colour', `${r.outdoor.colourId} (solar absorptance ${r.outdoor.absorptance.toFixed(2)})`],
    ['Heat deflection', celsiusFahrenheit(r.outdoor.heatDeflectionC)],
    [`Roof in full sun`, `${celsiusFahrenheit(r.outdoor.roof.solAirC)}, ${VERDICT_WORDS[r.outdoor.roof.verdict]}`],
    [`Wall in full sun`, `${celsiusFahrenheit(r.outdoor.wall.solAirC)}, ${VERDICT_WORDS[r.outdoor.wall.verdict]}`],
    [
      'Wall insulation',
      r.outdoor.wallResistance
        ? `${r.outdoor.wallResistance.rM2KW.toFixed(3)} m²K/W, ${Math.round(r.outdoor.wallResistance.ratioToPine * 100)} % of 19 mm pine ` +
          `(wall ${mm(r.outdoor.wallThicknessMm!, 2)}, ${r.outdoor.wallThicknessFrom})`
        : 'not estimated (no wall thickness)',
    ],
  ];
  if (r.orientationSearch) {
    for (const c of r.orientationSearch.candidates.slice(0, 5)) rows.push([`  #${c.rank} ${c.label}`, c.reason]);
  }
  const width = Math.max(...rows.map(([k]) => k.length));
  const lines = rows.map(([k, v]) => `${k.padEnd(width)}  ${v}`);
  if (r.warnings.length) lines.push('', 'Warnings:', ...r.warnings.map((w) => `- ${w}`));
  lines.push(
    '',
    `Outdoors (air ${r.outdoor.airC} °C, clear summer noon; estimates, not a guarantee):`,
    ...r.outdoor.cautions.map((c) => `- ${c}`),
  );
  return `${lines.join('\n')}\n`;
}
