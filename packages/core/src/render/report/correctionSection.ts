/**
 * Report sections from a correction study: the recommendation (equipment,
 * before/after, diagrams) and the resonance check it implies. Reads only the
 * study's plain result, so the study can grow without touching the report.
 */
import type { ControllerSettings, CorrectionReport } from '../../correction/correctionResult.js';
import type { CorrectionComparison } from '../../correction/compareCorrections.js';
import type { HarmonicCorrectionReport } from '../../harmonics/correctWithHarmonics.js';
import { correctionComparisonBlocks } from './correctionComparisonBlocks.js';
import { arrangementDescriptions, arrangementNames, everyLineReadingWords, meteringPointWords, ordersNearWords, stepStatesClearWords, stepStateTable } from '../../correction/correctionWording.js';
import { levelText } from '../../correction/voltageRiseFlag.js';
import { resonanceNearOrders } from '../../correction/stepStateResonance.js';
import { fixed } from '../svgText.js';
import { exportingLinesNote, isExportCurrentA, linePfText } from '../powerFactorText.js';
import { renderPhasorDiagram } from '../renderPhasorDiagram.js';
import { renderCurrentTriangles } from '../renderCurrentTriangles.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';
import { CORRECTION_DEFAULTS } from '../../correction/correctionDefaults.js';
import { labellerOf } from '../../board/conventions/phaseNames.js';
import { starWordOf, type StarWord } from '../../board/conventions/regionWords.js';

/** A three-phase board's arrangements, star in the region's word (wye in North America). */
const arrangementWordsIn = (star: StarWord): Readonly<Record<string, string>> => ({
  'star-bank': `capacitor bank in ${star}`,
  'delta-bank': 'capacitor bank in delta',
  'balancing-compensator': `balancing compensator (delta and ${star} branches)`,
});
/** Where star and delta name nothing (a split-phase or single-phase board), the board's own words. */
const arrangementWords = (report: CorrectionReport): string => {
  const { board, conventions } = report.verification.before;
  const system = board.system;
  return system === 'three-phase-4wire' || system === 'three-phase-3wire'
    ? (arrangementWordsIn(starWordOf(conventions.region))[report.arrangement] ?? report.arrangement)
    : arrangementDescriptions(system, conventions.region)[report.arrangement];
};

/** Losses before → after, the change worded by its sign ("saves", "adds") so a negative saving never reads as one. */
export function lossChangeWords(beforeKW: number, afterKW: number, reductionKW: number): string {
  const change = Number(fixed(Math.abs(reductionKW), 3)) === 0 ? 'no change' : reductionKW > 0 ? `saves ${fixed(reductionKW, 3)} kW` : `adds ${fixed(-reductionKW, 3)} kW`;
  return `${fixed(beforeKW, 3)} → ${fixed(afterKW, 3)} kW (${change})`;
}

/**
 * The steady rise beside its flag level: the solved figure, the estimate where there is one (the larger is
 * what is judged), and where it is above the level, that the warnings say what it does on this board.
 */
function riseFact(r: CorrectionReport['verification']['voltageRise']): string {
  const estimate = r.estimatePercent === null ? '' : `, about ${fixed(r.estimatePercent, 2)} % estimated`;
  const level = `the ${levelText(r.flagLevelPercent)} % flag level`;
  return `${fixed(r.solvedPercent, 2)} % solved${estimate}; ${r.flagged ? `above ${level} (see the warnings below)` : `not above ${level}`}`;
}

/** A PF before → after; none where no power flows (a PF of nothing is not defined). */
const pfChange = (x: { readonly before: number; readonly after: number } | null): string => (x === null ? '—' : `${fixed(x.before, 3)} → ${fixed(x.after, 3)}`);

