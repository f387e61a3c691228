/** CorrectionReport → the human-readable report of `trivar correct` (fits 100 columns). */
import { everyLineReadingWords, stepStatesClearWords, stepStateTable, exemptLeadingLines, lossesPlaceWords, arrangementDescriptions, arrangementNames, BUILD_VERDICT_WORDS, CORRECTION_DEFAULTS, labellerOf, meteringPointWords, reactorChanges, smallBranchWords, sparedBranchesWords, type BankSelection, type BankStep, type BeforeAfter, type BranchSizing, type CompensatorSizing, type ControllerSettings, type CorrectionReport, type CorrectionVerification, type FewerBranchesBuild, type PhaseId, type RoundingBesideReactors, type PhaseLabeller, signedPfText, linePfText, exportingLinesNote, isExportCurrentA, starWordOf, type StarWord } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { headerLines } from './solveReport.js';
import { wrapText } from './wrapText.js';
import { meteringSection } from './meteringSection.js';


const STATUS_WORDS: Record<string, string> = {
  'meets-target': 'MEETS THE TARGET',
  'meets-target-at-nominal-capacitance': 'MEETS THE TARGET at nominal capacitance (not across the whole tolerance band)',
  'already-meets-target': 'NOTHING TO DO: the board already meets the target',
  'misses-target-with-available-units': 'MISSES THE TARGET with the available units',
  'no-suitable-units': 'NO SUITABLE UNITS for this arrangement',
  infeasible: 'TARGET NOT REACHABLE with this arrangement',
  'nothing-to-build': 'NOTHING TO BUILD',
};

/** The verdict in capitals: a build that meets the target while it overloads what it is connected to says both. */
function headline(r: CorrectionReport): string {
  const words = r.status === 'no-suitable-units' && (r.selection?.units ?? 0) > 0 ? 'NO SUITABLE UNITS for part of this arrangement' : (STATUS_WORDS[r.status] ?? r.status);
  if (!r.status.startsWith('meets')) return words;
  // A CT given that is too small: met only with the CT the controller needs (ControllerSettings.ctNeeded).
  const ct = r.selection?.controller;
  const withCt = ct?.ctNeeded ? `${words} WITH A CT OF AT LEAST ${ampsRating(ct.ctNeeded.primaryA)}/${ampsRating(ct.ctSecondaryA)} A` : words;
  const buts = [
    ...(r.verification.overloadsCaused.length ? ['OVERLOADS WHAT FEEDS IT'] : []),
    // The estimate near a harmonic order in a state the controller can reach (every step in included).
    ...(r.verification.resonanceNearHarmonic ? ['ITS SUPPLY RESONANCE LIES NEAR A HARMONIC ORDER'] : []),
    ...(r.warnings.some((w) => w.code === 'harmonic-check-failed') ? ['FAILS THE HARMONIC CHECK'] : []),
  ];
  return buts.length ? `${withCt}, BUT ${buts.join(' AND ')}` : withCt;
}

const arrow = (x: BeforeAfter, digits: number, unit = '') => `${fixed(x.before, digits)}${unit} → ${fixed(x.after, digits)}${unit}`;
const pfArrow = (x: BeforeAfter) => `${signedPfText(x.before)} → ${signedPfText(x.after)}`;
const senseWord = (s: string) => (s === 'lagging' ? 'lag' : s === 'leading' ? 'lead' : '');
const indentLines = (lines: readonly string[]) => lines.map((l) => wrapText(l, '  ', '    ')).join('\n');
/** Phases, pairs and branches as the board file names them (L1-L2 or A-B); the study's data keys stay A/B/C. */
const labelsOf = (v: CorrectionVerification): PhaseLabeller => labellerOf(v.before.conventions.phaseNames);


/** A PF to 3 decimals; a line with no current has none. */
/** A bound to 3 decimals, or as many more as it takes to read as itself: 0.9999999 is not "1.000". */
export const boundFigure = (x: number): string => {
  let d = 3;
  while (d < 10 && Math.abs(Number(x.toFixed(d)) - x) > 1e-12) d++;
  return x.toFixed(d);
};

const pfFigure = (pf: number | null): string => (pf === null ? 'no current' : fixed(pf, 3));

function elementText(b: BranchSizing): string {
  if (b.element === 'none') return '-';
  if (b.element === 'capacitor') return `C ${fixed(b.capacitanceUF ?? 0, 1)} µF`;
  return `L ${fixed(b.inductanceMH ?? 0, 2)} mH`;
}

/** A voltage as a header shows it: 400 V, 230.9 V. */
const voltsText = (v: number): string => v.toFixed(1).replace(/\.0$/, '');

/**
 * The voltage a sizing's kvar column is taken at, read back from each branch (kvar = B·V²): the model's
 * nominal voltage, where the loads are rated (230.9 V on a 230/400 V board), which the unit tables after
 * it do not use (they are at the system's 230 V), so the header names it. A table with star and delta
 * branches (a compensator) names both in a note.
 */
function sizingVoltages(branches: readonly BranchSizing[]): { header: string; note: string } {
  const star = (b: BranchSizing) => /-(N|star)$/.test(b.branch);
  const voltsOf = (part: readonly BranchSizing[]) => [...new Set(part.filter((b) => b.susceptanceS !== 0).map((b) => voltsText(Math.sqrt((b.kvarAtNominalV * 1000) / b.susceptanceS))))];
  const ln = voltsOf(branches.filter(star));
  const ll = voltsOf(branches.filter((b) => !star(b)));
  if (ln.length + ll.length === 1) return { header: `kvar@${[...ln, ...ll][0]} V`, note: '' };
  if (ln.length === 1 && ll.length === 1) return { header: 'kvar@nom V', note: `\n  (kvar@nom V: at ${ln[0]} V across a line-to-neutral branch, ${ll[0]} V across a line-to-line branch)` };
  return { header: 'kvar@nom V', note: '' };
}

/** The continuous (ideal-size) elements: what each branch needs before units are chosen. */
function sizingTable(branches: readonly BranchSizing[], label: PhaseLabeller): string {
  const volts = sizingVoltages(branches);
  return renderTable(
    [
      { header: 'branch', align: 'left' },
      { header: 'element', align: 'left' },
      { header: volts.header },
      { header: 'V applied' },
      { header: 'kvar@applied' },
      { header: 'A' },
    ],
    branches.map((b) => [label(b.branch), elementText(b), fixed(b.kvarAtNominalV, 2), fixed(b.appliedV, 1), fixed(b.kvarAtAppliedV, 2), fixed(b.currentA, 2)]),
  ) + volts.note;
}

