/** Text report of `trivar check`: the textbook working, hand vs solved line by line, and the effects behind each difference. */
import { handCheckEffectRows, labellerOf, powerFactorText, type HandCheckResult, type PhaseLabeller, type PowerFactorSense } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { wrapText } from './wrapText.js';

const SYSTEM_WORDS: Readonly<Record<string, string>> = {
  'three-phase-4wire': 'three-phase 4-wire',
  'three-phase-3wire': 'three-phase 3-wire',
  'split-phase': 'split-phase',
  'single-phase': 'single-phase',
};

const signed = (x: number, d: number): string => {
  const s = fixed(x, d);
  return /^0\.?0*$/.test(s) ? s : x > 0 ? `+${s}` : s;
};
const senseWord = (s: PowerFactorSense): string => (s === 'unity' ? '' : s === 'lagging' ? ' lag' : ' lead');
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
        fixed(p.pfBefore, 3),
        ...(r.targetPf !== null ? [orDash(p.requiredKvar, 2)] : []),
        fixed(p.capacitorKvar, 2),
        fixed(p.kvarAfter, 2),
        orDash(p.tanAfter, 3),
        `${fixed(p.pfAfter, 3)}${senseWord(p.senseAfter)}`,
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
  const rows: string[][] = [];
  for (const l of r.lines) {
    rows.push([label(l.phase), 'current A', orDash(l.currentA.yours, 1), fixed(l.currentA.textbook, 1), fixed(l.currentA.solved, 1), signed(l.currentA.difference, 1)]);
    rows.push(['', 'PF', orDash(l.pf.yours, 3), `${fixed(l.pf.textbook, 3)}${senseWord(l.senseTextbook)}`, `${fixed(l.pf.solved, 3)}${senseWord(l.senseSolved)}`, signed(l.pf.difference, 3)]);
  }
  if (r.neutralA) rows.push(['N', 'current A', orDash(r.neutralA.yours, 1), fixed(r.neutralA.textbook, 1), fixed(r.neutralA.solved, 1), signed(r.neutralA.difference, 1)]);
  // The board's PF as every table prints one: a lead/lag tag, or "export" where power flows back.
  rows.push(['board', 'PF (vector)', orDash(r.boardPf.yours, 3), powerFactorText(r.boardPower.textbook), powerFactorText(r.boardPower.solved), signed(r.boardPf.difference, 3)]);
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

  out.push(section('Warnings') + (r.warnings.length ? r.warnings.map((w) => wrapText(w.message, '  ! ')).join('\n') : '  none'));

  out.push(section('Cautions'));
  for (const c of r.cautions) out.push(`  * ${c}`);
  return `${out.join('\n')}\n`;
}
