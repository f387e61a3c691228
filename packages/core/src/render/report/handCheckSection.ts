/**
 * The hand-calculation check as a report section: the textbook per-phase
 * working, the user's figures against the solved board, and the effects that
 * make up each difference. Reads only `checkHandFigures`' plain result.
 */
import type { HandCheckResult } from '../../handCheck/handCheckResult.js';
import type { PowerFactorSense } from '../../analysis/boardResult.js';
import { fixed } from '../svgText.js';
import { powerFactorText } from '../powerFactorText.js';
import type { ReportBlock, ReportColumn, ReportSection } from './reportDocument.js';
import { labelIn, type PhaseNaming } from '../../board/conventions/phaseNames.js';
import { checkObjectArgument } from '../../_internal/argumentChecks.js';

/** A phase, line pair or branch in the board's naming. */
type Label = (term: string) => string;

const num = (label: string): ReportColumn => ({ label, align: 'right' });
const orDash = (x: number | null, d: number): string => (x === null ? '—' : fixed(x, d));
const senseWord = (s: PowerFactorSense): string => (s === 'lagging' ? ' lag' : s === 'leading' ? ' lead' : '');
/** A PF with its sense; — on a line with no current, which has no PF (as the board table prints it). */
const pfCell = (pf: number, sense: PowerFactorSense): string => (sense === 'none' ? '—' : `${fixed(pf, 3)}${senseWord(sense)}`);
/** A change of φ, in degrees with its sign. */
const angleCell = (deg: number): string => `${signed(deg, 1)}°`;
/** A difference with its sign; a figure that rounds to zero reads as plain zero. */
const signed = (x: number, d: number): string => {
  const s = fixed(x, d);
  return /^0\.?0*$/.test(s) ? s : x > 0 ? `+${s}` : s;
};

function capacitorTable(r: HandCheckResult, label: Label): ReportBlock {
  return {
    kind: 'table',
    caption: 'Your capacitors: counted by hand and as they run on the board',
    columns: [{ label: 'Branch' }, num('kvar by hand'), num('µF'), num('V nominal'), num('V solved'), num('kvar solved')],
    rows: r.capacitors.map((c) => [label(c.branch), fixed(c.handKvar, 2), fixed(c.capacitanceUF, 1), fixed(c.nominalV, 1), fixed(c.appliedV, 1), fixed(c.kvarAtAppliedV, 2)]),
    note: 'A capacitor gives Q = ωCV²: at the solved voltage its output differs from the figure counted at nominal voltage.',
  };
}

function workingTable(r: HandCheckResult, label: Label): ReportBlock {
  const target = r.targetPf;
  const v = r.textbook[0]?.voltageV ?? r.board.nominalLineToNeutralV;
  return {
    kind: 'table',
    caption: 'Textbook working, phase by phase',
    columns: [
      { label: 'Phase' },
      num('P kW'),
      num('Q kvar'),
      num('tan φ1'),
      num('PF1'),
      ...(target !== null ? [num(`Qc for ${fixed(target, 2)}`)] : []),
      num('Qc yours'),
      num("Q' kvar"),
      num('tan φ2'),
      num('PF2'),
    ],
    rows: r.textbook.map((p) => [
      label(p.phase),
      fixed(p.kW, 2),
      fixed(p.kvarBefore, 2),
      orDash(p.tanBefore, 3),
      p.kW === 0 && p.kvarBefore === 0 ? '—' : fixed(p.pfBefore, 3),
      ...(target !== null ? [orDash(p.requiredKvar, 2)] : []),
      fixed(p.capacitorKvar, 2),
      fixed(p.kvarAfter, 2),
      orDash(p.tanAfter, 3),
      pfCell(p.pfAfter, p.senseAfter),
    ]),
    note: `Qc = P·(tan φ1 − tan φ2) and Q' = Q − Qc, with every phase at ${fixed(v, 1)} V and a line-pair branch counted half on each of its two lines.`,
  };
}