/** The branches of a step, short: a three-branch step by its connection. */
const branchWords = (s: BankStep, label: PhaseLabeller, star: StarWord) =>
  s.branches.length === 3
    ? `${label('ABC')} ${s.branches[0]!.endsWith('-N') ? `${star}-N` : s.branches[0]!.endsWith('-star') ? star : 'delta'}`
    : s.branches.map(label).join(' ');
const unitWords = (s: BankStep) => `${s.unit.kind === 'three-phase' ? '3-ph' : '1-ph'} ${fixed(s.unit.ratedKvar, 2)} kvar ${fixed(s.unit.ratedV, 0)} V`;
const partWords: Record<BankStep['part'], string> = { fixed: 'fixed', balanced: 'balanced', trim: 'trim', single: 'single' };

function stepsTable(sel: BankSelection, label: PhaseLabeller, star: StarWord): string {
  return renderTable(
    [
      { header: 'step', align: 'left' },
      { header: 'part', align: 'left' },
      { header: 'branches', align: 'left' },
      { header: 'units' },
      { header: 'unit', align: 'left' },
      { header: 'plate kvar' },
      { header: 'delivered' },
      { header: 'µF/branch' },
      { header: 'C/k A' },
    ],
    sel.steps.map((s) => [
      s.output === null ? '-' : String(s.output),
      partWords[s.part],
      branchWords(s, label, star),
      String(s.units),
      unitWords(s),
      fixed(s.nameplateKvar, 2),
      fixed(s.deliveredKvar, 2),
      fixed(s.capacitancePerBranchUF, 1),
      s.output === null ? '-' : fixed(s.responseThresholdA, 3),
    ]),
  );
}

/** True when no capacitance meets the target at the low tolerance and stays within the bounds at the high one. */
const emptyWindow = (s: BankSelection['selections'][number]) => s.maximumCapacitanceUF !== null && s.maximumCapacitanceUF < s.minimumCapacitanceUF;

/**
 * The two bounds of an empty window, with enough decimals that they read differently. The window is first
 * order, around the sizing's capacitance (a compensator's ideal one): where the board re-solved at both
 * tolerance ends still passes (`toleranceHeld`), the note says so rather than that nothing can meet the target.
 */
function emptyWindowNote(sel: BankSelection, s: BankSelection['selections'][number], label: PhaseLabeller, toleranceHeld: boolean): string {
  const hi = s.maximumCapacitanceUF ?? 0;
  let d = 1;
  while (d < 4 && fixed(s.minimumCapacitanceUF, d) === fixed(hi, d)) d++;
  const tol = sel.capacitanceTolerance;
  if (toleranceHeld)
    return `${label(s.branch)}: the first-order range around the sizing's ${fixed(s.requiredCapacitanceUF, 1)} µF is empty — keeping that much at −${tol.minusPercent} % takes at least ${fixed(s.minimumCapacitanceUF, d)} µF nominal, staying within every line's bounds at +${tol.plusPercent} % allows at most ${fixed(hi, d)} µF; re-solved at both tolerance ends, the ${fixed(s.designCapacitanceUF, 1)} µF built passes (see the Checks)`;
  return `${label(s.branch)}: no capacitance satisfies both tolerance ends — meeting the target at −${tol.minusPercent} % needs at least ${fixed(s.minimumCapacitanceUF, d)} µF nominal, keeping every line within its bounds at +${tol.plusPercent} % allows at most ${fixed(hi, d)} µF`;
}

function branchTable(sel: BankSelection, label: PhaseLabeller, emptyInSizing: readonly string[], toleranceHeld: boolean): string {
  const table = renderTable(
    [
      { header: 'branch', align: 'left' },
      { header: 'µF needed', align: 'left' },
      { header: 'µF built' },
      { header: 'fixed µF' },
      { header: 'kvar' },
      { header: 'A' },
      { header: 'V nom / max / rating ≥', align: 'left' },
    ],
    sel.selections.map((s) => [
      label(s.branch),
      emptyWindow(s) ? 'none (see below)' : s.maximumCapacitanceUF === null ? `≥ ${fixed(s.minimumCapacitanceUF, 1)}` : `${fixed(s.minimumCapacitanceUF, 1)} – ${fixed(s.maximumCapacitanceUF, 1)}`,
      fixed(s.designCapacitanceUF, 1),
      fixed(s.fixedCapacitanceUF, 1),
      fixed(s.designKvarAtAppliedV, 2),
      fixed(s.designCurrentA, 1),
      `${fixed(s.nominalV, 0)} / ${fixed(s.highestVoltageV, 0)} / ${fixed(s.requiredRatedV, 0)}`,
    ]),
  );
  const tol = sel.capacitanceTolerance;
  const notes = [
    ...(sel.windowsHeldTogether && !sel.equalBankWindows
      ? [
          `µF needed: ranges that hold together — with every branch anywhere in its range, every line meets the target at −${tol.minusPercent} % and stays within its bounds at +${tol.plusPercent} % (first order, re-solved below); each branch's own range, taken alone, left no room`,
        ]
      : []),
    // Said where the two tables would otherwise disagree on the page: a branch empty in the sizing, filled here.
    ...(sel.equalBankWindows && filledHere(sel, label, emptyInSizing)
      ? [
          `µF needed: the range of an equal bank (balanced steps, the same capacitance on every branch) — with every branch anywhere in it, every line meets the target at −${tol.minusPercent} % and stays within its bounds at +${tol.plusPercent} %; the build chosen is such a bank, judged on that range rather than each branch's own${filledHere(sel, label, emptyInSizing)}`,
        ]
      : []),
    ...sel.selections.filter(emptyWindow).map((s) => emptyWindowNote(sel, s, label, toleranceHeld)),
  ];
  return notes.length ? `${table}\n${indentLines(notes)}` : table;
}

/** Branches the continuous sizing left empty that the equal bank fills, named so the two tables agree on the page. */
const filledHere = (sel: BankSelection, label: PhaseLabeller, emptyInSizing: readonly string[]): string => {
  const filled = sel.selections.filter((s) => emptyInSizing.includes(s.branch) && s.designCapacitanceUF > 0).map((s) => label(s.branch));
  return filled.length ? `, so ${filled.join(' and ')}, at 0 kvar in the sizing above, ${filled.length > 1 ? 'take' : 'takes'} capacitance here` : '';
};

