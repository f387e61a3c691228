/**
 * Cross-field rules for a board that passed the schema. Each rule is a small
 * named function returning the problems it finds; `validateBoard` runs all of
 * them so the user sees every problem in one pass.
 */
import { hiddenCharactersOf, spaceFoldedName } from './nameFolding.js';
import { inputIssue, type InputIssue, quoteText } from '../errors.js';
import type { BoardBaseSpec, ConductorSpec, FeederSpec, LoadBaseSpec, SupplySpec, SystemKind } from './boardSchema.js';
import { isThreePhase, phasesOf, systemHasNeutral } from './systemTopology.js';
import { conductorResistance, tabulatedSizes } from './cableLibrary.js';
import { readVoltageNotation } from './conventions/voltageNotation.js';
import { nominalVoltagesOf } from './nominalVoltages.js';
import { PHYSICAL_RANGES, SYSTEMS } from './boardRanges.js';
import { groupDigits } from '../_internal/groupDigits.js';
import { labellerOf, type PhaseLabeller, type PhaseNaming } from './conventions/phaseNames.js';
import { isPerPhaseLine, lengthOf, materialOf, sizeOf } from './feederModel.js';
import { conductorSizeHint } from './conductorSizeSpelling.js';
import { checkWordArgument } from '../_internal/argumentChecks.js';

/**
 * A cross-field rule: the problems it finds in a board that passed the schema, its sentences naming
 * phases in the file's naming (issueNamingOf). Studies add their own (boardFile/).
 */
export type BoardRule<T extends BoardBaseSpec = BoardBaseSpec> = (board: T, naming: PhaseNaming) => InputIssue[];

const RATING_FORMS = 'exactly one rating: kW (pf 1 when not given), kW with pf, kVA with pf, A with pf, kW with kvar, or ohms';

function ruleVoltageGiven(board: BoardBaseSpec): InputIssue[] {
  const { voltage, system } = board.supply;
  const path = 'supply.voltage';
  if (voltage.written !== undefined) {
    // The schema read the notation; whether it fits the system can only be said here.
    const read = readVoltageNotation(voltage.written, system);
    if (!read.ok) return [inputIssue('bad_voltage_notation', path, read.problem, voltage.written)];
    const { lineToLineV, lineToNeutralV } = read.notation;
    if (voltage.lineToLine !== lineToLineV || voltage.lineToNeutral !== lineToNeutralV)
      return [
        inputIssue(
          'conflict',
          `${path}.written`,
          `the notation written as the voltage itself (voltage: ${quoteText(voltage.written)}), or lineToLine ${lineToLineV} and lineToNeutral ${lineToNeutralV} beside it`,
          voltage.lineToLine === undefined && voltage.lineToNeutral === undefined
            ? 'written with no figures beside it'
            : `lineToLine ${voltage.lineToLine ?? 'not given'}, lineToNeutral ${voltage.lineToNeutral ?? 'not given'}`,
        ),
      ];
    return [];
  }
  const { lineToLine, lineToNeutral } = voltage;
  if (lineToLine === undefined && lineToNeutral === undefined)
    return [inputIssue('missing', path, 'lineToLine or lineToNeutral (volts)')];
  if (lineToLine !== undefined && lineToNeutral !== undefined)
    return [inputIssue('conflict', path, 'only one of lineToLine and lineToNeutral (the other follows from the system)', 'both')];
  if (board.supply.system === 'single-phase' && lineToLine !== undefined)
    return [inputIssue('not_applicable', `${path}.lineToLine`, 'lineToNeutral for a single-phase 2-wire supply', lineToLine)];
  return [];
}

function ruleSourceImpedance(board: BoardBaseSpec): InputIssue[] {
  if (board.supply.impedance && board.supply.transformer)
    return [inputIssue('conflict', 'supply', 'either impedance or transformer, not both', 'both')];
  return [];
}

