/**
 * Scenarios from the board file (`profile.scenarios`): named load states with
 * the hours the board spends in each, for users without logged data. Each
 * scenario is one interval of the batch solve; energy and the billing power
 * factor weigh them by their hours. The hours and the reading of one board's
 * figures are shared with the installation's scenarios (studyInstallationScenarios.ts).
 */
import { assertBoardModel } from '../board/modelGuards.js';
import { lineRatingOf, type Board } from '../board/boardModel.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { compileBatchNetwork, type DriverSpec } from './batchNetwork.js';
import { ratedPower } from './columnPlan.js';
import type { ProfileSpec, ScenarioSpec } from './profileSpec.js';
import { allocateFigures, solveBatch, type IntervalFigures } from './solveBatch.js';
import { billingPowerFactor } from './billingPowerFactor.js';
import { clearRoundOff, conductorFloorA } from './intervalRoundOff.js';
import { ownEntry } from '../_internal/ownEntry.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';
import { VOLTAGE_UNBALANCE_LIMITS, type VoltageUnbalanceLimit } from '../board/conventions/unbalanceLimits.js';
import { priceScenarios, type ScenarioTariff } from './scenarioTariff.js';

export interface ScenarioReading {
  readonly name: string;
  readonly hours: number;
  readonly lineA: readonly number[];
  readonly neutralA: number | null;
  /** The lowest and highest voltage the limits judge (line-to-neutral where there is a neutral, line-to-line), % of nominal. */
  readonly lowestVoltagePercent: number;
  readonly highestVoltagePercent: number;
  /** Voltage unbalance on the board region's index (BoardScenarios.unbalance); null on a board of fewer than three phases. */
  readonly unbalancePercent: number | null;
  readonly kW: number;
  readonly kvar: number;
  /** Null where the scenario draws no power (a power factor of nothing is no figure). */
  readonly pf: number | null;
}

/** A board's readings in every scenario, and its year weighed by their hours. */
export interface BoardScenarios {
  readonly scenarios: readonly ScenarioReading[];
  readonly kWhImport: number;
  readonly kvarhLagging: number;
  /** Over the year; null when nothing was imported. */
  readonly billingPf: number | null;
  /** Each line's rating, A, in the order of the board's phases (null: none given). */
  readonly lineRatingsA: readonly (number | null)[];
  readonly neutralRatingA: number | null;
  /** The voltage unbalance index the board's region judges (unbalanceLimits.ts): |V2|/|V1|, or the line-to-line deviation. */
  readonly unbalance: VoltageUnbalanceLimit;
}

export interface ScenarioResult extends BoardScenarios {
  readonly board: string;
  readonly path: 'closed-form' | 'nodal';
  readonly hours: number;
  /** How the board file names its phases (L1/L2/L3 or A/B/C): renderers label lines this way. */
  readonly phaseNames: PhaseNaming;
  /** profile.tariff priced on the scenarios (scenarioTariff.ts: how, without calendar months); null where it prices nothing. */
  readonly tariff: ScenarioTariff | null;
}

const YEAR_HOURS = 8760;
/** The longest year, 366 × 24 h: the most hours a year's scenarios can share. */
const LEAP_YEAR_HOURS = 8784;

/**
 * Each scenario's hours (weights share out 8760 h); the issues of scenarios that give neither or mix
 * the two are pushed onto `issues`.
 */
export function scenarioHours(scenarios: readonly ScenarioSpec[], issues: InputIssue[]): number[] {
  const withHours = scenarios.filter((s) => s.hours !== undefined).length;
  if (withHours !== 0 && withHours !== scenarios.length)
    issues.push(inputIssue('mixed', 'profile.scenarios', 'every scenario with hours, or every scenario with a weight'));
  // The scenarios share out one year: the year-energy figures would otherwise count more hours than a year has.
  const totalHours = scenarios.reduce((a, s) => a + (s.hours ?? 0), 0);
  if (totalHours > LEAP_YEAR_HOURS)
    issues.push(
      inputIssue(
        'too_big',
        'profile.scenarios',
        `scenario hours that share out one year, ${LEAP_YEAR_HOURS} h at most (a leap year; ${YEAR_HOURS} h in other years): they sum to ${Math.round(totalHours * 100) / 100} h (${scenarios.map((s) => `${s.name} ${s.hours ?? 0} h`).join(' + ')}); scale them down, or give each a weight instead of hours to share out ${YEAR_HOURS} h`,
        `${Math.round(totalHours * 100) / 100} h in all`,
      ),
    );
  scenarios.forEach((s, k) => {
    if (s.hours === undefined && s.weight === undefined) issues.push(inputIssue('missing', `profile.scenarios[${k}].hours`, 'hours or weight'));
  });
  const totalWeight = scenarios.reduce((a, s) => a + (s.weight ?? 0), 0);
  return scenarios.map((s) => s.hours ?? ((s.weight ?? 0) / totalWeight) * YEAR_HOURS);
}