/** A rating as written on its plate: whole amperes, or the decimals it has (a 12.5/5 A CT, not 13/5). */
const ampsRating = (a: number): string => (Number.isInteger(a) ? String(a) : String(Number(a.toFixed(2))));

/** What C/k of a step across two lines of a three-phase board assumes (controllerSettings.ts derives it). */
const LINE_PAIR_CK = ' per line: the step is across two lines, and each of them sees √3/2 of its branch current as reactive current, read against that line\'s voltage to the neutral';

/** `everyLine`: how a controller reads every line where the CT reads (everyLineReadingWords). */
function controllerLines(c: ControllerSettings, everyLine: string): string[] {
  const band = `PF ≥ ${boundFigure(c.targetBand.minPf)} lagging${c.targetBand.maxPf === null ? (c.targetBand.leadingAllowed ? ', leading allowed' : ' up to 1.000') : ` up to ${fixed(c.targetBand.maxPf, 3)} lagging`}`;
  return [
    `outputs: ${c.outputsUsed} of ${c.outputs} used · ${c.measurement === 'one-line' ? 'balanced steps: an ordinary controller reading one CT' : `steps serve single lines: the controller must measure every line (${everyLine})`}`,
    `CT ${ampsRating(c.ctPrimaryA)}/${ampsRating(c.ctSecondaryA)} A${c.ctChosen ? '' : ' (given)'} at ${c.ctBasis.placeWords}; ${
      c.ctChosen ? `chosen: the next standard rating at or above 1.25 × ${c.ctBasis.currentWords}; give controller.ctPrimaryA if yours differs` : `checked against ${c.ctBasis.currentWords}`
    }${c.ctNeeded ? `  ← TOO SMALL: that current is ${fixed(c.ctBasis.currentA / c.ctPrimaryA, 1)} × its primary, so it saturates (see the warnings); the CT it needs: ${ampsRating(c.ctNeeded.primaryA)}/${ampsRating(c.ctSecondaryA)} A` : ''}`,
    `C/k of the smallest step (${fixed(c.smallestStepKvar, 2)} kvar at nominal voltage) = ${fixed(c.responseThresholdA, 3)} A${c.thresholdBasis === 'line-pair' ? LINE_PAIR_CK : ''}; set ${fixed(c.responseSettingA, 3)} A (${c.settingFraction} × C/k)${
      c.ctNeeded ? ` on the ${ampsRating(c.ctPrimaryA)}/${ampsRating(c.ctSecondaryA)} A given; on ${ampsRating(c.ctNeeded.primaryA)}/${ampsRating(c.ctSecondaryA)} A: C/k ${fixed(c.ctNeeded.responseThresholdA, 3)} A, set ${fixed(c.ctNeeded.responseSettingA, 3)} A` : ''
    }`,
    `target band ${band} · switching delay ${c.switchingDelayS} s · a step waits ${c.reconnectionDelayS} s before it is switched on again (discharge time ${c.dischargeTimeS} s, ${c.dischargeRule})`,
  ];
}

/** `toleranceHeld`: the build re-solved at both capacitance tolerance ends meets the target and leads no line past its bounds. */
function selectionBlock(sel: BankSelection, label: PhaseLabeller, star: StarWord, emptyInSizing: readonly string[] = [], toleranceHeld = false, everyLine = 'one CT per line'): string {
  const out: string[] = [];
  out.push(
    `  delivered ${fixed(sel.deliveredKvar, 2)} kvar at the solved voltage · nameplate ${fixed(sel.nameplateKvar, 2)} kvar · ${sel.units} unit${sel.units === 1 ? '' : 's'} · ${sel.steps.filter((s) => s.output !== null).length} switched step(s)`,
  );
  if (sel.steps.length) out.push(stepsTable(sel, label, star));
  // A step across two lines reads differently per line; said once, here, unless the controller's line says it.
  if (sel.controller?.thresholdBasis !== 'line-pair' && sel.steps.some((s) => s.output !== null && s.thresholdBasis === 'line-pair'))
    out.push(indentLines([`C/k of a step across two lines:${LINE_PAIR_CK}`]));
  out.push(
    indentLines([
      `units from the ${sel.catalogueTitle}${sel.catalogue === 'typical' ? ` — ${sel.catalogueNote}` : ''}`,
      `unit rating ≥ nominal voltage + ${fixed(sel.voltageMarginPercent, 0)} % (${sel.practice === 'iec' ? 'IEC' : 'North-American'} practice) and ≥ highest solved voltage / ${fixed(sel.continuousLimitPercent / 100, 2)}; every unit delivers ≥ ${fixed(sel.deliveryFloorPercent, 0)} % of its nameplate at nominal voltage; capacitance tolerance −${sel.capacitanceTolerance.minusPercent} % / +${sel.capacitanceTolerance.plusPercent} %`,
      // Nothing bought: there is no build to call the least cost.
      sel.units > 0 ? `chosen for ${sel.cost.statement} (cost ${fixed(sel.cost.value, 1)})` : 'no unit bought, so no build and no cost to state',
      // The least step the build kept to, with the step series as built beside it.
      // The span only where the steps differ (equal steps read 1:1.0, which says nothing).
      `least switched step: ${sel.leastStep.words}${sel.leastStep.ratio === null || sel.leastStep.ratio < 1.5 ? '' : `; steps as built span 1:${fixed(sel.leastStep.ratio, 1)} in C/k`}`,
    ]),
  );
  out.push(branchTable(sel, label, emptyInSizing, toleranceHeld));
  if (sel.controller) out.push(`  Controller\n${indentLines(controllerLines(sel.controller, everyLine).map((l) => `  ${l}`))}`);
  return out.join('\n');
}

/** `label`: the board file's phase labels (L1 or A). */
export function lineTable(v: Pick<CorrectionVerification, 'lines'>, label: PhaseLabeller): string {
  return renderTable(
    [
      { header: 'line', align: 'left' },
      { header: 'current A', align: 'left' },
      { header: 'active part A', align: 'left' },
      { header: 'reactive part A', align: 'left' },
      { header: 'PF', align: 'left' },
    ],
    v.lines.map((l) => [
      label(l.phase),
      arrow(l.currentA, 1),
      arrow(l.activeCurrentA, 1),
      arrow(l.reactiveCurrentA, 1),
      `${linePfText(l.pf.before, l.sense.before, l.activeCurrentA.before, NO_CURRENT)} → ${linePfText(l.pf.after, l.sense.after, l.activeCurrentA.after, NO_CURRENT)}`,
    ]),
  ) + exportNote(v.lines.filter((l) => isExportCurrentA(l.activeCurrentA.before) || isExportCurrentA(l.activeCurrentA.after)).map((l) => label(l.phase)));
}

