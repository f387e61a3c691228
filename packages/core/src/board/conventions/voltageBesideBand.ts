/**
 * A voltage printed beside its verdict or its band: at the report's usual decimals where they read on
 * the verdict's side of the band's edges, else with the fewest more (up to three) that do. A figure far
 * from an edge prints as it always did; 253.1 V against a 253.0 V edge at 230 V prints 110.04 %, not a
 * "110.0 %" that would sit on the edge beside an "over" verdict.
 */
import { aboveBandEdge, bandVolts, belowBandEdge, MOST_BAND_DECIMALS, type VoltageLimits } from './voltageLimits.js';
import { checkNumberArgument } from '../../_internal/argumentChecks.js';

export type BandSide = 'under' | 'over' | 'within';

type BandLimits = Pick<VoltageLimits, 'underPercent' | 'overPercent'>;

interface FigureShown {
  readonly text: string;
  readonly decimals: number;
}

/**
 * `value` printed so it reads on `side` of the edges as they are printed beside it (`printedEdges(d)` at d
 * decimals). A figure judged within but past an edge by round-off is printed as the edge itself.
 */
function showSide(value: number, side: BandSide, exactLow: number, exactHigh: number, printedEdges: (decimals: number) => readonly [number, number], usual: number): FigureShown {
  const shown = side === 'within' ? Math.min(Math.max(value, exactLow), exactHigh) : value;
  for (let d = usual; d < MOST_BAND_DECIMALS; d++) {
    const [low, high] = printedEdges(d);
    const printed = Number(shown.toFixed(d));
    const reads = printed < low ? 'under' : printed > high ? 'over' : 'within';
    if (reads === side) return { text: fixedText(shown, d), decimals: d };
  }
  const d = Math.max(usual, MOST_BAND_DECIMALS);
  return { text: fixedText(shown, d), decimals: d };
}

