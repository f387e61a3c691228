/**
 * Cross-field rules for a board that passed the schema. Each rule is a small
 * named function returning the problems it finds; `validateBoard` runs all of
 * them so the user sees every problem in one pass.
 */
import { inputIssue, type InputIssue } from '../errors.js';
import type { BoardSpec, ConductorSpec, FeederSpec, LoadSpec, SupplySpec, SystemKind } from './boardSchema.js';
import { phasesOf, systemHasNeutral } from './systemTopology.js';

type Rule = (board: BoardSpec) => InputIssue[];

const RATING_FORMS = 'exactly one rating: kW with pf, kVA with pf, A with pf, kW with kvar, or ohms';

function ruleVoltageGiven(board: BoardSpec): InputIssue[] {
  const { lineToLine, lineToNeutral } = board.supply.voltage;
  const path = 'supply.voltage';
  if (lineToLine === undefined && lineToNeutral === undefined)
    return [inputIssue('missing', path, 'lineToLine or lineToNeutral (volts)')];
  if (lineToLine !== undefined && lineToNeutral !== undefined)
    return [inputIssue('conflict', path, 'only one of lineToLine and lineToNeutral (the other follows from the system)', 'both')];
  if (board.supply.system === 'single-phase' && lineToLine !== undefined)
    return [inputIssue('not_applicable', `${path}.lineToLine`, 'lineToNeutral for a single-phase 2-wire supply', lineToLine)];
  return [];
}

function ruleSourceImpedance(board: BoardSpec): InputIssue[] {
  if (board.supply.impedance && board.supply.transformer)
    return [inputIssue('conflict', 'supply', 'either impedance or transformer, not both', 'both')];
  return [];
}

function ruleEmfPhases(board: BoardSpec): InputIssue[] {
  const emf = board.supply.emf;
  if (!emf) return [];
  const phases = phasesOf(board.supply.system);
  const issues: InputIssue[] = [];
  for (const phase of ['A', 'B', 'C'] as const) {
    const given = emf[phase] !== undefined;
    const belongs = phases.includes(phase);
    if (belongs && !given) issues.push(inputIssue('missing', `supply.emf.${phase}`, `an EMF for every phase of a ${board.supply.system} supply ({ V, angleDeg })`));
    if (!belongs && given) issues.push(inputIssue('not_applicable', `supply.emf.${phase}`, `only phases ${phases.join(', ')} on a ${board.supply.system} supply`, phase));
  }
  return issues;
}

function conductorIssues(conductor: ConductorSpec | undefined, path: string): InputIssue[] {
  if (!conductor) return [];
  const direct = conductor.r !== undefined || conductor.x !== undefined;
  const perLength = conductor.lengthM !== undefined || conductor.rOhmPerKm !== undefined || conductor.xOhmPerKm !== undefined;
  if (direct && perLength)
    return [inputIssue('conflict', path, 'either r and x, or lengthM with rOhmPerKm and xOhmPerKm, not both', 'both')];
  if (perLength) {
    const issues: InputIssue[] = [];
    if (conductor.lengthM === undefined) issues.push(inputIssue('missing', `${path}.lengthM`, 'the route length in metres'));
    if (conductor.rOhmPerKm === undefined) issues.push(inputIssue('missing', `${path}.rOhmPerKm`, 'resistance per km, ohm/km'));
    return issues;
  }
  return [];
}

function ruleFeeder(board: BoardSpec): InputIssue[] {
  const issues = [
    ...conductorIssues(board.feeder?.line, 'feeder.line'),
    ...conductorIssues(board.feeder?.neutral, 'feeder.neutral'),
  ];
  if (board.feeder?.neutral && !systemHasNeutral(board.supply.system))
    issues.push(inputIssue('not_applicable', 'feeder.neutral', 'no neutral conductor on a three-phase-3wire supply', 'a neutral'));
  return issues;
}

function ratingIssues(load: LoadSpec, path: string): InputIssue[] {
  const has = (v: unknown) => v !== undefined;
  const forms = [
    has(load.kW) && has(load.pf) && !has(load.kvar),
    has(load.kVA) && has(load.pf),
    has(load.A) && has(load.pf),
    has(load.kW) && has(load.kvar) && !has(load.pf),
    has(load.ohms),
  ].filter(Boolean).length;
  const given = (['kW', 'kvar', 'kVA', 'A', 'pf', 'ohms'] as const).filter((k) => has(load[k]));
  const issues: InputIssue[] = [];
  if (forms !== 1 || given.length !== (has(load.ohms) ? 1 : 2))
    issues.push(inputIssue('rating', path, RATING_FORMS, given.length ? given.join(' + ') : 'no rating'));
  if (load.sense !== undefined && load.pf === undefined)
    issues.push(inputIssue('not_applicable', `${path}.sense`, 'sense only together with pf', load.sense));
  return issues;
}

function modelIssues(load: LoadSpec, path: string): InputIssue[] {
  if (load.model !== undefined && load.zip !== undefined)
    return [inputIssue('conflict', path, 'either model or zip, not both', 'both')];
  if (load.zip) {
    const total = load.zip.z + load.zip.i + load.zip.p;
    if (Math.abs(total - 1) > 1e-6) return [inputIssue('out_of_range', `${path}.zip`, 'fractions z + i + p that sum to 1', total)];
  }
  return [];
}