const NO_CURRENT = 'no current';
const exportNote = (lines: readonly string[]): string => {
  const note = exportingLinesNote(lines);
  return note === null ? '' : `\n${wrapText(`(${note}.)`, '  ', '   ')}`;
};

/** A change worded by its sign: "saves 0.44 kW", or "adds 0.01 kW". */
const signed = (x: number, digits: number, unit: string, good: string, bad: string) =>
  Number(fixed(Math.abs(x), digits)) === 0 ? `no change` : x > 0 ? `${good} ${fixed(x, digits)} ${unit}` : `${bad} ${fixed(-x, digits)} ${unit}`;

function boardLines(v: CorrectionVerification): string {
  const out: string[] = [];
  const pf = v.powerFactor;
  if (pf.effective) out.push(`PF effective (IEEE 1459)     ${pfArrow(pf.effective)}`);
  // A board carrying no power has no PF (null): the row says so rather than a placeholder.
  out.push(`PF vector                    ${pf.vector ? pfArrow(pf.vector) : '-'}`);
  out.push(`PF arithmetic                ${pf.arithmetic ? pfArrow(pf.arithmetic) : '-'}`);
  if (pf.positiveSequence) out.push(`PF positive sequence         ${pfArrow(pf.positiveSequence)}`);
  if (v.neutralCurrentA) out.push(`neutral current              ${arrow(v.neutralCurrentA, 1, ' A')}`);
  if (v.unbalance) {
    out.push(`|I2|/|I1|                    ${arrow(v.unbalance.negativeSequenceCurrentPercent, 1, ' %')}`);
    out.push(`|I0|/|I1|                    ${arrow(v.unbalance.zeroSequenceCurrentPercent, 1, ' %')}`);
    out.push(`voltage unbalance |V2|/|V1|  ${arrow(v.unbalance.voltageFactorPercent, 2, ' %')}`);
  }
  out.push(
    `${`losses (${lossesPlaceWords(v.before.incomer)})`.padEnd(28)} ${fixed(v.before.losses.totalKW, 3)} kW → ${fixed(v.after.losses.totalKW, 3)} kW (${signed(v.lossReductionKW, 3, 'kW', 'saves', 'adds')})`,
  );
  const worstDrop = (r: CorrectionVerification['before']) => Math.max(...r.phases.map((p) => p.voltageDropPercent));
  out.push(`largest voltage drop         ${fixed(worstDrop(v.before), 2)} % → ${fixed(worstDrop(v.after), 2)} %`);
  const rel = v.releasedKVA;
  const released = (x: number, what: string) => signed(x, 2, `kVA ${what}`, 'releases', 'draws more by');
  // Measured at the board, as every row here; the HTML report quotes the source's figure: both are shown, each named.
  out.push(`apparent power at the board  ${released(rel.vector, 'vector')}${rel.effective === null ? '' : `, ${released(rel.effective, 'effective')}`}`);
  out.push(`apparent power at the source ${signed(rel.source, 2, 'kVA', 'releases', 'draws more by')}`);
  return out.map((l) => `  ${l}`).join('\n');
}

/**
 * The high-capacitance check in words. A line that already led before correction is judged by
 * whether it leads more, so "no line leads" would contradict the table beside it.
 */
function highEndWords(check: { readonly leadingLines: readonly PhaseId[]; readonly leadingBefore: readonly PhaseId[] }, label: PhaseLabeller): string {
  if (check.leadingLines.length) return `line${check.leadingLines.length > 1 ? 's' : ''} ${check.leadingLines.map(label).join(', ')} lead${check.leadingLines.length > 1 ? '' : 's'} beyond the bound`;
  if (check.leadingBefore.length)
    return `no line leads more than before (${check.leadingBefore.map(label).join(', ')} already led before correction)`;
  return 'no line leads';
}

/**
 * Where the tolerance ends were judged, where that is not the equipment's board: "no line leads" is said
 * of the metering point's lines, and must not read as a verdict on the board's lines table beside it.
 */
function toleranceWhere(v: CorrectionVerification): string {
  if (!v.metering) return '';
  const board = v.after.board.name;
  const led = v.lines.filter((l) => l.pf.after !== null && l.sense.after === 'leading' && l.activeCurrentA.after > 0);
  const atBoard = led.length ? `; at ${board} itself ${led.length > 1 ? 'lines' : 'line'} ${led.map((l) => labelsOf(v)(l.phase)).join(', ')} already ${led.length > 1 ? 'lead' : 'leads'} at nominal capacitance (lines table)` : '';
  return ` — judged at ${v.metering.point === 'origin' ? 'the origin' : `the incomer of ${v.metering.point}`}, where the target is measured${atBoard}`;
}

/**
 * X_path in words: the loop of line and neutral on a single-phase board; per line elsewhere, with the
 * neutral named where part of the capacitors' current returns on it.
 */
function pathReactanceWords(v: CorrectionVerification): string {
  const c = v.resonanceCapacitance;
  const x = `${fixed(c.supplyReactanceOhm ?? 0, 4)} Ω`;
  if (v.after.board.system === 'single-phase') return `${x}, the reactance of the loop out on the line and back on the neutral`;
  const neutral = c.neutralReactanceOhm === null ? '' : `, and ${fixed(c.neutralReactanceOhm, 4)} Ω in the neutral for the part of the capacitor current that returns on it`;
  const unequal = c.unequalCurrents ? '; S_sc,X weighed by the current these unequal capacitors put in each conductor' : '';
  const lines = v.voltageRise.unequalPath;
  if (lines) return `${x} per line, the figure the orders are worked from; the lines' own paths differ (${unequalPathWords(lines, labelsOf(v))}), so no one figure is every line's${neutral}${unequal}`;
  return `${x} per line, the supply path's reactance${neutral}${unequal}`;
}

/** Each line's own path reactance, and the open delta's corner line where that is why they differ. */
function unequalPathWords(p: NonNullable<CorrectionVerification['voltageRise']['unequalPath']>, label: PhaseLabeller): string {
  const corner = p.openDeltaCorner === null ? '' : `; line ${label(p.openDeltaCorner)} is the open delta's corner, with no winding in its path`;
  return `X ${p.lines.map((l) => `${label(l.phase)} ${fixed(l.reactanceOhm, 4)}`).join(', ')} Ω${corner}`;
}

