/** Limits and all wording of the open-neutral study's findings. */
import type { OpenNeutralLoadReading, OpenNeutralState, OpenNeutralWithoutRule } from './boardResult.js';
import type { RegionWords } from '../board/conventions/regionWords.js';
import { quoteText } from '../errors.js';

export const OPEN_NEUTRAL_LIMITS = {
  /**
   * A load's voltage differing by more than this % of nominal between the state
   * reached and the all-impedance model makes the answer "depend on the load
   * model" (common practice, no source: about half the ±10 % supply band).
   */
  modelDependencePercent: 5,
  /** Two solutions closer than this % of nominal at every node are the same state. */
  sameStatePercent: 0.5,
  /** The follow without the low-voltage rule ending within this % of nominal of the state reached means the rule did not decide it. */
  ruleAgreementPercent: 1,
} as const;

const fmt = (x: number, digits = 1) => x.toFixed(digits);
const ohms = (r: number) => (r >= 10 ? fmt(r, 0) : r >= 1 ? fmt(r, 1) : r.toPrecision(2));

function listLoads(loads: readonly OpenNeutralLoadReading[]): string {
  const names = loads.map((l) => `${quoteText(l.name)}`);
  return names.length <= 3 ? names.join(', ') : `${names.slice(0, 3).join(', ')} and ${names.length - 3} more`;
}

/** The load whose voltage differs most between two states of the same board. */
function largestDifference(a: OpenNeutralState, b: OpenNeutralState) {
  let best = { load: a.loads[0]!, other: b.loads[0]!, percent: 0 };
  a.loads.forEach((l, k) => {
    const other = b.loads[k]!;
    const percent = Math.abs(l.voltagePercent - other.voltagePercent);
    if (percent > best.percent) best = { load: l, other, percent };
  });
  return best;
}

const extremes = (s: OpenNeutralState) =>
  `highest ${fmt(s.highestPercent)} %, lowest ${fmt(s.lowestPercent)} % of nominal`;

export function openNeutralFindings(input: {
  readonly reached: OpenNeutralState;
  readonly reachedFromIntact: boolean;
  readonly collapseAtOhms: number | null;
  readonly impedanceModel: OpenNeutralState | null;
  readonly otherStates: readonly OpenNeutralState[];
  readonly withoutRule: OpenNeutralWithoutRule | null;
  readonly lowVoltageRuleDecides: boolean;
  readonly dependsOnLoadModel: boolean;
  readonly thresholdPercent: number;
  /** The one line every line-to-neutral load is on (as the board names it), or null. */
  readonly deadLine?: string | null;
}): string[] {
  const out: string[] = [];
  const { reached, withoutRule } = input;
  if (input.deadLine)
    out.push(
      `Every line-to-neutral load is on line ${input.deadLine}: with the neutral broken they have no return path, so they go dead (0 V) whatever their load model, and none is left on another line to see a raised voltage.`,
    );
  if (!input.reachedFromIntact)
    out.push(
      `Followed from the intact board as a resistance in the neutral rises, the operating state ceases to exist${input.collapseAtOhms === null ? ' just before the neutral opens' : ` at about ${ohms(input.collapseAtOhms)} ohm`} (voltage collapse): the board jumps to another state. Shown is the worst state found (${extremes(reached)}).`,
    );
  if (input.lowVoltageRuleDecides) {
    const below = reached.loads.filter((l) => l.belowLowVoltageRule);
    const without = !withoutRule
      ? ''
      : withoutRule.reachedOpen
        ? ` Without that rule the board would end at ${extremes(withoutRule.state)}.`
        : ` Without that rule the state followed from the intact board ceases to exist${withoutRule.collapseAtOhms === null ? ' just before the neutral opens' : ` at about ${ohms(withoutRule.collapseAtOhms)} ohm in the neutral`}: constant-power loads on the most heavily loaded side cannot draw their power (voltage collapse).`;
    out.push(
      `This result rests on a modelling choice: ${listLoads(below)} ${below.length === 1 ? 'sits' : 'sit'} below ${fmt(input.thresholdPercent, 0)} % of nominal, where trivar takes constant-power and constant-current loads as impedances.${without} What the real equipment does at low voltage (drops out, stalls, keeps drawing power) decides these voltages.`,
    );
  }
  if (input.otherStates.length > 0) {
    const first = input.otherStates[0]!;
    const diff = largestDifference(reached, first);
    out.push(
      `The open-neutral equations have ${input.otherStates.length + 1} solutions. Another one has ${quoteText(diff.other.name)} at ${fmt(diff.other.voltage)} V (${fmt(diff.other.voltagePercent)} %) instead of ${fmt(diff.load.voltage)} V; it is not reached from the intact board${input.reachedFromIntact ? '' : ' either'}, so a direct solve of the open board alone could have reported it.`,
    );
  }
  if (input.dependsOnLoadModel && input.impedanceModel) {
    const diff = largestDifference(reached, input.impedanceModel);
    out.push(
      `The answer depends on the load model: with every load as a constant impedance, ${quoteText(diff.load.name)} would see ${fmt(diff.other.voltage)} V (${fmt(diff.other.voltagePercent)} %) instead of ${fmt(diff.load.voltage)} V.`,
    );
  }
  return out;
}

