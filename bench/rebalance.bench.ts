/**
 * Rebalancing speed and quality on random invented boards (the test generator:
 * 0.3–18 kW circuits, PF 0.7–1 lagging or leading, one in ten exporting, 15 %
 * two-pole, one fixed three-phase motor). Never a timed unit test: run
 * `npm run bench:rebalance` (add `--quick` for fewer boards).
 *
 * Each time is the whole `rebalanceBoard` call without the move table (model,
 * search, bound, two network re-solves), best of three, as this process's CPU
 * time (the goals are judged on it: on a shared machine wall time also counts
 * waiting for other processes; the wall maximum is printed beside it), and as a
 * ratio to one network solve of the same board measured in this run.
 * Goals (issue 10): 42 circuits within 1 % of the optimum (or 1e-3·|I1|) in
 * under 50 ms; 84 circuits under 200 ms; the exact method proves 18 circuits
 * in under 1 s. "Within 1 %" is certified by the answer's own lower bound.
 * Quality baseline: the largest-first kVA spread (each circuit, largest kVA
 * first, to the phase with the least kVA so far), scored the same way.
 */
import {
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  rebalanceBoard,
  rebalanceInstallation,
  solveBoardModel,
  solveInstallationModel,
  type BoardSpec,
  type ConnectionSpec,
} from '../packages/core/src/index.js';
import { randomBoard, seeded, boardFigures } from '../test/rebalance/support/rebalanceBoards.js';
import { randomInstallation } from '../test/rebalance/support/rebalanceInstallations.js';