/** The solved rise: the largest, or each line's where the lines' paths differ and there is no estimate to set it beside. */
function solvedRiseWords(vr: CorrectionVerification['voltageRise'], label: PhaseLabeller): string {
  if (vr.estimateWithheld !== 'unequal-path') return `solved ${fixed(vr.solvedPercent, 2)} %`;
  return `solved ${vr.solvedPerLine.map((l) => `${label(l.phase)} ${fixed(l.percent, 2)} %`).join(', ')}`;
}

/** The steady rise estimate: the worst line's X·I (a capacitor's current is reactive), Q_C·X/V² where all lines share it alike, or why there is none. */
function voltageRiseEstimateWords(vr: CorrectionVerification['voltageRise'], v: CorrectionVerification): string {
  if (vr.shortCircuitKVA === null) return 'ideal source (none)';
  if (vr.estimateWithheld === 'reactors') return 'not estimated from Q_C/S_sc,X: the reactors lower the lines they sit on while the capacitors raise theirs, so the net kvar gives neither line\'s rise';
  if (vr.estimateWithheld === 'nothing-added') return 'none estimated, no capacitors are added';
  if (vr.estimateWithheld === 'unequal-path' && vr.unequalPath)
    return `not estimated: the lines' paths to the source differ (${unequalPathWords(vr.unequalPath, labelsOf(v))}), so Q_C·X/V² with one X per line is no line's rise`;
  if (vr.estimatePercent === null) return "not estimated, the supply path has no reactance (a capacitor's current raises the voltage by about I·X)";
  if (v.resonanceCapacitance.unequalCurrents && vr.estimateLine !== null) {
    const neutral = v.resonanceCapacitance.neutralReactanceOhm === null ? '' : ' plus the neutral\'s Z·I_N';
    const average = (100 * vr.capacitorKvar) / (vr.reactanceShortCircuitKVA ?? Infinity);
    return `≈ ${fixed(vr.estimatePercent, 2)} % on line ${labelsOf(v)(vr.estimateLine)}, the line these unequal capacitors raise most (Z_line·I_line${neutral} along its voltage, over V, with ${fixed(vr.capacitorKvar, 1)} kvar at the corrected board's voltage; the average over the conductors, Q_C/S_sc,X, gives ${fixed(average, 2)} %)`;
  }
  return `≈ Q_C/S_sc,X = ${fixed(vr.capacitorKvar, 1)} kvar (at the corrected board's voltage) / ${fixed(vr.reactanceShortCircuitKVA ?? 0, 0)} kVA = ${fixed(vr.estimatePercent, 2)} % (Q_C·X/V²: the reactance, not |Z|)`;
}

/** The orders of the LC network beside the lowest one that fall in the watched range, in words. */
function otherOrdersWords(v: CorrectionVerification): string {
  const watched = CORRECTION_DEFAULTS.resonanceWatchedOrders;
  const top = Math.max(...watched) * (1 + CORRECTION_DEFAULTS.resonanceNearFraction);
  const others = v.resonanceOrders.slice(1).filter((h) => h <= top);
  return others.length ? `; the network also resonates at h = ${others.map((h) => fixed(h, 2)).join(', ')}` : '';
}

/**
 * Four significant figures (whole units from 1000): enough that √(S_sc,X/Q_C) worked from the printed
 * figures gives the printed order to its two decimals (each figure within 0.01 % moves h by under 0.001).
 */
const handFigure = (x: number): string => (Math.abs(x) >= 1000 ? x.toFixed(0) : x.toPrecision(4));

/** Which order (mode) lies near which watched order: "order 7 (6.54)", so a line that names 4.48 first says which mode is near. */
function nearModesWords(v: CorrectionVerification): string {
  const band = CORRECTION_DEFAULTS.resonanceNearFraction;
  return v.resonanceNearOrders
    .map((w) => `order ${w} (${v.resonanceOrders.filter((h) => Math.abs(h - w) <= band * w).map((h) => fixed(h, 2)).join(', ')})`)
    .join(', ');
}

/** The supply resonance line: its estimate and what it is worked from, or why there is none. */
function resonanceWords(v: CorrectionVerification, detuned: boolean): string {
  const head = 'parallel resonance with the supply';
  const c = v.resonanceCapacitance;
  if (v.resonanceOrder === null) {
    if (detuned) return `${head}: a detuned bank keeps it below its tuning order (see the harmonic check)`;
    if (v.voltageRise.shortCircuitKVA === null) return `${head}: not estimated, the source is ideal (no impedance to resonate with)`;
    if (c.reactanceShortCircuitKVA === null && c.totalKvar > 0) return `${head}: not estimated, the supply path has no reactance (nothing inductive to resonate with)`;
    return `${head}: none, no capacitors are added and no load on the board draws leading vars`;
  }
  // From the path's reactance: the classic √(S_sc/Q_C) takes S_sc from |Z|, right only where X ≫ R. Where the
  // capacitors' own current pattern is not a mode of the network, √(S_sc,X/Q_C) lies above the lowest order.
  const at = `h = ${fixed(v.resonanceOrder, 2)} (× ${v.after.board.frequencyHz} Hz = ${fixed(v.resonanceOrder * v.after.board.frequencyHz, 0)} Hz)`;
  const figure = !c.lowestBelowSingleNode
    ? `h = ${c.reactorKvar > 0 ? '√((S_sc,X + Q_L)/Q_C)' : '√(X_C/X_path) = √(S_sc,X/Q_C)'} = ${at.slice(4)}${otherOrdersWords(v)}`
    : c.unequalCurrents
      ? `${at}, the lowest resonance of the supply path's reactances with the capacitances (√(S_sc,X/Q_C) = ${fixed(c.singleNodeOrder ?? 0, 2)} at nominal voltage weighs the conductors by the capacitors' own currents and lies above it)${otherOrdersWords(v)}`
      : `${at}, the lines together against the neutral${c.neutralTieReactanceOhm === null ? '' : ` (its path X ${fixed(c.neutralTieReactanceOhm, 4)} Ω)`}; the lines against each other at √(X_C/X_path) = ${fixed(c.singleNodeOrder ?? 0, 2)}`;
  const parts = [
    ...(c.addedKvar > 0 ? [`${fixed(c.addedKvar, 1)} kvar added`] : []),
    ...(c.onBoardKvar > 0 ? [`${fixed(c.onBoardKvar, 1)} kvar of leading loads already on the board (${c.loadsOnBoard.join(', ')}), taken as capacitance`] : []),
  ];
  // The orders are worked from the capacitance, so Q_C (and Q_L) are given at nominal voltage, the figures
  // √(S_sc,X/Q_C) is checked with by hand; the kvar at the solved voltage is what the voltage-rise line uses.
  const reactors = c.reactorKvar > 0 ? `; Q_L = ${handFigure(c.reactorKvarAtNominalV)} kvar of reactors added at nominal voltage (${fixed(c.reactorKvar, 1)} kvar at the solved voltage)` : '';
  const path = `; X_path = ${pathReactanceWords(v)} (S_sc,X = ${handFigure(c.reactanceShortCircuitKVA ?? 0)} kVA; its resistance damps the peak but hardly moves it)`;
  const near = v.resonanceNearOrders.length ? `; within 10 % of ${nearModesWords(v)}` : '';
  // Estimated with all the added capacitance in: fewer steps in raise every order (less capacitance), each state below.
  const states = c.addedKvar > 0 ? (v.resonanceStepStates ? '; with every step in (each step state below)' : '; with every step in (with fewer steps in, the orders lie higher)') : '';
  const qC = `Q_C = ${handFigure(c.capacitorKvarAtNominalV)} kvar at nominal voltage, what h is worked from (${parts.join(' + ')} at the solved voltage)`;
  return `${head} at about ${figure}${near}; ${qC}${reactors}${path}${states}`;
}