function equipmentTable(report: CorrectionReport): ReportBlock | null {
  const sel = report.selection;
  if (!sel) return null;
  const label = labellerOf(report.verification.before.conventions.phaseNames);
  return {
    kind: 'table',
    caption: `Equipment to install (${sel.units} units, ${fixed(sel.deliveredKvar, 1)} kvar delivered, ${fixed(sel.nameplateKvar, 1)} kvar nameplate; ${sel.catalogueNote})`,
    columns: [
      { label: 'Step' },
      { label: 'Branches' },
      { label: 'Unit' },
      { label: 'Units', align: 'right' },
      { label: 'kvar nameplate', align: 'right' },
      { label: 'kvar delivered', align: 'right' },
      { label: 'µF per branch', align: 'right' },
      { label: 'C/k A', align: 'right' },
    ],
    rows: sel.steps.map((s) => [
      s.output === null ? 'fixed' : String(s.output),
      s.branches.map(label).join(' '),
      `${s.unit.name} (${fixed(s.unit.ratedKvar, 1)} kvar ${fixed(s.unit.ratedV, 0)} V)`,
      String(s.units),
      fixed(s.nameplateKvar, 1),
      fixed(s.deliveredKvar, 2),
      fixed(s.capacitancePerBranchUF, 0),
      s.output === null ? '—' : fixed(s.responseThresholdA, 3),
    ]),
    note: `Capacitance tolerance −${sel.capacitanceTolerance.minusPercent} % / +${sel.capacitanceTolerance.plusPercent} %; units rated ${sel.voltageMarginPercent} % above the nominal voltage (${sel.catalogueTitle}).`,
  };
}

/** Where the target is measured, when that is not the equipment's board, and the PF reached there. */
/** What the installer sets on the bank's controller (the text report's Controller lines, as facts). */
/** `everyLine`: how a controller reads every line where the CT reads (everyLineReadingWords). */
function controllerFacts(c: ControllerSettings, system: string, everyLine: string): ReportBlock {
  const band = `PF at least ${fixed(c.targetBand.minPf, 3)} lagging${c.targetBand.maxPf === null ? (c.targetBand.leadingAllowed ? ', leading allowed' : ', never leading') : `, at most ${fixed(c.targetBand.maxPf, 3)} lagging`}`;
  const amps = (a: number) => (Number.isInteger(a) ? String(a) : fixed(a, 1));
  return {
    kind: 'facts',
    items: [
      ['Controller outputs', `${c.outputsUsed} of ${c.outputs} used; ${c.measurement === 'one-line' ? (system === 'single-phase' ? 'read from one CT on the line' : 'balanced steps, read from one CT') : `steps serving single lines: the controller measures every line (${everyLine})`}`],
      [
        'Current transformer',
        `${amps(c.ctPrimaryA)}/${amps(c.ctSecondaryA)} A${c.ctChosen ? '' : ' (given)'} at ${c.ctBasis.placeWords}; ${c.ctChosen ? `the next standard primary at or above 1.25 × ${c.ctBasis.currentWords}; use yours if it differs` : `checked against ${c.ctBasis.currentWords}`}${
          // A CT given far below the current it carries saturates: said on its own line, as `trivar correct` says it.
          c.ctNeeded ? `. Too small: that current is ${fixed(c.ctBasis.currentA / c.ctPrimaryA, 1)} × its primary, so it saturates and the controller misreads; the CT it needs: ${amps(c.ctNeeded.primaryA)}/${amps(c.ctSecondaryA)} A` : ''
        }`,
      ],
      [
        'Response threshold (C/k)',
        `${fixed(c.responseThresholdA, 3)} A for the smallest step (${fixed(c.smallestStepKvar, 2)} kvar at nominal voltage)${c.thresholdBasis === 'line-pair' ? ", per line: the step is across two lines, and each of them sees √3/2 of its branch current as reactive current, read against that line's voltage to the neutral" : ''}; set ${fixed(c.responseSettingA, 3)} A (${c.settingFraction} × C/k)${
          c.ctNeeded ? ` on the CT given; on ${amps(c.ctNeeded.primaryA)}/${amps(c.ctSecondaryA)} A: C/k ${fixed(c.ctNeeded.responseThresholdA, 3)} A, set ${fixed(c.ctNeeded.responseSettingA, 3)} A` : ''
        }`,
      ],
      ['Power-factor band', band],
      ['Switching', `delay ${c.switchingDelayS} s; a step is switched on again no sooner than ${c.reconnectionDelayS} s after it went off (discharge time ${c.dischargeTimeS} s, ${c.dischargeRule})`],
    ],
  };
}

function meteringFacts(report: CorrectionReport): [string, string][] {
  const m = report.verification.metering;
  if (!m) return [];
  const where = meteringPointWords(m.point);
  const lowest = (phases: typeof m.after.phases) => Math.min(...phases.map((p) => p.pf ?? 1));
  return [
    ['Target measured at', where],
    ['Power factor there, vector', pfChange(m.powerFactor.vector)],
    ['Lowest line power factor there', `${fixed(lowest(m.before.phases), 3)} → ${fixed(lowest(m.after.phases), 3)}`],
  ];
}