function ruleEmfPhases(board: BoardBaseSpec, naming: PhaseNaming): InputIssue[] {
  const emf = board.supply.emf;
  if (!emf) return [];
  const label = labellerOf(naming);
  const phases = phasesOf(board.supply.system);
  const issues: InputIssue[] = [];
  for (const phase of ['A', 'B', 'C'] as const) {
    const given = emf[phase] !== undefined;
    const belongs = phases.includes(phase);
    if (belongs && !given) issues.push(inputIssue('missing', `supply.emf.${phase}`, `an EMF for every phase of a ${board.supply.system} supply ({ V, angleDeg })`));
    if (!belongs && given) issues.push(inputIssue('not_applicable', `supply.emf.${phase}`, `only phases ${phases.map(label).join(', ')} on a ${board.supply.system} supply`, label(phase)));
  }
  return issues;
}

/**
 * Three EMFs given by angle turn one way: the phase order they describe must be the supply's `sequence`
 * (ABC when not given). Read the other way round, their positive- and negative-sequence parts swap, and
 * every unbalance figure is its reciprocal (a 2.5 % supply reported at 4,000 %). Told apart by which
 * sequence part is the larger (Fortescue).
 */
function ruleEmfSequence(board: BoardBaseSpec, naming: PhaseNaming): InputIssue[] {
  const emf = board.supply.emf;
  if (!emf || !isThreePhase(board.supply.system) || !emf.A || !emf.B || !emf.C) return [];
  const rad = Math.PI / 180;
  // Σ E_k·e^{j(θ_k + 120°·k·turn)}: the positive-sequence sum for ABC with turn +1, for ACB with turn −1.
  const part = (turn: 1 | -1) => {
    let re = 0;
    let im = 0;
    (['A', 'B', 'C'] as const).forEach((p, k) => {
      const angle = (emf[p]!.angleDeg + 120 * k * turn) * rad;
      re += emf[p]!.V * Math.cos(angle);
      im += emf[p]!.V * Math.sin(angle);
    });
    return Math.hypot(re, im);
  };
  const declared = board.supply.sequence ?? 'ABC';
  const turnsAbc = part(1) > part(-1);
  const described = turnsAbc ? 'ABC' : 'ACB';
  if (described === declared) return [];
  const label = labellerOf(naming);
  const order = (seq: string) => {
    const labels = [...seq].map((p) => label(p as 'A'));
    return labels.join(labels.some((l) => l.length > 1) ? '-' : '');
  };
  const given = board.supply.sequence === undefined ? ' (the default: the file gives none)' : '';
  return [
    inputIssue(
      'conflict',
      'supply.emf',
      `EMF angles that turn in the supply's sequence ${order(declared)}${given}, e.g. ${label('B')} at ${order(declared) === order('ABC') ? '−120°' : '+120°'} from ${label('A')}; or sequence: ${described} if the supply turns that way`,
      `angles that turn ${order(described)}`,
    ),
  ];
}