/** `detuned`: the bank's steps sit behind reactors, so √(S_sc/Qc) does not apply (the harmonic check covers it). */
function checksBlock(v: CorrectionVerification, detuned = false): string {
  const out: string[] = [];
  const label = labelsOf(v);
  const t = v.tolerance;
  out.push(
    `capacitance ×${t.low.capacitanceFactor}: target ${t.low.check.met ? 'met' : 'NOT met'} · ×${t.high.capacitanceFactor}: ${highEndWords(t.high.check, label)}${toleranceWhere(v)}`,
  );
  const vr = v.voltageRise;
  out.push(
    `steady voltage rise: ${voltageRiseEstimateWords(vr, v)}; ${solvedRiseWords(vr, label)}; flag above ${vr.flagLevelPercent} %${vr.flagged ? '  ← FLAGGED (see Warnings)' : ''}`,
  );
  out.push(resonanceWords(v, detuned));
  // The step states under the resonance line: a table is set as it is, not wrapped.
  const table = stepStatesBlock(v);
  if (table.line) out.push(table.line);
  const head = indentLines(out) + (table.table ? `\n${table.table}` : '');
  out.length = 0;
  if (v.lightLoad) {
    const ll = v.lightLoad;
    const lines = ll.lines.map((l) => `${label(l.phase)} ${pfFigure(l.pf)} ${senseWord(l.sense)}`.trim()).join(', ');
    out.push(
      `light load (${fixed(ll.fraction * 100, 0)} % of the loads, fixed part ${fixed(ll.fixedKvar, 2)} kvar only): ${lines || 'no lines'}${ll.ok ? ' — no line leads' : ` — LEADS on ${ll.leadingLines.map(label).join(', ')}`}; voltage rise ${fixed(ll.voltageRise.solvedPercent, 2)} %`,
    );
  }
  return out.length ? `${head}\n${indentLines(out)}` : head;
}

/**
 * The supply resonance in every state the controller can reach: one line where none lies near a watched
 * order, else a small table of the states (stepStateTable) under a heading.
 */
function stepStatesBlock(v: CorrectionVerification): { line: string | null; table: string | null } {
  const r = v.resonanceStepStates;
  if (!r) return { line: null, table: null };
  if (r.nearStates === 0) return { line: stepStatesClearWords(r), table: null };
  const t = stepStateTable(r);
  const columns = t.header.map((header, k) => ({ header, align: k === 0 || k === 3 ? ('left' as const) : ('right' as const) }));
  return {
    line: `resonance in each step state the controller can reach (${r.nearStates} of ${r.states.length} within 10 % of a harmonic order):`,
    table: `${renderTable(columns, t.rows, '    ')}\n${wrapText(t.note, '    ', '      ')}`,
  };
}

function balanceLine(r: CorrectionReport): string[] {
  if (r.sizing.arrangement !== 'balancing-compensator' || !r.balance) return [];
  const b = r.balance;
  const t = b.target;
  const neutral = t.maxNeutralPercent === null || b.neutralPercent === null ? '' : `, neutral ${fixed(b.neutralPercent, 1)} % of |I1| (target ≤ ${fixed(t.maxNeutralPercent, 0)} %)`;
  return [`balance as built: |I2|/|I1| ${fixed(b.negativeSequencePercent, 1)} % (target ≤ ${fixed(t.maxNegativeSequencePercent, 0)} %)${neutral} — ${b.met ? 'met' : 'NOT met'}`];
}

/** The exact solution's negligible branches: left out of the ideal solution above, or kept and why. */
function smallBranchLines(c: CompensatorSizing, label: PhaseLabeller): string[] {
  const percent = 100 * CORRECTION_DEFAULTS.negligibleBranchFraction;
  return c.smallBranches.map((b) => wrapText(smallBranchWords({ ...b, branch: label(b.branch) }, percent), '  ', '    '));
}

/** The capacitor-only solution on fewer branches: which went, and whether that build or the one on every branch is built. */
function fewerBranchLines(c: CompensatorSizing, build: FewerBranchesBuild | null, label: PhaseLabeller): string[] {
  if (!c.fewerBranches) return [];
  const spreadOver = c.capacitorOnly.branches.filter((b) => b.element !== 'none').length;
  const words = sparedBranchesWords(c.fewerBranches.spared.map((b) => ({ ...b, branch: label(b.branch) })), spreadOver, CORRECTION_DEFAULTS.fewerBranchesAllowancePercent);
  const cost = (x: number | null) => (x === null ? 'no units fit' : `cost ${fixed(x, 1)}`);
  const choice =
    build === null
      ? ''
      : build.verdict !== build.verdictOnEveryBranch
      ? `; from units, on fewer branches the board ${BUILD_VERDICT_WORDS[build.verdict]}, on every branch it ${BUILD_VERDICT_WORDS[build.verdictOnEveryBranch]}: ${build.used ? 'fewer branches built' : 'every branch built'}`
      : `; from units, ${cost(build.cost)} on fewer branches against ${cost(build.costOnEveryBranch)} on every branch: ${build.used ? 'fewer branches built' : 'every branch built'}`;
  const table = build?.used ? ['  capacitor-only on fewer branches (built):', sizingTable(c.fewerBranches.solution.branches, label)] : [];
  return [wrapText(words + choice, '  ', '    '), ...table];
}

