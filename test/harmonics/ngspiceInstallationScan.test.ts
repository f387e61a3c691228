/**
 * The resonance scan of an installation against ngspice: |Z| seen from a bank's board with every
 * EMF shorted, for several bank states and every terminal pair, at every point of the scan grid,
 * from an AC sweep of the installation written from its physical parts (test/support/
 * ngspiceInstallation.ts) with 1 A driven between the two terminals — the supply, every feeder
 * and every other board's loads in the path. Cases: Harrow Yard (a delta bank on a sub-board) and
 * an installation whose transformer has a zero-sequence impedance with a star bank on a sub-board
 * (the scan follows the file's earthing of the star point); and Ferrybank joinery (two banks on two
 * boards) in a mixed state — one step of the machine shop's bank with the finishing shop's bank at
 * its first step — as the joint scan sets it (impedancesIn); and a sixteen-floor riser with a bank on
 * the top floor, large enough that the scan factorises the sparse matrix. 1e-6 relative.
 * Worst figures go to test/harmonics/.ngspice-installation-scan.json. Skipped without ngspice unless CI=true.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  createInstallationScanEvaluator,
  parseInstallation,
  readBoardText,
  resolveInstallationHarmonics,
  scanGrid,
  solveInstallationNetwork,
  type InstallationSpec,
} from '@trivar/core';
import { cAbs, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { probeNgspice } from '../support/ngspice.js';
import { runAcSweep } from '../support/ngspiceHarmonics.js';
import { buildInstallationNetlist } from '../support/ngspiceInstallation.js';

const REL = 1e-6;
const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const figures = new FigureLog(new URL('./.ngspice-installation-scan.json', import.meta.url));

const example = (name: string) => readBoardText(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8')) as InstallationSpec;

/** A transformer with a zero-sequence impedance (Z0 ≠ Z1), a star bank on the sub-board. */
const STAR_POINT: InstallationSpec = {
  name: 'zero-sequence supply',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.006, x: 0.025 }, zeroSequence: { r: 0.012, x: 0.06 } },
  boards: [
    { name: 'Main', feeder: { line: { r: 0.004, x: 0.003 }, neutral: { r: 0.004, x: 0.003 } }, loads: [{ name: 'heaters', connection: 'A-N', kW: 6 }] },
    {
      name: 'Plant',
      fedFrom: 'Main',
      feeder: { line: { r: 0.02, x: 0.008 }, neutral: { r: 0.03, x: 0.008 } },
      loads: [
        { name: 'motors', connection: 'ABC-delta', kW: 30, pf: 0.8 },
        { name: 'pcs', connection: 'B-N', kW: 4, pf: 0.97, spectrum: 'switch-mode' },
      ],
    },
  ],
  harmonics: { scan: { maxOrder: 13, step: 0.2 }, banks: [{ board: 'Plant', connection: 'star', ratedV: 440, stepsKvar: [10, 15] }] },
} as InstallationSpec;

/**
 * A 16-floor riser (invented): a tap-off board per floor, 3.5 m of 95 mm² between floors, each floor's
 * flats on one phase in turn, a delta bank on the top floor. About 70 unknowns, so the scan factorises
 * the sparse matrix (network/sparseTerminalImpedance.ts) rather than inverting the dense one.
 */
const TALL_RISER: InstallationSpec = {
  name: 'sixteen-floor riser',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 500, impedancePercent: 5, xOverR: 5 } },
  boards: [
    { name: 'Floor 0', feeder: { lengthM: 30, line: { mm2: 185 }, neutral: { mm2: 185 } }, loads: [{ name: 'lifts', connection: 'ABC-delta', kW: 15, pf: 0.8 }] },
    ...Array.from({ length: 15 }, (_, i) => ({
      name: `Floor ${i + 1}`,
      fedFrom: `Floor ${i}`,
      feeder: { lengthM: 3.5, line: { mm2: 95 }, neutral: { mm2: 95 } },
      loads: [
        { name: `flats ${i + 1}`, connection: (['A-N', 'B-N', 'C-N'] as const)[i % 3]!, kW: 6 + (i % 4), pf: 0.95 },
        { name: `landing ${i + 1}`, connection: (['B-N', 'C-N', 'A-N'] as const)[i % 3]!, kW: 0.4 },
      ],
    })),
  ],
  harmonics: { scan: { maxOrder: 13, step: 0.25 }, banks: [{ board: 'Floor 15', connection: 'delta', ratedV: 440, stepsKvar: [10, 10] }] },
} as InstallationSpec;

const CASES = [
  { name: 'Harrow Yard studios, bank on Workshop', spec: example('harrow-yard-studios.yaml'), grid: scanGrid(25, 0.25) },
  { name: 'zero-sequence supply, star bank on Plant', spec: STAR_POINT, grid: scanGrid(13, 0.2) },
  { name: 'sixteen-floor riser, delta bank on the top floor (sparse factorisation)', spec: TALL_RISER, grid: scanGrid(13, 0.25) },
];