function triangleTable(r: HandCheckResult, label: Label): ReportBlock {
  return {
    kind: 'table',
    caption: 'Current triangle of each phase, before → after your capacitors',
    columns: [{ label: 'Phase' }, num('Active A = P/V'), num('Reactive A = Q/V'), num('Line A = √(a² + r²)')],
    rows: r.textbook.map((p) => [
      label(p.phase),
      fixed(p.activeCurrentA, 1),
      `${fixed(p.reactiveCurrentBeforeA, 1)} → ${fixed(p.reactiveCurrentAfterA, 1)}`,
      `${fixed(p.currentBeforeA, 1)} → ${fixed(p.currentAfterA, 1)}`,
    ]),
  };
}

/** The PF difference as printed: — where either side has no PF, the turn of φ where it crosses unity, else solved − textbook. */
function pfDifferenceCell(l: HandCheckResult['lines'][number]): string {
  if (l.senseTextbook === 'none' || l.senseSolved === 'none') return '—';
  return l.crossesUnity ? `crosses unity, φ ${angleCell(l.angleDeg.difference)}` : signed(l.pf.difference, 3);
}

/** The board's PF difference, worded as a line's: a board lagging by hand and leading as solved crosses unity. */
function boardPfDifferenceCell(r: HandCheckResult): string {
  const [t, s] = [r.boardPower.textbook, r.boardPower.solved];
  const turns = (t.sense === 'lagging' && s.sense === 'leading') || (t.sense === 'leading' && s.sense === 'lagging');
  if (!turns) return signed(r.boardPf.difference, 3);
  const phi = (p: { kW: number; kvar: number }) => (Math.atan2(p.kvar, Math.abs(p.kW)) * 180) / Math.PI;
  return `crosses unity, φ ${angleCell(phi(s) - phi(t))}`;
}

/**
 * The rows of hand figures against the solved board — per line its current and PF, the neutral, the
 * board PF — as both the report and `trivar check`'s text print them (the line named on each row).
 * @param label the board's phase labels @defaultValue A/B/C as the data keys
 */
export function handCheckComparedRows(r: HandCheckResult, label: Label = (t) => t): string[][] {
  checkObjectArgument(r, 'r', 'a hand check from checkHandFigures(...)', ['lines', 'neutralA', 'boardPf', 'boardPower']);
  const rows: string[][] = [];
  for (const l of r.lines) {
    rows.push([label(l.phase), 'current A', orDash(l.currentA.yours, 1), fixed(l.currentA.textbook, 1), fixed(l.currentA.solved, 1), signed(l.currentA.difference, 1)]);
    rows.push([label(l.phase), 'PF', orDash(l.pf.yours, 3), pfCell(l.pf.textbook, l.senseTextbook), pfCell(l.pf.solved, l.senseSolved), pfDifferenceCell(l)]);
  }
  if (r.neutralA) rows.push(['N', 'current A', orDash(r.neutralA.yours, 1), fixed(r.neutralA.textbook, 1), fixed(r.neutralA.solved, 1), signed(r.neutralA.difference, 1)]);
  rows.push(['board', 'PF (vector)', orDash(r.boardPf.yours, 3), powerFactorText(r.boardPower.textbook), powerFactorText(r.boardPower.solved), boardPfDifferenceCell(r)]);
  return rows;
}

/** Where the crossing is told by φ, a note says what φ is. */
const angleNote = (r: HandCheckResult): string =>
  r.lines.some((l) => l.crossesUnity) ? ' A PF that crosses unity (lagging one way, leading the other) is compared by its angle φ = atan(Q/|P|), lagging positive, in degrees.' : '';

function comparedTable(r: HandCheckResult, label: Label): ReportBlock {
  const rows = handCheckComparedRows(r, label);
  return {
    kind: 'table',
    caption: 'Predicted against solved, with your capacitors in',
    columns: [{ label: 'Line' }, { label: 'Figure' }, num('Yours'), num('Textbook'), num('Solved'), num('Solved − textbook')],
    rows,
    note: `Yours: the figures you expected (— where none given). Textbook: the per-phase method above. Solved: the board as trivar solves it with exactly your equipment. A line with no current has no PF (—).${angleNote(r)}`,
  };
}