/** True when the study adds nothing: the board already meets the target (and, compared, so it does for every arrangement). */
export function nothingToAdd(report: CorrectionReport | null, comparison: CorrectionComparison | null = null): boolean {
  if (report?.status !== 'already-meets-target') return false;
  return comparison === null || comparison.outcomes.every((o) => !o.report || o.report.status === 'already-meets-target');
}

/**
 * A board that already meets the target: the verdict and the lines it rests on. No equipment,
 * before → after table or drawings (each would show no change), and no capacitor cautions (the
 * report leaves them out too, see buildBoardReport.ts).
 */
function nothingToAddSection(report: CorrectionReport, comparison: CorrectionComparison | null): ReportSection {
  const v = report.verification;
  const label = labellerOf(v.before.conventions.phaseNames);
  const names = arrangementNames(v.before.board.system, v.before.conventions.region);
  const studied = comparison ? comparison.outcomes.filter((o) => o.report).map((o) => names[o.arrangement]) : [names[report.arrangement]];
  const who = studied.length === 1 ? `a ${studied[0]}` : `every arrangement studied (${studied.join(', ')})`;
  const blocks: ReportBlock[] = [
    { kind: 'paragraph', text: `The board already meets the correction target (${report.target.statement}; PF at least ${fixed(report.target.pf, 3)}): ${who} would add nothing.` },
  ];
  if (report.reasons.length) blocks.push({ kind: 'list', tone: 'warning', items: report.reasons });
  blocks.push({
    kind: 'table',
    caption: v.lines.length === 1 ? 'The line as solved, without equipment' : 'Each line as solved, without equipment',
    columns: [{ label: 'Line' }, { label: 'A', align: 'right' }, { label: 'Active A', align: 'right' }, { label: 'Reactive A', align: 'right' }, { label: 'PF', align: 'right' }],
    rows: v.lines.map((l) => [
      label(l.phase),
      fixed(l.currentA.before, 1),
      fixed(l.activeCurrentA.before, 1),
      fixed(l.reactiveCurrentA.before, 1),
      linePfText(l.pf.before, l.sense.before, l.activeCurrentA.before, '—'),
    ]),
    note: linesNote(v.lines.filter((l) => isExportCurrentA(l.activeCurrentA.before)).map((l) => label(l.phase)), v.lines.length),
  });
  return { id: 'correction', title: 'Correction recommendation', blocks };
}


/** The lines tables' note, with what "export" means where a line carries power back; a single-phase board has one line. */
function linesNote(exporting: readonly string[], lineCount: number): string {
  const base =
    lineCount === 1
      ? 'Active and reactive parts of the line current, along and across its voltage to the neutral (reactive above zero is lagging).'
      : 'Active and reactive parts of each line current, along and across its own line-to-neutral voltage (reactive above zero is lagging).';
  const more = exportingLinesNote(exporting);
  return more === null ? base : `${base} ${more.charAt(0).toUpperCase()}${more.slice(1)}.`;
}

/**
 * A study with nothing to build: the verdict, why in figures (each line's need against the smallest step
 * and unit, a build withheld because it made things worse) and what to do instead. No equipment,
 * controller or before → after: there is no bank.
 */
function nothingToBuildSection(report: CorrectionReport, comparison: CorrectionComparison | null): ReportSection {
  const v = report.verification;
  const label = labellerOf(v.before.conventions.phaseNames);
  const nothing = report.nothingToBuild;
  const blocks: ReportBlock[] = [
    ...(comparison ? correctionComparisonBlocks(comparison, v.before.board.system, v.before.conventions.region) : []),
    { kind: 'paragraph', text: `Nothing to build: ${report.summary}.` },
  ];
  if (report.reasons.length) blocks.push({ kind: 'list', tone: 'warning', items: report.reasons });
  if (nothing) {
    blocks.push({
      kind: 'table',
      caption: 'What each line needs to reach the target',
      columns: [{ label: 'Line' }, { label: 'kW', align: 'right' }, { label: 'kvar', align: 'right' }, { label: 'PF', align: 'right' }, { label: 'PF wanted', align: 'right' }, { label: 'kvar to add', align: 'right' }],
      rows: nothing.needs.map((n) => [label(n.phase), fixed(n.kW, 2), fixed(n.kvar, 2), n.pfBefore === null ? '—' : fixed(n.pfBefore, 3), fixed(n.pfTarget, 3), n.pfBefore === null ? '—' : fixed(n.neededKvar, 2)]),
      note: `kvar to add = P·(tan φ1 − tan φ2) at the solved voltage; the least step a bank may switch is ${fixed(nothing.minStepKvar, 2)} kvar (bank.minStepKvar).`,
    });
    blocks.push({ kind: 'paragraph', text: `What to do: ${nothing.advice}.` });
  }
  return { id: 'correction', title: 'Correction recommendation', blocks };
}

