/**
 * Supply voltages as the trade writes them on drawings and nameplates:
 * "208Y/120" and "480Y/277" (North America: star, line-to-line first), "400/230" or
 * "230/400" (IEC 60038 writes U0/U; both orders are read), "120/240" or "240/120"
 * (split phase: a centre-tapped winding, ratio 2), "120/208" (star, smaller first).
 *
 * A star system's two figures must be √3 apart and a split-phase system's 2 apart,
 * within NOTATION_RATIO_TOLERANCE: nominal values are rounded (480/277 is 1.7329,
 * 415/240 is 1.729, 400/230 is 1.739), an impossible pair (400/200 on a star) is not.
 */
import type { SystemKind } from '../boardSchema.js';
import { PHYSICAL_RANGES, SYSTEMS } from '../boardRanges.js';
import { argumentIssueError, checkNumberArgument } from '../../_internal/argumentChecks.js';

/** Relative tolerance on the ratio of the two figures: rounded nominal values stay within 1 %; 2 % leaves room (common practice, no source). */
export const NOTATION_RATIO_TOLERANCE = 0.02;

export interface VoltageNotation {
  /** The system the notation describes: a √3 pair is a star (4-wire) system, a ratio of 2 a split-phase one. */
  readonly system: 'three-phase-4wire' | 'split-phase';
  readonly lineToLineV: number;
  readonly lineToNeutralV: number;
  /** The text as written, trimmed. */
  readonly text: string;
  /** Written with Y (the North-American star form). */
  readonly star: boolean;
}

export type NotationReading = { ok: true; notation: VoltageNotation } | { ok: false; problem: string };

/** What a notation looks like, for messages and the JSON Schema. */
export const NOTATION_ACCEPTED =
  'a number pair like "208Y/120", "480Y/277", "600Y/347", "400/230", "230/400", "415/240", "120/208" (star: ratio √3) or "120/240", "240/120" (split phase: ratio 2), optionally followed by V';

const FORM = /^\s*(\d+(?:\.\d+)?)\s*([Yy])?\s*\/\s*(\d+(?:\.\d+)?)\s*(?:V|v)?\s*$/;

const near = (ratio: number, target: number) => Math.abs(ratio / target - 1) <= NOTATION_RATIO_TOLERANCE;

/**
 * Reads a voltage notation. `system`, when the file gives one, must agree: a √3 pair can
 * feed a 3-wire or single-phase board too; a split-phase pair only a split-phase or single-phase one.
 */
export function readVoltageNotation(text: string, system?: SystemKind): NotationReading {
  const m = FORM.exec(text);
  if (!m) return { ok: false, problem: NOTATION_ACCEPTED };
  const first = Number(m[1]);
  const second = Number(m[3]);
  const star = m[2] !== undefined;
  const high = Math.max(first, second);
  const low = Math.min(first, second);
  if (low <= 0) return { ok: false, problem: 'two voltages above 0 V' };
  // The range { lineToLine } and { lineToNeutral } are held to: trivar models low-voltage installations.
  const { min, max } = PHYSICAL_RANGES.voltage;
  if (low < min || high > max) return { ok: false, problem: `voltages from ${min} to ${max.toLocaleString('en-US')} V, a low-voltage supply (IEC 60038): ${high}/${low} is outside` };
  const ratio = high / low;
  const pair = `${high}/${low} is ${ratio.toFixed(3)}`;
  if (star && first < second) return { ok: false, problem: 'the line-to-line voltage first in the Y form (e.g. "208Y/120")' };
  const sqrt3 = near(ratio, Math.sqrt(3));
  const two = near(ratio, 2);
  const trimmed = text.trim();
  if (star && !sqrt3) return { ok: false, problem: `a line-to-line voltage √3 (1.732) × the line-to-neutral one with Y, which marks a star system: ${pair}` };
  if (sqrt3) {
    if (system === 'split-phase') return { ok: false, problem: 'a ratio of 2 for a split-phase supply (e.g. "120/240"); this is a star pair, ratio √3' };
    return { ok: true, notation: { system: 'three-phase-4wire', lineToLineV: high, lineToNeutralV: low, text: trimmed, star } };
  }
  if (two) {
    if (system === 'three-phase-4wire' || system === 'three-phase-3wire')
      return { ok: false, problem: `a ratio of √3 (1.732) for a three-phase star system (e.g. "400/230", "208Y/120"): ${pair}, a split-phase pair` };
    return { ok: true, notation: { system: 'split-phase', lineToLineV: high, lineToNeutralV: low, text: trimmed, star: false } };
  }
  return { ok: false, problem: `a ratio of √3 (1.732, a star system) or 2 (split phase) within ±${NOTATION_RATIO_TOLERANCE * 100} %: ${pair}` };
}