/**
 * One effect's share of a line's PF difference: — on a line with no current; on a line whose PF crosses
 * unity the change of φ in degrees (the PF's own changes would not add up across the turn), else the PF's.
 */
function effectPfCell(line: HandCheckResult['lines'][number], share: { readonly pf: number; readonly angleDeg: number }): string {
  if (line.senseTextbook === 'none' && line.senseSolved === 'none') return '—';
  return line.crossesUnity ? angleCell(share.angleDeg) : signed(share.pf, 3);
}

/**
 * The effects as table rows — per line current, neutral current, per line PF, board PF — closed by
 * their total (solved − textbook). Shared by the report and `trivar check`'s text.
 */
export function handCheckEffectRows(r: HandCheckResult): string[][] {
  checkObjectArgument(r, 'r', 'a hand check from checkHandFigures(...)', ['effects', 'neutralA', 'lines']);
  const hasN = r.neutralA !== null;
  return [
    ...r.effects.map((e) => [
      e.title,
      ...e.lines.map((l) => signed(l.currentA, 1)),
      ...(hasN ? [e.neutralA === null ? '—' : signed(e.neutralA, 1)] : []),
      ...e.lines.map((l, k) => effectPfCell(r.lines[k]!, l)),
      signed(e.boardPf, 3),
    ]),
    [
      'total (solved − textbook)',
      ...r.lines.map((l) => signed(l.currentA.difference, 1)),
      ...(hasN ? [signed(r.neutralA!.difference, 1)] : []),
      ...r.lines.map((l) => effectPfCell(l, { pf: l.pf.difference, angleDeg: l.angleDeg.difference })),
      signed(r.boardPf.difference, 3),
    ],
  ];
}

function effectsTable(r: HandCheckResult, label: Label): ReportBlock {
  const phases = r.lines.map((l) => label(l.phase));
  return {
    kind: 'table',
    caption: 'Where each difference comes from',
    columns: [{ label: 'Effect' }, ...phases.map((p) => num(`${p} A`)), ...(r.neutralA !== null ? [num('N A')] : []), ...phases.map((p) => num(`${p} PF`)), num('Board PF')],
    rows: handCheckEffectRows(r),
    note: `Each effect is switched on in turn, in this order, and the board solved again; its size is how far it moves each figure, so the sizes add up to the whole difference.${angleNote(r)}`,
  };
}

/**
 * The check of a hand calculation as a report section (id `hand-check`).
 * @param triangles optional drawing of the line current triangles without and with the user's capacitors
 * @param namingGiven the phase naming to label with @defaultValue the board's (`r.phaseNames`)
 */
export function handCheckSection(r: HandCheckResult, triangles?: string, namingGiven?: PhaseNaming): ReportSection {
  checkObjectArgument(r, 'r', 'a hand check from checkHandFigures(...)', ['effects', 'neutralA', 'phaseNames', 'board']);
  // The default is read here, after the check: a default parameter would read r before it.
  const naming = namingGiven ?? r.phaseNames;
  const label: Label = (term) => labelIn(naming, term);
  const blocks: ReportBlock[] = [
    {
      kind: 'paragraph',
      text: `The capacitors of your hand calculation were added to ${r.board.name} and the board solved again${r.targetPf !== null ? `; your target power factor is ${fixed(r.targetPf, 2)}` : ''}.`,
    },
    capacitorTable(r, label),
    workingTable(r, label),
    triangleTable(r, label),
    comparedTable(r, label),
    effectsTable(r, label),
    { kind: 'list', items: r.effects.map((e) => `${e.title}: ${e.explanation}`) },
    // What the capacitors do to the board (leading lines, ratings, voltages), as `trivar check` warns.
    ...(r.warnings.length ? [{ kind: 'list' as const, tone: 'warning' as const, items: r.warnings.map((w) => w.message) }] : []),
  ];
  if (triangles) blocks.push({ kind: 'figure', name: 'hand-check-triangles', caption: 'Line current triangles without and with your capacitors', svg: triangles });
  return { id: 'hand-check', title: 'Hand calculation checked', blocks };
}
