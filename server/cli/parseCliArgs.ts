import { parseArgs, type ParseArgsConfig } from 'node:util';

/** The exit codes the commands share: done, refused by the data (a bad file, an e-mail in use), bad arguments. */
export const EXIT_CODE = { ok: 0, refused: 1, usage: 2 } as const;

/**
 * Parses a command's arguments with node:util parseArgs; an unknown option or a missing value is written to stderr
 * with the command's usage text instead of being thrown.
 * @param config - the parseArgs configuration (args and options)
 * @param usageText - what follows the parse error's message and a line break on stderr
 * @returns the parsed values, or `undefined` after bad arguments (the command then exits with `EXIT_CODE.usage`)
 */
export function parseCliArgs<T extends ParseArgsConfig>(
  config: T,
  usageText: string,
): ReturnType<typeof parseArgs<T>>['values'] | undefined {
  try {
    return parseArgs(config).values;
  } catch (err) {
    process.stderr.write(`${(err as Error).message}\n${usageText}`);
    return undefined;
  }
}