function conductorIssues(conductor: ConductorSpec | undefined, path: string, feeder: FeederSpec | undefined): InputIssue[] {
  if (!conductor) return [];
  const direct = conductor.r !== undefined || conductor.x !== undefined;
  const size = sizeOf(conductor);
  const sizes = [conductor.mm2, conductor.awg, conductor.kcmil].filter((v) => v !== undefined).length;
  const perLength = conductor.rOhmPerKm !== undefined || conductor.xOhmPerKm !== undefined || size !== null;
  const ownLength = conductor.lengthM !== undefined || conductor.lengthFt !== undefined;
  const issues: InputIssue[] = [];
  if (direct && (perLength || ownLength))
    return [inputIssue('conflict', path, 'either r and x, or a length with rOhmPerKm or a size (mm2, awg, kcmil), not both', 'both')];
  if (conductor.lengthM !== undefined && conductor.lengthFt !== undefined)
    issues.push(inputIssue('conflict', path, 'one length: lengthM or lengthFt', 'both'));
  if (sizes > 1) issues.push(inputIssue('conflict', path, 'one size: mm2, awg or kcmil', 'more than one'));
  if (size && conductor.rOhmPerKm !== undefined) issues.push(inputIssue('conflict', path, 'either a size from the cable library or rOhmPerKm, not both', 'both'));
  if (!size && (conductor.material !== undefined || conductor.temperatureC !== undefined))
    issues.push(inputIssue('not_applicable', conductor.material !== undefined ? `${path}.material` : `${path}.temperatureC`, 'material and temperatureC only with a size (mm2, awg or kcmil)', conductor.material ?? conductor.temperatureC));
  // Table 9's raceway columns are for AWG/kcmil sizes; a stated reactance already says what the raceway does.
  if (conductor.conduit !== undefined && (!size || 'mm2' in size))
    issues.push(inputIssue('not_applicable', `${path}.conduit`, 'conduit only with an AWG or kcmil size (NEC Chapter 9 Table 9); give xOhmPerKm for a metric cable', conductor.conduit));
  else if (conductor.conduit !== undefined && conductor.xOhmPerKm !== undefined)
    issues.push(inputIssue('conflict', path, 'either xOhmPerKm or conduit (which picks the NEC Table 9 reactance), not both', 'both'));
  if (size && sizes === 1 && !conductorResistance(size, materialOf(conductor))) {
    const field = 'mm2' in size ? 'mm2' : 'awg' in size ? 'awg' : 'kcmil';
    const metal = materialOf(conductor);
    const hint = field === 'mm2' ? '' : conductorSizeHint(field, Object.values(size)[0], metal);
    issues.push(inputIssue('unknown_size', `${path}.${field}`, `${/^[aeiou]/.test(metal) ? 'an' : 'a'} ${metal} size in ${'mm2' in size ? 'IEC 60228' : 'NEC Chapter 9 Table 8'}: ${tabulatedSizes(size, metal).map((k) => k.replace(' kcmil', '')).join(', ')}${hint}`, Object.values(size)[0]));
  }
  if (perLength || ownLength) {
    if (lengthOf(conductor, feeder) === null) issues.push(inputIssue('missing', `${path}.lengthM`, 'the route length (lengthM or lengthFt, here or on the feeder)'));
    if (!size && conductor.rOhmPerKm === undefined) issues.push(inputIssue('missing', `${path}.rOhmPerKm`, 'resistance per km (ohm/km), or a size (mm2, awg or kcmil)'));
  }
  return issues;
}

function lineConductorIssues(feeder: FeederSpec | undefined, path: string, system: BoardBaseSpec['supply']['system'], label: PhaseLabeller): InputIssue[] {
  const line = feeder?.line;
  if (!line) return [];
  if (!isPerPhaseLine(line)) return conductorIssues(line, path, feeder);
  const phases = phasesOf(system);
  const issues: InputIssue[] = [];
  for (const p of ['A', 'B', 'C'] as const) {
    const belongs = phases.includes(p);
    if (belongs && !line[p]) issues.push(inputIssue('missing', `${path}.${p}`, `a conductor for every phase of a ${system} supply`));
    if (!belongs && line[p]) issues.push(inputIssue('not_applicable', `${path}.${p}`, `only phases ${phases.map(label).join(', ')} on a ${system} supply`, label(p)));
    if (belongs && line[p]) issues.push(...conductorIssues(line[p], `${path}.${p}`, feeder));
  }
  return issues;
}

/** Checks a feeder; `path` is where it sits (`feeder`, `boards[2].feeder`). */
export function feederIssues(feeder: FeederSpec | undefined, path: string, system: BoardBaseSpec['supply']['system'], naming: PhaseNaming): InputIssue[] {
  const issues = [...lineConductorIssues(feeder, `${path}.line`, system, labellerOf(naming)), ...conductorIssues(feeder?.neutral, `${path}.neutral`, feeder)];
  if (feeder?.lengthM !== undefined && feeder.lengthFt !== undefined) issues.push(inputIssue('conflict', path, 'one length: lengthM or lengthFt', 'both'));
  if (feeder?.neutral && !systemHasNeutral(system))
    issues.push(inputIssue('not_applicable', `${path}.neutral`, 'no neutral conductor on a three-phase-3wire supply', 'a neutral'));
  return issues;
}

function ruleFeeder(board: BoardBaseSpec, naming: PhaseNaming): InputIssue[] {
  return feederIssues(board.feeder, 'feeder', board.supply.system, naming);
}