/** Fixed decimals, never "-0.0". */
function fixedText(x: number, decimals: number): string {
  const s = x.toFixed(decimals);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

const sideOf = (percent: number, lowPercent: number, highPercent: number): BandSide =>
  belowBandEdge(percent, lowPercent) ? 'under' : aboveBandEdge(percent, highPercent) ? 'over' : 'within';

function checkUsual(usualDecimals: number): void {
  checkNumberArgument(usualDecimals, 'usualDecimals', `a whole number of decimals from 0 to ${MOST_BAND_DECIMALS}`, (x) => Number.isInteger(x) && x >= 0 && x <= MOST_BAND_DECIMALS);
}

/**
 * A % of nominal beside a band given by its edges in % of nominal (a profile's limits, 90–110): its usual
 * decimals, or more where they would put it on the wrong side of an edge. The edges are printed as given.
 * @throws {InputError} naming `percent`, `lowPercent`, `highPercent` or `usualDecimals` when one is not a finite figure in range
 */
export function percentBesideEdges(percent: number, lowPercent: number, highPercent: number, usualDecimals = 1): string {
  checkNumberArgument(percent, 'percent', 'a voltage as a finite percentage of nominal, e.g. 97.4');
  checkNumberArgument(lowPercent, 'lowPercent', 'the lower edge of the band, a finite percentage of nominal, e.g. 90');
  checkNumberArgument(highPercent, 'highPercent', 'the upper edge of the band, a finite percentage of nominal no lower than lowPercent, e.g. 110', (x) => x >= lowPercent);
  checkUsual(usualDecimals);
  const side = sideOf(percent, lowPercent, highPercent);
  return showSide(percent, side, lowPercent, highPercent, () => [lowPercent, highPercent], usualDecimals).text;
}

/**
 * A % of nominal beside the verdict of `limits` ("110.04 %" where the usual "110.0 %" would sit on a +10 % edge).
 * @throws {InputError} naming the argument that is not a finite figure in range
 */
export function percentBesideBand(limits: BandLimits, percent: number, usualDecimals = 1): string {
  checkNumberArgument(limits?.underPercent, 'limits.underPercent', 'a finite percentage below nominal, from 0 to 100', (x) => x >= 0 && x <= 100);
  checkNumberArgument(limits?.overPercent, 'limits.overPercent', 'a finite percentage above nominal, 0 or more', (x) => x >= 0);
  return percentBesideEdges(percent, 100 - limits.underPercent, 100 + limits.overPercent, usualDecimals);
}

/**
 * The common case, answered without the search below: a good reading whose volts and percentage both lie
 * more than two units of their last printed decimal from every edge, where rounding cannot carry either
 * figure onto or across an edge (a band end in V is itself rounded by at most half a unit). A report
 * prints a board's every circuit through here, so this path checks inline and builds nothing else;
 * null sends anything else (a figure near an edge, a bad argument) through the full path and its checks.
 */
function clearOfEdges(limits: BandLimits, reading: { readonly volts: number; readonly percent: number }, usual: number): VoltageShown | null {
  const under = limits?.underPercent;
  const over = limits?.overPercent;
  const volts = reading?.volts;
  const percent = reading?.percent;
  if (!(typeof under === 'number' && under >= 0 && under <= 100 && typeof over === 'number' && over >= 0 && Number.isFinite(over))) return null;
  if (!(typeof volts === 'number' && volts > 0 && Number.isFinite(volts) && typeof percent === 'number' && percent > 0 && Number.isFinite(percent))) return null;
  if (!(usual === 1 || usual === 0 || usual === 2)) return null;
  const unit = 2 * 10 ** -usual;
  const fromEdge = Math.min(Math.abs(percent - (100 - under)), Math.abs(percent - (100 + over)));
  // The same distance in volts: percent of the nominal the reading was taken against (volts / percent).
  if (!(fromEdge > unit && (fromEdge * volts) / percent > unit)) return null;
  const side = sideOf(percent, 100 - under, 100 + over);
  return { side, volts: fixedText(volts, usual), voltsDecimals: usual, percent: fixedText(percent, usual), percentDecimals: usual };
}

/** A voltage beside its band, in volts and % of nominal, each with the decimals that show its side. */
export interface VoltageShown {
  readonly side: BandSide;
  readonly volts: string;
  /** Decimals of `volts`: the band's ends in V beside it are printed with as many (bandVolts, bandVoltsWords). */
  readonly voltsDecimals: number;
  readonly percent: string;
  readonly percentDecimals: number;
}

/**
 * A voltage and its % of nominal beside the verdict of `limits`. The volts are read against the band's
 * ends in V printed with the same decimals (bandVolts), the percentage against the limits as written;
 * the nominal is the one the percentage was taken against (volts / percent).
 * @throws {InputError} naming the argument that is not a finite figure in range
 */
export function voltageBesideBand(limits: BandLimits, reading: { readonly volts: number; readonly percent: number }, usualDecimals = 1): VoltageShown {
  const clear = clearOfEdges(limits, reading, usualDecimals);
  if (clear !== null) return clear;
  checkNumberArgument(limits?.underPercent, 'limits.underPercent', 'a finite percentage below nominal, from 0 to 100', (x) => x >= 0 && x <= 100);
  checkNumberArgument(limits?.overPercent, 'limits.overPercent', 'a finite percentage above nominal, 0 or more', (x) => x >= 0);
  checkNumberArgument(reading?.volts, 'reading.volts', 'a voltage magnitude in V, finite and 0 or more', (x) => x >= 0);
  checkNumberArgument(reading?.percent, 'reading.percent', 'the voltage in % of nominal, finite and 0 or more', (x) => x >= 0);
  checkUsual(usualDecimals);
  const low = 100 - limits.underPercent;
  const high = 100 + limits.overPercent;
  const side = sideOf(reading.percent, low, high);
  const percent = showSide(reading.percent, side, low, high, () => [low, high], usualDecimals);
  // A dead circuit (0 V) has no nominal to read back: it is far from every edge but a 100 % fall.
  if (!(reading.volts > 0 && reading.percent > 0)) return { side, volts: fixedText(reading.volts, usualDecimals), voltsDecimals: usualDecimals, percent: percent.text, percentDecimals: percent.decimals };
  const nominalV = (100 * reading.volts) / reading.percent;
  const volts = showSide(reading.volts, side, (nominalV * low) / 100, (nominalV * high) / 100, (d) => {
    const band = bandVolts(limits, nominalV, Math.max(1, d));
    return [Number(band.low), Number(band.high)];
  }, usualDecimals);
  return { side, volts: volts.text, voltsDecimals: volts.decimals, percent: percent.text, percentDecimals: percent.decimals };
}
