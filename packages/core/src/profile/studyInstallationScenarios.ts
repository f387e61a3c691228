/**
 * `profile.scenarios` on an installation file: each scenario is one interval
 * of the installation's batch path (every board and feeder solved at once), and
 * every board is read as a board's scenarios are — the supply at the main board,
 * a sub-board's incoming feeder, each with its own rating; the year at each
 * board weighed by the scenarios' hours. Loads and group members are named as
 * interval-data columns name them: by the load's name where only one board has
 * it, else `<board>/<load>`.
 */
import { assertInstallationModel } from '../board/modelGuards.js';
import type { Installation } from '../board/boardModel.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { bankPartIndices, listedBanksInService, type ListedBankInService } from '../analysis/banksInServiceWords.js';
import { boardOfInstallation } from '../network/installationModel.js';
import { NOISE_FLOOR_RELATIVE } from '../analysis/noiseFloor.js';
import { clearRoundOff, conductorFloorA } from './intervalRoundOff.js';
import { ambiguousLoadIssue, bankPartIssue, boardNamesOf, flattenLoads, loadLookup } from './installationColumns.js';
import { allocateBoardFigures, compileInstallationBatch, solveInstallationBatch } from './installationBatch.js';
import type { ProfileSpec } from './profileSpec.js';
import { aboveBandEdge, belowBandEdge } from '../board/conventions/voltageLimits.js';
import { priceScenarios, type ScenarioTariff } from './scenarioTariff.js';
import { resolveLimits } from './studyProfile.js';
import type { ResolvedLimits } from './summariseFigures.js';
import { readBoardScenarios, scenarioDrivers, scenarioHours, type BoardScenarios } from './studyScenarios.js';
import { ownEntry } from '../_internal/ownEntry.js';

export interface InstallationScenarioBoard extends BoardScenarios {
  readonly board: string;
  /** The board feeding it; null for the main board (its currents are the supply's). */
  readonly fedFrom: string | null;
  /** The board's voltage band: its own limits, or profile.limits where they set one (as for interval data). */
  readonly limits: Pick<ResolvedLimits, 'voltageLowPercent' | 'voltageHighPercent' | 'voltageLimitsFrom'>;
  /** Scenarios with a phase voltage outside the band, judged on the figure printed to 0.1 %. */
  readonly outsideBand: readonly string[];
}

export interface InstallationScenarioResult {
  readonly installation: string;
  readonly path: 'nodal';
  readonly hours: number;
  /** Board number order (main first). */
  readonly boards: readonly InstallationScenarioBoard[];
  /** How the file names its phases (L1/L2/L3 or A/B/C): renderers label lines this way. */
  readonly phaseNames: PhaseNaming;
  /** The banks the file lists in service (harmonics.banks), as listed in every scenario. */
  readonly banksInService: readonly ListedBankInService[];
  /** profile.tariff priced on the main board's scenarios, where the supply is billed (scenarioTariff.ts); null where it prices nothing. */
  readonly tariff: ScenarioTariff | null;
}

const EXPECTED_LOAD = 'a load name on one board, "<board>/<load>" (or "<board>//<load>"), or a group from profile.groups';

/**
 * @throws {InputError} naming the field (`profile.scenarios[k].loads.<name>`, `profile.groups.<group>[i]`) of a
 *   load no board has or that several boards have, and scenarios that mix hours and weights.
 */