/** @param comparison the arrangements compared, when the study named none and `report` is the one recommended */
export function correctionSection(report: CorrectionReport, comparison: CorrectionComparison | null = null): ReportSection {
  if (nothingToAdd(report, comparison)) return nothingToAddSection(report, comparison);
  if (report.status === 'nothing-to-build') return nothingToBuildSection(report, comparison);
  const v = report.verification;
  // Lines as the board file names them (L1 or A).
  const label = labellerOf(v.before.conventions.phaseNames);
  const blocks: ReportBlock[] = [
    ...(comparison ? correctionComparisonBlocks(comparison, report.verification.before.board.system, report.verification.before.conventions.region) : []),
    { kind: 'paragraph', text: report.summary },
    // A study on a board with harmonic data chose plain or detuned by its harmonic check (the comparison's reason says so already).
    ...(!comparison && 'harmonics' in report ? [{ kind: 'paragraph' as const, text: `Harmonic check: ${(report as HarmonicCorrectionReport).harmonics.summary}.` }] : []),
    {
      kind: 'facts',
      items: [
        ['Arrangement', arrangementWords(report)],
        ['Outcome', `${report.status.replace(/-/g, ' ')}${v.voltageRise.flagged ? `; voltage rise above the ${levelText(v.voltageRise.flagLevelPercent)} % flag level` : ''}`],
        ...meteringFacts(report),
        ['Power factor, vector', pfChange(v.powerFactor.vector)],
        ...(v.powerFactor.effective ? ([['Power factor, effective (IEEE 1459)', `${fixed(v.powerFactor.effective.before, 3)} → ${fixed(v.powerFactor.effective.after, 3)}`]] as [string, string][]) : []),
        ...(v.neutralCurrentA ? ([['Neutral current', `${fixed(v.neutralCurrentA.before, 1)} → ${fixed(v.neutralCurrentA.after, 1)} A`]] as [string, string][]) : []),
        ['Apparent power released at the source', `${fixed(v.releasedKVA.source, 2)} kVA`],
        [v.before.incomer ? `Losses in the feeder from ${v.before.incomer.fedFrom}` : 'Losses in source and feeder', lossChangeWords(v.before.losses.totalKW, v.after.losses.totalKW, v.lossReductionKW)],
        ['Voltage rise from the capacitors', riseFact(v.voltageRise)],
      ],
    },
  ];
  if (report.reasons.length) blocks.push({ kind: 'list', tone: 'warning', items: report.reasons });
  const equipment = equipmentTable(report);
  if (equipment) blocks.push(equipment);
  const controller = report.selection?.controller;
  if (controller) blocks.push(controllerFacts(controller, v.before.board.system, everyLineReadingWords(controller.ctBasis.place === 'metering-point' && v.metering ? v.metering.before : v.before)));
  blocks.push({
    kind: 'table',
    caption: v.lines.length === 1 ? 'The line before and after' : 'Each line before and after',
    columns: [
      { label: 'Line' },
      { label: 'A before', align: 'right' },
      { label: 'A after', align: 'right' },
      { label: 'Active A', align: 'right' },
      { label: 'Reactive A', align: 'right' },
      { label: 'PF before', align: 'right' },
      { label: 'PF after', align: 'right' },
    ],
    rows: v.lines.map((l) => [
      label(l.phase),
      fixed(l.currentA.before, 1),
      fixed(l.currentA.after, 1),
      `${fixed(l.activeCurrentA.before, 1)} → ${fixed(l.activeCurrentA.after, 1)}`,
      `${fixed(l.reactiveCurrentA.before, 1)} → ${fixed(l.reactiveCurrentA.after, 1)}`,
      linePfText(l.pf.before, l.sense.before, l.activeCurrentA.before, '—'),
      linePfText(l.pf.after, l.sense.after, l.activeCurrentA.after, '—'),
    ]),
    note: linesNote(v.lines.filter((l) => isExportCurrentA(l.activeCurrentA.before) || isExportCurrentA(l.activeCurrentA.after)).map((l) => label(l.phase)), v.lines.length),
  });
  blocks.push({ kind: 'figure', name: 'correction-phasors', caption: 'Phasors before (dashed) and after (solid) the correction', svg: renderPhasorDiagram(v.before, { after: v.after }) });
  blocks.push({ kind: 'figure', name: 'correction-triangles', caption: v.lines.length === 1 ? 'How the equipment changes the line current' : 'How the equipment changes each line current', svg: renderCurrentTriangles(v.before, v.after) });
  if (v.lightLoad) {
    blocks.push({
      kind: 'paragraph',
      text: `At ${fixed(100 * v.lightLoad.fraction, 0)} % load with only the fixed part (${fixed(v.lightLoad.fixedKvar, 2)} kvar) connected: ${v.lightLoad.ok ? 'no line leads' : `line(s) ${v.lightLoad.leadingLines.map(label).join(', ')} lead`}.`,
    });
  }
  if (v.warnings.length || report.warnings.length) blocks.push({ kind: 'list', tone: 'warning', items: [...new Set([...report.warnings, ...v.warnings].map((w) => w.message))] });
  return { id: 'correction', title: 'Correction recommendation', blocks };
}

