/**
 * Capacitor duty with harmonics against the continuous limits of the shunt
 * capacitor standards [METHODS §4], per unit of the unit's rating (rated
 * voltage U_r, rated current and kvar at U_r and the board frequency, nominal
 * capacitance):
 *   V_rms = √Σ V_h²,  V_peak ≤ Σ V_h (arithmetic sum, the conservative bound),
 *   I_rms = √Σ (h·V_h)²,  Q = Σ h·V_h²   (V_h per unit, across the capacitor itself).
 * In a detuned step the capacitor sees V_C,h = V_h / |1 − h²p| of the branch
 * voltage V_h (at h = 1: U/(1 − p)).
 */
import { abs, sub, ZERO } from '../complex.js';
import { terminalVoltage, type NetworkSolution } from '../network/solveNetwork.js';
import type { Board } from '../board/boardModel.js';
import type { BankModel } from './harmonicModel.js';
import type { CapacitorDuty, DutyCase, DutyCondition, DutyFigures, DutyLimits } from './harmonicsResult.js';

export const DUTY_LIMITS: Readonly<Record<CapacitorDuty['standard'], { limits: DutyLimits; source: string }>> = {
  'ieee-18': {
    limits: { voltageRms: 1.1, voltagePeak: 1.2, currentRms: 1.35, kvar: 1.35 },
    source: 'IEEE Std 18 continuous (contingency) limits: 110 % rms voltage, 120 % peak voltage, 135 % rms current, 135 % kvar (confirmed secondary, quoting IEEE 18-2002)',
  },
  'iec-60831-1': {
    limits: { voltageRms: 1.1, voltagePeak: null, currentRms: 1.3, kvar: null },
    source:
      'IEC 60831-1: rms voltage 1.10 U_N for 8 h in every 24 h (1.00 U_N continuous; from memory), rms current 1.3 × rated current (confirmed: catalogue citing IEC 60831); no separate peak or kvar limit',
  },
};

/**
 * The rms voltage a capacitor stands continuously, per unit of its rating, where it is below the duty
 * limit above: IEC 60831-1's 1.00 U_N (from memory). IEEE 18's 110 % is itself continuous.
 */
export const CONTINUOUS_VOLTAGE_PU: Readonly<Record<CapacitorDuty['standard'], number | null>> = { 'ieee-18': null, 'iec-60831-1': 1.0 };

/**
 * Figures per unit for one bank branch from its branch voltage at each order. `capacitanceFactor`
 * is the units' capacitance over nominal: current and kvar scale with it [METHODS §4].
 */
export function dutyFigures(branchVoltages: readonly { order: number; volts: number }[], ratedV: number, p: number, capacitanceFactor = 1): DutyFigures {
  let v2 = 0;
  let vSum = 0;
  let i2 = 0;
  let q = 0;
  for (const { order: h, volts } of branchVoltages) {
    const vc = volts / Math.abs(1 - h * h * p) / ratedV;
    v2 += vc * vc;
    vSum += vc;
    i2 += (h * vc) ** 2;
    q += h * vc * vc;
  }
  return { voltageRms: Math.sqrt(v2), voltagePeak: vSum, currentRms: capacitanceFactor * Math.sqrt(i2), kvar: capacitanceFactor * q };
}

export function withinLimits(f: DutyFigures, limits: DutyLimits): boolean {
  return (
    f.voltageRms <= limits.voltageRms &&
    f.currentRms <= limits.currentRms &&
    (limits.voltagePeak === null || f.voltagePeak <= limits.voltagePeak) &&
    (limits.kvar === null || f.kvar <= limits.kvar)
  );
}

/** Largest ratio figure/limit, the number a verdict turns on. */
export function dutyRatio(f: DutyFigures, limits: DutyLimits): number {
  return Math.max(
    f.voltageRms / limits.voltageRms,
    f.currentRms / limits.currentRms,
    limits.voltagePeak === null ? 0 : f.voltagePeak / limits.voltagePeak,
    limits.kvar === null ? 0 : f.kvar / limits.kvar,
  );
}

/** What the duty reads of a solved order (h = 1 the fundamental, first): the node voltages, and the bank's board's terminals among them. */
export interface DutyOrder {
  readonly order: number;
  readonly solution: Pick<NetworkSolution, 'topology' | 'nodeVoltages'>;
}

/**
 * The worst branch of the bank in one state. Every part of the bank has the
 * same per-unit duty at a given branch position, so the first part on is read.
 * Returns null when no part is on.
 * @param board the bank's board as solved: its loads' branches give the terminals read in `orders`
 */
export function dutyCase(
  board: Board,
  orders: readonly DutyOrder[],
  bank: BankModel,
  steps: readonly boolean[],
  label: string,
  limits: DutyLimits,
  condition: DutyCondition = { capacitancePercent: 100, loads: 'as given' },
): DutyCase | null {
  const partOn = bank.fixedLoad ?? bank.stepLoads.find((_, k) => steps[k]);
  if (partOn === undefined) return null;
  let worst: DutyCase | null = null;
  for (const b of board.loads[partOn]!.branches) {
    const volts = orders.map((o) => ({
      order: o.order,
      volts: abs(sub(terminalVoltage(o.solution, b.from) ?? ZERO, terminalVoltage(o.solution, b.to) ?? ZERO)),
    }));
    const figures = dutyFigures(volts, bank.ratedV, bank.detuning, condition.capacitancePercent / 100);
    const branch = `${b.from}-${b.to.startsWith('star:') ? 'star' : b.to}`;
    const capacitorVoltageV = volts[0]!.volts / Math.abs(1 - bank.detuning);
    const candidate: DutyCase = { label, steps, branch, figures, ok: withinLimits(figures, limits), condition, capacitorVoltageV };
    if (!worst || dutyRatio(figures, limits) > dutyRatio(worst.figures, limits)) worst = candidate;
  }
  return worst;
}