export function studyInstallationScenarios(installation: Installation, profile: ProfileSpec): InstallationScenarioResult {
  assertInstallationModel(installation);
  const scenarios = profile.scenarios ?? [];
  const groups = profile.groups ?? {};
  const issues: InputIssue[] = [];
  const hours = scenarioHours(scenarios, issues);
  const flat = flattenLoads(installation);
  const lookup = loadLookup(installation);
  // The banks the file lists in service are as listed in every scenario: no scenario or group names them.
  const inService = bankPartIndices(installation);
  const bankParts = new Set(inService);
  /** The one load a name stands for, or null after an issue at `path`. */
  const oneLoad = (name: string, path: string, expected: string): number | null => {
    const found = lookup(name);
    const bank = bankPartIssue(found, bankParts, name, path, 'scenario');
    if (bank) {
      issues.push(bank);
      return null;
    }
    if (found.length === 1) return found[0]!;
    if (found.length === 0) issues.push(inputIssue('unknown_load', path, expected, name));
    else issues.push(ambiguousLoadIssue(installation, lookup, 'ambiguous_load', path, name, found));
    return null;
  };
  const members = new Map<string, number[]>();
  for (const [group, names] of Object.entries(groups)) {
    const found = names.map((m, i) => oneLoad(m, `profile.groups.${group}[${i}]`, 'a load name on one board, or "<board>/<load>" (or "<board>//<load>")'));
    if (found.every((l): l is number => l !== null)) members.set(group, found);
  }
  const named = scenarios.map((s, k) =>
    Object.entries(s.loads).map(([name, scale]) => {
      // A group of that name wins, as in the interval data's columns.
      const loads = ownEntry(groups, name) ? (members.get(name) ?? []) : [oneLoad(name, `profile.scenarios[${k}].loads.${name}`, EXPECTED_LOAD)].filter((l): l is number => l !== null);
      return { loads, scale };
    }),
  );
  if (issues.length) throw new InputError(issues, 'the scenarios are not valid');
  const { drivers, columns } = scenarioDrivers(flat.loads, scenarios, (s) => {
    const scales = new Float64Array(flat.loads.length).fill(s.others ?? 0);
    for (const { loads, scale } of named[scenarios.indexOf(s)]!) for (const l of loads) scales[l] = scale;
    for (const l of inService) scales[l] = 1;
    return scales;
  });
  const figures = allocateBoardFigures(installation, scenarios.length);
  solveInstallationBatch(compileInstallationBatch(installation, flat.loads, flat.boards, drivers), columns, figures);
  const names = boardNamesOf(installation);
  clearRoundOff(figures, conductorFloorA(names.map((_, b) => boardOfInstallation(installation, b))), installation.main.nominalLineToNeutralV);
  // A board with nothing on in a scenario still shows round-off power (about 1e-13 W); as the general solve
  // does with currents (analysis/noiseFloor.ts), power below that fraction of the supply's largest is none.
  let largest = 0;
  for (let k = 0; k < scenarios.length; k++) {
    let w = 0;
    let q = 0;
    for (let p = 0; p < installation.main.phases.length; p++) {
      w += figures[0]!.phaseW[p]![k]!;
      q += figures[0]!.phaseVar[p]![k]!;
    }
    largest = Math.max(largest, Math.hypot(w, q));
  }
  const floorVA = NOISE_FLOOR_RELATIVE * largest;
  const boards = names.map((name, b): InstallationScenarioBoard => {
    const board = boardOfInstallation(installation, b);
    const { voltageLowPercent, voltageHighPercent, voltageLimitsFrom } = resolveLimits(board, profile);
    const read = readBoardScenarios(board, figures[b]!, scenarios, hours, floorVA);
    return {
      board: name,
      fedFrom: b === 0 ? null : names[installation.subBoards[b - 1]!.fedFrom]!,
      limits: { voltageLowPercent, voltageHighPercent, voltageLimitsFrom },
      outsideBand: read.scenarios.filter((r) => belowBandEdge(r.lowestVoltagePercent, voltageLowPercent) || aboveBandEdge(r.highestVoltagePercent, voltageHighPercent)).map((r) => r.name),
      ...read,
    };
  });
  return {
    installation: installation.name,
    path: 'nodal',
    hours: hours.reduce((a, b) => a + b, 0),
    boards,
    phaseNames: conventionsOf(installation.main).phaseNames,
    banksInService: listedBanksInService(installation),
    tariff: priceScenarios(boards[0]!, profile.tariff),
  };
}