function connectionIssues(load: LoadSpec, path: string, system: SystemKind): InputIssue[] {
  const phases = phasesOf(system);
  const issues: InputIssue[] = [];
  const c = load.connection;
  const threePhase = c === 'ABC-star' || c === 'ABC-delta';
  const used = threePhase ? ['A', 'B', 'C'] : c.split('-').filter((t) => t !== 'N');
  const missing = used.filter((p) => !phases.includes(p as never));
  if (missing.length) {
    const accepted = acceptedConnections(system).join(', ');
    issues.push(inputIssue('unknown_phase', `${path}.connection`, `one of ${accepted} on a ${system} supply`, c));
  } else if (c.endsWith('-N') && !systemHasNeutral(system)) {
    issues.push(inputIssue('no_neutral', `${path}.connection`, `a line-to-line or three-phase connection: a three-phase-3wire supply has no neutral`, c));
  }
  if (load.starPoint !== undefined) {
    if (c !== 'ABC-star') issues.push(inputIssue('not_applicable', `${path}.starPoint`, 'starPoint only on ABC-star loads', load.starPoint));
    else if (load.starPoint === 'neutral' && !systemHasNeutral(system))
      issues.push(inputIssue('no_neutral', `${path}.starPoint`, 'floating: a three-phase-3wire supply has no neutral', load.starPoint));
  }
  return issues;
}

/** The connections a load may use on each system. */
export function acceptedConnections(system: BoardSpec['supply']['system']): string[] {
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
 * Load-by-load rules and duplicate names. `loads` may have holes where a load failed the schema
 * (forEach skips them, indices stay the file's); without a valid supply the connection check waits.
 */
function loadIssues(loads: readonly (LoadSpec | undefined)[], system: SystemKind | null): InputIssue[] {
  const issues: InputIssue[] = [];
  const names = new Map<string, number>();
  loads.forEach((load, i) => {
    if (load === undefined) return;
    const path = `loads[${i}]`;
    issues.push(...ratingIssues(load, path), ...modelIssues(load, path));
    if (system !== null) issues.push(...connectionIssues(load, path, system));
    if (load.ohms && load.ohms.r === 0 && load.ohms.x === 0)
      issues.push(inputIssue('out_of_range', `${path}.ohms`, 'a non-zero impedance (r = x = 0 is a short circuit)', 'r = 0, x = 0'));
    const first = names.get(load.name);
    if (first !== undefined)
      issues.push(inputIssue('duplicate', `${path}.name`, `a name not already used (loads[${first}] has it)`, load.name));
    else names.set(load.name, i);
  });
  return issues;
}

/**
 * Harmonic fields of a load: a spectrum makes it a current source at harmonic
 * orders, so a linear form does not apply; a floating star of fixed impedance
 * keeps its own star point, which current sources alone would leave undefined.
 */
function ruleHarmonicFields(board: BoardSpec): InputIssue[] {
  const issues: InputIssue[] = [];
  board.loads.forEach((load, i) => {
    const path = `loads[${i}]`;
    if (load.spectrum === undefined || load.spectrum === 'linear') return;
    if (load.linearForm !== undefined)
      issues.push(inputIssue('conflict', `${path}.linearForm`, 'linearForm only on loads without a spectrum (a non-linear load is a current source at harmonic orders)', load.linearForm));
    const floating = load.connection === 'ABC-star' && (load.starPoint === 'floating' || !systemHasNeutral(board.supply.system));
    const fixedImpedance = load.ohms !== undefined || load.model === 'constant-impedance' || load.zip?.z === 1;
    if (floating && fixedImpedance)
      issues.push(inputIssue('not_applicable', `${path}.spectrum`, 'a spectrum on ABC-delta loads or stars tied to the neutral (describe a floating-star non-linear load as ABC-delta)', 'a floating star'));
  });
  return issues;
}

function ruleLoads(board: BoardSpec): InputIssue[] {
  return loadIssues(board.loads, board.supply.system);
}

/** The parts of a board that passed the schema on their own, when the whole did not. */
export interface BoardParts {
  readonly supply: SupplySpec | null;
  /** undefined when the board has no feeder; null when it has one that failed the schema. */
  readonly feeder: FeederSpec | null | undefined;
  /** Loads that passed the schema at their index in the file; holes where one failed. */
  readonly loads: readonly (LoadSpec | undefined)[];
}

/**
 * The cross-field rules that can still run when the schema failed elsewhere, so schema errors
 * do not hide duplicate names or missing ratings until they are fixed: every problem in one pass.
 */
export function partialBoardIssues(parts: BoardParts): InputIssue[] {
  const issues: InputIssue[] = [];
  if (parts.supply) {
    const board = { supply: parts.supply, feeder: parts.feeder ?? undefined, loads: [] } as unknown as BoardSpec;
    issues.push(...ruleVoltageGiven(board), ...ruleSourceImpedance(board), ...ruleEmfPhases(board));
    if (parts.feeder !== null) issues.push(...ruleFeeder(board));
  }
  issues.push(...loadIssues(parts.loads, parts.supply?.system ?? null));
  return issues;
}

export const BOARD_RULES: readonly Rule[] = [ruleVoltageGiven, ruleSourceImpedance, ruleEmfPhases, ruleFeeder, ruleLoads, ruleHarmonicFields];
