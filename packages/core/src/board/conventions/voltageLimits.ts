/**
 * Voltage limits that a board's voltages are judged against, as named presets or
 * custom percentages of nominal. Each preset names the document it follows and how
 * far its values were checked (see METHODS.md §12).
 *
 * A figure is judged as it is, beyond a round-off allowance (VOLTAGE_ROUND_OFF_PERCENT); a report
 * prints a figure near an edge with the decimals that show its side (voltageBesideBand.ts).
 */
import type { Region } from './region.js';
import { argumentIssueError, checkNumberArgument } from '../../_internal/argumentChecks.js';

export interface VoltageLimitPreset {
  /** Allowed fall below nominal, %. */
  readonly underPercent: number;
  /** Allowed rise above nominal, %. */
  readonly overPercent: number;
  /** What the limits are, in words, with the source and how far it was checked. */
  readonly source: string;
}

export const VOLTAGE_LIMIT_PRESETS = {
  'en50160-supply': {
    underPercent: 10,
    overPercent: 10,
    source:
      'EN 50160, LV public supply: ±10 % of the nominal 230 V for 95 % of the 10-minute means of a week (confirmed secondary: an EN 50160:2010 meter technical note); here ±10 % of the board’s own nominal voltage, applied to every solved voltage',
  },
  'c84-service-a': {
    underPercent: 5,
    overPercent: 5,
    source: 'ANSI C84.1 Range A, service voltage: ±5 % of nominal (±5 % at service confirmed secondary; exact table from memory)',
  },
  'c84-service-b': {
    // The standard's volts on a 120 V base, as exact fractions: a rounded −8.3/+5.8 % would put 110 V and 127 V
    // themselves outside, now that a figure is judged as it is.
    underPercent: (100 * 10) / 120,
    overPercent: (100 * 7) / 120,
    source: 'ANSI C84.1 Range B, service voltage: 110–127 V on a 120 V base, −8.333 %/+5.833 % of nominal (from memory)',
  },
  'uk-supply': {
    underPercent: 6,
    overPercent: 10,
    source:
      'UK supply: +10 %/−6 % of the nominal 230 V (confirmed: the Electricity Supply (Amendment) (No. 2) Regulations 1994 summary; carried into the Electricity Safety, Quality and Continuity Regulations 2002 — from memory); here of the board’s own nominal voltage',
  },
} as const satisfies Record<string, VoltageLimitPreset>;

export type VoltageLimitPresetName = keyof typeof VOLTAGE_LIMIT_PRESETS;
/** Custom limits a file may set, % of nominal each way. */
export const VOLTAGE_LIMIT_PERCENT = { min: 0, max: 50 } as const;

export const VOLTAGE_LIMIT_PRESET_NAMES = Object.keys(VOLTAGE_LIMIT_PRESETS) as VoltageLimitPresetName[];

/** The limits a board is judged against: a preset's, or the file's own percentages (`preset: 'custom'`). */
export interface VoltageLimits extends VoltageLimitPreset {
  readonly preset: VoltageLimitPresetName | 'custom';
}

/** The preset a region uses when the file names none: ANSI C84.1 Range A in North America, EN 50160 elsewhere. */
export const DEFAULT_LIMITS_OF_REGION: Readonly<Record<Region, VoltageLimitPresetName>> = {
  iec: 'en50160-supply',
  'north-america': 'c84-service-a',
};

export function presetLimits(name: VoltageLimitPresetName): VoltageLimits {
  return { preset: name, ...VOLTAGE_LIMIT_PRESETS[name] };
}

export function customLimits(underPercent: number, overPercent: number): VoltageLimits {
  return { preset: 'custom', underPercent, overPercent, source: `custom limits from the file: −${underPercent} %/+${overPercent} % of nominal` };
}

/**
 * How far past a band edge a voltage may lie and still be judged on it, % of nominal: round-off of the
 * solve and of nominal × (1 ± limit) (1e-13 relative), not a tolerance. 0.001 % is 2.3 mV at 230 V, far
 * below what a meter reads (a 0.1 V display step is 0.04 %); and a figure judged past it shows its side
 * within three decimals of a percentage (and of volts from a 100 V nominal up).
 */
export const VOLTAGE_ROUND_OFF_PERCENT = 0.001;

/** Below a band's lower edge (% of nominal) by more than round-off: the one test every count and verdict uses. */
export const belowBandEdge = (percent: number, lowPercent: number): boolean => percent < lowPercent - VOLTAGE_ROUND_OFF_PERCENT;
/** Above a band's upper edge (% of nominal) by more than round-off. */
export const aboveBandEdge = (percent: number, highPercent: number): boolean => percent > highPercent + VOLTAGE_ROUND_OFF_PERCENT;

/** Where a voltage (% of nominal) stands against the limits: judged on the figure itself, beyond round-off. */
export function judgeVoltage(limits: VoltageLimits, percent: number): 'under' | 'over' | 'within' {
  // NaN compares false with both ends and would read as within the limits. Checked inline first: this runs
  // for every branch of every board and interval, so the good path builds no closure and no path text.
  const under = limits?.underPercent;
  const over = limits?.overPercent;
  if (!(Number.isFinite(percent) && typeof under === 'number' && under >= 0 && under <= 100 && typeof over === 'number' && over >= 0 && Number.isFinite(over))) {
    checkNumberArgument(percent, 'percent', 'a voltage as a finite percentage of nominal, e.g. 97.4');
    checkNumberArgument(under, 'limits.underPercent', 'a finite percentage below nominal, from 0 to 100', (x) => x >= 0 && x <= 100);
    checkNumberArgument(over, 'limits.overPercent', 'a finite percentage above nominal, 0 or more', (x) => x >= 0);
  }
  if (belowBandEdge(percent, 100 - limits.underPercent)) return 'under';
  if (aboveBandEdge(percent, 100 + limits.overPercent)) return 'over';
  return 'within';
}

