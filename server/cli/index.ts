/**
 * `npm run cli -- <command> [options]`: one entry point, one module per command in ./commands.
 * Each command module exports `run(argv): Promise<number>` (the exit code) and `summary`.
 */
const COMMANDS: Record<string, string> = {
  'user:create': './commands/userCreate.ts',
  templates: './commands/templates.ts',
  export: './commands/export.ts',
  analyze: './commands/analyze.ts',
};

interface CliCommand {
  summary: string;
  run(argv: string[]): Promise<number>;
}

async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === 'help' || !(name in COMMANDS)) {
    if (name && name !== '--help' && name !== 'help') process.stderr.write(`Unknown command: ${name}\n\n`);
    process.stdout.write('Usage: npm run cli -- <command> [options]\n\nCommands:\n');
    for (const [key, path] of Object.entries(COMMANDS)) {
      const mod = (await import(path).catch(() => null)) as CliCommand | null;
      process.stdout.write(`  ${key.padEnd(14)} ${mod?.summary ?? '(not available)'}\n`);
    }
    return name && name !== '--help' && name !== 'help' ? 2 : 0;
  }
  const mod = (await import(COMMANDS[name])) as CliCommand;
  return mod.run(rest);
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (err: unknown) => {
    process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(1);
  },
);
