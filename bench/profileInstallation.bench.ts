/**
 * Profile on an installation: the batch path (one compiled circuit of every board and feeder, load
 * powers overwritten per interval) against the general solve run once per interval
 * (solveInstallationNetwork on the installation with that interval's loads), both on the invented
 * Maple Court riser (6 boards, 21 loads) with the same invented per-load scales. The script checks
 * that both give the same currents before timing. No goal is set; the ratio is the figure.
 * Run: `npm run bench:profile-installation` (add `--quick` for a short run).
 */
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import {
  normaliseInstallation,
  parseInstallation,
  planDrivers,
  planInstallationColumns,
  readBoardText,
  solveInstallationNetwork,
  type BoardLoad,
  type DriverColumns,
  type Installation,
} from '../packages/core/src/index.js';
import { allocateBoardFigures, compileInstallationBatch, solveInstallationBatch } from '../packages/core/src/profile/installationBatch.js';

const quick = process.argv.includes('--quick');
const { installation } = normaliseInstallation(parseInstallation(readBoardText(readFileSync('examples/maple-court-riser.yaml', 'utf8'))));
const names = [installation.main, ...installation.subBoards].flatMap((b) => b.loads.map((l) => `${b.name}/${l.name} [x]`));
const BATCH = quick ? 20_000 : 100_000;
const GENERAL = quick ? 500 : 2_000;

// mulberry32: invented, repeatable scales between 0 and 1.2.
let seed = 20261202;
const random = () => {
  seed = (seed + 0x6d2b79f5) >>> 0;
  let t = seed;
  t = Math.imul(t ^ (t >>> 15), t | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
};
const columns: DriverColumns = {
  count: BATCH,
  re: names.map(() => Float64Array.from({ length: BATCH }, () => 1.2 * random())),
  im: names.map(() => new Float64Array(BATCH)),
};
const plan = planInstallationColumns(installation, ['time', ...names]);
const net = compileInstallationBatch(installation, plan.board.loads, plan.loadBoards, planDrivers(plan));

function scaledAt(i: number): Installation {
  let k = 0;
  const scale = (loads: readonly BoardLoad[]) =>
    loads.map((load) => {
      const x = columns.re[k++]![i]!;
      return { ...load, branches: load.branches.map((b) => ({ ...b, sNominal: { re: b.sNominal.re * x, im: b.sNominal.im * x } })) };
    });
  return { ...installation, main: { ...installation.main, loads: scale(installation.main.loads) }, subBoards: installation.subBoards.map((sb) => ({ ...sb, loads: scale(sb.loads) })) };
}

const figures = allocateBoardFigures(installation, BATCH);
let start = process.hrtime.bigint();
solveInstallationBatch(net, columns, figures);
const batchSeconds = Number(process.hrtime.bigint() - start) / 1e9;

start = process.hrtime.bigint();
let worst = 0;
for (let i = 0; i < GENERAL; i++) {
  const general = solveInstallationNetwork(scaledAt(i));
  general.boards.forEach((g, b) =>
    g.lineCurrents.forEach((c, k) => {
      const a = Math.hypot(c.re, c.im);
      worst = Math.max(worst, Math.abs(figures[b]!.lineA[k]![i]! - a) / Math.max(1, a));
    }),
  );
}
const generalSeconds = Number(process.hrtime.bigint() - start) / 1e9;
const batchRate = BATCH / batchSeconds;
const generalRate = GENERAL / generalSeconds;
console.log(`Maple Court riser, ${installation.subBoards.length + 1} boards, ${names.length} loads; load average ${loadavg().map((x) => x.toFixed(1)).join(' ')}`);
console.log(`batch path:    ${BATCH.toLocaleString('en')} intervals in ${batchSeconds.toFixed(2)} s = ${batchRate.toExponential(2)} intervals/s`);
console.log(`general solve: ${GENERAL.toLocaleString('en')} intervals in ${generalSeconds.toFixed(2)} s = ${generalRate.toExponential(2)} intervals/s`);
console.log(`ratio ${(batchRate / generalRate).toFixed(1)}x; largest line-current difference ${worst.toExponential(1)} (relative, floor 1 A)`);
if (!(worst < 1e-9)) throw new Error('the two paths disagree');