/** Qc as worked: the capacitors added and the leading loads already on the board; QL the reactors added. */
function capacitanceWords(c: CorrectionReport['verification']['resonanceCapacitance'], statesBelow: boolean): string {
  const parts = [
    // Worked with every step in: fewer steps in put less capacitance on and raise the orders (each state below, where known).
    ...(c.addedKvar > 0 ? [`${fixed(c.addedKvar, 1)} kvar added, every step in (${statesBelow ? 'each step state below' : 'with fewer steps in, the orders lie higher'})`] : []),
    ...(c.onBoardKvar > 0 ? [`${fixed(c.onBoardKvar, 1)} kvar of leading loads already on the board (${c.loadsOnBoard.join(', ')})`] : []),
  ];
  // The orders are worked from the capacitance: Qc at nominal voltage, beside what it delivers at the solved voltage.
  const reactors = c.reactorKvar > 0 ? `; reactors added ${fixed(c.reactorKvarAtNominalV, 2)} kvar at nominal voltage (${fixed(c.reactorKvar, 1)} kvar at the solved voltage)` : '';
  return `Qc = ${fixed(c.capacitorKvarAtNominalV, 2)} kvar at nominal voltage, what the order is worked from; at the solved voltage ${parts.join(' + ')}${reactors}`;
}

/** The resonance of the recommended capacitors with the supply, when the study could estimate it. */
/** X_path: the loop of line and neutral on a single-phase board; per line elsewhere, with the neutral where part of the capacitors' current returns on it. */
function pathReactanceWords(report: CorrectionReport): string {
  const c = report.verification.resonanceCapacitance;
  const x = `${fixed(c.supplyReactanceOhm ?? 0, 4)} Ω`;
  if (report.verification.before.board.system === 'single-phase') return `${x}, the loop out on the line and back on the neutral`;
  const neutral = c.neutralReactanceOhm === null ? '' : `, and ${fixed(c.neutralReactanceOhm, 4)} Ω in the neutral for the part of the capacitor current that returns on it`;
  const unequal = c.unequalCurrents ? '; S_sc,X weighed by the current these unequal capacitors put in each conductor' : '';
  const lines = report.verification.voltageRise.unequalPath;
  if (lines) {
    const label = labellerOf(report.verification.before.conventions.phaseNames);
    const corner = lines.openDeltaCorner === null ? '' : `; line ${label(lines.openDeltaCorner)} is the open delta's corner, with no winding in its path`;
    return `${x} per line, the figure the orders are worked from; the lines' own paths differ (${lines.lines.map((l) => `${label(l.phase)} ${fixed(l.reactanceOhm, 4)}`).join(', ')} Ω${corner}), so no one figure is every line's${neutral}${unequal}`;
  }
  return `${x} per line${neutral}${unequal}`;
}

