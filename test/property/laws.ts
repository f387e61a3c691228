/**
 * Circuit laws every solved board must obey, each written once and applied by
 * the property tests to random boards. Each helper throws on a violation and
 * returns the largest residual it saw, relative to the board's own scale (the
 * largest current, the nominal voltage, the total branch power), so the tests
 * can record how close to exact the solver is.
 */
import type { Board, BoardResult, ComplexValue, NetworkSolution, Terminal } from '@trivar/core';
import { terminalVoltage } from '@trivar/core';
import { C0, c, cAbs, cAdd, cInv, cMul, cPower, cScale, cSub, cSum } from '../support/complexMath.js';
import { expectComplexClose, type Tolerance } from '../support/tolerance.js';

/** Relative accuracy asked of every exact law: far looser than rounding, far tighter than any modelling slip. */
export const LAW_REL = 1e-9;

/** A checker that compares with `tolerance` and remembers the worst error relative to `scale`. */
function residualTracker(tolerance: Tolerance, scale: number) {
  let worst = 0;
  return {
    check(actual: ComplexValue, expected: ComplexValue, what: string) {
      expectComplexClose(actual, expected, tolerance, what);
      worst = Math.max(worst, cAbs(cSub(actual, expected)) / scale);
    },
    get worst() {
      return worst;
    },
  };
}

/**
 * Current scale of a board, A: the largest current anywhere (line, neutral or
 * branch), but never less than the largest branch's rated current |S0|/V0, so
 * a board whose loads are all de-energised (say one load behind an open
 * neutral) is not measured against a scale of rounding noise.
 */
export function largestCurrent(solution: NetworkSolution): number {
  const all = [...solution.lineCurrents, ...(solution.neutralCurrent ? [solution.neutralCurrent] : []), ...solution.branches.flat().map((b) => b.current)];
  const rated = solution.board.loads.flatMap((l) => l.branches).map((b) => cAbs(b.sNominal) / b.vNominal);
  return Math.max(...all.map(cAbs), ...rated);
}

/**
 * Kirchhoff's current law at every node of a NetworkSolution.
 * Sign conventions: line currents flow source → board, the neutral current
 * board → source, branch currents from → to. So at a phase bus the line
 * current equals the sum of branch currents leaving it, a load's private star
 * point sums to zero, the current that loads bring into the neutral bar is the
 * neutral current, and ΣI_line = I_N (= 0 on a 3-wire board).
 */
export function assertCurrentLawHolds(solution: NetworkSolution): number {
  const { board } = solution;
  const scale = largestCurrent(solution);
  const law = residualTracker({ rel: LAW_REL, abs: LAW_REL * scale }, scale);
  const leaving = new Map<Terminal, ComplexValue>();
  board.loads.forEach((load, li) =>
    load.branches.forEach((b, bi) => {
      const i = solution.branches[li]![bi]!.current;
      leaving.set(b.from, cAdd(leaving.get(b.from) ?? C0, i));
      leaving.set(b.to, cSub(leaving.get(b.to) ?? C0, i));
    }),
  );
  board.phases.forEach((p, k) => law.check(leaving.get(p) ?? C0, solution.lineCurrents[k]!, `KCL at the phase ${p} bus`));
  for (const [terminal, net] of leaving) if (terminal.startsWith('star:')) law.check(net, C0, `KCL at ${terminal}`);
  const lineSum = cSum(solution.lineCurrents);
  if (board.hasNeutral) {
    if (!solution.neutralCurrent) throw new Error('a board with a neutral reported no neutral current');
    law.check(cScale(leaving.get('N') ?? C0, -1), solution.neutralCurrent, 'KCL at the neutral bar');
    law.check(lineSum, solution.neutralCurrent, 'ΣI_line = I_N');
    if (board.neutralOpen) law.check(solution.neutralCurrent, C0, 'no current in an open neutral');
  } else {
    if (solution.neutralCurrent !== null) throw new Error('a 3-wire board reported a neutral current');
    law.check(lineSum, C0, 'ΣI_line = 0 on a 3-wire board');
  }
  return law.worst;
}

/**
 * Ohm's law on every element: each branch current is its admittance times the
 * voltage between its terminals; each line carries (E − V_bus)/(Z_source + Z_feeder);
 * the neutral conductor carries V_bar/Z_N (and a solid neutral holds the bar at the star point).
 */
export function assertElementLawsHold(solution: NetworkSolution): number {
  const { board } = solution;
  const vScale = board.nominalLineToNeutralV;
  const iScale = largestCurrent(solution);
  const volts = residualTracker({ rel: LAW_REL, abs: LAW_REL * vScale }, vScale);
  const amps = residualTracker({ rel: LAW_REL, abs: LAW_REL * iScale }, iScale);
  const v = (t: Terminal) => terminalVoltage(solution, t);
  board.loads.forEach((load, li) =>
    load.branches.forEach((b, bi) => {
      const state = solution.branches[li]![bi]!;
      const vf = v(b.from);
      const vt = v(b.to);
      const what = `load ${load.name} branch ${b.from}→${b.to}`;
      if (vf && vt) {
        volts.check(state.voltage, cSub(vf, vt), `${what} voltage`);
        amps.check(state.current, cMul(state.admittance, state.voltage), `${what} current`);
      } else amps.check(state.current, C0, `${what} (dead) current`);
    }),
  );
  const zLine = cAdd(board.sourceImpedance, board.lineImpedance);
  board.phases.forEach((p, k) => {
    const bus = v(p);
    if (!bus) throw new Error(`phase ${p} bus has no voltage`);
    const drop = cSub(board.emf[k]!, bus);
    if (cAbs(zLine) === 0) volts.check(bus, board.emf[k]!, `phase ${p} bus on a zero-impedance line`);
    else amps.check(solution.lineCurrents[k]!, cMul(cInv(zLine), drop), `phase ${p} line current`);
  });
  if (board.hasNeutral && !board.neutralOpen) {
    const bar = v('N') ?? C0;
    volts.check(bar, cMul(board.neutralImpedance, solution.neutralCurrent!), 'neutral conductor V = Z_N·I_N');
  }
  return Math.max(volts.worst, amps.worst);
}