/** A load that returns current through the neutral (line-to-neutral, or a star tied to the neutral). */
export const usesNeutral = (load: Pick<LoadBaseSpec, 'connection' | 'starPoint'>) => load.connection.endsWith('-N') || (load.connection === 'ABC-star' && load.starPoint !== 'floating');

/** The loads a feeder's neutral returns, as the message names them (`"Kettle"`, or `"Kettle" on Floor 2`). */
export interface NeutralUsers {
  readonly lineToNeutral: readonly string[];
  readonly star: readonly string[];
}

const listed = (names: readonly string[]) => `${names.slice(0, 3).join(', ')}${names.length > 3 ? ` and ${names.length - 3} more` : ''}`;

/**
 * What a feeder with line conductors and no neutral is missing. A star-connected load takes the neutral
 * only because its star point is tied by default: a motor's star is not connected to a neutral, so the
 * fix is usually `starPoint: floating`, not a conductor.
 */
export function missingNeutralWords({ lineToNeutral, star }: NeutralUsers): string {
  const floating = `starPoint: floating on ${listed(star)} if ${star.length > 1 ? 'their star (wye) points are' : 'its star (wye) point is'} not tied to a neutral (a motor's is not)`;
  if (lineToNeutral.length === 0)
    return `${floating}: a star-connected (wye) load is taken as tied unless so written, and this feeder has no neutral; where the star point is tied, the neutral conductor's size with the length (e.g. neutral: { mm2: … })`;
  const rest = star.length ? `; and ${floating}` : '';
  return `the neutral conductor, which ${listed(lineToNeutral)} return through: its size with the length (e.g. neutral: { mm2: … }), or r: 0, x: 0 for a neutral of no impedance${rest}`;
}

/**
 * A feeder written with line conductors but no neutral, on a board whose loads return current through
 * the neutral, is refused: taken as written it would have a neutral of no impedance, half the drop and
 * loss of a real one on a single-phase load, with nothing said. An installation judges the same for
 * every feeder over the boards beyond it (installationRules.ts), so it leaves this rule out.
 */
export function ruleFeederNeutral(board: BoardBaseSpec): InputIssue[] {
  const f = board.feeder;
  if (!f?.line || f.neutral || !systemHasNeutral(board.supply.system)) return [];
  const users = board.loads.filter(usesNeutral);
  if (!users.length) return [];
  const names = (ls: typeof users) => ls.map((l) => `"${l.name}"`);
  const words = missingNeutralWords({ lineToNeutral: names(users.filter((l) => l.connection !== 'ABC-star')), star: names(users.filter((l) => l.connection === 'ABC-star')) });
  return [inputIssue('missing', 'feeder.neutral', words)];
}