/** One scale-factor driver per load (its rating), and each scenario's factor per load as one interval. */
export function scenarioDrivers(loads: readonly Board['loads'][number][], scenarios: readonly ScenarioSpec[], scalesOf: (s: ScenarioSpec) => Float64Array) {
  const drivers: DriverSpec[] = loads.map((l, i) => ({ name: l.name, loads: [{ load: i, coefficient: ratedPower(l) }] }));
  const n = scenarios.length;
  const re = loads.map(() => new Float64Array(n));
  scenarios.forEach((s, k) => scalesOf(s).forEach((x, i) => (re[i]![k] = x)));
  return { drivers, columns: { count: n, re, im: re.map(() => new Float64Array(n)) } };
}

/**
 * A board's figures (one interval per scenario) read as scenarios, energy weighed by `hours`.
 * @param powerFloorVA a board power below this is round-off, read as none (no kW, kvar or PF of its own) @defaultValue 0
 */
export function readBoardScenarios(board: Board, figures: IntervalFigures, scenarios: readonly ScenarioSpec[], hours: readonly number[], powerFloorVA = 0): BoardScenarios {
  const nominal = judgedNominalOf(board);
  const vPct = 100 / nominal.ln;
  const unbalance = VOLTAGE_UNBALANCE_LIMITS[conventionsOf(board).region];
  const unbalanceColumn = unbalance.index === 'negative-sequence' ? figures.unbalancePercent : figures.lineDeviationPercent;
  const readings = scenarios.map((s, k): ScenarioReading => {
    let w = 0;
    let q = 0;
    for (let p = 0; p < board.phases.length; p++) {
      w += figures.phaseW[p]![k]!;
      q += figures.phaseVar[p]![k]!;
    }
    if (Math.hypot(w, q) < powerFloorVA) w = q = 0;
    // The voltages the board's limits judge: phases where a neutral gives them meaning, and every line pair.
    const llPct = 100 / (nominal.ll ?? nominal.ln);
    const volts = [
      ...(board.hasNeutral || figures.lineToLineV.length === 0 ? figures.phaseV.map((c) => c[k]! * vPct) : []),
      ...figures.lineToLineV.map((c) => c[k]! * llPct),
    ];
    return {
      name: s.name,
      hours: hours[k]!,
      lineA: figures.lineA.map((c) => c[k]!),
      neutralA: board.hasNeutral ? figures.neutralA[k]! : null,
      lowestVoltagePercent: Math.min(...volts),
      highestVoltagePercent: Math.max(...volts),
      unbalancePercent: board.phases.length === 3 ? unbalanceColumn[k]! : null,
      kW: w / 1000,
      kvar: q / 1000,
      pf: Math.hypot(w, q) === 0 ? null : Math.min(1, Math.abs(w) / Math.hypot(w, q)),
    };
  });
  const kWhImport = readings.reduce((a, r) => a + Math.max(r.kW, 0) * r.hours, 0);
  const kvarhLagging = readings.reduce((a, r) => a + Math.max(r.kvar, 0) * r.hours, 0);
  return {
    scenarios: readings,
    kWhImport,
    kvarhLagging,
    billingPf: billingPowerFactor(kWhImport, kvarhLagging),
    lineRatingsA: board.phases.map((_, k) => lineRatingOf(board, k)),
    neutralRatingA: board.neutralRatingA,
    unbalance,
  };
}

/**
 * @throws {InputError} when a scenario names a load or group the board does not have, or
 *   mixes hours and weights.
 */
export function studyScenarios(board: Board, profile: ProfileSpec): ScenarioResult {
  assertBoardModel(board);
  const scenarios = profile.scenarios ?? [];
  const issues: InputIssue[] = [];
  const loadIndex = new Map(board.loads.map((l, i) => [l.name, i]));
  const groups = profile.groups ?? {};
  const hours = scenarioHours(scenarios, issues);
  scenarios.forEach((s, k) => {
    for (const name of Object.keys(s.loads))
      if (!loadIndex.has(name) && !ownEntry(groups, name)) issues.push(inputIssue('unknown_load', `profile.scenarios[${k}].loads.${name}`, 'a load or group name of this board', name));
  });
  if (issues.length) throw new InputError(issues, 'the scenarios are not valid');
  const { drivers, columns } = scenarioDrivers(board.loads, scenarios, (s) => {
    const scales = new Float64Array(board.loads.length).fill(s.others ?? 0);
    for (const [name, scale] of Object.entries(s.loads)) for (const n2 of ownEntry(groups, name) ?? [name]) scales[loadIndex.get(n2)!] = scale;
    return scales;
  });
  const figures = allocateFigures(scenarios.length, board.phases.length);
  const { path } = solveBatch(compileBatchNetwork(board, drivers), columns, figures);
  clearRoundOff([figures], conductorFloorA([board]), board.nominalLineToNeutralV);
  const { scenarios: readings, ...year } = readBoardScenarios(board, figures, scenarios, hours);
  // Keys in the order the JSON has always had them.
  return {
    board: board.name,
    path,
    scenarios: readings,
    hours: hours.reduce((a, b) => a + b, 0),
    ...year,
    phaseNames: conventionsOf(board).phaseNames,
    tariff: priceScenarios({ scenarios: readings, ...year }, profile.tariff),
  };
}