/** How the capacitors beside the reactors were rounded to units, and why (both builds re-solved). */
function roundingLines(r: RoundingBesideReactors | null, resized: boolean): string[] {
  if (!r) return [];
  const cost = (x: number | null) => (x === null ? 'no units fit' : `cost ${fixed(x, 1)}`);
  const how = `rounded up the board ${BUILD_VERDICT_WORDS[r.verdictUp]} (${cost(r.costUp)}), rounded down it ${BUILD_VERDICT_WORDS[r.verdictDown]} (${cost(r.costDown)}; reactors counted at twice their kvar)`;
  const what = `capacitors rounded ${r.used === 'up' ? 'up to units' : 'down to their requirement'}, the reactors ${resized ? 'sized again around them' : 'as sized'}`;
  return [wrapText(`${what}: ${how}`, '  ', '    ')];
}

function compensatorBlock(c: CompensatorSizing, ideal: CorrectionVerification | null, resizing: CorrectionReport['reactorResizing'], fewer: FewerBranchesBuild | null, rounding: RoundingBesideReactors | null, label: PhaseLabeller): string {
  const res = (title: string, s: CompensatorSizing['ideal']) =>
    `${title}: |I2|/|I1| ${fixed(s.residual.negativeSequenceCurrentPercent, 2)} %, |I0|/|I1| ${fixed(s.residual.zeroSequenceCurrentPercent, 2)} %` +
    (s.residual.neutralCurrentA === null ? '' : `, neutral ${fixed(s.residual.neutralCurrentA, 2)} A`) +
    (s.residual.positiveSequencePf === null ? '' : `, PF1+ ${fixed(s.residual.positiveSequencePf, 3)}`) +
    (s.reactorBranches.length ? ` — reactors on ${s.reactorBranches.map(label).join(', ')}` : '');
  return [
    `  ideal solution (may need reactors), re-solved:`,
    sizingTable(c.ideal.branches, label),
    indentLines([res('ideal residual', c.ideal)]),
    ...smallBranchLines(c, label),
    ideal ? `  ideal solution verified: lines ${ideal.lines.map((l) => `${label(l.phase)} ${pfFigure(l.pf.after)}`).join(', ')}` : '',
    '',
    indentLines(['best capacitor-only solution (least remaining unbalance and reactive error, no line made to lead):']),
    sizingTable(c.capacitorOnly.branches, label),
    indentLines([res('capacitor-only residual', c.capacitorOnly)]),
    ...fewerBranchLines(c, fewer, label),
    ...roundingLines(rounding, resizing?.used === true),
    indentLines([
      c.recommended === 'ideal'
        ? resizing?.used
          ? `built: the ideal solution with capacitors from units and the reactors sized again beside them (${reactorChanges(resizing.reactors.map((r) => ({ ...r, branch: label(r.branch) })))}), because capacitors alone miss the target`
          : 'built: the ideal solution (capacitors from units, reactors as sized), because capacitors alone miss the target'
        : fewer?.used
        ? 'built: the capacitor-only solution on fewer branches'
        : 'built: the capacitor-only solution',
    ]),
  ]
    .filter((l) => l !== '')
    .join('\n');
}

/** The floating-star rule, said where it applies, in the board's word for star (wye in North America). */
const floatingStarNote = (star: StarWord) =>
  `a floating ${star} bank is sized as its exact delta equivalent (Y–Δ transform of the capacitances) and mapped back; its ${star} point settles where the three capacitor currents sum to zero`;

/** Lines as solved without equipment: the before side of `lineTable`, for a board with nothing to add. */
function lineTableNow(v: Pick<CorrectionVerification, 'lines'>, label: PhaseLabeller): string {
  return renderTable(
    [
      { header: 'line', align: 'left' },
      { header: 'current A' },
      { header: 'active part A' },
      { header: 'reactive part A' },
      { header: 'PF', align: 'left' },
    ],
    v.lines.map((l) => [label(l.phase), fixed(l.currentA.before, 1), fixed(l.activeCurrentA.before, 1), fixed(l.reactiveCurrentA.before, 1), linePfText(l.pf.before, l.sense.before, l.activeCurrentA.before, NO_CURRENT)]),
  ) + exportNote(v.lines.filter((l) => isExportCurrentA(l.activeCurrentA.before)).map((l) => label(l.phase)));
}

/**
 * The report of a board that already meets the target: the verdict and the figures it rests on.
 * No sizing, bank or before → after tables (every one would read zero or "x → x").
 * `studied` names what was studied: one arrangement, or every one compared.
 */
export function renderNothingToAdd(r: CorrectionReport, studied: string): string {
  const v = r.verification;
  const label = labelsOf(v);
  const pf = v.powerFactor;
  // A board whose lines carry nothing has no power factor to show (its PF figures are placeholders).
  const idle = v.lines.every((l) => l.pf.before === null);
  const board = idle
    ? ['no line current, so no power factor']
    : [
        ...(pf.effective ? [`PF effective (IEEE 1459) ${signedPfText(pf.effective.before)}`] : []),
        ...(pf.vector ? [`PF vector ${signedPfText(pf.vector.before)}`] : []),
        ...(pf.arithmetic ? [`PF arithmetic ${signedPfText(pf.arithmetic.before)}`] : []),
        ...(pf.positiveSequence ? [`PF positive sequence ${signedPfText(pf.positiveSequence.before)}`] : []),
      ];
  if (v.neutralCurrentA) board.push(`neutral ${fixed(v.neutralCurrentA.before, 1)} A`);
  const parts = [
    headerLines(v.before).slice(0, 2).join('\n'),
    wrapText(`target: ${targetWords(r)}`, '', '  '),
    '',
    wrapText(`${STATUS_WORDS['already-meets-target']} — ${studied} would add nothing`, '', '  '),
    ...r.reasons.map((x) => wrapText(x, '  - ', '    ')),
    ...balanceLine(r).map((x) => wrapText(x, '  ', '    ')),
  ];
  if (v.metering) parts.push(meteringSection(v.metering, lineTableNow(v.metering, label)));
  parts.push(section('Lines as solved, without equipment') + lineTableNow(v, label));
  parts.push(section('Board') + wrapText(board.join(' · '), '  ', '    '));
  // The study gives only the cautions that hold without equipment to install.
  if (r.cautions.length) parts.push(section('Cautions') + r.cautions.map((c) => wrapText(c, '  * ', '    ')).join('\n'));
  return `${parts.join('\n')}\n`;
}