const quick = process.argv.includes('--quick');
/** `--installations`: only the installation rows (the board rows take minutes on a shared machine). */
const installationsOnly = process.argv.includes('--installations');
const seeds = quick ? [1, 2, 3] : [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

/** Best of `runs` after a warm-up call: wall time and this process's CPU time, ms. */
function bestOf<T>(runs: number, fn: () => T): { ms: number; cpuMs: number; value: T } {
  let ms = Infinity;
  let cpuMs = Infinity;
  let value = fn();
  for (let r = 0; r < runs; r++) {
    const start = performance.now();
    const cpu = process.cpuUsage();
    value = fn();
    const used = process.cpuUsage(cpu);
    ms = Math.min(ms, performance.now() - start);
    cpuMs = Math.min(cpuMs, (used.user + used.system) / 1000);
  }
  return { ms, cpuMs, value };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const board = (circuits: number, seed: number): BoardSpec =>
  randomBoard({ system: 'three-phase-4wire', circuits, threePhaseLoad: true }, seeded(circuits * 1000 + seed));

/** The spreadsheet habit: largest kVA first, each to the phase with the least kVA so far (two-pole circuits stay). */
function kvaSpread(spec: BoardSpec): ConnectionSpec[] {
  const kva = { A: 0, B: 0, C: 0 };
  const order = spec.loads.map((_, i) => i).sort((a, b) => Math.abs(spec.loads[b]!.kW ?? 0) / (spec.loads[b]!.pf ?? 1) - Math.abs(spec.loads[a]!.kW ?? 0) / (spec.loads[a]!.pf ?? 1));
  const out = spec.loads.map((l) => l.connection);
  for (const i of order) {
    const l = spec.loads[i]!;
    if (!l.connection.endsWith('-N')) continue;
    const phase = (Object.keys(kva) as ('A' | 'B' | 'C')[]).reduce((p, q) => (kva[q] < kva[p] ? q : p));
    kva[phase] += Math.abs(l.kW ?? 0) / (l.pf ?? 1);
    out[i] = `${phase}-N`;
  }
  return out;
}

function sizeRow(circuits: number, method: 'local-search' | 'exact') {
  const rows = seeds.map((seed) => {
    const spec = board(circuits, seed);
    const model = normaliseBoard(parseBoard(spec));
    const solveMs = bestOf(3, () => solveBoardModel(model)).ms;
    const { ms, cpuMs, value: r } = bestOf(3, () => rebalanceBoard(model, {}, { method, moveTable: false }));
    const i1 = r.conditions[0]!.model.before.largestLineA; // for scale only
    const greedy = boardFigures(spec, kvaSpread(spec));
    const after = r.conditions[0]!.model.after;
    return {
      ms,
      cpuMs,
      ratio: ms / solveMs,
      proven: r.proven,
      gapPercent: r.score.gapPercent ?? NaN,
      within: (r.score.gap ?? Infinity) <= Math.max(0.01 * r.score.after, 1e-3 * (r.score.lowerBound ?? i1)),
      nodes: r.search.nodes,
      neutralAfter: after.neutralA ?? 0,
      neutralKva: greedy.neutral,
      lineAfter: after.largestLineA,
      lineKva: Math.max(...greedy.lines),
    };
  });
  return rows;
}

function report(title: string, circuits: number, method: 'local-search' | 'exact', goalMs: number | null) {
  const rows = sizeRow(circuits, method);
  const ms = rows.map((r) => r.ms);
  const cpu = rows.map((r) => r.cpuMs);
  const line = [
    `${title.padEnd(26)}`,
    `CPU median ${median(cpu).toFixed(1).padStart(6)} ms, max ${Math.max(...cpu).toFixed(1).padStart(6)} ms`,
    `(wall max ${Math.max(...ms).toFixed(1)} ms)`,
    `(${median(rows.map((r) => r.ratio)).toFixed(0)}× one network solve)`,
    method === 'exact' ? `proven ${rows.filter((r) => r.proven).length}/${rows.length}, nodes ≤ ${Math.max(...rows.map((r) => r.nodes))}` : `gap ≤ ${Math.max(...rows.map((r) => r.gapPercent)).toFixed(3)} %, within goal ${rows.filter((r) => r.within).length}/${rows.length}`,
  ].join('  ');
  // Judged on CPU time: on a shared machine the wall time also counts waiting for other processes.
  const ok = goalMs === null || Math.max(...cpu) < goalMs;
  console.log(`${line}  ${goalMs === null ? '' : ok ? `goal < ${goalMs} ms: met` : `goal < ${goalMs} ms: MISSED`}`);
  return rows;
}

console.log(`trivar rebalance benchmark — ${new Date().toISOString().slice(0, 10)}, node ${process.version}, ${seeds.length} boards per size`);
console.log('score: largest line current + neutral current (A); times: whole call, best of 3; goals on CPU time\n');
const at42 = installationsOnly ? [] : report('42 circuits, local search', 42, 'local-search', 50);
const at84 = installationsOnly ? [] : report('84 circuits, local search', 84, 'local-search', 200);
for (const n of installationsOnly ? [] : quick ? [18] : [14, 16, 18, 20]) report(`${n} circuits, exact`, n, 'exact', n === 18 ? 1000 : null);

/**
 * Over its ratings: the same random boards, a 1 m feeder whose lines are rated 2 % below the largest line the
 * unrated search reaches and whose neutral is rated 2 A, with at most 4 moves: no answer keeps every rating, so
 * the search ranks by overload and the report states a bound on the least largest loading (or proves it).
 */
function overLimitRow(circuits: number, goalMs: number | null) {
  const rows = seeds.map((seed) => {
    const spec = board(circuits, seed);
    const free = rebalanceBoard(normaliseBoard(parseBoard(spec)), {}, { method: 'local-search', moveTable: false });
    const lineRating = Math.round(0.98 * free.conditions[0]!.model.after.largestLineA);
    const conductor = (ratingA: number) => ({ lengthM: 1, rOhmPerKm: 0.1, xOhmPerKm: 0.05, ratingA });
    const rated = normaliseBoard(parseBoard({ ...spec, feeder: { line: conductor(lineRating), neutral: conductor(2) } } as BoardSpec));
    const { ms, cpuMs, value: r } = bestOf(3, () => rebalanceBoard(rated, { moveLimit: 4 }, { method: 'local-search', moveTable: false }));
    const bound = r.overload?.bound ?? null;
    return { ms, cpuMs, within: r.overload?.within ?? true, bound };
  });
  const cpu = rows.map((r) => r.cpuMs);
  const ok = goalMs === null || Math.max(...cpu) < goalMs;
  const bounds = rows.filter((r) => r.bound).map((r) => `${r.bound!.answerPercent.toFixed(1)} ≥ ${r.bound!.leastPercent.toFixed(1)} %`);
  console.log(
    [
      `${`${circuits} circuits over ratings, local`.padEnd(36)}`,
      `CPU median ${median(cpu).toFixed(1).padStart(6)} ms, max ${Math.max(...cpu).toFixed(1).padStart(6)} ms`,
      `(wall max ${Math.max(...rows.map((r) => r.ms)).toFixed(1)} ms)`,
      `over ${rows.filter((r) => !r.within).length}/${rows.length}`,
      bounds.length ? `largest loading found ≥ bound: ${bounds.join(', ')}` : 'no bound reported',
      goalMs === null ? '' : ok ? `goal < ${goalMs} ms: met` : `goal < ${goalMs} ms: MISSED`,
    ].join('  '),
  );
}
if (!installationsOnly) {
  console.log('');
  overLimitRow(42, null);
  overLimitRow(84, null);
}

if (!installationsOnly) console.log('\nAgainst the largest-first kVA spread (median over the boards):');
for (const [n, rows] of installationsOnly ? [] : ([[42, at42], [84, at84]] as const)) {
  const share = (x: (r: (typeof rows)[number]) => number) => median(rows.map(x));
  console.log(
    `  ${n} circuits: neutral ${share((r) => r.neutralKva).toFixed(1)} A → ${share((r) => r.neutralAfter).toFixed(3)} A; largest line ${share((r) => r.lineKva).toFixed(1)} A → ${share((r) => r.lineAfter).toFixed(1)} A`,
  );
}

/**
 * Installations: a main board feeding a rising main of five floor boards in a chain (each floor fed
 * from the one below) plus a plant board off the main board, circuits spread over the seven boards,
 * cables and a transformer. Scored at every incomer (added), the default; the whole call includes
 * the installation re-solves before and after.
 */
function installationRow(circuits: number, method: 'local-search' | 'exact', goalMs: number | null) {
  const perBoard = Array.from({ length: 7 }, (_, b) => Math.floor((circuits + b) / 7));
  const rows = seeds.map((seed) => {
    const spec = randomInstallation({ system: 'three-phase-4wire', circuits: perBoard, parents: [0, 0, 2, 3, 4, 5], impedance: true, seed: circuits * 1000 + seed });
    const model = normaliseInstallation(parseInstallation(spec)).installation;
    const solveMs = bestOf(3, () => solveInstallationModel(model)).ms;
    const { ms, cpuMs, value: r } = bestOf(3, () => rebalanceInstallation(model, {}, { method, moveTable: false }));
    return { ms, cpuMs, ratio: ms / solveMs, proven: r.proven, gapPercent: r.score.gapPercent ?? NaN, nodes: r.search.nodes };
  });
  const cpu = rows.map((r) => r.cpuMs);
  const ok = goalMs === null || Math.max(...cpu) < goalMs;
  console.log(
    [
      `${`${circuits} circuits on 7 boards, ${method === 'exact' ? 'exact' : 'local'}`.padEnd(36)}`,
      `CPU median ${median(cpu).toFixed(1).padStart(6)} ms, max ${Math.max(...cpu).toFixed(1).padStart(6)} ms`,
      `(wall max ${Math.max(...rows.map((r) => r.ms)).toFixed(1)} ms)`,
      `(${median(rows.map((r) => r.ratio)).toFixed(0)}× one installation solve)`,
      method === 'exact'
        ? `proven ${rows.filter((r) => r.proven).length}/${rows.length}, nodes ≤ ${Math.max(...rows.map((r) => r.nodes))}`
        : `gap ≤ ${Math.max(...rows.map((r) => r.gapPercent)).toFixed(3)} %`,
      goalMs === null ? '' : ok ? `goal < ${goalMs} ms: met` : `goal < ${goalMs} ms: MISSED`,
    ].join('  '),
  );
}

console.log('\nInstallations (score at every board incomer, added; same goals as a board of the same size):');
installationRow(18, 'exact', 1000);
installationRow(42, 'local-search', 50);
if (!quick) installationRow(84, 'local-search', 200);
