/** Text report of `trivar check`: the textbook working, hand vs solved line by line, and the effects behind each difference. */
import { handCheckComparedRows, handCheckEffectRows, labellerOf, type HandCheckResult, type PhaseLabeller, type PowerFactorSense } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { wrapText } from './wrapText.js';

const SYSTEM_WORDS: Readonly<Record<string, string>> = {
  'three-phase-4wire': 'three-phase 4-wire',
  'three-phase-3wire': 'three-phase 3-wire',
  'split-phase': 'split-phase',
  'single-phase': 'single-phase',
};

const senseWord = (s: PowerFactorSense): string => (s === 'lagging' ? ' lag' : s === 'leading' ? ' lead' : '');
/** A PF with its sense; — on a phase with no current, which has no PF (as the board table prints it). */
const pfCell = (pf: number, sense: PowerFactorSense): string => (sense === 'none' ? '—' : `${fixed(pf, 3)}${senseWord(sense)}`);
const orDash = (x: number | null, d: number): string => (x === null ? '—' : fixed(x, d));

/** @param label the board file's phase labels (`labellerOf(conventionsOf(board).phaseNames)`) */
export function renderHandCheckReport(r: HandCheckResult, label: PhaseLabeller = labellerOf(r.phaseNames)): string {
  const out: string[] = [];
  out.push(`Hand figures checked on ${r.board.name}`);
  out.push(`${SYSTEM_WORDS[r.board.system] ?? r.board.system} · ${fixed(r.board.nominalLineToNeutralV, 1)} V line-to-neutral · ${r.board.frequencyHz} Hz`);

  out.push(section('Your capacitors, counted by hand and as they run on the board'));
  out.push(
    renderTable(
      [{ header: 'branch', align: 'left' }, { header: 'kvar by hand' }, { header: 'µF' }, { header: 'V nominal' }, { header: 'V solved' }, { header: 'kvar solved' }],
      r.capacitors.map((c) => [label(c.branch), fixed(c.handKvar, 2), fixed(c.capacitanceUF, 1), fixed(c.nominalV, 1), fixed(c.appliedV, 1), fixed(c.kvarAtAppliedV, 2)]),
    ),
  );

  const v = r.textbook[0]?.voltageV ?? r.board.nominalLineToNeutralV;
  out.push(section(`Textbook working per phase (each phase at ${fixed(v, 1)} V; a line-pair branch counted half on each of its lines)`));
  out.push(
    renderTable(
      [
        { header: 'phase', align: 'left' },
        { header: 'P kW' },
        { header: 'Q kvar' },
        { header: 'tan φ1' },
        { header: 'PF1' },
        ...(r.targetPf !== null ? [{ header: `Qc for ${fixed(r.targetPf, 2)}` }] : []),
        { header: 'Qc yours' },
        { header: "Q' kvar" },
        { header: 'tan φ2' },
        { header: 'PF2', align: 'left' as const },
      ],
      r.textbook.map((p) => [
        label(p.phase),
        fixed(p.kW, 2),
        fixed(p.kvarBefore, 2),
        orDash(p.tanBefore, 3),
        p.kW === 0 && p.kvarBefore === 0 ? '—' : fixed(p.pfBefore, 3),
        ...(r.targetPf !== null ? [orDash(p.requiredKvar, 2)] : []),
        fixed(p.capacitorKvar, 2),
        fixed(p.kvarAfter, 2),
        orDash(p.tanAfter, 3),
        pfCell(p.pfAfter, p.senseAfter),
      ]),
    ),
  );
  out.push('  Qc = P·(tan φ1 − tan φ2);  Q\' = Q − Qc');
  out.push('');
  out.push(
    renderTable(
      [{ header: 'phase', align: 'left' }, { header: 'active A = P/V' }, { header: 'reactive A = Q/V', align: 'left' }, { header: 'line A = √(a² + r²)', align: 'left' }],
      r.textbook.map((p) => [label(p.phase), fixed(p.activeCurrentA, 1), `${fixed(p.reactiveCurrentBeforeA, 1)} → ${fixed(p.reactiveCurrentAfterA, 1)}`, `${fixed(p.currentBeforeA, 1)} → ${fixed(p.currentAfterA, 1)}`]),
    ),
  );
  out.push('  current triangle of each phase, before → after the capacitors');

  out.push(section('Hand figures against the solved board, with your capacitors in'));
  // The line is named once, on its current row; its PF row under it leaves the name blank.
  const rows = handCheckComparedRows(r, label).map((row) => (row[1] === 'PF' ? ['', ...row.slice(1)] : row));
  out.push(
    renderTable(
      [{ header: 'line', align: 'left' }, { header: 'figure', align: 'left' }, { header: 'yours' }, { header: 'textbook' }, { header: 'solved' }, { header: 'solved − textbook' }],
      rows,
    ),
  );

  const phases = r.lines.map((l) => label(l.phase));
  const hasN = r.neutralA !== null;
  out.push(section('Where each difference comes from'));
  out.push(
    renderTable(
      [{ header: 'effect', align: 'left' }, ...phases.map((p) => ({ header: `${p} A` })), ...(hasN ? [{ header: 'N A' }] : []), ...phases.map((p) => ({ header: `${p} PF` })), { header: 'board PF' }],
      handCheckEffectRows(r),
    ),
  );
  out.push('');
  for (const e of r.effects) out.push(`  * ${e.title}: ${e.explanation}`);
  out.push(
    "  Each effect is switched on in turn, in this order, and the board solved again; its size is how far it moves the figure, and the sizes add up to the whole difference.",
  );
  if (r.lines.some((l) => l.crossesUnity))
    out.push('  A PF that crosses unity (lagging one way, leading the other) is compared by its angle φ = atan(Q/|P|), lagging positive, in degrees.');

  out.push(section('Warnings') + (r.warnings.length ? r.warnings.map((w) => wrapText(w.message, '  ! ')).join('\n') : '  none'));

  out.push(section('Cautions'));
  for (const c of r.cautions) out.push(`  * ${c}`);
  return `${out.join('\n')}\n`;
}
