/** The trivar command line: commands wired to core; no physics here. */
import { Command, CommanderError } from 'commander';
import { EXIT, exitCodeFor, messageFor, UsageError } from './exitCodes.js';
import type { CliIo } from './io.js';
import { runSolve } from './commands/solve.js';
import { runSchema } from './commands/schema.js';

export const VERSION = '0.1.0';

const SOLVE_EXAMPLES = `
Examples:
  trivar solve examples/corner-bakery.yaml
  trivar solve examples/corner-bakery.yaml --json > result.json
  trivar solve examples/hillside-workshop.yaml --open-neutral
  cat board.yaml | trivar solve -

Exit codes:
  0  solved
  2  the command line is wrong
  3  the board file cannot be read or is not valid (every problem is listed with its field path)
  4  the board has no solution (singular network, or loads beyond what the supply can deliver)
  1  internal error (a bug in trivar)`;

export function createProgram(io: CliIo): Command {
  const program = new Command('trivar');
  program
    .description('Exact phase, neutral and unbalance figures for low-voltage boards with uneven single-phase loads.')
    .version(VERSION, '-V, --version')
    .configureOutput({ writeOut: io.stdout, writeErr: io.stderr })
    .exitOverride()
    .showHelpAfterError('(run with --help for usage)');

  program
    .command('solve')
    .description('solve a board file: voltages, line and neutral currents, unbalance, power factor, losses')
    .argument('<board>', 'board file (YAML or JSON), or - for standard input')
    .option('--json', 'print the full result as JSON instead of the report')
    .option('--open-neutral', 'also show what each line-to-neutral load would see if the neutral conductor broke')
    .addHelpText('after', SOLVE_EXAMPLES)
    .action(async (board: string, opts: { json?: boolean; openNeutral?: boolean }) => {
      await runSolve(board, opts, io);
    });

  program
    .command('schema')
    .description('print the JSON Schema of board files (for editor completion and checking)')
    .action(() => runSchema(io));

  return program;
}

/** Runs the CLI on `argv` (user arguments only) and returns the exit code. */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const program = createProgram(io);
  try {
    await program.parseAsync(argv as string[], { from: 'user' });
    return EXIT.ok;
  } catch (error) {
    if (error instanceof CommanderError) {
      // Help and version exit "successfully" through commander's override.
      if (error.code === 'commander.helpDisplayed' || error.code === 'commander.version' || error.code === 'commander.help') return EXIT.ok;
      return EXIT.usage;
    }
    io.stderr(`${messageFor(error instanceof UsageError ? error : error)}\n`);
    return exitCodeFor(error);
  }
}