/** Σ over every load branch of |S|, VA. */
export function branchPowerScale(result: BoardResult): number {
  return result.loads.flatMap((l) => l.branches).reduce((s, b) => s + 1000 * Math.hypot(b.kW, b.kvar), 0);
}

/** Σ over every load branch of its rated |S0|, VA. */
export function ratedPower(board: Board): number {
  return board.loads.flatMap((l) => l.branches).reduce((s, b) => s + cAbs(b.sNominal), 0);
}

const kilo = (kW: number, kvar: number) => c(kW * 1000, kvar * 1000);

/**
 * Power balance (Tellegen): the complex power the source EMFs deliver equals
 * what the loads draw plus what the source, feeder and neutral impedances
 * absorb; the power into the board terminals (Σ per-phase readings) equals
 * the load total; and the load total is the sum of the loads.
 * Relative to Σ|S| over the branches plus |losses|, so that boards where
 * generation cancels consumption are still measured against a real scale;
 * `ratedVA` (see `ratedPower`) floors that scale for boards left de-energised.
 */
export function assertPowerBalances(result: BoardResult, ratedVA: number): number {
  const source = kilo(result.source.kW, result.source.kvar);
  const totals = kilo(result.totals.kW, result.totals.kvar);
  const losses = kilo(result.losses.totalKW, result.losses.totalKvar);
  const scale = Math.max(branchPowerScale(result) + cAbs(losses), ratedVA);
  const law = residualTracker({ rel: LAW_REL, abs: LAW_REL * scale }, scale);
  law.check(source, cAdd(totals, losses), 'source power = loads + losses');
  law.check(cSum(result.phases.map((p) => kilo(p.kW, p.kvar))), totals, 'Σ per-phase power = load total');
  law.check(cSum(result.loads.map((l) => kilo(l.kW, l.kvar))), totals, 'Σ loads = load total');
  law.check(kilo(result.losses.sourceKW + result.losses.lineFeederKW + result.losses.neutralKW, result.losses.totalKvar), losses, 'loss parts add up');
  return law.worst;
}

/**
 * KCL seen through the BoardResult (what users read): ΣI_line = I_N, and each
 * phase's line current is the sum of the load-branch currents leaving that phase.
 * `floorA` floors the current scale (see `largestCurrent`).
 */
export function assertResultCurrentLawHolds(result: BoardResult, floorA: number): number {
  const branches = result.loads.flatMap((l) => l.branches);
  const scale = Math.max(floorA, ...result.phases.map((p) => p.current.magnitude), ...branches.map((b) => b.current.magnitude));
  const law = residualTracker({ rel: LAW_REL, abs: LAW_REL * scale }, scale);
  const lineSum = cSum(result.phases.map((p) => p.current));
  law.check(lineSum, result.neutral ? result.neutral.current : C0, result.neutral ? 'ΣI_line = I_N' : 'ΣI_line = 0');
  for (const phase of result.phases) {
    const out = branches.filter((b) => b.from === phase.phase).map((b) => b.current);
    const back = branches.filter((b) => b.to === phase.phase).map((b) => b.current);
    law.check(cSub(cSum(out), cSum(back)), phase.current, `phase ${phase.phase} line current = Σ branch currents`);
  }
  return law.worst;
}

/**
 * Each branch draws what its model says: S = S0·(z·u² + i·u + p) with
 * u = |V|/V0; below the low-voltage threshold u_t the current and power parts
 * act as impedances fixed at u_t, S = S0·u²·(z + i/u_t + p/u_t²).
 * `rel` allows for the iteration stopping at a finite voltage change.
 */
export function assertLoadModelsHold(solution: NetworkSolution, rel: number, lowVoltageThreshold = 0.7): number {
  let worst = 0;
  solution.board.loads.forEach((load, li) =>
    load.branches.forEach((b, bi) => {
      const state = solution.branches[li]![bi]!;
      if (!state.energised) return;
      const u = cAbs(state.voltage) / b.vNominal;
      const { z, i, p } = b.zip;
      const factor = u >= lowVoltageThreshold ? z * u * u + i * u + p : u * u * (z + i / lowVoltageThreshold + p / lowVoltageThreshold ** 2);
      const expected = cScale(b.sNominal, factor);
      const drawn = cPower(state.voltage, state.current);
      const s0 = cAbs(b.sNominal);
      expectComplexClose(drawn, expected, { rel, abs: rel * s0 }, `load ${load.name} branch ${b.from}→${b.to} at ${u.toFixed(4)} pu`);
      worst = Math.max(worst, cAbs(cSub(drawn, expected)) / s0);
    }),
  );
  return worst;
}
