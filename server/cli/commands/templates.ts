/** `npm run cli -- templates [--json]`: every template with its parameters. */
import { describeParameters } from '../../../templates/lib/describeParameters';
import { TEMPLATES } from '../../../templates/index';
import { EXIT_CODE, parseCliArgs } from '../parseCliArgs';

/** The usage line printed after bad arguments. */
export const USAGE = 'Usage: npm run cli -- templates [--json]\n';

/** One line for the command list. */
export const summary = 'List the parametric templates and their parameters (--json for machine-readable output)';

/**
 * Prints every template (id, version, name, and per parameter key, unit, min, max, step, default).
 * @param argv - command-line arguments after the command name
 */
export async function run(argv: string[]): Promise<number> {
  const values = parseCliArgs(
    { args: argv, options: { json: { type: 'boolean', default: false } }, strict: true, allowPositionals: false },
    USAGE,
  );
  if (!values) return EXIT_CODE.usage;
  const templates = TEMPLATES.map((template) => ({
    id: template.id,
    version: template.version,
    name: template.name,
    summary: template.summary,
    parameters: describeParameters(template),
  }));
  if (values.json) {
    process.stdout.write(`${JSON.stringify({ templates }, null, 2)}\n`);
    return 0;
  }
  for (const template of templates) {
    process.stdout.write(`${template.id} v${template.version}: ${template.name} — ${template.summary}\n`);
    for (const p of template.parameters) {
      const range =
        p.kind === 'number'
          ? `${p.min}–${p.max} ${p.unit}`.trim()
          : p.kind === 'choice'
            ? (p.options ?? []).join(' | ')
            : 'on/off';
      process.stdout.write(`  ${p.key.padEnd(24)} ${String(p.default).padEnd(8)} ${range}\n`);
    }
  }
  return 0;
}