export function resonanceSection(report: CorrectionReport): ReportSection | null {
  const h = report.verification.resonanceOrder;
  if (h === null) return null;
  const f = h * report.verification.before.board.frequencyHz;
  const near = report.verification.resonanceNearOrders;
  const watched = CORRECTION_DEFAULTS.resonanceWatchedOrders;
  const band = CORRECTION_DEFAULTS.resonanceNearFraction;
  const sc = report.verification.voltageRise.shortCircuitKVA;
  const c = report.verification.resonanceCapacitance;
  const top = Math.max(...watched) * (1 + band);
  const others = report.verification.resonanceOrders.slice(1).filter((o) => o <= top);
  // Where the harmonic check scanned the bank in the same study, its verdict decides, not the estimate.
  const check = (report as { harmonics?: { summary: string; check: unknown } }).harmonics;
  const scanned = check && check.check !== null ? check : null;
  // Name the mode that is near, not only the order: the lowest mode may be clear while another is not.
  const modesNear = ordersNearWords(report.verification.resonanceOrders, (o) => resonanceNearOrders(o)).join('; ');
  return {
    id: 'harmonics',
    title: 'Harmonics and resonance',
    blocks: [
      {
        kind: 'facts',
        items: [
          ['Short-circuit power at the board', sc === null ? '—' : `${fixed(sc, 0)} kVA`],
          ['Capacitive output considered', capacitanceWords(report.verification.resonanceCapacitance, report.verification.resonanceStepStates !== null)],
          ['Reactance of the supply path', c.supplyReactanceOhm === null ? '—' : `${pathReactanceWords(report)} (S_sc,X = ${fixed(c.reactanceShortCircuitKVA ?? 0, 0)} kVA)`],
          [
            `Parallel resonance with the supply, h = ${c.lowestBelowSingleNode ? `the lowest order of the path’s reactances with the capacitances${c.unequalCurrents ? '' : ', the lines together against the neutral'}` : c.reactorKvar > 0 ? '√((Ssc,X + QL)/Qc)' : '√(Xc/Xpath)'}`,
            `order ${fixed(h, 2)} (${fixed(f, 0)} Hz)${others.length ? `; also ${others.map((o) => fixed(o, 2)).join(', ')}` : ''}`,
          ],
        ],
      },
      near.length
        ? scanned
          ? { kind: 'list', tone: 'warning', items: [`The estimate lies within ${fixed(100 * band, 0)} % of a harmonic order: ${modesNear}; the harmonic check of this report scanned the bank and decides: ${scanned.summary}.`] }
          : { kind: 'list', tone: 'warning', items: [`Within ${fixed(100 * band, 0)} % of a harmonic order, which common non-linear loads produce: ${modesNear}. A harmonic study and detuning reactors are strongly advised.`] }
        : { kind: 'paragraph', text: `With every step in, the resonance is not within ${fixed(100 * band, 0)} % of orders ${watched.join(', ')}. This is an estimate from the supply path's reactance only (its resistance damps the peak but hardly moves it; the classic √(Ssc/Qc) with Ssc from |Z| assumes X ≫ R); it does not replace a harmonic study of the board.` },
      ...stepStateBlocks(report, scanned),
    ],
  };
}

/**
 * The supply resonance in every step state the controller can reach: one paragraph where none lies near a
 * watched order, else the table of states and a warning naming them (or, where the harmonic check scanned
 * every step combination in the same study, what it decided).
 */
function stepStateBlocks(report: CorrectionReport, scanned: { summary: string } | null): ReportBlock[] {
  const r = report.verification.resonanceStepStates;
  if (!r) return [];
  if (r.nearStates === 0) return [{ kind: 'paragraph', text: `${upperFirst(stepStatesClearWords(r))}.` }];
  const t = stepStateTable(r);
  const partial = r.states.slice(1).filter((st) => st.nearOrders.length > 0).length;
  const table: ReportBlock = {
    kind: 'table',
    caption: 'Supply resonance in each step state the controller can reach',
    columns: t.header.map((label, k) => (k === 0 || k === 3 ? { label } : { label, align: 'right' as const })),
    rows: t.rows,
    note: t.note,
  };
  if (!partial) return [table];
  const states = `${partial} state${partial === 1 ? '' : 's'} put${partial === 1 ? 's' : ''}`;
  const words = scanned
    ? `With fewer steps in, ${states} an order within 10 % of a harmonic order; the harmonic check of this report scanned every step combination and decides: ${scanned.summary}.`
    : `With fewer steps in, ${states} an order within 10 % of a harmonic order, and the controller reaches ${partial === 1 ? 'it' : 'them'} as it follows the load: a harmonic study, then detuning reactors or a switching programme that avoids ${partial === 1 ? 'that combination' : 'those combinations'}, decided with a licensed professional to the local codes.`;
  return [table, { kind: 'list', tone: 'warning', items: [words] }];
}

const upperFirst = (text: string): string => text.charAt(0).toUpperCase() + text.slice(1);