/** The load seeing most above the line-to-line voltage between the board's lines in the same state. */
export interface BeyondLineToLine {
  readonly load: OpenNeutralLoadReading;
  /** The highest line-to-line voltage at the board in that state, V. */
  readonly lineToLineV: number;
  /** True where only the all-impedance model goes beyond it, not the state reached. */
  readonly impedanceModelOnly: boolean;
  /** A line-to-neutral load draws leading vars (a capacitor, a filter): the rise is a series resonance. */
  readonly capacitive: boolean;
  /** "phases", or "legs" on a split-phase board. */
  readonly phasesWord: string;
}

/**
 * The cautions of the study, following its figures. With loads of one power factor the floating
 * neutral stays inside the triangle of line voltages (Millman: a weighted mean with positive real
 * weights), so no load sees more than the line-to-line voltage, as the region's first caution says.
 * Unlike power factors make the weights complex and can take it outside: a little for lagging loads,
 * far for a capacitive load on one line and an inductive one on another (a series resonance through
 * the floating neutral). There the caution gives the figure instead, and with a capacitive load adds
 * one about capacitors on line-to-neutral circuits.
 */
/**
 * What to do instead of line-to-neutral capacitors where a lost neutral is credible, by the lines there
 * are: a delta or floating-star (floating-wye) bank on three phases, a line-to-line bank across two legs.
 */
const betweenLines = (phasesWord: string, star: string): string => (phasesWord === 'leg' ? 'a line-to-line bank' : `a delta or floating-${star} bank`);

/**
 * The caution about capacitors from a line to the neutral once the neutral is lost: one wording for the
 * broken-neutral study (where its figures show the resonance) and for trivar correct (where the
 * equipment it adds puts capacitors line to neutral), so the two never disagree on the same equipment.
 * @param phasesWord "phases", or "leg" on a split-phase board (RegionWords.phasesWord)
 * @param star the region's word for a star connection (RegionWords.starWord)
 */
export const lineToNeutralCapacitorsCaution = (phasesWord: string, star: string = 'star'): string =>
  `Capacitors on line-to-neutral circuits (power-factor correction of single-phase equipment, the EMI filters of electronic equipment) can resonate with inductive loads on the other ${phasesWord} once the neutral is lost: the overvoltage lasts until the supply is disconnected, beyond what surge protective devices are made to absorb, and breaks down insulation and capacitor dielectrics (a capacitor can fail violently). Where a lost neutral is credible, correct power factor between lines (${betweenLines(phasesWord, star)}) rather than line to neutral.`;

export function openNeutralCautions(words: Pick<RegionWords, 'openNeutralCautions' | 'openNeutralCautionsReaching'> & Partial<Pick<RegionWords, 'starWord'>>, beyond: BeyondLineToLine | null): readonly string[] {
  if (!beyond) return words.openNeutralCautions;
  const { load, lineToLineV, phasesWord } = beyond;
  const ratio = load.voltage / lineToLineV;
  const times = ratio >= 1.2 ? `${fmt(ratio)} times` : 'above';
  const model = beyond.impedanceModelOnly ? ' with every load as a constant impedance' : '';
  const why = beyond.capacitive ? `: capacitive and inductive loads on different ${phasesWord} are in series resonance through the floating neutral` : '';
  const reach = `line-to-neutral equipment can see more than the line-to-line voltage and be destroyed (here "${load.name}" would see ${fmt(load.voltage)} V${model}, ${times} the ${fmt(lineToLineV)} V between the board's lines${why})`;
  const capacitors = beyond.capacitive ? [lineToNeutralCapacitorsCaution(phasesWord, words.starWord ?? 'star')] : [];
  return [...words.openNeutralCautionsReaching(reach), ...capacitors];
}

export const OPEN_NEUTRAL_METHOD =
  'Found by following the board from intact to open: a resistance in series with the neutral conductor is raised step by step, as a failing joint would, and the state of the board is tracked.';

/**
 * What each voltage column of the broken-neutral study means, one wording for `trivar solve` and the
 * report, so the two explain the same figures the same way.
 */
export const OPEN_NEUTRAL_COLUMN_KEY = {
  reached: 'V: the state the board reaches',
  worstFound: 'V: the worst state found',
  impedanceModel: 'V if Z: every load as a constant impedance',
  otherState: 'V alt: another solution of the same equations',
  belowLowVoltageRule: '*: below the low-voltage rule, taken as an impedance',
} as const;
