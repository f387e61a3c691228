/**
 * What a capacitor unit gives at the voltage and frequency it is used at:
 * Q = Q_r·(V/V_r)²·(f/f_r), from Q = 2πf·C·V² with C fixed by the rating.
 */
import type { CapacitorUnitSpec } from './correctionSpec.js';
import { checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

export interface AppliedConditions {
  /** Voltage across the unit, V rms (line-to-neutral in a star bank, line-to-line in a delta bank). */
  readonly voltageV: number;
  readonly frequencyHz: number;
}

export interface CapacitorOutput {
  /** Reactive output at the applied voltage and frequency, kvar. */
  readonly kvar: number;
  /** Current at the applied voltage and frequency, A. */
  readonly currentA: number;
  /** Capacitance from the rating, µF. */
  readonly capacitanceUF: number;
  /** Current at rated voltage and frequency, A. */
  readonly ratedCurrentA: number;
}

/** Capacitance of a unit from its rating, F. */
export const unitCapacitanceF = (unit: Pick<CapacitorUnitSpec, 'ratedKvar' | 'ratedV' | 'ratedHz'>): number =>
  (unit.ratedKvar * 1000) / (2 * Math.PI * unit.ratedHz * unit.ratedV ** 2);

/**
 * Output of one unit at applied voltage and frequency.
 * @example
 * capacitorOutput({ ratedKvar: 10, ratedV: 480, ratedHz: 50 }, { voltageV: 400, frequencyHz: 50 }).kvar
 * //=> 6.944… (= 10 × (400/480)²)
 */
export function capacitorOutput(unit: Pick<CapacitorUnitSpec, 'ratedKvar' | 'ratedV' | 'ratedHz'>, applied: AppliedConditions): CapacitorOutput {
  checkObjectArgument(unit, 'unit', 'a capacitor unit { ratedKvar, ratedV, ratedHz }', ['ratedKvar', 'ratedV', 'ratedHz']);
  checkNumberArgument(unit.ratedKvar, 'unit.ratedKvar', 'a rated output, kvar, at least 0', (x) => x >= 0);
  checkNumberArgument(unit.ratedV, 'unit.ratedV', 'a rated voltage, V, above 0', (x) => x > 0);
  checkNumberArgument(unit.ratedHz, 'unit.ratedHz', 'a rated frequency, Hz, above 0', (x) => x > 0);
  checkObjectArgument(applied, 'applied', 'the conditions applied { voltageV, frequencyHz }', ['voltageV', 'frequencyHz']);
  checkNumberArgument(applied.voltageV, 'applied.voltageV', 'a voltage, V, at least 0', (x) => x >= 0);
  checkNumberArgument(applied.frequencyHz, 'applied.frequencyHz', 'a frequency, Hz, above 0', (x) => x > 0);
  const kvar = unit.ratedKvar * (applied.voltageV / unit.ratedV) ** 2 * (applied.frequencyHz / unit.ratedHz);
  return {
    kvar,
    currentA: applied.voltageV === 0 ? 0 : (kvar * 1000) / applied.voltageV,
    capacitanceUF: unitCapacitanceF(unit) * 1e6,
    ratedCurrentA: (unit.ratedKvar * 1000) / unit.ratedV,
  };
}

/** Capacitance of a susceptance B > 0 at frequency f, µF. */
export const capacitanceUF = (susceptanceS: number, frequencyHz: number): number => (susceptanceS / (2 * Math.PI * frequencyHz)) * 1e6;

/** Inductance of a susceptance B < 0 at frequency f, mH. */
export const inductanceMH = (susceptanceS: number, frequencyHz: number): number => (1 / (2 * Math.PI * frequencyHz * Math.abs(susceptanceS))) * 1e3;

