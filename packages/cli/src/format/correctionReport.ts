/** CorrectionReport → the human-readable report of `trivar correct`. */
import type { BeforeAfter, BranchSizing, CorrectionReport, CorrectionVerification, BankSelection, CompensatorSizing } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { headerLines } from './solveReport.js';

const ARRANGEMENT_WORDS: Record<string, string> = {
  'star-bank': 'star-connected capacitor bank (one capacitor per phase)',
  'delta-bank': 'delta-connected capacitor bank (one capacitor per line pair)',
  'balancing-compensator': 'balancing compensator (Steinmetz/Gyugyi reactive branches)',
};

const STATUS_WORDS: Record<string, string> = {
  'meets-target': 'MEETS THE TARGET',
  'meets-target-at-nominal-capacitance': 'MEETS THE TARGET at nominal capacitance (not across the whole tolerance band)',
  'already-meets-target': 'NOTHING TO DO: the board already meets the target',
  'misses-target-with-available-units': 'MISSES THE TARGET with the available units',
  infeasible: 'TARGET NOT REACHABLE with this arrangement',
};

const arrow = (x: BeforeAfter, digits: number, unit = '') => `${fixed(x.before, digits)}${unit} → ${fixed(x.after, digits)}${unit}`;
const senseWord = (s: string) => (s === 'lagging' ? 'lag' : s === 'leading' ? 'lead' : '');

function elementText(b: BranchSizing): string {
  if (b.element === 'none') return '-';
  if (b.element === 'capacitor') return `C ${fixed(b.capacitanceUF ?? 0, 1)} µF`;
  return `L ${fixed(b.inductanceMH ?? 0, 2)} mH`;
}

/** The continuous (ideal-size) elements: what each branch needs before units are chosen. */
function sizingTable(branches: readonly BranchSizing[]): string {
  return renderTable(
    [
      { header: 'branch', align: 'left' },
      { header: 'element', align: 'left' },
      { header: 'kvar@nom V' },
      { header: 'V applied' },
      { header: 'kvar@applied' },
      { header: 'A' },
    ],
    branches.map((b) => [b.branch, elementText(b), fixed(b.kvarAtNominalV, 2), fixed(b.appliedV, 1), fixed(b.kvarAtAppliedV, 2), fixed(b.currentA, 2)]),
  );
}

function selectionTable(sel: BankSelection): string {
  const rows = sel.selections.map((s) => {
    if (!s.unit) return [s.branch, '(none)', '', '', '', '', '', '', ''];
    const steps = s.stepUnits.length ? s.stepUnits.map((n, k) => `${n}${s.stepsOnAtDesign[k] ? '*' : ''}`).join('+') : '-';
    return [
      s.branch,
      s.unit.name.includes('kvar') ? s.unit.name : `${s.unit.name} (${fixed(s.unit.ratedKvar, 2)} kvar ${fixed(s.unit.ratedV, 0)} V ${s.unit.ratedHz} Hz)`,
      String(s.fixedUnits),
      steps,
      fixed(s.installedKvar, 2),
      fixed(s.designCapacitanceUF, 1),
      fixed(s.designKvarAtAppliedV, 2),
      fixed(s.designCurrentA, 2),
      `${fixed(s.highestVoltageV, 0)} / ${fixed(s.requiredRatedV, 0)}`,
    ];
  });
  const table = renderTable(
    [
      { header: 'branch', align: 'left' },
      { header: 'unit', align: 'left' },
      { header: 'fixed' },
      { header: 'steps' },
      { header: 'kvar plate' },
      { header: 'µF on' },
      { header: 'kvar on' },
      { header: 'A on' },
      { header: 'V max / rating ≥' },
    ],
    rows,
  );
  return [
    table,
    `  units per step (pattern ${sel.pattern}); * = step switched on at the design load; "on" columns: design state at the solved voltage`,
    `  installed ${fixed(sel.installedKvar, 2)} kvar in ${sel.installedUnits} units · ${sel.catalogueNote}`,
    `  capacitance tolerance −${sel.capacitanceTolerance.minusPercent} % / +${sel.capacitanceTolerance.plusPercent} % · unit rating ≥ highest applied voltage + ${sel.voltageMarginPercent} %`,
  ].join('\n');
}

