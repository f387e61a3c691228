/** The trivar command line: commands wired to core; no physics here. */
import { Command, CommanderError, InvalidArgumentError, Option } from 'commander';
import { EXIT, exitCodeFor, messageFor } from './exitCodes.js';
import { DEFAULT_MAX_INPUT_MB, type CliIo } from './io.js';
// Each command's module loads when that command runs (esbuild splits them into chunks), so
// `trivar solve` never parses the correction, harmonic, profile or report code.
import type { SchemaCommandOptions } from './commands/schema.js';
import type { CorrectCommandOptions } from './commands/correct.js';
import type { ProfileCommandOptions } from './commands/profile.js';
import type { RebalanceCommandOptions } from './commands/rebalance.js';
import type { DiagramCommandOptions } from './commands/diagram.js';
import type { ReportCommandOptions } from './commands/report.js';
import type { CheckCommandOptions } from './commands/check.js';
import { DIAGRAM_VIEWS } from './commands/diagramViews.js';
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
  6  the output could not be written (disk full); a reader closing the pipe early ends trivar quietly with 0
  1  internal error (a bug in trivar)`;

const CORRECT_EXAMPLES = `
The study can also live in the board file under "correction:" (see trivar schema); options override it.

Examples:
  trivar correct examples/riverside-cold-store.yaml
  trivar correct examples/cedar-falls-print-shop.yaml        (no arrangement: all compared)
  trivar correct examples/riverside-cold-store.yaml --arrangement star-bank --pf 0.97
  trivar correct examples/corner-bakery.yaml --arrangement balancing-compensator
  trivar correct examples/tannery-lane-works.yaml --board "Press shop" --arrangement star-bank
  trivar correct examples/tannery-lane-works.yaml --board "Press shop" --measured-at origin --arrangement star-bank
  trivar correct board.yaml --arrangement delta-bank --definition effective --light-load 0.2 --json

Exit codes: as for solve, plus
  5  the study ran but the target cannot be met with the allowed equipment, or no unit suits
     the voltage (the report says why and shows the best reachable result)`;

const PROFILE_EXAMPLES = `
Interval data: a CSV file whose first column is the time (2025-03-30 02:15, or ISO 8601 with Z or an
offset) and whose other headers are "<target> [<quantity>]":
  target    a load name, a group from the board file's profile.groups, or phase A / phase B / phase C;
            on an installation file a load on one board by its name, else "<board>/<load>", and
            "<board>/phase A" for a sub-board's metered phase; "<board>//<load>" always names that
            board's load alone (where names meet: a load "Sub A/b" beside board "Sub A"'s load "b");
            a phase is metered whole: no column (nor --unlisted-at-rating) for a load on it as well
  quantity  x (fraction of rating) | kW | kW and kvar | kW and pf | A and pf, each of a pair its own
            column ("oven [kW]", "oven [pf]"; pf < 0 = leading)
  kW alone  a load or group at its loads' own rated power factors, a group's kW shared by rated kW;
            a phase at the rated power factor of the file's loads on it (the output says which)
Columns separated by commas. Intervals from 1 s to 1 h; a row a part of an interval before the next
counts for that part. Gaps and repeated times are reported; gaps stay out of every figure unless
--fill-gaps says how to fill them (a warning where more than 10 % of the intervals are made up).
Tariff, limits and the bank live under profile: in the board file (see trivar schema). Without --data
the file's profile.scenarios run, and the options that work on interval data only are refused.

Examples:
  node scripts/generate-profile-example.mjs /tmp/quay-street.csv
  trivar profile examples/quay-street-flats.yaml --data /tmp/quay-street.csv --time-zone Europe/Dublin
  trivar profile examples/quay-street-flats.yaml --data /tmp/quay-street.csv --bank --charts charts/
  trivar profile board.yaml --data meter.csv --fill-gaps hold --summary-csv summary.csv --json
  trivar profile examples/osier-mill-studios.yaml --data examples/osier-mill-day.csv --bank --board Pottery

Exit codes: as for solve (3 also for interval data that cannot be read: every bad cell is named
by row and column)`;
const HARMONICS_EXAMPLES = `
Spectra go on the loads (spectrum: switch-mode | [{ order, percent, angleDeg }]); background distortion,
an installed bank, the IEEE 519 current check (pcc) and the levels the board voltages are judged against
(voltageDistortionLimits: iec-61000-2-2 | en50160 | ieee-519; default by region) go under "harmonics:"
in the board file (see trivar schema).
On an installation file every board is solved at once (the feeders and their neutrals at each order);
banks go under "harmonics: banks:" with the board each is on, and the scan is seen from that board.

