/** Fixed wording of reports: assumptions and the standards and methods referred to. */
import type { StarWord } from '../../board/conventions/regionWords.js';

/**
 * How the line currents close, said for the board's system: a three-phase 3-wire board has no neutral
 * (its line currents sum to zero), a split-phase board has two lines, a single-phase board one.
 */
export function currentConvention(system: string, label: (phase: string) => string = (p) => p): string {
  const closes =
    system === 'three-phase-3wire'
      ? 'the board has no neutral, so the three line currents add up to zero'
      : system === 'split-phase'
        ? 'the neutral current back to the source, so the two line currents add up to the neutral current'
        : system === 'single-phase'
          ? 'the neutral current back to the source, equal and opposite to the line current'
          : 'the neutral current back to the source, so the three line currents add up to the neutral current';
  return `Line currents flow from the source into the board${system === 'three-phase-3wire' ? '' : ' and'} ${system === 'three-phase-3wire' ? `(${closes})` : closes}. Phase angles are referred to the source voltage of line ${label('A')}.`;
}

/** The model's assumptions, with the current convention of the boards in the report (one sentence per system). */
export function modelAssumptions(systems: readonly string[], label?: (phase: string) => string): string[] {
  const [first, ...rest] = MODEL_ASSUMPTIONS;
  const kinds = [...new Set(systems.length ? systems : ['three-phase-4wire'])];
  const conventions = kinds.map((s) => currentConvention(s, label));
  return [first!, rest[0]!, sourceAssumption(kinds), ...conventions, ...rest.slice(1)];
}

/** How many EMFs the source of each system has: one winding, the two halves of a centre-tapped one, three phases. */
const EMF_COUNT: Readonly<Record<string, string>> = { 'single-phase': 'one EMF', 'split-phase': 'two EMFs', 'three-phase-4wire': 'three EMFs', 'three-phase-3wire': 'three EMFs' };

/** The source and feeder model, with the number of EMFs of the boards' systems. */
function sourceAssumption(systems: readonly string[]): string {
  const counts = [...new Set(systems.map((s) => EMF_COUNT[s] ?? 'three EMFs'))];
  return `The source is ${counts.join(' or ')} behind the source impedance; ${SOURCE_AND_FEEDERS}`;
}

const SOURCE_AND_FEEDERS =
  'a transformer rating gives that impedance referred to the board voltage. Feeder conductors are series impedances, each at the resistance of its stated operating temperature (a conductor from the cable library is corrected from its 20 °C table value); mutual coupling between conductors, and the temperature the load current itself would give, are not modelled.';

const MODEL_ASSUMPTIONS: readonly string[] = [
  'Steady state at the fundamental frequency: voltages and currents are sinusoidal phasors (rms values).',
  'Every circuit is modelled as entered: its rating at nominal voltage and its voltage dependence (constant power, current, impedance or a ZIP mix); a constant-power or constant-current load below 0.7 of its nominal voltage is held at the impedance it has there.',
  'Powers follow the load convention: kW above zero is consumed, kvar above zero is lagging (inductive).',
];

export const CORRECTION_ASSUMPTIONS: readonly string[] = [
  'A capacitor gives Q = Qr·(V/Vr)²·(f/fr) at its applied voltage V and frequency f; capacitor banks are re-solved with the board, so their effect on every voltage and load is included.',
  'Units are chosen from the catalogue in the board file or, without one, from typical ratings (not a vendor catalogue); capacitance tolerance and the light-load state are checked by solving again.',
];

export interface StandardReference {
  readonly name: string;
  readonly use: string;
}

export const BOARD_STANDARDS: readonly StandardReference[] = [
  { name: 'IEEE Std 1459-2010', use: 'effective apparent power and power factor under unbalance; arithmetic and vector apparent power' },
];

/** Only for three-phase boards, where sequence components and unbalance indices are reported. */
export const THREE_PHASE_STANDARDS: readonly StandardReference[] = [
  { name: 'C. L. Fortescue (1918), symmetrical components', use: 'zero-, positive- and negative-sequence voltages and currents' },
  { name: 'IEC 61000-4-30 / IEC 61000-2-2', use: 'voltage unbalance factor |V2|/|V1|' },
  { name: 'NEMA MG 1 / ANSI C84.1 Annex D', use: 'line-voltage unbalance rate (the largest deviation of a line-to-line voltage from the average of the three): the derating of three-phase motors, and the North-American unbalance limit' },
  { name: 'IEEE phase-voltage unbalance rate (P. Pillay, M. Manyage, "Definitions of voltage unbalance")', use: 'unbalance of the line-to-neutral voltages' },
];

/**
 * The standards a correction study rests on; the compensator's branches in the board's word for star (wye in North America).
 * @param threePhase false where no board of the report is three-phase: the balancing compensator is a three-phase method
 */
export const correctionStandards = (star: StarWord, threePhase = true): readonly StandardReference[] => [
  { name: 'IEC 60831-1', use: 'low-voltage shunt capacitors: capacitance tolerance, permitted voltage and current, discharge' },
  { name: 'IEEE Std 18', use: 'shunt power capacitors: continuous voltage, current and kvar limits' },
  { name: 'IEEE Std 1036', use: `application of shunt capacitors: voltage rise ΔV/V ≈ Qc/Ssc and parallel resonance order h = √(Ssc/Qc), both worked here from the reactance of the path the capacitor current takes (line and neutral on a single-phase board), ΔV/V ≈ Qc·Xpath/V² and h = √(Xc/Xpath), as the formulas assume X ≫ R; for unequal capacitors or a ${star} bank on the neutral, the lowest order of the path’s reactances with the capacitances and the worst line’s rise` },
  { name: 'NEC Article 460', use: 'capacitor installations: discharge and conductor sizing (where the NEC applies)' },
  ...(threePhase ? [{ name: 'Steinmetz / Gyugyi balancing compensator', use: `delta and ${star} reactive branches that balance an unbalanced load` }] : []),
];

export const INSTALLATION_ASSUMPTIONS: readonly string[] = [
  'The installation is radial: every board is fed by one feeder from one other board, and all boards are solved together as one network, so a load on one board moves the voltages of every other board.',
  "Each board's figures are at that board: its line currents are what its feeder carries (the boards beyond it included), and its voltage drop is counted from the source EMF.",
];