/** The ways to give a source impedance are exclusive; each has systems it suits. */
function ruleUnequalSource(board: BoardBaseSpec, naming: PhaseNaming): InputIssue[] {
  const { impedance, transformer, bank, openDelta, zeroSequence, system } = board.supply;
  const issues: InputIssue[] = [];
  const given = [impedance && 'impedance', transformer && 'transformer', bank && 'bank', openDelta && 'openDelta'].filter((x): x is string => !!x);
  if (given.length > 1 && !(given.length === 2 && impedance && transformer)) issues.push(inputIssue('conflict', 'supply', 'one source description: impedance, transformer, bank or openDelta', given.join(' + ')));
  const phases = phasesOf(system);
  const label = labellerOf(naming);
  const perPhase = (value: Partial<Record<'A' | 'B' | 'C', unknown>>, path: string, what: string) => {
    for (const p of ['A', 'B', 'C'] as const) {
      const belongs = phases.includes(p);
      if (belongs && value[p] === undefined) issues.push(inputIssue('missing', `${path}.${p}`, `${what} for every phase of a ${system} supply`));
      if (!belongs && value[p] !== undefined) issues.push(inputIssue('not_applicable', `${path}.${p}`, `only phases ${phases.map(label).join(', ')} on a ${system} supply`, label(p)));
    }
  };
  if (impedance && !('r' in impedance)) perPhase(impedance, 'supply.impedance', 'an impedance');
  if (bank) {
    if (!isThreePhase(system)) issues.push(inputIssue('not_applicable', 'supply.bank', 'a bank of single-phase units only on a three-phase supply', system));
    else perPhase(bank, 'supply.bank', 'a unit');
  }
  if (openDelta) {
    const count = (['A-B', 'B-C', 'C-A'] as const).filter((k) => openDelta[k] !== undefined).length;
    if (system !== 'three-phase-3wire') issues.push(inputIssue('not_applicable', 'supply.openDelta', 'an open delta only on a three-phase-3wire supply', system));
    else if (count !== 2) issues.push(inputIssue('out_of_range', 'supply.openDelta', 'exactly two units (an open delta has two of the three windings)', `${count} units`));
  }
  if (zeroSequence) {
    if (system !== 'three-phase-4wire') issues.push(inputIssue('not_applicable', 'supply.zeroSequence', 'a zero-sequence impedance only on a three-phase-4wire supply (no zero-sequence current flows otherwise)', system));
    else if (!(transformer || (impedance && 'r' in impedance)) || bank || openDelta)
      issues.push(inputIssue('missing', 'supply.impedance', 'the positive-sequence impedance with zeroSequence: one impedance { r, x } or a transformer'));
    else {
      const z1 = transformer ? 1 : Math.hypot((impedance as { r: number }).r, (impedance as { x: number }).x);
      if (z1 === 0) issues.push(inputIssue('out_of_range', 'supply.impedance', 'a non-zero positive-sequence impedance with zeroSequence', 'r = 0, x = 0'));
    }
  }
  return issues;
}

function ratingIssues(load: LoadBaseSpec, path: string): InputIssue[] {
  const has = (v: unknown) => v !== undefined;
  const forms = [
    has(load.kW) && !has(load.kvar) && !has(load.kVA) && !has(load.A),
    has(load.kVA) && has(load.pf),
    has(load.A) && has(load.pf),
    has(load.kW) && has(load.kvar) && !has(load.pf),
    has(load.ohms),
  ].filter(Boolean).length;
  const given = (['kW', 'kvar', 'kVA', 'A', 'pf', 'ohms'] as const).filter((k) => has(load[k]));
  const issues: InputIssue[] = [];
  const kWAlone = has(load.kW) && given.length === 1;
  if (forms !== 1 || (!kWAlone && given.length !== (has(load.ohms) ? 1 : 2)))
    issues.push(inputIssue('rating', path, RATING_FORMS, given.length ? given.join(' + ') : 'no rating'));
  if (load.sense !== undefined && load.pf === undefined)
    issues.push(inputIssue('not_applicable', `${path}.sense`, 'sense only together with pf', load.sense));
  return issues;
}

function modelIssues(load: LoadBaseSpec, path: string): InputIssue[] {
  if (load.model !== undefined && load.zip !== undefined)
    return [inputIssue('conflict', path, 'either model or zip, not both', 'both')];
  if (load.zip) {
    const total = load.zip.z + load.zip.i + load.zip.p;
    if (Math.abs(total - 1) > 1e-6) return [inputIssue('out_of_range', `${path}.zip`, 'fractions z + i + p that sum to 1', total)];
  }
  return [];
}

function connectionIssues(load: LoadBaseSpec, path: string, system: SystemKind, label: PhaseLabeller): InputIssue[] {
  const phases = phasesOf(system);
  const issues: InputIssue[] = [];
  const c = load.connection;
  const threePhase = c === 'ABC-star' || c === 'ABC-delta';
  const used = threePhase ? ['A', 'B', 'C'] : c.split('-').filter((t) => t !== 'N');
  const missing = used.filter((p) => !phases.includes(p as never));
  if (missing.length) {
    const accepted = acceptedConnections(system).map(label).join(', ');
    issues.push(inputIssue('unknown_phase', `${path}.connection`, `one of ${accepted} on a ${system} supply`, label(c)));
  } else if (c.endsWith('-N') && !systemHasNeutral(system)) {
    issues.push(inputIssue('no_neutral', `${path}.connection`, `a line-to-line or three-phase connection: a three-phase-3wire supply has no neutral`, label(c)));
  }
  if (load.starPoint !== undefined) {
    if (c !== 'ABC-star') issues.push(inputIssue('not_applicable', `${path}.starPoint`, `starPoint only on ${label('ABC-star')} loads`, load.starPoint));
    else if (load.starPoint === 'neutral' && !systemHasNeutral(system))
      issues.push(inputIssue('no_neutral', `${path}.starPoint`, 'floating: a three-phase-3wire supply has no neutral', load.starPoint));
  }
  return issues;
}