/**
 * The limits a band is written from: each percentage finite and in range, or an InputError naming it
 * (NaN printed "NaN–NaN V" and "±undefined %"). Reports ask once per board, never per interval.
 */
function checkBandLimits(limits: unknown): asserts limits is Pick<VoltageLimits, 'underPercent' | 'overPercent'> {
  if (typeof limits !== 'object' || limits === null) throw argumentIssueError('limits', 'voltage limits { underPercent, overPercent, ... }, e.g. a preset of VOLTAGE_LIMIT_PRESETS', limits);
  const l = limits as Record<string, unknown>;
  checkNumberArgument(l.underPercent, 'limits.underPercent', 'a finite percentage below nominal, from 0 to 100', (x) => x >= 0 && x <= 100);
  checkNumberArgument(l.overPercent, 'limits.overPercent', 'a finite percentage above nominal, 0 or more', (x) => x >= 0);
}

const NOMINAL_EXPECTED = 'a nominal voltage in V, a finite number above 0';

/** Most decimals a band's ends or a figure beside them are printed with (voltageBesideBand.ts). */
export const MOST_BAND_DECIMALS = 3;

/**
 * The band in volts about a nominal voltage, each end to 0.1 V: the one rounding every report uses
 * for it (the table's allowed volts and the limits line alike), so a 208Y/120 board whose nominal
 * is 208/√3 = 120.1 V reads 114.1–126.1 V in both places. `decimals` (1 to 3) prints the ends finer,
 * as a figure beside them needed to show its side of an edge.
 * @throws {InputError} naming `limits.underPercent`, `limits.overPercent`, `nominalV` or `decimals` when one is not a finite figure in range
 */
export function bandVolts(limits: Pick<VoltageLimits, 'underPercent' | 'overPercent'>, nominalV: number, decimals = 1): { readonly low: string; readonly high: string } {
  checkBandLimits(limits);
  checkNumberArgument(nominalV, 'nominalV', NOMINAL_EXPECTED, (x) => x > 0);
  checkBandDecimals(decimals, 'decimals');
  return { low: ((nominalV * (100 - limits.underPercent)) / 100).toFixed(decimals), high: ((nominalV * (100 + limits.overPercent)) / 100).toFixed(decimals) };
}

function checkBandDecimals(decimals: unknown, name: string): void {
  checkNumberArgument(decimals, name, `a whole number of decimals from 1 to ${MOST_BAND_DECIMALS}`, (x) => Number.isInteger(x) && x >= 1 && x <= MOST_BAND_DECIMALS);
}

/**
 * "120.1 V: 114.1–126.1 V line-to-neutral; 208.0 V: 197.6–218.4 V line-to-line": the band at a board's nominal voltages.
 * `decimals` prints one kind's ends finer where a figure beside them needed it (bandDecimalsOf in voltageCheck.ts).
 * @throws {InputError} naming the limit, the nominal voltage or the decimals that is not a finite figure in range (as judgedNominals gives them: a number or null)
 */
export function bandVoltsWords(
  limits: VoltageLimits,
  nominal: { readonly lineToNeutralV: number | null; readonly lineToLineV: number | null },
  decimals: { readonly lineToNeutral?: number; readonly lineToLine?: number } = {},
): string {
  checkBandLimits(limits);
  if (typeof nominal !== 'object' || nominal === null) throw argumentIssueError('nominal', '{ lineToNeutralV, lineToLineV }, each a voltage in V or null, e.g. from judgedNominals(result)', nominal);
  for (const key of ['lineToNeutralV', 'lineToLineV'] as const)
    if (nominal[key] !== null) checkNumberArgument(nominal[key], `nominal.${key}`, `${NOMINAL_EXPECTED}, or null`, (x) => x > 0);
  if (typeof decimals !== 'object' || decimals === null) throw argumentIssueError('decimals', '{ lineToNeutral?, lineToLine? }, each a whole number of decimals from 1 to 3', decimals);
  for (const key of ['lineToNeutral', 'lineToLine'] as const) if (decimals[key] !== undefined) checkBandDecimals(decimals[key], `decimals.${key}`);
  const at = (v: number, what: string, d = 1) => {
    const { low, high } = bandVolts(limits, v, d);
    return `${v.toFixed(1)} V: ${low}–${high} V ${what}`;
  };
  return [
    nominal.lineToNeutralV === null ? null : at(nominal.lineToNeutralV, 'line-to-neutral', decimals.lineToNeutral),
    nominal.lineToLineV === null ? null : at(nominal.lineToLineV, 'line-to-line', decimals.lineToLine),
  ]
    .filter((x): x is string => x !== null)
    .join('; ');
}

/** A limit as written, to 3 decimals at most: 10, 8.3, 8.333 (Range B's exact 25/3). */
const limitFigure = (x: number): string => String(Math.round(x * 1000) / 1000);

/** "±5 %" or "−6/+10 %": the band in a few characters, for tables and verdicts. */
export function bandWords(limits: VoltageLimits): string {
  checkBandLimits(limits);
  return limits.underPercent === limits.overPercent ? `±${limitFigure(limits.overPercent)} %` : `−${limitFigure(limits.underPercent)}/+${limitFigure(limits.overPercent)} %`;
}
