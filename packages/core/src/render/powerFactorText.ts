/**
 * A power factor as every table prints it, beside the power it belongs to. Figures keep the load
 * convention (+kW consumed, +kvar absorbed); a lag/lead tag only means something for power taken
 * from the supply, so where active power flows back the cell says "export" (and the text says which
 * way the vars go). A PF that prints as 1.000 with vars that print as 0.00 gets no tag: a lamp of 1 W
 * on a 10 kW phase must not make the line read "1.000 lag". No power at all has no PF: `none`.
 */
import type { PowerFactorSense, PowerReading } from '../analysis/boardResult.js';
import { fixed } from './svgText.js';
import { argumentIssueError, checkNumberArgument } from '../_internal/argumentChecks.js';

/** True when the power, as printed to 2 decimals, flows back toward the supply. */
export function isExportKW(kW: number): boolean {
  if (!Number.isFinite(kW)) checkNumberArgument(kW, 'kW', 'an active power in kW, a finite number (negative when exported)');
  return fixed(kW, 2).startsWith('-');
}

export function powerFactorText(r: Pick<PowerReading, 'pf' | 'sense' | 'kVA' | 'kW' | 'kvar'>, none = '-'): string {
  if (typeof r !== 'object' || r === null) throw argumentIssueError('reading', 'a power reading { pf, sense, kVA, kW, kvar } of a solved board', r);
  // Checked inline first (a report calls this for every circuit): the messages are built only for a bad reading.
  if (!(Number.isFinite(r.kVA) && Number.isFinite(r.kW) && Number.isFinite(r.kvar) && (r.pf === null || Math.abs(r.pf) <= 1 + 1e-9))) {
    for (const key of ['kVA', 'kW', 'kvar'] as const) checkNumberArgument(r[key], `reading.${key}`, 'a finite number');
    if (r.pf !== null) checkNumberArgument(r.pf, 'reading.pf', 'a power factor from -1 to 1, or null where no power flows', (x) => Math.abs(x) <= 1 + 1e-9);
  }
  if (r.pf === null || fixed(r.kVA, 2) === '0.00') return none;
  const pf = fixed(Math.abs(r.pf), 3);
  if (isExportKW(r.kW)) return `${pf} export`;
  const noVars = Number(fixed(Math.abs(r.kvar), 2)) === 0 && pf === '1.000';
  const sense = noVars ? '' : r.sense === 'lagging' ? ' lag' : r.sense === 'leading' ? ' lead' : '';
  return `${pf}${sense}`;
}

/**
 * A signed board PF (P/S, negative when the board exports, as BoardResult's power definitions give it)
 * in the same words: "0.950", "1.000 export", `none` where no power flows (pf null).
 */
export function signedPfText(pf: number | null, none = '-'): string {
  if (pf === null) return none;
  // NaN printed "NaN"; a board PF is P/S, from -1 to 1.
  if (!(Math.abs(pf) <= 1 + 1e-9)) checkNumberArgument(pf, 'pf', 'a signed power factor from -1 to 1 (negative when the board exports), or null where no power flows', (x) => Math.abs(x) <= 1 + 1e-9);
  const shown = fixed(Math.abs(pf), 3);
  return pf < 0 && fixed(pf, 3) !== '0.000' ? `${shown} export` : shown;
}

/**
 * A displacement power factor (the fundamental's, as the harmonic study reads it) in the words of
 * `powerFactorText`: "0.894 lead" where the fundamental's vars are capacitive, "0.950 lag", "export" where
 * active power flows back, no tag at 1.000 with 0.00 kvar, `none` where nothing flows.
 * @param pf the displacement PF, signed (negative where the power flows back) or not; null where nothing flows
 * @param power the fundamental's sense, kW and kvar (load convention) the PF is read from
 */