/** Line (ungrounded) conductors a connection uses: the poles its breaker needs. */
export function linesOfConnection(c: LoadBaseSpec['connection']): 1 | 2 | 3 {
  if (c === 'ABC-star' || c === 'ABC-delta') return 3;
  return c.endsWith('-N') ? 1 : 2;
}

/** A breaker switches every line conductor of its circuit (a 1P+N device counts as 1 pole). */
function poleIssues(load: LoadBaseSpec, path: string, label: PhaseLabeller): InputIssue[] {
  if (load.poles === undefined) return [];
  const needed = linesOfConnection(load.connection);
  if (load.poles === needed) return [];
  const kind = needed === 1 ? 'a line-to-neutral load' : needed === 2 ? 'a line-to-line load' : 'a three-phase load';
  return [inputIssue('pole_count', `${path}.poles`, `${needed} pole${needed > 1 ? 's' : ''} for ${kind} (${label(load.connection)}): one per line conductor it uses; a device that also switches the neutral (1P+N, 3P+N) is given by its line poles (${needed})`, load.poles)];
}

/** The connections a load may use on each system. */
export function acceptedConnections(system: BoardBaseSpec['supply']['system']): string[] {
  checkWordArgument(system, 'system', SYSTEMS);
  switch (system) {
    case 'three-phase-4wire':
      return ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'];
    case 'three-phase-3wire':
      return ['A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'];
    case 'split-phase':
      return ['A-N', 'B-N', 'A-B'];
    case 'single-phase':
      return ['A-N'];
  }
}

/**
 * A load in ohms is held to the same limit as one rated in kVA: its draw at nominal voltage,
 * branches × V²/|Z|, at most PHYSICAL_RANGES.loadKVA. Without it 1e-12 ohm drew 5e13 kW, and a
 * denormal resistance failed in the solve with an error about the result, not the file.
 */
function ohmsDrawIssues(load: LoadBaseSpec, ohms: { r: number; x: number }, path: string, voltages: { ln: number; ll: number | null }): InputIssue[] {
  const threePhase = load.connection.startsWith('ABC');
  const acrossLines = load.connection === 'ABC-delta' || (!threePhase && !load.connection.endsWith('-N'));
  const v = acrossLines ? (voltages.ll ?? voltages.ln) : voltages.ln;
  const branches = threePhase ? 3 : 1;
  const z = Math.hypot(ohms.r, ohms.x);
  const limitVA = PHYSICAL_RANGES.loadKVA.max * 1000;
  if (!(v > 0) || (branches * v * v) / z <= limitVA) return [];
  const smallest = (branches * v * v) / limitVA;
  const figure = (x: number) => x.toPrecision(3);
  // The least |Z| accepted, rounded up so that the figure printed is itself accepted.
  const step = 10 ** (Math.floor(Math.log10(smallest)) - 2);
  const roundedUp = (Math.ceil(smallest / step) * step).toPrecision(3);
  return [
    inputIssue(
      'out_of_range',
      `${path}.ohms`,
      `an impedance drawing at most ${groupDigits(PHYSICAL_RANGES.loadKVA.max)} kVA at nominal voltage (${figure(v)} V across ${branches > 1 ? 'each of 3 branches' : 'it'}): |Z| at least ${roundedUp} ohm`,
      `|Z| = ${figure(z)} ohm`,
    ),
  ];
}