Examples:
  trivar harmonics examples/mill-street-offices.yaml
  trivar harmonics examples/mill-street-offices.yaml --json > harmonics.json
  trivar harmonics examples/harrow-yard-studios.yaml --board "Studios ground"

Exit codes: as for solve`;

const REBALANCE_EXAMPLES = `
The study can also live in the board file under "rebalance:" (pins, load conditions, capacities;
see trivar schema); options override it.

Examples:
  trivar rebalance examples/larkspur-court-flats.yaml
  trivar rebalance examples/larkspur-court-flats.yaml --move-limit 3
  trivar rebalance examples/larkspur-court-flats.yaml --near-best 2 --write larkspur-moved.yaml
  trivar rebalance board.yaml --aim neutral=1,largest-line=0.5 --json
  trivar rebalance examples/quay-street-flats.yaml --data quay-street.csv --combine weighted
  trivar rebalance examples/maple-court-riser.yaml --move-limit 4 --write riser-moved.yaml
  trivar rebalance examples/maple-court-riser.yaml --boards "Floor 3" --measure-at main
  trivar rebalance examples/maple-court-riser.yaml --aim voltage-unbalance --measure-at "Floor 4"

Exit codes: as for solve`;

/** A decimal number as people write one (12, -0.5, .95, 1e3); not hex, binary or octal, which Number() also reads. */
const DECIMAL = /^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$/;

const AIM_NAMES: Record<string, string> = {
  'largest-line': 'largestLine',
  neutral: 'neutral',
  'current-unbalance': 'currentUnbalance',
  'voltage-unbalance': 'voltageUnbalance',
};

/** "neutral=2,largest-line" → { neutral: 2, largestLine: 1 }. */
function parseAim(text: string): Record<string, number> {
  const aim: Record<string, number> = {};
  for (const part of text.split(',')) {
    const [name = '', weight] = part.split('=').map((s) => s.trim());
    const key = AIM_NAMES[name];
    const w = weight === undefined ? 1 : DECIMAL.test(weight) ? Number(weight) : Number.NaN;
    if (!key || !Number.isFinite(w) || w < 0)
      throw new InvalidArgumentError(`expected figures from ${Object.keys(AIM_NAMES).join(', ')}, each optionally =weight (a number >= 0), separated by commas.`);
    if (key in aim) throw new InvalidArgumentError(`${name} is named twice; give each figure once, with its weight.`);
    aim[key] = w;
  }
  return aim;
}

/** Any number: the study's schema checks the range and names the field. */
function anyNumber(text: string): number {
  const x = Number(text);
  if (!DECIMAL.test(text) || !Number.isFinite(x)) throw new InvalidArgumentError('expected a number.');
  return x;
}

const DIAGRAM_EXAMPLES = `
Examples:
  trivar diagram examples/corner-bakery.yaml -o bakery-phasors.svg
  trivar diagram examples/riverside-cold-store.yaml --with-correction -o cold-store.svg
  trivar diagram examples/riverside-cold-store.yaml --view triangles -o triangles.svg
  trivar diagram examples/hillside-workshop.yaml --view sequence > sequence.svg
  trivar diagram examples/maple-court-riser.yaml --view one-line -o riser.svg
  trivar diagram examples/maple-court-riser.yaml --board "Floor 4" -o floor-4.svg`;

const REPORT_EXAMPLES = `
The report includes the correction study when the board file has a "correction:" section (naming no
arrangement: every arrangement compared and the one trivar correct recommends, in full), and the harmonic
study when it has a "harmonics:" section or loads with a spectrum. On an installation file it describes the
supply, the feeders and every board, with a one-line drawing, and (with harmonic data) the harmonic study of
every board and bank.

Examples:
  trivar report examples/riverside-cold-store.yaml -o cold-store.html
  trivar report examples/corner-bakery.yaml -o bakery.md               (Markdown, from the extension; writes bakery-*.svg beside it)
  trivar report examples/maple-court-riser.yaml -o riser.html         (an installation: every board and feeder)
  trivar report examples/riverside-cold-store.yaml --hand-figures examples/hand-figures/riverside-cold-store.yaml -o store.html`;

const CHECK_EXAMPLES = `
The figures file (YAML or JSON) lists the capacitors you chose and, if you like, what you expect:
  targetPf: 0.95
  capacitors:
    - { branch: A-B, kvar: 16 }              # nameplate kvar (at ratedV, default the branch's nominal voltage)
    - { branch: C-N, uF: 250 }               # or the capacitance
  expected: { pf: 0.95, neutralA: 20, lines: { A: { currentA: 170, pf: 0.95 } } }

