/**
 * Voltage limits that a board's voltages are judged against, as named presets or
 * custom percentages of nominal. Each preset names the document it follows and how
 * far its values were checked (see METHODS.md §12).
 *
 * A figure is judged as printed: rounded to 0.1 % of nominal first, so a report never
 * shows "95.0 %" beside a verdict that 95 % is outside a −5 % limit.
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
    underPercent: 8.3,
    overPercent: 5.8,
    source: 'ANSI C84.1 Range B, service voltage: −8.3 %/+5.8 % of nominal (from memory)',
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

/** A percentage of nominal as a report prints it (0.1 %), the figure the limits judge. */
export const asPrinted = (percent: number): number => Math.round(percent * 10) / 10;

/** Where a voltage (% of nominal) stands against the limits, judged on its printed figure. */
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
  const p = asPrinted(percent);
  if (p < 100 - limits.underPercent) return 'under';
  if (p > 100 + limits.overPercent) return 'over';
  return 'within';
}

/**
 * The band in volts about a nominal voltage, each end to 0.1 V: the one rounding every report uses
 * for it (the table's allowed volts and the limits line alike), so a 208Y/120 board whose nominal
 * is 208/√3 = 120.1 V reads 114.1–126.1 V in both places.
 */
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

/** @throws {InputError} naming `limits.underPercent`, `limits.overPercent` or `nominalV` when one is not a finite figure in range */
export function bandVolts(limits: Pick<VoltageLimits, 'underPercent' | 'overPercent'>, nominalV: number): { readonly low: string; readonly high: string } {
  checkBandLimits(limits);
  checkNumberArgument(nominalV, 'nominalV', NOMINAL_EXPECTED, (x) => x > 0);
  return { low: ((nominalV * (100 - limits.underPercent)) / 100).toFixed(1), high: ((nominalV * (100 + limits.overPercent)) / 100).toFixed(1) };
}

/** "120.1 V: 114.1–126.1 V line-to-neutral; 208.0 V: 197.6–218.4 V line-to-line": the band at a board's nominal voltages. */
/** @throws {InputError} naming the limit or the nominal voltage that is not a finite figure in range (as judgedNominals gives them: a number or null) */
export function bandVoltsWords(limits: VoltageLimits, nominal: { readonly lineToNeutralV: number | null; readonly lineToLineV: number | null }): string {
  checkBandLimits(limits);
  if (typeof nominal !== 'object' || nominal === null) throw argumentIssueError('nominal', '{ lineToNeutralV, lineToLineV }, each a voltage in V or null, e.g. from judgedNominals(result)', nominal);
  for (const key of ['lineToNeutralV', 'lineToLineV'] as const)
    if (nominal[key] !== null) checkNumberArgument(nominal[key], `nominal.${key}`, `${NOMINAL_EXPECTED}, or null`, (x) => x > 0);
  const at = (v: number, what: string) => {
    const { low, high } = bandVolts(limits, v);
    return `${v.toFixed(1)} V: ${low}–${high} V ${what}`;
  };
  return [nominal.lineToNeutralV === null ? null : at(nominal.lineToNeutralV, 'line-to-neutral'), nominal.lineToLineV === null ? null : at(nominal.lineToLineV, 'line-to-line')]
    .filter((x): x is string => x !== null)
    .join('; ');
}

/** "±5 %" or "−6/+10 %": the band in a few characters, for tables and verdicts. */
export function bandWords(limits: VoltageLimits): string {
  checkBandLimits(limits);
  return limits.underPercent === limits.overPercent ? `±${limits.overPercent} %` : `−${limits.underPercent}/+${limits.overPercent} %`;
}
