// Placewright command line: `npm run --silent cli -- COMMAND [options]` (server/cli/README.md).
// A small dispatcher; each command lives in server/cli/<command>.ts and exports a `Command`.
import { EngineInputError } from '../shared/core';
import { CliUsageError, EXIT_BAD_INPUT, type CliIo, type Command } from './cli/common';

/** Registration point: one line per command, loaded on demand. */
const COMMANDS: Record<string, () => Promise<Command>> = {
  import: async () => (await import('./cli/import')).importCommand,
  panelize: async () => (await import('./cli/panelize')).panelizeCommand,
  align: async () => (await import('./cli/align')).alignCommand,
  check: async () => (await import('./cli/check')).checkCommand,
};

async function usage(): Promise<string> {
  const lines = ['Usage: cli COMMAND [options]   (cli COMMAND --help for details)', '', 'Commands:'];
  for (const [name, load] of Object.entries(COMMANDS)) lines.push(`  ${name.padEnd(10)} ${(await load()).summary}`);
  lines.push('', 'Exit codes: 0 done; 1 check found an error-severity finding; 2 bad input or options.');
  return lines.join('\n') + '\n';
}

export async function main(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  try {
    if (!name) {
      io.stderr(await usage());
      return EXIT_BAD_INPUT;
    }
    if (name === '--help' || name === '-h' || name === 'help') {
      io.stdout(await usage());
      return 0;
    }
    const load = COMMANDS[name];
    if (!load) throw new CliUsageError(`unknown command "${name}"; expected one of ${Object.keys(COMMANDS).join(', ')}`);
    return await (await load()).run(rest, io);
  } catch (e) {
    if (e instanceof EngineInputError || e instanceof CliUsageError) {
      io.stderr(`error: ${e.message.replace(/[\r\n]+/g, ' ')}\n`);
      return EXIT_BAD_INPUT;
    }
    io.stderr(`error: internal: ${(e as Error)?.stack ?? String(e)}\n`);
    return EXIT_BAD_INPUT;
  }
}

const isEntry = process.argv[1] && /cli\.ts$/.test(process.argv[1]);
if (isEntry) {
  const code = await main(process.argv.slice(2), {
    stdout: (s) => process.stdout.write(s),
    stderr: (s) => process.stderr.write(s),
  });
  process.exitCode = code;
}
