/** InstallationSolution → InstallationResult: each board read as a board, plus its feeder and the totals. */
import type { InstallationSolution } from '../network/solveNetwork.js';
import type { SolveOptions } from '../network/solveOptions.js';
import { feedingOrder } from '../network/installationCircuit.js';
import { ratedKvarInService } from '../network/installationModel.js';
import { analyseSolution } from './analyseSolution.js';
import { bankOverLoadsWarning } from './boardWarnings.js';
import { solveOptionsOf } from '../network/solveOptions.js';
import { bankRatingWarningOn, boardNominalPair } from '../board/bankRatingCheck.js';
import { studyOpenNeutral } from './studyOpenNeutral.js';
import type { BoardResult } from './boardResult.js';
import type { BankInService } from '../board/boardModel.js';
import type { BankInServiceReading, FeederReading, InstallationResult } from './installationResult.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';

export interface AnalyseInstallationOptions extends SolveOptions {
  /** Also study a broken neutral in each board's feeder. @defaultValue the file's `studies.openNeutral` */
  readonly openNeutral?: boolean;
}

export function analyseInstallation(solution: InstallationSolution, options: AnalyseInstallationOptions = {}): InstallationResult {
  const { installation } = solution;
  const main = installation.main;
  const wantOpen = options.openNeutral ?? main.studies.openNeutral;
  const results: BoardResult[] = solution.boards.map((s) => {
    const r = analyseSolution(s);
    return wantOpen ? { ...r, openNeutral: studyOpenNeutral(s.board, solveOptionsOf(options)) } : r;
  });
  // A board whose bank in service delivers more than its own circuits draw says so among its warnings.
  const banks = (installation.banksInService ?? []).map((bank) => {
    const r = results[bank.boardIndex]!;
    const reading = bankReading(bank, r.board.name, r);
    const over = bankOverLoadsWarning(reading.deliveredKvar, r.totals.kvar);
    const rating = bankRatingWarningOn(bank, boardNominalPair(main));
    const added = [over, rating].filter((w) => w !== null);
    if (added.length) results[bank.boardIndex] = { ...r, warnings: [...r.warnings, ...added] };
    return reading;
  });
  const nameOf = (b: number) => solution.boards[b]!.board.name;
  const parentOf = (b: number) => (b === 0 ? null : installation.subBoards[b - 1]!.fedFrom);
  const feederOf = (b: number): FeederReading => {
    const s = solution.boards[b]!;
    const r = results[b]!;
    const parent = parentOf(b);
    const ln = judgedNominalOf(main).ln;
    const lines = main.phases.map((phase, k) => {
      const sending = parent === null ? Math.hypot(main.emf[k]!.re, main.emf[k]!.im) : results[parent]!.phases[k]!.voltage.magnitude;
      return {
        phase,
        // The board's reading of its incoming line current, round-off already read as 0 (noiseFloor.ts).
        current: r.phases[k]!.current,
        loadingPercent: r.phases[k]!.loadingPercent,
        voltageDropPercent: (100 * (sending - r.phases[k]!.voltage.magnitude)) / ln,
      };
    });
    return {
      board: nameOf(b),
      from: parent === null ? null : nameOf(parent),
      description: b === 0 ? (installation.serviceFeederDescription ?? null) : installation.subBoards[b - 1]!.feeder.description,
      lines,
      neutral: r.neutral ? { current: r.neutral.current, loadingPercent: r.neutral.loadingPercent, open: s.board.neutralOpen } : null,
      lossesKW: r.losses.totalKW,
      // The phase whose voltage changes most along the feeder, sign kept: a rise under export (negative)
      // counts as much as a drop, or an exporting board's worst phase would read as its mildest.
      voltageDropPercent: lines.reduce((worst, l) => (Math.abs(l.voltageDropPercent) > Math.abs(worst) ? l.voltageDropPercent : worst), lines[0]!.voltageDropPercent),
    };
  };
  const { order } = feedingOrder(installation);
  const depth = new Array<number>(solution.boards.length).fill(1);
  for (const b of order) if (b !== 0) depth[b] = depth[parentOf(b)!]! + 1;
  // The lowest voltage the limits judge (line-to-neutral, line-to-line, at the loads: voltageCheck.ts), so the
  // figure agrees with every board's verdict.
  let lowest = { percent: Infinity, board: nameOf(0), at: '' };
  for (const b of order) {
    const l = results[b]!.voltageCheck.lowest;
    if (l.percent < lowest.percent) lowest = { percent: l.percent, board: nameOf(b), at: l.at };
  }
  const sum = (f: (r: BoardResult) => number) => results.reduce((t, r) => t + f(r), 0);
  return {
    installation: { name: installation.name, system: main.system, boardCount: results.length },
    boards: order.map((b) => ({ name: nameOf(b), fedFrom: parentOf(b) === null ? null : nameOf(parentOf(b)!), depth: depth[b]!, result: results[b]! })),
    feeders: order.map(feederOf),
    banksInService: banks,
    totals: {
      sourceKW: results[0]!.source.kW,
      sourceKvar: results[0]!.source.kvar,
      loadKW: sum((r) => r.totals.kW),
      loadKvar: sum((r) => r.totals.kvar),
      lossesKW: sum((r) => r.losses.totalKW),
      lowestVoltagePercent: lowest.percent,
      lowestVoltageBoard: lowest.board,
      lowestVoltageAt: lowest.at,
    },
  };
}

/** A bank in service as solved: its rated output in service and what its parts deliver (−Σ of their kvar). */
function bankReading(bank: BankInService, board: string, result: BoardResult): BankInServiceReading {
  const { boardIndex: _b, loads, ...rest } = bank;
  return {
    board,
    ...rest,
    ratedKvarInService: ratedKvarInService(bank),
    deliveredKvar: -loads.reduce((s, k) => s + result.loads[k]!.kvar, 0),
  };
}
