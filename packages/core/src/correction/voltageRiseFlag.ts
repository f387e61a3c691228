/**
 * What a steady voltage rise above the flag level (CorrectionSpec.voltageRiseLimitPercent) does on the
 * board it is flagged on. The level asks for a second look; it is no limit the verdict is judged on: the
 * same rise that lifts a board sagging under load towards nominal lifts it further when the load falls
 * and the steps are still in. So the board's own voltages (those its voltage check judges, loads left out)
 * are read at design load without and with the equipment, and with the board's loads off and every step
 * in (a controller that has not yet taken them out, or a bank that cannot), each against the board's band.
 * Two solves, made only where the rise is flagged.
 */
import type { Board } from '../board/boardModel.js';
import type { BoardResult } from '../analysis/boardResult.js';
import { boardVoltagePoints } from '../analysis/voltageCheck.js';
import { judgeVoltage } from '../board/conventions/voltageLimits.js';
import { percentBesideBand } from '../board/conventions/voltageBesideBand.js';
import { addCorrectionEquipment, type EquipmentGroup } from './equipment.js';
import { scaleBoardLoads } from './scaleBoardLoads.js';
import { distinctDigits } from './correctionWording.js';
import { checkNumberArgument } from '../_internal/argumentChecks.js';
import type { BoardVoltageRange, VoltageRise, VoltageRiseFlagReading } from './correctionResult.js';

/** The board's own voltages as its voltage check judges them (line-to-neutral and line-to-line with a neutral, line-to-line without), % of nominal. */
export function boardVoltageRange(r: BoardResult): BoardVoltageRange {
  const percents = boardVoltagePoints(r.phases, r.lineToLine, r.voltageCheck.boardVoltages === 'line-to-neutral', (x) => x).map((p) => p.percent);
  return { lowestPercent: Math.min(...percents), highestPercent: Math.max(...percents) };
}

/** The farthest a range lies from nominal, % of nominal. */
const offNominal = (r: BoardVoltageRange): number => Math.max(100 - r.lowestPercent, r.highestPercent - 100);

/**
 * @param what the equipment in words ("the bank", "the compensator")
 * @param solve the solve and analysis the verification uses
 */
export function readRiseFlag(input: {
  readonly board: Board;
  readonly equipment: readonly EquipmentGroup[];
  readonly before: BoardResult;
  readonly after: BoardResult;
  readonly solve: (b: Board) => BoardResult;
  readonly what: string;
}): VoltageRiseFlagReading {
  const { board, equipment, before, after, solve, what } = input;
  const limits = after.voltageCheck.limits;
  const designLoad = { before: boardVoltageRange(before), after: boardVoltageRange(after) };
  const unloaded = scaleBoardLoads(board, { fraction: 0 });
  const noLoad = {
    withoutPercent: boardVoltageRange(solve(unloaded)).highestPercent,
    everyStepInPercent: boardVoltageRange(solve(addCorrectionEquipment(unloaded, equipment))).highestPercent,
  };
  const over = (percent: number) => judgeVoltage(limits, percent) === 'over';
  const atDesignLoad = over(designLoad.after.highestPercent)
    ? 'above-band'
    : judgeVoltage(limits, designLoad.after.lowestPercent) === 'within' && offNominal(designLoad.after) < offNominal(designLoad.before)
      ? 'towards-nominal'
      : 'within-band';
  const atNoLoad = over(noLoad.everyStepInPercent) ? 'above-band' : 'within-band';
  const band = { lowPercent: 100 - limits.underPercent, highPercent: 100 + limits.overPercent };
  const reading = { designLoad, noLoad, band, atDesignLoad, atNoLoad } as const;
  return { ...reading, words: riseFlagWords(reading, what, (p) => percentBesideBand(limits, p)) };
}

/** The reading in words: each figure with the decimals that show its side of the band. */
export function riseFlagWords(r: Omit<VoltageRiseFlagReading, 'words'>, what: string, shown: (percent: number) => string): string {
  const range = (x: BoardVoltageRange) => `${shown(x.lowestPercent)}–${shown(x.highestPercent)} %`;
  const high = shown(r.band.highPercent);
  const design =
    r.atDesignLoad === 'above-band'
      ? `, above the band's ${high} %: a smaller ${what.replace(/^the /, '')} or a lower supply voltage (the transformer's tapping) before it is built`
      : r.atDesignLoad === 'towards-nominal'
        ? ', so the rise is welcome there'
        : ', inside the band';
  const unloaded =
    r.atNoLoad === 'above-band'
      ? `, above the band's ${high} %: the steps must be out before the load falls that far (check that the controller's band and delays take them out, and what stays in)`
      : `, inside the band: the steps must come out as the load falls, as the controller's band takes them out`;
  return (
    `at design load the board sits at ${range(r.designLoad.before)} of nominal without ${what} and ${range(r.designLoad.after)} with it ` +
    `(band ${shown(r.band.lowPercent)}–${high} %)${design}; with the board's loads off and every step still in it would reach ${shown(r.noLoad.everyStepInPercent)} % ` +
    `(${shown(r.noLoad.withoutPercent)} % without ${what})${unloaded}`
  );
}

/** The verdict's rider where the rise is flagged ('' where it is not): a verdict never reads plain beside the flag. */
export function riseFlagRider(rise: Pick<VoltageRise, 'flagged' | 'judgedPercent' | 'flagLevelPercent'>, where: string): string {
  if (!rise.flagged) return '';
  return `; its steady voltage rise, about ${distinctDigits(rise.judgedPercent, rise.flagLevelPercent, 2)[0]} %, is above the ${levelText(rise.flagLevelPercent)} % flag level (${where})`;
}

/**
 * A flag level as set: 3, 2.5.
 * @throws {InputError} naming `level` unless it is a finite number above 0
 */
export function levelText(level: number): string {
  checkNumberArgument(level, 'level', 'a flag level in %, a finite number above 0', (x) => x > 0);
  return String(Number(level.toFixed(2)));
}

/**
 * A rise beside the flag level, with the decimals that keep a figure above the level from printing as it
 * (3.004, never "3.00 %, above the 3 % flag level").
 * @throws {InputError} naming `percent` or `level` unless each is a finite number (`level` above 0)
 */
export function riseFigureText(percent: number, level: number): string {
  checkNumberArgument(percent, 'percent', 'a voltage rise in % of nominal, a finite number');
  checkNumberArgument(level, 'level', 'a flag level in %, a finite number above 0', (x) => x > 0);
  return distinctDigits(percent, level, 2)[0];
}

/**
 * The arrangements of a comparison whose rise is above the flag level, with their figures, beside the
 * recommendation; with what it means on the board where the recommended one is among them.
 * @param reading the recommended arrangement's flagReading words, or null where it is not flagged
 */
export function comparisonRiseWords(flagged: readonly { readonly name: string; readonly percent: number; readonly recommended: boolean }[], level: number, reading: string | null): string {
  const figure = (p: number) => `${distinctDigits(p, level, 2)[0]} %`;
  const chosen = flagged.find((f) => f.recommended);
  const others = flagged.filter((f) => !f.recommended);
  const above = `above the ${levelText(level)} % flag level`;
  if (!chosen)
    return `note: ${others.map((o) => `the ${o.name} would raise the board voltage by about ${figure(o.percent)}`).join(' and ')} at design load, ${above}`;
  const also = others.length ? ` (${others.map((o) => `the ${o.name} by ${figure(o.percent)}`).join(', ')})` : '';
  return `note: the recommended ${chosen.name} raises the board voltage by about ${figure(chosen.percent)} at design load, ${above}${also}${reading ? `: ${reading}` : ''}`;
}
