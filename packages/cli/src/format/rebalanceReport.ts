/** RebalanceReport → the text report of `trivar rebalance`. */
import { labelIn, type ConditionComparison, type ConditionFigures, type RebalanceReport } from '@trivar/core';
import { fixed, renderTable, renderTableWithin, section } from './textTable.js';
import { wrapText } from './wrapText.js';

const amps = (x: number | null) => (x === null ? '-' : fixed(x, 1));
const percent = (x: number | null) => (x === null ? '-' : fixed(x, 2));

const FIGURE_WORDS: Record<string, string> = {
  largestLine: 'largest line current (A)',
  neutral: 'neutral current (A)',
  currentUnbalance: 'current unbalance |I2|/|I1| (%)',
  voltageUnbalance: 'voltage unbalance |V2|/|V1| (%)',
};

/**
 * A North-American board's motors are judged by NEMA MG 1's line-voltage unbalance rate (largest deviation
 * of a line-to-line voltage from the mean of the three, % of the mean): its reports show that figure beside
 * |V2|/|V1|, from the network re-solve (the fast model has no line voltages). IEC boards show |V2|/|V1| alone.
 */
const showsLineRate = (r: RebalanceReport, f: ConditionFigures) => r.board.region === 'north-america' && f.lineVoltageRatePercent !== null;
const LINE_RATE_ROW = 'line-voltage unbalance, NEMA MG 1 (%)';

/**
 * Where the score weighs |V2|/|V1| on a North-American board: what it scored, and the NEMA figure now and after
 * (the largest over the conditions and incomers the score reads, where there are several).
 */
function lineRateBesideScore(r: RebalanceReport): string | null {
  if (r.aim === 'custom' || r.aim.voltageUnbalance === 0) return null;
  const read = r.conditions.filter((c) => showsLineRate(r, c.solved.before));
  if (read.length === 0) return null;
  const largest = (side: 'before' | 'after') => Math.max(...read.map((c) => c.solved[side].lineVoltageRatePercent!));
  const where = read.length > 1 ? ', the largest over the conditions and incomers scored' : '';
  return `The score weighs |V2|/|V1|; the NEMA MG 1 line-voltage unbalance rate, which agrees closely with it while the unbalance is small, is now ${percent(largest('before'))} % → after ${percent(largest('after'))} % (network re-solve${where}).`;
}

/** True when the report covers several boards of an installation. */
const isInstallation = (r: RebalanceReport) => r.boards.all.length > 1;

function scoreWords(r: RebalanceReport): string {
  const conditionCount = new Set(r.conditions.map((c) => c.name)).size;
  const over = conditionCount > 1 ? (r.combine === 'worst' ? ', worst condition' : ', weighted mean of conditions') : '';
  if (r.aim === 'custom') return `custom score${over}`;
  const aim = r.aim;
  const terms = (Object.keys(aim) as (keyof typeof aim)[])
    .filter((k) => aim[k] > 0)
    .map((k) => (aim[k] === 1 ? FIGURE_WORDS[k]! : `${fixed(aim[k], 2)} × ${FIGURE_WORDS[k]!}`));
  const where = !isInstallation(r)
    ? ''
    : r.boards.measured.length > 1
      ? ', added over the incomers of every board'
      : `, at the incomer of "${r.boards.measured[0]}"`;
  return `${terms.join(' + ')}${where}${over}`;
}

/** Digits that keep a score readable whatever its size (a near-zero neutral still shows). */
const score = (x: number) => fixed(x, scoreDigits([x]));

/**
 * Scores read side by side take one precision, the one their smallest non-zero member needs
 * ("149.80 → 91.28", not "149.8 → 91.28"; "149.800 → 0.004").
 */
function scoreDigits(xs: readonly number[]): number {
  const sizes = xs.map(Math.abs).filter((x) => x > 0);
  const smallest = sizes.length ? Math.min(...sizes) : 0;
  return smallest >= 100 ? 1 : smallest >= 1 ? 2 : 3;
}

/** What a proof covers where the study lets only some boards' circuits move: " of the circuits on "Shed"". */
const scopeWords = (onlyBoards: readonly string[] | null) => (onlyBoards === null ? '' : ` of the circuits on ${onlyBoards.map((b) => `"${b}"`).join(', ')}`);