function lineTable(v: CorrectionVerification): string {
  return renderTable(
    [
      { header: 'line', align: 'left' },
      { header: 'current A', align: 'left' },
      { header: 'active part A', align: 'left' },
      { header: 'reactive part A', align: 'left' },
      { header: 'PF', align: 'left' },
    ],
    v.lines.map((l) => [
      l.phase,
      arrow(l.currentA, 1),
      arrow(l.activeCurrentA, 1),
      arrow(l.reactiveCurrentA, 1),
      `${fixed(l.pf.before, 3)} ${senseWord(l.sense.before)} → ${fixed(l.pf.after, 3)} ${senseWord(l.sense.after)}`,
    ]),
  );
}

function boardLines(v: CorrectionVerification): string {
  const out: string[] = [];
  const pf = v.powerFactor;
  if (pf.effective) out.push(`PF effective (IEEE 1459)     ${arrow(pf.effective, 3)}`);
  out.push(`PF vector                    ${arrow(pf.vector, 3)}`);
  out.push(`PF arithmetic                ${arrow(pf.arithmetic, 3)}`);
  if (pf.positiveSequence) out.push(`PF positive sequence         ${arrow(pf.positiveSequence, 3)}`);
  if (v.neutralCurrentA) out.push(`neutral current              ${arrow(v.neutralCurrentA, 1, ' A')}`);
  if (v.unbalance) {
    out.push(`|I2|/|I1|                    ${arrow(v.unbalance.negativeSequenceCurrentPercent, 1, ' %')}`);
    out.push(`|I0|/|I1|                    ${arrow(v.unbalance.zeroSequenceCurrentPercent, 1, ' %')}`);
    out.push(`voltage unbalance |V2|/|V1|  ${arrow(v.unbalance.voltageFactorPercent, 2, ' %')}`);
  }
  out.push(`losses (source + feeder)     ${fixed(v.before.losses.totalKW, 3)} kW → ${fixed(v.after.losses.totalKW, 3)} kW (saves ${fixed(v.lossReductionKW, 3)} kW)`);
  const worstDrop = (r: CorrectionVerification['before']) => Math.max(...r.phases.map((p) => p.voltageDropPercent));
  out.push(`largest voltage drop         ${fixed(worstDrop(v.before), 2)} % → ${fixed(worstDrop(v.after), 2)} %`);
  const rel = v.releasedKVA;
  out.push(`apparent power released      ${fixed(rel.vector, 2)} kVA vector${rel.effective === null ? '' : `, ${fixed(rel.effective, 2)} kVA effective`}`);
  return out.map((l) => `  ${l}`).join('\n');
}

function checksBlock(v: CorrectionVerification): string {
  const out: string[] = [];
  const t = v.tolerance;
  out.push(`capacitance ×${t.low.capacitanceFactor}: target ${t.low.check.met ? 'met' : 'NOT met'} · ×${t.high.capacitanceFactor}: ${t.high.check.leadingLines.length ? `lines ${t.high.check.leadingLines.join(', ')} lead` : 'no line leads'}`);
  const vr = v.voltageRise;
  out.push(
    `steady voltage rise: ${vr.estimatePercent === null ? 'ideal source (none)' : `≈ Qc/S_sc = ${fixed(vr.capacitorKvar, 1)} kvar / ${fixed(vr.shortCircuitKVA ?? 0, 0)} kVA = ${fixed(vr.estimatePercent, 2)} %`}; solved ${fixed(vr.solvedPercent, 2)} %; flag above ${vr.limitPercent} %${vr.flagged ? '  ← FLAGGED' : ''}`,
  );
  out.push(
    v.resonanceOrder === null
      ? 'parallel resonance with the supply: not estimated (ideal source or no capacitors)'
      : `parallel resonance with the supply at about h = √(S_sc/Qc) = ${fixed(v.resonanceOrder, 2)} (× ${v.after.board.frequencyHz} Hz = ${fixed(v.resonanceOrder * v.after.board.frequencyHz, 0)} Hz)`,
  );
  if (v.lightLoad) {
    const ll = v.lightLoad;
    const lines = ll.lines.map((l) => `${l.phase} ${fixed(l.pf, 3)} ${senseWord(l.sense)}`).join(', ');
    out.push(
      `light load (${fixed(ll.fraction * 100, 0)} % of the loads, fixed part ${fixed(ll.fixedKvar, 2)} kvar only): ${lines || 'no lines'}${ll.ok ? ' — no line leads' : ` — LEADS on ${ll.leadingLines.join(', ')}`}; voltage rise ${fixed(ll.voltageRise.solvedPercent, 2)} %`,
    );
  }
  return out.map((l) => `  ${l}`).join('\n');
}