export function displacementPfText(pf: number | null, power: { readonly sense: PowerFactorSense; readonly kW: number; readonly kvar: number }, none = '-'): string {
  if (pf !== null && !(Math.abs(pf) <= 1 + 1e-9)) checkNumberArgument(pf, 'pf', 'a displacement power factor from -1 to 1, or null where no current flows', (x) => Math.abs(x) <= 1 + 1e-9);
  if (typeof power !== 'object' || power === null) throw argumentIssueError('power', "the fundamental's { sense, kW, kvar }", power);
  if (pf === null) return none;
  return powerFactorText({ pf: Math.abs(pf), sense: power.sense, kW: power.kW, kvar: power.kvar, kVA: Math.hypot(power.kW, power.kvar) }, none);
}

/**
 * The footnote for circuits given in kW without a pf (`*`), from the kW of those circuits: a consumer
 * taken at pf 1 is a resistive load, an exporter (a generator, PV) simply runs at unity power factor.
 */
export function assumedPfNote(assumedKW: readonly number[]): string {
  if (!Array.isArray(assumedKW) || assumedKW.length === 0) throw argumentIssueError('assumedKW', 'the kW of the circuits given without a pf, at least one', assumedKW);
  assumedKW.forEach((kW, k) => checkNumberArgument(kW, `assumedKW[${k}]`, 'an active power in kW, a finite number'));
  const exporters = assumedKW.filter((kW) => kW < 0).length;
  const why = exporters === 0 ? ' (a resistive load)' : exporters === assumedKW.length ? ' (exporting at unity power factor)' : ' (a resistive load; where it exports, a source at unity power factor)';
  return `*: pf not given in the file, taken as 1${why}.`;
}

/** True when a line current's active part, as the tables print it (0.1 A), is below zero: the line carries power back. */
export function isExportCurrentA(activeCurrentA: number): boolean {
  if (!Number.isFinite(activeCurrentA)) checkNumberArgument(activeCurrentA, 'activeCurrentA', 'the active part of the line current in A, a finite number');
  return fixed(activeCurrentA, 1).startsWith('-');
}

/**
 * A line's PF in a correction table, beside its active part as printed (0.1 A): "0.951 lag", or
 * "0.572 export" where that active part is below zero, the same words `powerFactorText` gives the line
 * in `trivar solve` (the reactive part beside it says which way the vars go); `none` without current.
 */
export function linePfText(pf: number | null, sense: PowerFactorSense, activeCurrentA: number, none = '-'): string {
  if (!(Number.isFinite(activeCurrentA) && (pf === null || Math.abs(pf) <= 1 + 1e-9))) {
    checkNumberArgument(activeCurrentA, 'activeCurrentA', 'the active part of the line current in A, a finite number');
    if (pf !== null) checkNumberArgument(pf, 'pf', 'a power factor from -1 to 1, or null where no current flows', (x) => Math.abs(x) <= 1 + 1e-9);
  }
  if (pf === null) return none;
  const shown = fixed(Math.abs(pf), 3);
  if (isExportCurrentA(activeCurrentA)) return `${shown} export`;
  return sense === 'lagging' ? `${shown} lag` : sense === 'leading' ? `${shown} lead` : shown;
}

/**
 * The note under a table of lines where some carry active power back to the supply (active part
 * below zero, as printed): what "export" in their PF cell means and where the vars' direction is read.
 * Null where no line does. `lines` are the labels of those lines.
 */
export function exportingLinesNote(lines: readonly string[]): string | null {
  if (!Array.isArray(lines) || lines.some((l) => typeof l !== 'string')) throw argumentIssueError('lines', 'the labels of the lines that export, e.g. ["L2"]', lines);
  if (lines.length === 0) return null;
  const which = lines.length === 1 ? `line ${lines[0]} carries` : `lines ${lines.join(', ')} carry`;
  return `${which} active power back to the supply (active part below zero): "export" in place of lag/lead; the reactive part says which way the vars go (above zero: absorbed, as by a lagging load)`;
}