/** The overload measure in words: how the search ranks answers that leave something over its limit. */
const OVERLOAD_ORDER = 'least overload first: the largest loading over 100 %, then the loadings over 100 % added, then the score';

/** The verdict where the answer leaves something over a rating or capacity: what, how far, and whether proven least. */
function overloadVerdict(r: RebalanceReport, o: NonNullable<RebalanceReport['overload']>, plural: (n: number) => string): string {
  // The re-solve's figure; where whole per cents would put it below the fast model's bound beside it, the bound's decimals.
  const worstDigits = o.bound && !o.proven && Number(fixed(o.worst?.loadingPercent ?? 0, 0)) < Math.floor(o.bound.leastPercent) ? o.bound.decimals : 0;
  const what = o.worst
    ? `${o.worst.what} at ${fixed(o.worst.loadingPercent, worstDigits)} % of its ${o.worst.limit}${worstDigits ? ' (network re-solve)' : ''}`
    : 'a limit in the fast model, though the network re-solve finds every current within';
  if (r.moveLimit === 0) return `still over: ${what}; the move limit of 0 allows no move`;
  const budget = `${scopeWords(r.search.onlyBoards)}${r.moveLimit === null ? '' : ` with at most ${plural(r.moveLimit)}`}`;
  if (o.proven) return `still over: ${what}; no arrangement${budget} does better (proven, ${OVERLOAD_ORDER})`;
  const b = o.bound;
  if (b === null) return `still over: ${what}; the least overload found${budget}, not proven (${OVERLOAD_ORDER})`;
  // The bound rounded down (still a true bound), the answer to the nearest, at the decimals the report chose.
  const boundText = fixed(Math.floor(b.leastPercent * 10 ** b.decimals + 1e-9) / 10 ** b.decimals, b.decimals);
  const answerText = fixed(b.answerPercent, b.decimals);
  if (b.answerLeast)
    return `still over: ${what}; no arrangement${budget} has a lower largest loading (proven by a lower bound: ${answerText} % in the fast model); after it, the least overload found (${OVERLOAD_ORDER})`;
  return b.limitsUnreachable
    ? `still over: ${what}; no arrangement${budget} keeps every limit (proven by a lower bound: in the fast model none has its largest loading below ${boundText} %, this answer ${answerText} %); the least overload found (${OVERLOAD_ORDER})`
    : `still over: ${what}; the least overload found${budget}, not proven (fast model: best found ${answerText} %, no arrangement below ${boundText} %; ${OVERLOAD_ORDER})`;
}

function verdict(r: RebalanceReport): string {
  const plural = (n: number) => `${n} move${n === 1 ? '' : 's'}`;
  if (r.overload && !r.overload.within) return overloadVerdict(r, r.overload, plural);
  // Where the file rates conductors or supply units, the search kept them: the proof is over those answers.
  // The fast model keeps the ratings; where the re-solve puts one over all the same, the proof is the model's only.
  const ratingOver = r.capacityExceeded.filter((e) => e.limit === 'rating');
  const caused = ratingOver.some((e) => e.change !== 'unchanged');
  // A proof over some boards' circuits says so: another board's circuit may do better.
  const scope = r.search.onlyBoards ? ` among the arrangements${scopeWords(r.search.onlyBoards)}` : '';
  const proof = r.proven
    ? r.ratingsKept
      ? ratingOver.length
        ? `proven best within the file's ratings by the fast model, but the network re-solve puts a rating over (see the ${caused ? 'first note' : 'notes'})`
        : `proven best within the file's ratings${scope}`
      : `proven best${scope}`
    : r.score.gapPercent !== null
      ? `best found; at most ${fixed(r.score.gapPercent, 2)} % (${score(r.score.gap ?? 0)}) above the best possible`
      : 'best found; no bound';
  if (r.nearBest?.bestScore != null) {
    // The best it is measured from keeps every limit; where a row over one scores lower, say which best.
    const withinOnly = (r.moveTable ?? []).some((t) => !t.withinCapacity) ? ' of the answers within every limit' : '';
    return `${proof} with at most ${plural(r.moves.length)}: the fewest moves within ${fixed(r.nearBest.percent, 1)} % of the best score${withinOnly}, ${score(r.nearBest.bestScore)}`;
  }
  return `${proof}${r.moveLimit === null ? '' : ` with at most ${plural(r.moveLimit)}`}`;
}