/** Each line's need against the target, Q = P·(tan φ1 − tan φ2): the figures a study with nothing to build rests on. */
function needsTable(r: CorrectionReport, label: PhaseLabeller): string {
  const needs = r.nothingToBuild?.needs ?? [];
  return renderTable(
    [
      { header: 'line', align: 'left' },
      { header: 'kW' },
      { header: 'kvar' },
      { header: 'PF' },
      { header: 'PF wanted' },
      { header: 'kvar to add' },
    ],
    needs.map((n) => [label(n.phase), fixed(n.kW, 2), fixed(n.kvar, 2), pfFigure(n.pfBefore), fixed(n.pfTarget, 3), n.pfBefore === null ? '-' : fixed(n.neededKvar, 2)]),
  ) + `\n${wrapText(`kvar to add = P·(tan φ1 − tan φ2) at the solved voltage; the least step a bank may switch is ${fixed(r.nothingToBuild?.minStepKvar ?? 0, 2)} kvar (bank.minStepKvar)`, '  ', '    ')}`;
}

/** The head of a study's report: the board, the arrangement, the target, the verdict with its summary, and the reasons. */
function studyHead(r: CorrectionReport, verdict: string): string[] {
  const v = r.verification;
  return [
    headerLines(v.before).slice(0, 2).join('\n'),
    wrapText(`correction: ${arrangementDescriptions(v.before.board.system, v.before.conventions.region)[r.arrangement]}`, '', '  '),
    wrapText(`target: ${targetWords(r)}`, '', '  '),
    '',
    wrapText(`${verdict} — ${r.summary}`, '', '  '),
    ...r.reasons.map((x) => wrapText(x, '  - ', '    ')),
  ];
}

/**
 * The report of a study with nothing to build: the verdict, why in figures (each line's need, the
 * smallest step and unit, a build withheld because it made things worse) and what to do instead. No
 * sizing, bank, steps, CT or controller: there is no bank.
 */
export function renderNothingToBuild(r: CorrectionReport): string {
  const v = r.verification;
  const label = labelsOf(v);
  const parts = studyHead(r, STATUS_WORDS['nothing-to-build'] ?? 'NOTHING TO BUILD');
  parts.push(section('What each line needs') + needsTable(r, label));
  if (r.nothingToBuild) parts.push(section('What to do') + wrapText(r.nothingToBuild.advice.charAt(0).toUpperCase() + r.nothingToBuild.advice.slice(1), '  ', '    '));
  if (v.metering) parts.push(meteringSection(v.metering, lineTableNow(v.metering, label)));
  parts.push(section('Lines as solved, without equipment') + lineTableNow(v, label));
  parts.push(section('Cautions') + r.cautions.map((c) => wrapText(c, '  * ', '    ')).join('\n'));
  return `${parts.join('\n')}\n`;
}

/** Lines that led before correction are held to another rule (the verdict says why): the target line names them. */
const exemptNote = (r: CorrectionReport): string => {
  const lines = exemptLeadingLines(r.verification.check).map(labelsOf(r.verification));
  return lines.length ? ` (except line${lines.length > 1 ? 's' : ''} ${lines.join(', ')}, which already led before correction: held to lead no more than before)` : '';
};

const targetWords = (r: CorrectionReport): string =>
  `${r.target.statement}; PF ≥ ${boundFigure(r.target.pf)}${r.target.leading === 'never' ? ', never leading' : ', leading allowed'}${exemptNote(r)}${r.target.maxLaggingPf === null ? '' : `, at most ${fixed(r.target.maxLaggingPf, 3)} lagging`}${r.target.measuredAt === undefined ? '' : `; measured at ${meteringPointWords(r.target.measuredAt)}`}`;

export function renderCorrectionReport(r: CorrectionReport): string {
  if (r.status === 'already-meets-target') return renderNothingToAdd(r, `a ${arrangementNames(r.verification.before.board.system, r.verification.before.conventions.region)[r.arrangement]}`);
  if (r.status === 'nothing-to-build') return renderNothingToBuild(r);
  const v = r.verification;
  const label = labelsOf(v);
  const parts = [...studyHead(r, headline(r)), ...balanceLine(r).map((x) => wrapText(x, '  ', '    '))];
  if (r.sizing.arrangement === 'balancing-compensator') parts.push(section('Compensator sizing') + compensatorBlock(r.sizing, r.idealVerification, r.reactorResizing, r.fewerBranchesBuild, r.roundingBesideReactors, label));
  else {
    const shift = r.sizing.starPointShift;
    const star = starWordOf(v.before.conventions.region);
    const shiftLines = shift
      ? `\n${indentLines([`floating ${star} point of the bank: ${fixed(shift.magnitude, 2)} V from the centroid of the line voltages`, floatingStarNote(star)])}`
      : '';
    parts.push(section('Sizing (continuous, before choosing units)') + sizingTable(r.sizing.branches, label) + shiftLines);
  }
  // Branches the bank's continuous sizing left empty (the "-" rows of its table), for the units table's note.
  const emptyInSizing = r.sizing.arrangement === 'balancing-compensator' ? [] : r.sizing.branches.filter((b) => b.element === 'none').map((b) => b.branch);
  // The controller reads where its CT is: the equipment's board, or the metering point.
  const ctReads = r.selection?.controller?.ctBasis.place === 'metering-point' && v.metering ? v.metering.before : v.before;
  if (r.selection) parts.push(section('Bank as built from units') + selectionBlock(r.selection, label, starWordOf(v.before.conventions.region), emptyInSizing, v.tolerance.low.check.met && v.tolerance.high.check.leadingLines.length === 0, everyLineReadingWords(ctReads)));
  if (v.metering) parts.push(meteringSection(v.metering, lineTable(v.metering, label)));
  parts.push(section('Lines, before → after (verified by re-solving the board)') + lineTable(v, label));
  parts.push(section('Board, before → after') + boardLines(v));
  parts.push(section('Checks') + checksBlock(v, r.selection?.steps.some((s) => s.detuningFactor > 0) ?? false));
  parts.push(section('Warnings') + (r.warnings.length ? r.warnings.map((w) => wrapText(w.message, '  ! ', '    ')).join('\n') : '  none'));
  parts.push(section('Cautions') + r.cautions.map((c) => wrapText(c, '  * ', '    ')).join('\n'));
  return `${parts.join('\n')}\n`;
}
