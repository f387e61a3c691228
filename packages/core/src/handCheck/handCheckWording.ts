/** Every sentence `trivar check` says about an effect, with the board's numbers filled in. */
import type { HandEffectId } from './handCheckResult.js';
import type { PhaseLabel, PhaseLabeller } from '../board/conventions/phaseNames.js';

const f = (x: number, d: number): string => {
  const s = x.toFixed(d);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
};

export const EFFECT_TITLES: Readonly<Record<HandEffectId, string>> = {
  'line-pair-split': 'line-pair branches share unevenly',
  'board-voltage': 'voltage drop at the board',
  'neutral-return': 'neutral return',
  'capacitor-voltage': 'capacitor output at applied voltage',
  'voltage-dependent-loads': 'voltage-dependent loads',
};

export const effectExplanation = {
  /** `label`: the board's phase labels, for the example pair. */
  lineSplit: (loadKW: number, loadKvar: number, capKvar: number, splitPhase: boolean, label: PhaseLabeller): string =>
    splitPhase
      ? 'On a split-phase board the two half-windings are in line with the 240 V branch, so splitting its power half to each line is exact here.'
      : `A branch across two lines draws its current in step with its line-to-line voltage, 30° away from either phase voltage, so it does not take half its P and Q from each line: ` +
        `part of its reactive power shows up as active current moved from one line to the other (a capacitor on ${label('A-B')} takes active current off line ${label('A')} and puts it on line ${label('B')}). ` +
        `On this board ${f(loadKW, 1)} kW and ${f(loadKvar, 1)} kvar of loads and ${f(capKvar, 1)} kvar of your capacitors sit across line pairs.`,
  boardVoltage: (lowPct: number, highPct: number, unbalancedSource: boolean): string =>
    `The source and feeder impedance leave the phases at ${f(lowPct, 1)}–${f(highPct, 1)} % of nominal${unbalancedSource ? ' (with the unbalanced source voltages entered)' : ''}: ` +
    'the same power at a lower voltage takes more current, and every phase angle moves with the drop.',
  noDrop: 'The source is ideal and the feeder has no impedance: the board sits at nominal voltage, as the hand method assumes.',
  /** @param sourcePoint where the neutral returns, in the board's region words (the source star point, the transformer center tap) */
  /**
   * @param neutralA the neutral current as solved (the figure the comparison table shows)
   * @param stepNeutralA the neutral current at this step (loads at rated power, capacitors at their hand kvar), quoted beside it where it differs as printed
   */
  neutralReturn: (neutralA: number, stepNeutralA: number, shiftV: number, sourcePoint: string, splitPhase: boolean): string =>
    `The neutral carries ${f(neutralA, 1)} A back to the source as solved${f(stepNeutralA, 1) === f(neutralA, 1) ? '' : ` (${f(stepNeutralA, 1)} A at this step, with the loads still at their rated power and the capacitors at their hand kvar)`}${
      // A neutral with no impedance (an ideal source, no feeder) drops nothing: the bar stays on the source's point.
      f(shiftV, 2) === '0.00'
        ? `, but with no impedance in its path it drops nothing: the neutral bar stays on ${sourcePoint} and the ${splitPhase ? 'line-to-neutral' : 'phase'} voltages stay as the source gives them.`
        : ` and its drop lifts the neutral bar ${f(shiftV, 2)} V off ${sourcePoint}, so the ${splitPhase ? 'line-to-neutral' : 'phase'} voltages become unequal.`
    }`,
  noNeutral: 'This board has no neutral conductor, so there is no neutral return to account for.',
  capacitorVoltage: (appliedKvar: number, handKvar: number, ratedNote: string): string =>
    f(appliedKvar, 2) === f(handKvar, 2)
      ? `A capacitor's output goes with the square of its voltage (Q = ωCV²): at the solved voltages your capacitors give the ${f(handKvar, 2)} kvar counted by hand.${ratedNote}`
      : `A capacitor's output goes with the square of its voltage (Q = ωCV²): at the solved voltages your capacitors give ${f(appliedKvar, 2)} kvar, not the ${f(handKvar, 2)} kvar counted by hand (${f((100 * (appliedKvar - handKvar)) / handKvar, 1)} %).${ratedNote}`,
  ratedNote: (branch: PhaseLabel, ratedV: number, nominalV: number): string =>
    ` The ${branch} unit is rated at ${f(ratedV, 0)} V: on ${f(nominalV, 0)} V it gives (${f(nominalV, 0)}/${f(ratedV, 0)})² = ${f((100 * nominalV * nominalV) / (ratedV * ratedV), 1)} % of its nameplate kvar.`,
  voltageDependentLoads: (solvedKW: number, solvedKvar: number, ratedKW: number, ratedKvar: number): string =>
    `Loads modelled as constant impedance or constant current follow the voltage instead of holding their rating: the board's loads draw ${f(solvedKW, 2)} kW and ${f(solvedKvar, 2)} kvar at the solved voltages against ${f(ratedKW, 2)} kW and ${f(ratedKvar, 2)} kvar rated.`,
  allConstantPower: 'Every load on this board is constant power, so none follows the voltage.',
};