/** What the move does to the breaker's position and number, in a work-order cell. */
function breakerWords(m: RebalanceReport['moves'][number], on: (c: string) => string): string {
  const n = m.circuitNumber;
  if (n === null) return '';
  const implied = n.implied ? on(n.implied.join('-')) : '';
  // A multi-pole breaker given one number takes the positions below it too, "14 and 16 below it".
  const positions = n.positions ?? [];
  const oneNumber = positions.length > 1 && m.circuit!.trim() === String(positions[0]);
  const written = oneNumber ? `${positions.join(' and ')} below it` : m.circuit;
  const several = positions.length > 1;
  if (n.verdict === 'renumber') return `new position${several ? 's' : ''} and no${several ? 's' : ''}. (${written} ${several ? 'are' : 'is'} on ${implied})`;
  if (n.verdict === 'matches-new-line') return `check: no${several ? 's' : ''}. ${written} ${several ? 'are' : 'is'} on ${implied} already`;
  return 'new position: update its no.';
}

function workOrder(r: RebalanceReport): string {
  if (r.moves.length === 0) return '  (no moves)';
  // The work order speaks the file's naming (L1-N where the file wrote L1-N).
  const on = (c: string) => labelIn(r.board.phaseNames ?? 'A/B/C', c);
  // The file's circuit numbers, where it gives them, and what each move does to its breaker's position.
  const numbered = r.moves.some((m) => m.circuit !== null);
  const north = r.moves.some((m) => m.circuitNumber?.implied);
  const check = r.moves.some((m) => m.circuitNumber?.verdict === 'matches-new-line');
  const legendWords = numbered
    ? `(no.: the circuit number in the file; list no.: the circuit’s place in its board’s loads list, from 1; the moves may be made in any order. A moved circuit’s breaker takes a position on its new line${north ? ': the usual panel numbering (odd down the left, even down the right, lines in turn by row) ties each number to a line, so the circuit takes the new position’s number' : ''}.${check ? ' check: the number is already one of the new line’s while the file has the circuit on the old line: find its breaker before moving it.' : ''})`
    : '(list no.: the circuit’s place in its board’s loads list, from 1; the moves may be made in any order)';
  const legend = `\n${wrapText(legendWords, '  ', '   ')}`;
  const columns = [
    ...(isInstallation(r) ? [{ header: 'board', align: 'left' as const }] : []),
    ...(numbered ? [{ header: 'no.', align: 'left' as const }] : []),
    { header: 'list no.' },
    { header: 'circuit', align: 'left' as const },
    { header: 'now on', align: 'left' as const },
    { header: 'move to', align: 'left' as const },
    ...(numbered ? [{ header: 'breaker', align: 'left' as const }] : []),
  ];
  const rows = r.moves.map((m) => [
    ...(isInstallation(r) ? [m.board] : []),
    ...(numbered ? [m.circuit ?? '-'] : []),
    String(m.listPosition),
    m.name,
    on(m.from),
    on(m.to),
    ...(numbered ? [breakerWords(m, on)] : []),
  ]);
  return (isInstallation(r) ? renderTableWithin(columns, rows) : renderTable(columns, rows)) + legend;
}

/**
 * Installations: two rows per board's incomer (now, after), network re-solve, and the table's key; `*` marks
 * the boards the score reads.
 */
