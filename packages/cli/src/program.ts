/** The trivar command line: commands wired to core; no physics here. */
import { Command, CommanderError, InvalidArgumentError, Option } from 'commander';
import { EXIT, exitCodeFor, messageFor } from './exitCodes.js';
import type { CliIo } from './io.js';
import { runSolve } from './commands/solve.js';
import { runSchema } from './commands/schema.js';
import { runCorrect, type CorrectCommandOptions } from './commands/correct.js';
import packageJson from '../package.json' with { type: 'json' };

export const VERSION: string = packageJson.version;

const SOLVE_EXAMPLES = `
Examples:
  trivar solve examples/corner-bakery.yaml
  trivar solve examples/corner-bakery.yaml --json > result.json
  trivar solve examples/hillside-workshop.yaml --open-neutral
  trivar solve examples/maple-court-riser.yaml --board "Floor 4"
  cat board.yaml | trivar solve -

Exit codes:
  0  solved
  2  the command line is wrong
  3  the board file cannot be read or is not valid (every problem is listed with its field path)
  4  the board has no solution (singular network, or loads beyond what the supply can deliver)
  1  internal error (a bug in trivar)`;

const CORRECT_EXAMPLES = `
The study can also live in the board file under "correction:" (see trivar schema); options override it.

Examples:
  trivar correct examples/riverside-cold-store.yaml
  trivar correct examples/riverside-cold-store.yaml --arrangement star-bank --pf 0.97
  trivar correct examples/corner-bakery.yaml --arrangement balancing-compensator
  trivar correct board.yaml --arrangement delta-bank --definition effective --light-load 0.2 --json

Exit codes: as for solve, plus
  5  the study ran but the target cannot be met with the allowed equipment (the report says why
     and shows the best reachable result)`;

function numberIn(min: number, max: number, what: string) {
  return (text: string): number => {
    const x = Number(text);
    if (!Number.isFinite(x) || x <= min || x > max) throw new InvalidArgumentError(`expected ${what}.`);
    return x;
  };
}

/** What a command that ran to the end reports through the exit code (set by `correct`). */
export interface RunOutcome {
  exitCode: number;
}

export function createProgram(io: CliIo, outcome: RunOutcome = { exitCode: EXIT.ok }): Command {
  const program = new Command('trivar');
  program
    .description('Exact phase, neutral and unbalance figures for low-voltage boards with uneven single-phase loads.')
    .version(VERSION, '-V, --version')
    .configureOutput({ writeOut: io.stdout, writeErr: io.stderr })
    .exitOverride()
    .showHelpAfterError('(run with --help for usage)');

  program
    .command('solve')
    .description('solve a board or installation file: voltages, line and neutral currents, unbalance, power factor, losses')
    .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
    .option('--json', 'print the full result as JSON instead of the report')
    .option('--open-neutral', 'also show what each line-to-neutral load would see if the neutral conductor broke')
    .option('--board <name>', 'installation files: also print the full figures of this board (repeatable)', (v: string, prev: string[] = []) => [...prev, v])
    .option('--all-boards', 'installation files: print the full figures of every board')
    .addHelpText('after', SOLVE_EXAMPLES)
    .action(async (board: string, opts: { json?: boolean; openNeutral?: boolean; board?: string[]; allBoards?: boolean }) => {
      await runSolve(board, opts, io);
    });

  program
    .command('correct')
    .description('size a capacitor bank or balancing compensator for a power-factor target, choose units, and verify by re-solving')
    .argument('<board>', 'board file (YAML or JSON), or - for standard input')
    .addOption(new Option('--arrangement <kind>', 'what to size').choices(['star-bank', 'delta-bank', 'balancing-compensator']))
    .option('--pf <value>', 'target power factor (0 < pf <= 1; default 0.95)', numberIn(0, 1, 'a power factor above 0 and at most 1'))
    .addOption(
      new Option('--definition <name>', 'which power factor the target applies to').choices(['per-line', 'effective', 'vector', 'arithmetic', 'positive-sequence']),
    )
    .option('--allow-leading', 'let a line end up leading (default: never leading)')
    .option('--upper-pf <value>', 'do not correct beyond this lagging power factor', numberIn(0, 1, 'a power factor above 0 and at most 1'))
    .option('--light-load <fraction>', 'check the fixed part at this fraction of every load (0-1)', numberIn(-1e-12, 1, 'a fraction from 0 to 1'))
    .addOption(new Option('--pattern <steps>', 'switched-step ratios of the bank').choices(['fixed', '1:1:1', '1:2:2', '1:2:4']))
    .option('--json', 'print the full report as JSON instead of the text report')
    .addHelpText('after', CORRECT_EXAMPLES)
    .action(async (board: string, opts: CorrectCommandOptions) => {
      const report = await runCorrect(board, opts, io);
      const missed = report.status === 'infeasible' || report.status === 'misses-target-with-available-units';
      if (missed) outcome.exitCode = EXIT.targetNotMet;
    });

  program
    .command('schema')
    .description('print the JSON Schema of board files (for editor completion and checking)')
    .action(() => runSchema(io));

  return program;
}

/** Runs the CLI on `argv` (user arguments only) and returns the exit code. */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const outcome: RunOutcome = { exitCode: EXIT.ok };
  const program = createProgram(io, outcome);
  try {
    await program.parseAsync(argv as string[], { from: 'user' });
    return outcome.exitCode;
  } catch (error) {
    if (error instanceof CommanderError) {
      // Help and version exit "successfully" through commander's override.
      if (error.code === 'commander.helpDisplayed' || error.code === 'commander.version' || error.code === 'commander.help') return EXIT.ok;
      return EXIT.usage;
    }
    io.stderr(`${messageFor(error)}\n`);
    return exitCodeFor(error);
  }
}