/**
 * The system a notation's ratio names (√3: three-phase 4-wire, 2: split phase), whether or not the
 * notation is otherwise valid; null when it names none. Lets a file that leaves `system` out be told
 * only what is wrong with its notation, not also that `system` is missing.
 */
export function systemOfNotationRatio(text: string): SystemKind | null {
  const m = FORM.exec(text);
  if (!m) return null;
  const high = Math.max(Number(m[1]), Number(m[3]));
  const low = Math.min(Number(m[1]), Number(m[3]));
  if (!(low > 0)) return null;
  return near(high / low, Math.sqrt(3)) ? 'three-phase-4wire' : near(high / low, 2) ? 'split-phase' : null;
}

/**
 * The nominal voltages a notation sets on a board of the given system. The line-to-line
 * figure sets a three-phase board's nominal (ln = ll/√3, as `lineToLine` does: "208Y/120" is
 * 208 V and 120.1 V); a split-phase pair is exact; a single-phase board takes the line-to-neutral figure.
 */
export function nominalOfNotation(n: VoltageNotation, system: SystemKind): { ln: number; ll: number | null } {
  if (system === 'single-phase') return { ln: n.lineToNeutralV, ll: null };
  if (n.system === 'split-phase') return { ln: n.lineToNeutralV, ll: 2 * n.lineToNeutralV };
  return { ln: n.lineToLineV / Math.sqrt(3), ll: n.lineToLineV };
}

/**
 * Writes the nominal voltages the way the region writes them: North America puts the
 * line-to-line figure first with Y for a star ("208Y/120") and writes split phase as
 * "120/240"; IEC practice writes U0/U the other way round ("230/400"). Reading the text
 * back gives the same figures (rounded to 0.1 V).
 */
export function writeVoltageNotation(system: SystemKind, lineToNeutralV: number, lineToLineV: number | null, region: 'iec' | 'north-america'): string {
  // NaN wrote "NaN/NaN V"; an unknown system or region fell through to a star's notation.
  if (!(SYSTEMS as readonly unknown[]).includes(system)) throw argumentIssueError('system', `one of ${SYSTEMS.map((x) => `"${x}"`).join(', ')}`, system);
  checkNumberArgument(lineToNeutralV, 'lineToNeutralV', 'a voltage in V, a finite number above 0', (x) => x > 0);
  if (lineToLineV !== null) checkNumberArgument(lineToLineV, 'lineToLineV', 'a voltage in V, a finite number above 0, or null', (x) => x > 0);
  if (region !== 'iec' && region !== 'north-america') throw argumentIssueError('region', '"iec" or "north-america"', region);
  const v = (x: number) => String(Math.round(x * 10) / 10);
  if (lineToLineV === null || system === 'single-phase') return `${v(lineToNeutralV)} V`;
  if (system === 'three-phase-3wire') return `${v(lineToLineV)} V`;
  if (system === 'split-phase') return `${v(lineToNeutralV)}/${v(lineToLineV)} V`;
  return region === 'north-america' ? `${v(lineToLineV)}Y/${v(lineToNeutralV)} V` : `${v(lineToNeutralV)}/${v(lineToLineV)} V`;
}