function boardsTable(r: RebalanceReport, condition: string): string {
  const rows: { board: string; measured: boolean; before: ConditionFigures; after: ConditionFigures }[] = [
    ...r.conditions.filter((c) => c.name === condition).map((c) => ({ board: c.board, measured: true, before: c.solved.before, after: c.solved.after })),
    ...r.otherBoards.filter((c) => c.name === condition).map((c) => ({ board: c.board, measured: false, before: c.before, after: c.after })),
  ].sort((a, b) => r.boards.all.indexOf(a.board) - r.boards.all.indexOf(b.board));
  const first = rows[0]!.before;
  // |I2|/|I1| is a three-line figure; an idle board's is "-", not a missing column.
  const threeLines = first.lineA.length === 3;
  const columns = [
    { header: 'board incomer', align: 'left' as const },
    { header: '', align: 'left' as const },
    ...first.lineA.map((_, k) => ({ header: `line ${labelIn(r.board.phaseNames ?? 'A/B/C', 'ABC'[k]!)}` })),
    ...(first.neutralA !== null ? [{ header: 'neutral' }] : []),
    ...(threeLines ? [{ header: '|I2|/|I1|' }] : []),
    ...(first.voltageUnbalancePercent !== null ? [{ header: '|V2|/|V1|' }] : []),
    ...(showsLineRate(r, first) ? [{ header: 'NEMA MG 1' }] : []),
  ];
  const cells = (f: ConditionFigures) => [
    ...f.lineA.map((a) => amps(a)),
    ...(first.neutralA !== null ? [amps(f.neutralA)] : []),
    ...(threeLines ? [percent(f.currentUnbalancePercent)] : []),
    ...(first.voltageUnbalancePercent !== null ? [percent(f.voltageUnbalancePercent)] : []),
    ...(showsLineRate(r, first) ? [percent(f.lineVoltageRatePercent)] : []),
  ];
  const mark = rows.some((x) => !x.measured);
  const measuredKey = mark ? '\n  * the score reads these incomers' : '';
  const lineRateKey = showsLineRate(r, first)
    ? `\n${wrapText('NEMA MG 1: line-voltage unbalance rate, % (the largest deviation of a line-to-line voltage from the mean of the three)', '  ', '    ')}`
    : '';
  const table = renderTableWithin(
    columns,
    rows.flatMap(({ board, measured, before, after }) => [
      [`${mark ? (measured ? '* ' : '  ') : ''}${board}`, 'now', ...cells(before)],
      ['', 'after', ...cells(after)],
    ]),
  );
  return table + measuredKey + lineRateKey;
}


function conditionTable(r: RebalanceReport, c: ConditionComparison, lines: readonly string[]): string {
  const rows: string[][] = [];
  const row = (label: string, pick: (f: ConditionFigures) => string) =>
    rows.push([label, pick(c.solved.before), pick(c.solved.after), pick(c.model.after)]);
  lines.forEach((line, k) => row(`line ${line} (A)`, (f) => amps(f.lineA[k] ?? null)));
  if (c.solved.before.neutralA !== null) row('neutral (A)', (f) => amps(f.neutralA));
  if (lines.length === 3) row('|I2|/|I1| (%)', (f) => percent(f.currentUnbalancePercent));
  if (c.solved.before.voltageUnbalancePercent !== null)
    rows.push(['|V2|/|V1| (%)', percent(c.solved.before.voltageUnbalancePercent), percent(c.solved.after.voltageUnbalancePercent), c.model.after.voltageUnbalancePercent === null ? '-' : percent(c.model.after.voltageUnbalancePercent)]);
  if (showsLineRate(r, c.solved.before)) rows.push([LINE_RATE_ROW, percent(c.solved.before.lineVoltageRatePercent), percent(c.solved.after.lineVoltageRatePercent), '-']);
  return renderTable(
    [{ header: '', align: 'left' }, { header: 'now' }, { header: 'after' }, { header: 'after (fast model)' }],
    rows,
  );
}

/** A loading, %: one decimal, more where one would show a row just over its limit as 100.0 (up to 100.001). */
function loadingCell(percent: number): string {
  let digits = 1;
  while (digits < 3 && percent > 100 && Number(fixed(percent, digits)) <= 100) digits++;
  return fixed(percent, digits);
}

