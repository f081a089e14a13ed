/**
 * `npm run cli -- export --template ID [--params '<json>'] [--format stl|3mf] [--printer ID] [--material ID]
 * [--colour ID] --out FILE`.
 */
import { createHash } from 'node:crypto';
import { writeFile } from 'node:fs/promises';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS } from '../../../shared/production/defaults';
import { design3mf } from '../../../shared/mesh/design3mf';
import { writeStl } from '../../../shared/mesh/writeStl';
import { generate } from '../../../templates/generate';
import { findTemplate } from '../../../templates/index';
import { TemplateParamError } from '../../../templates/lib/TemplateParamError';
import { EXIT_CODE, parseCliArgs } from '../parseCliArgs';

/** One line for the command list. */
export const summary =
  'Write a template design as STL or 3MF; prints { triangles, volumeMm3, meshSha256, fileSha256, file }';

/** The usage line printed after bad arguments. */
export const USAGE =
  "Usage: npm run cli -- export --template ID [--params '<json>'] [--format stl|3mf] [--printer ID] " +
  '[--material ID] [--colour ID] --out FILE\n' +
  '  meshSha256: hash of the mesh content (the same for STL and 3MF); fileSha256: sha256 of the file written\n';

function usageError(message: string): number {
  process.stderr.write(`${message}\n${USAGE}`);
  return EXIT_CODE.usage;
}

/**
 * Generates the design (validated, closed mesh), writes the file and prints its triangle count, volume, the mesh's
 * content hash (`meshSha256`) and the sha256 of the written file (`fileSha256`). A 3MF holds each part as its own
 * named object in the chosen material and colour, laid on the chosen printer's plate by the plate rule.
 * Bad arguments (unknown option, template, printer, material or colour, or a parameter out of range) exit with 2
 * and the usage line.
 * @param argv - command-line arguments after the command name
 */
export async function run(argv: string[]): Promise<number> {
  const values = parseCliArgs(
    {
      args: argv,
      options: {
        template: { type: 'string' },
        params: { type: 'string', default: '{}' },
        format: { type: 'string', default: 'stl' },
        printer: { type: 'string', default: DEFAULT_PRINTERS[0].id },
        material: { type: 'string', default: DEFAULT_MATERIALS[0].id },
        colour: { type: 'string' },
        out: { type: 'string' },
      },
      strict: true,
      allowPositionals: false,
    },
    USAGE,
  );
  if (!values) return EXIT_CODE.usage;
  if (!values.template || !values.out) return usageError('--template and --out are required.');
  if (values.format !== 'stl' && values.format !== '3mf')
    return usageError(`--format must be stl or 3mf, not "${values.format}".`);
  if (!findTemplate(values.template)) return usageError(`There is no template "${values.template}".`);
  const printer = DEFAULT_PRINTERS.find((p) => p.id === values.printer);
  if (!printer) return usageError(`There is no printer "${values.printer}".`);
  const material = DEFAULT_MATERIALS.find((m) => m.id === values.material);
  if (!material) return usageError(`There is no material "${values.material}".`);
  const colour = values.colour ? material.colours.find((c) => c.id === values.colour) : material.colours[0];
  if (!colour) return usageError(`${material.name} does not come in "${values.colour}".`);
  let params: unknown;
  try {
    params = JSON.parse(values.params);
  } catch {
    return usageError('--params must be a JSON object, e.g. \'{"entryHoleDiameterMm":28}\'.');
  }
  let result;
  try {
    result = await generate(values.template, params);
  } catch (err) {
    if (err instanceof TemplateParamError) return usageError(err.message);
    throw err;
  }
  const file =
    values.format === 'stl'
      ? writeStl(result.mesh)
      : design3mf(result, {
          buildVolumeMm: [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z],
          material: { name: `${material.name}, ${colour.name}`, displayColour: colour.hex },
        });
  await writeFile(values.out, file);
  const fileSha256 = createHash('sha256').update(file).digest('hex');
  process.stdout.write(
    `${JSON.stringify({
      triangles: result.triangles,
      volumeMm3: Math.round(result.volumeMm3 * 10) / 10,
      meshSha256: result.sha256,
      fileSha256,
      file: values.out,
    })}\n`,
  );
  return EXIT_CODE.ok;
}