function compensatorBlock(c: CompensatorSizing, ideal: CorrectionVerification | null): string {
  const res = (label: string, s: CompensatorSizing['ideal']) =>
    `  ${label}: |I2|/|I1| ${fixed(s.residual.negativeSequenceCurrentPercent, 2)} %, |I0|/|I1| ${fixed(s.residual.zeroSequenceCurrentPercent, 2)} %` +
    (s.residual.neutralCurrentA === null ? '' : `, neutral ${fixed(s.residual.neutralCurrentA, 2)} A`) +
    (s.residual.positiveSequencePf === null ? '' : `, PF1+ ${fixed(s.residual.positiveSequencePf, 3)}`) +
    (s.reactorBranches.length ? ` — reactors on ${s.reactorBranches.join(', ')}` : '');
  return [
    `  ideal solution (may need reactors), re-solved:`,
    sizingTable(c.ideal.branches),
    res('ideal residual', c.ideal),
    ideal ? `  ideal solution verified: lines ${ideal.lines.map((l) => `${l.phase} ${fixed(l.pf.after, 3)}`).join(', ')}` : '',
    '',
    `  best capacitor-only solution. Objective: ${c.objectiveStatement}`,
    sizingTable(c.capacitorOnly.branches),
    res('capacitor-only residual', c.capacitorOnly),
  ]
    .filter((l) => l !== '')
    .join('\n');
}

export function renderCorrectionReport(r: CorrectionReport): string {
  const v = r.verification;
  const parts = [
    headerLines(v.before).slice(0, 2).join('\n'),
    `correction: ${ARRANGEMENT_WORDS[r.arrangement] ?? r.arrangement}`,
    `target: ${r.target.statement}; PF ≥ ${fixed(r.target.pf, 3)}${r.target.leading === 'never' ? ', never leading' : ', leading allowed'}${r.target.maxLaggingPf === null ? '' : `, at most ${fixed(r.target.maxLaggingPf, 3)} lagging`}`,
    '',
    `${STATUS_WORDS[r.status] ?? r.status} — ${r.summary}`,
    ...r.reasons.map((x) => `  - ${x}`),
  ];
  if (r.sizing.arrangement === 'balancing-compensator') parts.push(section('Compensator sizing') + compensatorBlock(r.sizing, r.idealVerification));
  else {
    const shift = r.sizing.starPointShift;
    const shiftLine = shift ? `\n  floating star point of the bank: ${fixed(shift.magnitude, 2)} V from the centroid of the line voltages` : '';
    parts.push(section('Sizing (continuous, before choosing units)') + sizingTable(r.sizing.branches) + shiftLine);
  }
  if (r.selection) parts.push(section('Bank as built from units') + selectionTable(r.selection));
  parts.push(section('Lines, before → after (verified by re-solving the board)') + lineTable(v));
  parts.push(section('Board, before → after') + boardLines(v));
  parts.push(section('Checks') + checksBlock(v));
  parts.push(section('Warnings') + (r.warnings.length ? r.warnings.map((w) => `  ! ${w.message}`).join('\n') : '  none'));
  parts.push(section('Cautions') + r.cautions.map((c) => `  * ${c}`).join('\n'));
  return `${parts.join('\n')}\n`;
}