Examples:
  trivar check examples/riverside-cold-store.yaml examples/hand-figures/riverside-cold-store.yaml
  trivar check board.yaml my-figures.yaml --diagram triangles.svg
  trivar check board.yaml my-figures.yaml --json`;

function numberIn(min: number, max: number, what: string) {
  return (text: string): number => {
    const x = DECIMAL.test(text) ? Number(text) : Number.NaN;
    if (!Number.isFinite(x) || x <= min || x > max) throw new InvalidArgumentError(`expected ${what}.`);
    return x;
  };
}

/** The read limit for board files and standard input, checked while reading. */
function maxInputOption(): Option {
  return new Option('--max-input-mb <MB>', `refuse a board larger than this (default ${DEFAULT_MAX_INPUT_MB} MB)`).argParser(
    numberIn(0, 4096, 'a size in MB above 0 and at most 4096'),
  );
}

/** What a command that ran to the end reports through the exit code (set by `correct`). */
export interface RunOutcome {
  exitCode: number;
}

/** Every command, in the order --help lists them. */
export const COMMAND_NAMES = ['solve', 'correct', 'profile', 'harmonics', 'rebalance', 'diagram', 'report', 'check', 'schema'] as const;
export type CommandName = (typeof COMMAND_NAMES)[number];

/**
 * The program with every command, or with only `only`: a run that names its command needs no other
 * (building all nine and their options was 4–7 M instructions of every run's start-up, cachegrind). Help and
 * errors that list commands come from a program with all of them (runCli).
 */
export function createProgram(io: CliIo, outcome: RunOutcome = { exitCode: EXIT.ok }, only?: CommandName): Command {
  const wanted = (name: CommandName): boolean => only === undefined || only === name;
  const program = new Command('trivar');
  program
    .description('Exact phase, neutral and unbalance figures for low-voltage boards with uneven single-phase loads.')
    .version(VERSION, '-V, --version')
    .configureOutput({ writeOut: io.stdout, writeErr: io.stderr })
    .exitOverride()
    .showHelpAfterError('(run with --help for usage)');

  if (wanted('solve')) {
    program
      .command('solve')
      .description('solve a board or installation file: voltages, line and neutral currents, unbalance, power factor, losses')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .option('--json', 'print the full result as JSON instead of the report')
      .option('--open-neutral', 'also show what each line-to-neutral load would see if the neutral conductor broke')
      .option('--board <name>', 'installation files: also print the full figures of this board (repeatable)', (v: string, prev: string[] = []) => [...prev, v])
      .option('--all-boards', 'installation files: print the full figures of every board')
      .addOption(maxInputOption())
      .addHelpText('after', SOLVE_EXAMPLES)
      .action(async (board: string, opts: { json?: boolean; openNeutral?: boolean; board?: string[]; allBoards?: boolean; maxInputMb?: number }) => {
        const { runSolve } = await import('./commands/solve.js');
        await runSolve(board, opts, io);
      });
  }

  if (wanted('correct')) {
    program
      .command('correct')
      .description('size a capacitor bank or balancing compensator for a power-factor target, choose units, and verify by re-solving')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .option('--board <name>', 'installation files: the board the equipment goes on (default: the main board)')
      .option('--measured-at <point>', "where the target is measured: origin (the supply's terminals) or a board the equipment's board is fed through (default: the equipment's board)")
      .addOption(new Option('--arrangement <kind>', 'what to size (default: compare every arrangement that fits the board)').choices(['star-bank', 'delta-bank', 'balancing-compensator']))
      .option('--pf <value>', 'target power factor (0 < pf <= 1; default 0.95)', numberIn(0, 1, 'a power factor above 0 and at most 1'))
      .addOption(
        new Option('--definition <name>', 'which power factor the target applies to').choices(['per-line', 'effective', 'vector', 'arithmetic', 'positive-sequence']),
      )
      .option('--allow-leading', 'let a line end up leading (default: never leading)')
      .option('--upper-pf <value>', 'do not correct beyond this lagging power factor', numberIn(0, 1, 'a power factor above 0 and at most 1'))
      .option('--light-load <fraction>', 'check the fixed part at this fraction of every load (0-1)', numberIn(-1e-12, 1, 'a fraction from 0 to 1'))
      .addOption(new Option('--practice <region>', 'regional practice: typical catalogue, voltage margin, discharge time').choices(['iec', 'north-american']))
      .addOption(new Option('--outputs <n>', 'switched outputs of the bank controller').choices(['6', '8', '12']))
      .option('--ct <amps>', 'primary of the controller current transformer, A', numberIn(0, 1e6, 'a current above 0 A and at most 1000000 A'))
      .option('--json', 'print the full report as JSON instead of the text report')
      .addOption(maxInputOption())
      .addHelpText('after', CORRECT_EXAMPLES)
      .action(async (board: string, opts: CorrectCommandOptions) => {
        const { outcomeMeetsTarget, runCorrect } = await import('./commands/correct.js');
        if (!outcomeMeetsTarget(await runCorrect(board, opts, io))) outcome.exitCode = EXIT.targetNotMet;
      });
  }

  if (wanted('profile')) {
    program
      .command('profile')
      .description('run interval data through the board or installation: peaks and percentiles, hours over limits, energy and billing power factor by month, an automatic bank simulated over the year')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .option('--data <file>', 'interval data (CSV)')
      .option('--time-zone <name>', 'IANA time zone of times written without an offset, and of calendar months (default UTC); other than UTC, every time printed carries its UTC offset')
      .addOption(new Option('--fill-gaps <how>', 'fill missing intervals (default: leave them out)').choices(['none', 'hold', 'linear']))
      .option('--unlisted-at-rating', 'keep loads that no column drives at their rating (default: off)')
      .option('--bank', 'simulate an automatic capacitor bank over the profile (profile.bank in the board file sets it up)')
      .option('--correction-bank', "simulate instead the bank trivar correct designs for this board: its steps, fixed part and controller settings (the board file's correction section)")
      .option('--pf <value>', 'target power factor of the bank (0 < pf <= 1; default 0.95)', numberIn(0, 1, 'a power factor above 0 and at most 1'))
      .option('--board <name>', "installation files: the board the bank goes on (default: the main board, or the correction section's board with --correction-bank)")
      .option('--summary-csv <file>', 'write the summary as CSV')
      .option('--intervals-csv <file>', 'write per-interval results as CSV')
      .option('--charts <dir>', 'write SVG charts (currents, power factor, load duration) into this folder; installation files: a folder per board and the feeders\' loading')
      .option('--threads <n>', 'worker threads for reading large files (1 or 2; default 2 where there are two cores)', numberIn(0, 2, '1 or 2'))
      .option('--json', 'print the full result as JSON instead of the report')
      .addHelpText('after', PROFILE_EXAMPLES)
      .action(async (board: string, opts: ProfileCommandOptions) => {
        const { runProfile } = await import('./commands/profile.js');
        await runProfile(board, opts, io);
      });
  }

  if (wanted('harmonics')) {
    program
      .command('harmonics')
      .description('harmonic study: line and neutral rms with harmonics, THD, resonance scan of every bank state, capacitor duty')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .option('--json', 'print the full report (with the scan data) as JSON instead of the text report')
      .option('--board <name>', 'installation files: also print the full figures of this board (repeatable)', (v: string, prev: string[] = []) => [...prev, v])
      .option('--all-boards', 'installation files: print the full figures of every board')
      .addHelpText('after', HARMONICS_EXAMPLES)
      .action(async (board: string, opts: { json?: boolean; board?: string[]; allBoards?: boolean }) => {
        const { runHarmonics } = await import('./commands/harmonics.js');
        await runHarmonics(board, opts, io);
      });
  }

  if (wanted('rebalance')) {
    program
      .command('rebalance')
      .description('find which circuits to move to which phase (fewest moves, proven bound) and re-solve the board or installation')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .option('--aim <figures>', 'what to make small: largest-line, neutral, current-unbalance, voltage-unbalance, each =weight (default largest-line,neutral)', parseAim)
      .addOption(new Option('--combine <how>', 'over several load conditions: the worst one or the weighted mean').choices(['worst', 'weighted']))
      .option('--move-limit <n>', 'move at most this many circuits', anyNumber)
      .option('--near-best <percent>', 'fewest moves whose score is within this % of the best of the answers within every rating and capacity (no effect where none is)', anyNumber)
      .option('--capacity <A>', 'largest current any line may carry, A', anyNumber)
      .option('--boards <names>', 'installations: only the circuits of these boards may move (comma-separated)', (v: string) => v.split(',').map((x) => x.trim()).filter(Boolean))
      .option('--measure-at <where>', 'installations: score each board\'s incomer ("each", default), the main incomer ("main") or one board\'s incomer and voltage (its name)')
      .option('--scenarios', 'use the profile section\'s scenarios as the load conditions, weighted by their hours')
      .option('--data <csv>', 'interval data (as for trivar profile): its peak intervals and a spread of typical ones become the load conditions')
      .option('--spread <n>', 'with --data: typical intervals picked besides the peaks (default 8)', anyNumber)
      .option('--time-zone <zone>', 'with --data: IANA zone of timestamps written without an offset (default UTC)')
      .addOption(new Option('--method <how>', 'search: exact branch-and-bound, local search, or auto by board size').choices(['auto', 'exact', 'local-search']))
      .option('--no-table', 'skip the table of the best score by moves allowed')
      .option('--write <file>', 'save the board file with the moves made (never the input file)')
      .option('--json', 'print the full report as JSON instead of the text report')
      .addHelpText('after', REBALANCE_EXAMPLES)
      .action(async (board: string, opts: RebalanceCommandOptions) => {
        const { runRebalance } = await import('./commands/rebalance.js');
        await runRebalance(board, opts, io);
      });
  }

  if (wanted('diagram')) {
    program
      .command('diagram')
      .description('draw the board as SVG: phasors (voltages, line and neutral currents), sequence components, or per-line current triangles; an installation also as its one-line drawing')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .addOption(new Option('--view <name>', 'what to draw (one-line: installation files)').choices([...DIAGRAM_VIEWS]).default('phasors'))
      .option('--with-correction', "overlay the board before and after the board file's correction study")
      .option('--board <name>', 'installation files: the board to draw (default: the main board)')
      .option('-o, --output <file>', 'write the SVG to this file (default: standard output)')
      .addHelpText('after', DIAGRAM_EXAMPLES)
      .action(async (board: string, opts: DiagramCommandOptions) => {
        const { runDiagram } = await import('./commands/diagram.js');
        await runDiagram(board, opts, io);
      });
  }

  if (wanted('report')) {
    program
      .command('report')
      .description('write a self-contained report of the board or installation (HTML, or Markdown with SVG figures beside it)')
      .argument('<board>', 'board or installation file (YAML or JSON), or - for standard input')
      .option('-o, --output <file>', 'report file to write (HTML may go to standard output)')
      .addOption(new Option('--format <kind>', "report format (default: the one the -o file's extension names, .md or .html/.htm; else html)").choices(['html', 'md']))
      .option('--no-correction', "leave out the board file's correction study")
      .option('--no-harmonics', "leave out the harmonic study (run when the board file has a harmonics: section or load spectra)")
      .option('--profile-data <file.csv>', 'add a load-over-time section from interval data (columns as for trivar profile --data)')
      .option('--time-zone <zone>', 'IANA time zone of the interval data (default UTC)')
      .option('--hand-figures <file>', 'board files: add a check of your hand calculation (the figures file trivar check reads)')
      .addHelpText('after', REPORT_EXAMPLES)
      .action(async (board: string, opts: ReportCommandOptions) => {
        const { runReport } = await import('./commands/report.js');
        await runReport(board, opts, io, `Made with trivar ${VERSION}. Figures come from the model entered; check them against measurements and local codes.`);
      });
  }

  if (wanted('check')) {
    program
      .command('check')
      .description('check a hand calculation: solve the board with the capacitors you chose and explain each difference from the textbook figures')
      .argument('<board>', 'board file (YAML or JSON), or - for standard input')
      .argument('<figures>', 'your hand figures (YAML or JSON): capacitors per phase or line pair, expected PF and currents')
      .option('--json', 'print the full result as JSON instead of the report')
      .option('--diagram <file>', 'also write the current triangle of every line, without and with your capacitors, as SVG')
      .addHelpText('after', CHECK_EXAMPLES)
      .action(async (board: string, figures: string, opts: CheckCommandOptions) => {
        const { runCheck } = await import('./commands/check.js');
        await runCheck(board, figures, opts, io);
      });
  }

  if (wanted('schema')) {
    program
      .command('schema')
      .description('print the JSON Schema of board files (for editor completion and checking)')
      .option('--installation', 'the schema of installation files (boards: fed from each other) instead')
      .action(async (opts: SchemaCommandOptions) => {
        const { runSchema } = await import('./commands/schema.js');
        runSchema(io, opts);
      });
  }

  return program;
}

/** Runs the CLI on `argv` (user arguments only) and returns the exit code. */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const outcome: RunOutcome = { exitCode: EXIT.ok };
  const named = COMMAND_NAMES.find((name) => name === argv[0]);
  const program = createProgram(io, outcome, named);
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