function moveTable(r: RebalanceReport): string {
  const table = r.moveTable ?? [];
  const digits = scoreDigits(table.flatMap((t) => [t.score, ...(t.lowerBound === null ? [] : [t.lowerBound])]));
  // Where a row is over a limit, rows rank by overload before score: its largest loading is shown beside the score.
  const loading = table.some((t) => !t.withinCapacity);
  const rows = table.map((t) => [
    String(t.moves),
    fixed(t.score, digits),
    t.lowerBound === null ? '-' : fixed(t.lowerBound, digits),
    ...(loading ? [t.largestLoadingPercent === null ? '-' : `${loadingCell(t.largestLoadingPercent)}${t.loadingSolved ? '*' : ' '}`] : []),
    // Over a rating or capacity, a row's answer is the least overload (proven: no answer with as many moves has less).
    t.withinCapacity ? (t.proven ? 'proven' : 'best found') : t.proven ? 'over a limit, least proven' : 'over a limit',
    String(t.movesUsed),
  ]);
  const solvedRows = table.some((t) => t.loadingSolved);
  const tightened = r.search.limitsTightened ? ', then tightened where the re-solve of an answer put a rating over that the fast model kept' : '';
  const keyWords = [
    'largest loading: the most loaded current the file rates or the study caps, % of its limit; an answer over a limit is ranked by it first.',
    solvedRows ? '* network re-solve of that wiring (the present wiring, the answer given), as the notes give it. Other rows:' : 'Every row:',
    `the fast model against each limit as the search holds it (a rating scaled by how far the fast model reads the present wiring above or below the network re-solve${tightened}), which a re-solve may put a few % either way.`,
  ].join(' ');
  const key = loading ? `\n${wrapText(keyWords, '  ', '  ')}` : '';
  return (
    renderTable(
      [
        { header: 'moves allowed' },
        { header: 'score' },
        { header: 'bound' },
        ...(loading ? [{ header: 'largest loading %' }] : []),
        { header: 'status', align: 'left' },
        { header: 'moves used' },
      ],
      rows,
    ) + key
  );
}

export function renderRebalanceReport(r: RebalanceReport): string {
  const lines = r.conditions[0]?.solved.before.lineA.map((_, k) => labelIn(r.board.phaseNames ?? 'A/B/C', 'ABC'[k]!)) ?? [];
  const installation = isInstallation(r);
  // One line: no score, no work order, only why.
  if (r.oneLine) return `${[r.board.name, ...r.notes.map((n) => wrapText(n, '', ''))].join('\n')}\n`;
  // The four scores and the bound in one precision.
  const digits = scoreDigits([r.score.before, r.score.after, r.solvedScore.before, r.solvedScore.after, ...(r.score.lowerBound === null ? [] : [r.score.lowerBound])]);
  const s = (x: number) => fixed(x, digits);
  const parts: string[] = [
    r.board.name,
    wrapText(`Rebalancing: ${r.search.movable} of ${r.search.circuitsInInstallation} circuits can move${r.search.pinned ? `, ${r.search.pinned} pinned` : ''}${installation ? (r.search.onlyBoards ? ` (only those on ${r.search.onlyBoards.map((b) => `"${b}"`).join(', ')})` : ` (boards: ${r.boards.movable.join(', ')})`) : ''}`, '', '  '),
    wrapText(`Score: ${scoreWords(r)}`, '', '  '),
    `  fast model:       now ${s(r.score.before)}  →  after ${s(r.score.after)}   lower bound ${r.score.lowerBound === null ? '-' : s(r.score.lowerBound)}`,
    `  network re-solve: now ${s(r.solvedScore.before)}  →  after ${s(r.solvedScore.after)}`,
    wrapText(verdict(r), '  ', '    '),
  ];
  const beside = lineRateBesideScore(r);
  if (beside) parts.push(wrapText(beside, '  ', '    '));
  parts.push(section(`Work order (${r.moves.length} move${r.moves.length === 1 ? '' : 's'})`) + workOrder(r));
  const names = [...new Set(r.conditions.map((c) => c.name))];
  if (installation)
    for (const name of names) {
      const weight = r.conditions.find((c) => c.name === name)!.weight;
      const what = 'incomer currents (A) and unbalance (%), installation re-solved';
      const title = names.length > 1 ? `Condition "${name}" (weight ${fixed(weight, 2)}): ${what}` : `Before and after: ${what}`;
      parts.push(section(title) + boardsTable(r, name));
    }
  else
    for (const c of r.conditions) {
      const title = r.conditions.length > 1 ? `Condition "${c.name}" (weight ${fixed(c.weight, 2)}), network re-solve` : 'Before and after, network re-solve';
      parts.push(section(title) + conditionTable(r, c, lines));
    }
  if (r.moveTable && r.moveTable.length > 1) parts.push(section('Best score by moves allowed') + moveTable(r));
  if (r.notes.length) parts.push(section('Notes') + r.notes.map((n) => wrapText(n, '  * ', '    ')).join('\n'));
  parts.push(section('Cautions') + r.cautions.map((c) => wrapText(c, '  * ', '    ')).join('\n'));
  return `${parts.join('\n')}\n`;
}