describe.skipIf(!ngspice && !mustRun)(`installation scan against ngspice (${ngspice ?? 'missing'})`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-inst-scan-'));
  afterAll(() => {
    if (!process.env.KEEP_SPICE) rmSync(dir, { recursive: true, force: true });
    figures.describe('reference', `${ngspice ?? 'none'}: AC sweep of the installation's physical parts, EMFs shorted, 1 A between the terminals`);
    figures.describe('tolerance', { rel: REL });
    if (ngspice) figures.write();
  });
  it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

  CASES.forEach(({ name, spec, grid }, c) => {
    it(`${name}: |Z| of every pair at every scanned order, several bank states`, () => {
      const { installation, models, bankBoards } = resolveInstallationHarmonics(parseInstallation(spec));
      const fundamental = solveInstallationNetwork(installation);
      const b = bankBoards[0]!;
      const bank = models[b]!.bank!;
      const evaluator = createInstallationScanEvaluator(fundamental, models, b);
      const f = installation.main.frequencyHz;
      const zeros = installation.main.emf.map(() => ({ re: 0, im: 0 }));
      const states = [bank.stepLoads.map(() => true), bank.stepLoads.map((_, k) => k === 0), bank.stepLoads.map(() => false)];
      const out = new Float64Array(evaluator.pairs.length);
      let compared = 0;
      states.forEach((steps, s) => {
        const omit = new Set(bank.stepLoads.filter((_, k) => !steps[k]).map((l) => `${b}:${l}`));
        evaluator.pairs.forEach(([p, q], k) => {
          const node = (t: string) => (t === 'N' ? `b${b}_n` : `b${b}_${t.toLowerCase()}`);
          const { netlist } = buildInstallationNetlist(installation, fundamental, { order: 0, emf: zeros, fundamental, models, drive: { board: b, into: p, from: q }, omit });
          const vectors = [`v(${node(p)})`, `v(${node(q)})`];
          const sweep = runAcSweep(netlist, { startHz: grid[0]! * f, stopHz: grid.at(-1)! * f, points: grid.length }, vectors, dir, `scan${c}-${s}-${k}`);
          grid.forEach((h, i) => {
            evaluator.prepare(h);
            evaluator.impedances(steps, out, 0);
            const spice = cAbs(cSub(sweep.values.get(vectors[0]!)![i]!, sweep.values.get(vectors[1]!)![i]!));
            const error = Math.abs(out[k]! - spice) / spice;
            figures.note('scan |Z| relative', error, `${name}, state ${s}, ${p}-${q}, h ${h}`);
            expect(error, `${p}-${q} at h = ${h}: core ${out[k]}, ngspice ${spice}`).toBeLessThan(REL);
            compared++;
          });
        });
      });
      figures.note(`scan points compared (${name})`, compared);
    });
  });

  it('Ferrybank joinery, a mixed state of two banks: machine shop step 1, finishing shop step 1', () => {
    const { installation, models, bankBoards } = resolveInstallationHarmonics(parseInstallation(example('ferrybank-joinery.yaml')));
    const fundamental = solveInstallationNetwork(installation);
    const b = bankBoards[0]!;
    const evaluator = createInstallationScanEvaluator(fundamental, models, b);
    expect(evaluator.banks.map((x) => x.board)).toEqual([...bankBoards].sort((x, y) => x - y));
    // Every bank at its first step only; the omitted parts are every other step of every bank.
    const states = evaluator.banks.map((bank) => ({ steps: Array.from({ length: bank.stepCount }, (_, k) => k === 0), fixedOn: true }));
    const omit = new Set(evaluator.banks.flatMap((bank) => models[bank.board]!.bank!.stepLoads.filter((_, k) => k > 0).map((l) => `${bank.board}:${l}`)));
    const grid = scanGrid(25, 0.25);
    const f = installation.main.frequencyHz;
    const zeros = installation.main.emf.map(() => ({ re: 0, im: 0 }));
    const out = new Float64Array(evaluator.pairs.length);
    let compared = 0;
    evaluator.pairs.forEach(([p, q], k) => {
      const node = (t: string) => (t === 'N' ? `b${b}_n` : `b${b}_${t.toLowerCase()}`);
      const { netlist } = buildInstallationNetlist(installation, fundamental, { order: 0, emf: zeros, fundamental, models, drive: { board: b, into: p, from: q }, omit });
      const vectors = [`v(${node(p)})`, `v(${node(q)})`];
      const sweep = runAcSweep(netlist, { startHz: grid[0]! * f, stopHz: grid.at(-1)! * f, points: grid.length }, vectors, dir, `mixed-${k}`);
      grid.forEach((h, i) => {
        evaluator.prepare(h);
        evaluator.impedancesIn(states, out, 0);
        const spice = cAbs(cSub(sweep.values.get(vectors[0]!)![i]!, sweep.values.get(vectors[1]!)![i]!));
        const error = Math.abs(out[k]! - spice) / spice;
        figures.note('scan |Z| relative', error, `Ferrybank mixed state, ${p}-${q}, h ${h}`);
        expect(error, `${p}-${q} at h = ${h}: core ${out[k]}, ngspice ${spice}`).toBeLessThan(REL);
        compared++;
      });
    });
    figures.note('scan points compared (Ferrybank mixed state)', compared);
    // The state matters: with every bank on, |Z| differs by far more than the tolerance somewhere.
    const allOn = new Float64Array(evaluator.pairs.length);
    const largest = Math.max(
      ...grid.map((h) => {
        evaluator.prepare(h);
        evaluator.impedancesIn(states, out, 0);
        evaluator.impedancesIn(evaluator.banks.map((bank) => ({ steps: Array.from({ length: bank.stepCount }, () => true), fixedOn: true })), allOn, 0);
        return Math.abs(out[0]! - allOn[0]!) / allOn[0]!;
      }),
    );
    expect(largest).toBeGreaterThan(0.1);
  });
});