export const HAND_CHECK_METHOD =
  'Each effect is switched on in turn, in the order listed, and the board solved again; an effect\'s size is how far it moves the figure. The effects add up to the whole difference between the textbook figure and the solved board.';

/** What the capacitors do to the board that a hand check must say, beside the figures. */
export const handCheckWarningWords = {
  /** @param capacitorKvar, loadKvar the line's share by the textbook split (a line-pair branch half on each of its lines) */
  leadingLine: (line: PhaseLabel, pf: number, capacitorKvar: number, loadKvar: number, linePairs: boolean, solvedKvar: number): string =>
    `line ${line} leads at PF ${f(pf, 3)} with your capacitors in: they supply more reactive power than the loads on it draw (over-correction) — ${f(capacitorKvar, 2)} kvar against ${f(loadKvar, 2)} kvar${linePairs ? ', a line-pair branch counted half on each of its lines' : ''}${
      f(solvedKvar, 2) === f(capacitorKvar, 2) ? '' : `; ${f(solvedKvar, 2)} kvar at the voltage they see as solved`
    }`,
  /**
   * A line whose capacitors give less than its loads draw by hand, but more at the voltage they see as solved
   * (a neutral shift or a supply above nominal lifts it): over-correction the hand figures do not show.
   */
  leadingLineVoltage: (line: PhaseLabel, pf: number, solvedKvar: number, handKvar: number, loadKvar: number): string =>
    `line ${line} leads at PF ${f(pf, 3)} with your capacitors in: counted by hand they give ${f(handKvar, 2)} kvar against the ${f(loadKvar, 2)} kvar its loads draw, but at the voltage they see as solved they give ${f(solvedKvar, 2)} kvar (Q = ωCV²), more than the loads draw: over-correction the hand figures do not show`,
  /** A line that leads although its capacitors give less than its loads draw, even as solved, and no line-pair branch is on it. */
  leadingLineOther: (line: PhaseLabel, pf: number, solvedKvar: number, loadKvar: number): string =>
    `line ${line} leads at PF ${f(pf, 3)} with your capacitors in, though they give it ${f(solvedKvar, 2)} kvar as solved against ${f(loadKvar, 2)} kvar its loads draw at rating: its loads draw less than their rating at the voltage they see`,
  /**
   * A line that leads although its capacitors give it less than its loads draw: the lead is the 30° shift of
   * the line-pair branches on it, not over-correction.
   * @param pairs the line-pair branches on this line, in the board's labels (loads and capacitors)
   */
  leadingLineShare: (line: PhaseLabel, pf: number, capacitorKvar: number, loadKvar: number, pairs: readonly PhaseLabel[]): string =>
    `line ${line} leads at PF ${f(pf, 3)} with your capacitors in, yet they give it less reactive power than its loads draw (${f(capacitorKvar, 2)} of ${f(loadKvar, 2)} kvar, a line-pair branch counted half on each of its lines), so this is not over-correction: ` +
    `a branch across two lines (here ${pairs.join(', ')}) draws its current in step with its line-to-line voltage, 30° ahead of one of its lines' phase voltage and 30° behind the other's, which moves line ${line} towards leading and the other line of the pair towards lagging`,
  /** A line that led as much or more without the capacitors: its loads make it lead, not the capacitors. */
  leadingLineBefore: (line: PhaseLabel, pf: number, pfBefore: number, acrossLines: boolean): string =>
    `line ${line} leads at PF ${f(pf, 3)} with your capacitors in, as it did without them (PF ${f(pfBefore, 3)} leading): the loads on it make it lead${acrossLines ? ' (a load across two lines draws its current 30° off either phase voltage)' : ''}, so this is not over-correction, and capacitors cannot bring it back to lagging`,
  /** A line that led without the capacitors and leads more with them. */
  leadingLineMore: (line: PhaseLabel, pf: number, pfBefore: number): string =>
    `line ${line} already led without your capacitors (PF ${f(pfBefore, 3)} leading) and leads more with them in (PF ${f(pf, 3)}): capacitors on it add to the lead; leave them off this line`,
  leadingBoardBefore: (pf: number, pfBefore: number): string =>
    `the board leads at PF ${f(pf, 3)} with your capacitors in, as it did without them (PF ${f(pfBefore, 3)} leading): its own loads draw leading vars, so this is not over-correction`,
  leadingBoard: (pf: number, capacitorKvar: number, loadKvar: number): string =>
    `the board leads at PF ${f(pf, 3)} with your capacitors in: they give ${f(capacitorKvar, 2)} kvar at the solved voltages, ${loadKvar > 0 ? `against ${f(loadKvar, 2)} kvar drawn by its loads` : 'and its loads draw no lagging reactive power'}`,
};