/** The hidden characters two alike names hold, in words: `; this one holds U+00A0`. */
function hiddenWords(name: string, other: string): string {
  const [here, there] = [hiddenCharactersOf(name), hiddenCharactersOf(other)];
  const words = (list: string[]) => list.join(', ');
  return here.length ? `; this one holds ${words(here)}` : there.length ? `; that one holds ${words(there)}` : '';
}

/**
 * Load-by-load rules and duplicate names. `loads` may have holes where a load failed the schema
 * (forEach skips them, indices stay the file's); without a valid supply the connection check waits.
 */
function loadIssues(loads: readonly (LoadBaseSpec | undefined)[], supply: SupplySpec | null, naming: PhaseNaming): InputIssue[] {
  const system = supply?.system ?? null;
  const voltages = supply ? nominalVoltagesOf(supply) : null;
  const issues: InputIssue[] = [];
  const label = labellerOf(naming);
  const names = new Map<string, number>();
  // Names alike but for the kind of spaces or invisible characters print alike: refused as duplicates too.
  const folded = new Map<string, number>();
  loads.forEach((load, i) => {
    if (load === undefined) return;
    const path = `loads[${i}]`;
    issues.push(...ratingIssues(load, path), ...modelIssues(load, path), ...poleIssues(load, path, label));
    if (system !== null) issues.push(...connectionIssues(load, path, system, label));
    if (load.ohms && load.ohms.r === 0 && load.ohms.x === 0)
      issues.push(inputIssue('out_of_range', `${path}.ohms`, 'a non-zero impedance (r = x = 0 is a short circuit)', 'r = 0, x = 0'));
    else if (load.ohms && voltages) issues.push(...ohmsDrawIssues(load, load.ohms, path, voltages));
    const first = names.get(load.name);
    const alike = folded.get(spaceFoldedName(load.name));
    if (first !== undefined)
      issues.push(inputIssue('duplicate', `${path}.name`, `a name not already used (loads[${first}] has it)`, load.name));
    else if (alike !== undefined)
      issues.push(
        inputIssue(
          'duplicate',
          `${path}.name`,
          `a name that differs from the other loads' in more than the kind of spaces or invisible characters (loads[${alike}] is ${quoteText(loads[alike]!.name)}${hiddenWords(load.name, loads[alike]!.name)}): every table and work order would print the two alike`,
          load.name,
        ),
      );
    else {
      names.set(load.name, i);
      folded.set(spaceFoldedName(load.name), i);
    }
  });
  return issues;
}

function ruleLoads(board: BoardBaseSpec, naming: PhaseNaming): InputIssue[] {
  return loadIssues(board.loads, board.supply, naming);
}

/** The parts of a board that passed the schema on their own, when the whole did not. */
export interface BoardParts {
  readonly supply: SupplySpec | null;
  /** undefined when the board has no feeder; null when it has one that failed the schema. */
  readonly feeder: FeederSpec | null | undefined;
  /** Loads that passed the schema at their index in the file; holes where one failed. */
  readonly loads: readonly (LoadBaseSpec | undefined)[];
}

/**
 * The cross-field rules that can still run when the schema failed elsewhere, so schema errors
 * do not hide duplicate names or missing ratings until they are fixed: every problem in one pass.
 */
export function partialBoardIssues(parts: BoardParts, naming: PhaseNaming): InputIssue[] {
  const issues: InputIssue[] = [];
  if (parts.supply) {
    const board = { supply: parts.supply, feeder: parts.feeder ?? undefined, loads: [] } as unknown as BoardBaseSpec;
    issues.push(...ruleVoltageGiven(board), ...ruleSourceImpedance(board), ...ruleUnequalSource(board, naming), ...ruleEmfPhases(board, naming), ...ruleEmfSequence(board, naming));
    if (parts.feeder !== null) issues.push(...ruleFeeder(board, naming));
  }
  issues.push(...loadIssues(parts.loads, parts.supply, naming));
  return issues;
}

/** The board's own rules; boardFile/ appends the studies' rules after these. */
export const BOARD_RULES: readonly BoardRule[] = [ruleVoltageGiven, ruleSourceImpedance, ruleUnequalSource, ruleEmfPhases, ruleEmfSequence, ruleFeeder, ruleFeederNeutral, ruleLoads];
