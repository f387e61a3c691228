/**
 * Reference check of the harmonic study against ngspice (an independent
 * circuit solver, run as an external program):
 * 1. the resonance scan: an AC sweep of the same linear network (EMFs shorted,
 *    1 A driven between the two terminals) at every scanned frequency, for
 *    several bank states, |Z| to 1e-6 relative;
 * 2. the harmonic solve: at every order present, the network with AC current
 *    sources for the non-linear loads and the background EMFs; line, neutral
 *    currents and bus voltages to 1e-6 relative (floor 1e-9 of the scale).
 * The netlists are written from circuit elements (test/support/ngspiceHarmonics.ts),
 * so ngspice does the frequency scaling itself. Worst figures go to
 * test/harmonics/.ngspice-harmonics.json. Skipped without ngspice unless CI=true.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  addInstalledBank,
  createScanEvaluator,
  normaliseBoard,
  ordersPresent,
  parseBoard,
  readBoardText,
  resolveHarmonicModel,
  scanGrid,
  solveAtOrder,
  solveNetwork,
  type BoardSpec,
} from '@trivar/core';
import { cAbs, cSub, c } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { probeNgspice, runAc } from '../support/ngspice.js';
import { harmonicNetlist, nodeOf, runAcSweep } from '../support/ngspiceHarmonics.js';

const REL = 1e-6;
const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const figures = new FigureLog(new URL('./.ngspice-harmonics.json', import.meta.url));

const example = (name: string) => readBoardText(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8')) as BoardSpec;

/** A 3-wire board with a detuned star bank on a floating star point, series-form loads (constant resistance: SPICE resistors do not change with frequency). */
const THREE_WIRE: BoardSpec = {
  name: 'three-wire workshop',
  supply: { system: 'three-phase-3wire', voltage: { lineToLine: 480 }, frequencyHz: 60, transformer: { kVA: 500, impedancePercent: 5.5, xOverR: 5 } },
  feeder: { line: { r: 0.004, x: 0.003 } },
  loads: [
    { name: 'drive 1', connection: 'ABC-delta', kW: 75, pf: 0.96, spectrum: 'six-pulse-drive' },
    { name: 'welder', connection: 'A-B', kW: 20, pf: 0.7, linearForm: 'series' },
    { name: 'heaters', connection: 'ABC-delta', ohms: { r: 14, x: 0 } },
    { name: 'motors', connection: 'ABC-star', kW: 60, pf: 0.82 },
  ],
  harmonics: {
    background: [{ order: 5, percent: 2, angleDeg: 30 }],
    bank: { connection: 'star', ratedV: 320, stepsKvar: [30, 60], detuningPercent: 7 },
  },
};

/** A 120/240 V split-phase farm shop with a detuned bank across the two lines and non-linear loads on each line. */
const SPLIT_PHASE: BoardSpec = {
  name: 'split-phase farm shop',
  supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.4, xOverR: 1.8 } },
  feeder: { line: { r: 0.03, x: 0.012 }, neutral: { r: 0.05, x: 0.012 } },
  loads: [
    { name: 'grain dryer fan', connection: 'A-B', kW: 7.5, pf: 0.8, linearForm: 'series' },
    { name: 'shop lighting', connection: 'A-N', kW: 1.2, pf: 0.95, spectrum: 'led-driver' },
    { name: 'office', connection: 'B-N', kW: 0.9, pf: 0.98, spectrum: 'switch-mode' },
    { name: 'heat lamps', connection: 'B-N', ohms: { r: 9, x: 0 } },
  ],
  harmonics: {
    background: [{ order: 5, percent: 1.5, angleDeg: 10 }],
    bank: { connection: 'delta', ratedV: 277, stepsKvar: [2, 3], detuningPercent: 7 },
  },
};

/** A single-phase cabin with one capacitor from the line to the neutral. */
const SINGLE_PHASE: BoardSpec = {
  name: 'single-phase pump house',
  supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50, transformer: { kVA: 25, impedancePercent: 3, xOverR: 1.5 } },
  feeder: { line: { r: 0.08, x: 0.02 }, neutral: { r: 0.08, x: 0.02 } },
  loads: [
    { name: 'borehole pump', connection: 'A-N', kW: 3, pf: 0.75, linearForm: 'series' },
    { name: 'controls', connection: 'A-N', kW: 0.4, pf: 0.9, spectrum: 'switch-mode' },
  ],
  harmonics: { bank: { connection: 'star', ratedV: 250, stepsKvar: [1, 1] } },
};

const BOARDS: { name: string; spec: BoardSpec }[] = [
  { name: 'split-phase farm shop (detuned line-to-line bank)', spec: SPLIT_PHASE },
  { name: 'single-phase pump house (line-to-neutral capacitors)', spec: SINGLE_PHASE },
  { name: 'Mill Street offices (plain delta bank, 4-wire)', spec: example('mill-street-offices.yaml') },
  { name: 'three-wire workshop (detuned floating star bank)', spec: THREE_WIRE },
];

function prepared(spec: BoardSpec) {
  const parsed = parseBoard(spec);
  const plain = normaliseBoard(parsed);
  const withBank = parsed.harmonics?.bank ? addInstalledBank(plain, parsed.harmonics.bank) : { board: plain, model: null };
  const model = resolveHarmonicModel(parsed, withBank.board, withBank.model);
  return { board: withBank.board, model, fundamental: solveNetwork(withBank.board) };
}

if (!ngspice && !mustRun) {
  describe.skip('ngspice harmonic check — SKIPPED: ngspice is not installed', () => {
    it('needs ngspice on PATH', () => {});
  });
} else {
  describe(`harmonics against ngspice (${ngspice ?? 'missing'})`, () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-harm-'));
    afterAll(() => {
      rmSync(dir, { recursive: true, force: true });
      figures.describe('reference', `${ngspice ?? 'none'}: AC sweep of the scan network; AC current sources per order`);
      figures.describe('tolerance', { rel: REL });
      if (ngspice) figures.write();
    });

    it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

    BOARDS.forEach(({ name, spec }, b) => {
      it.skipIf(!ngspice)(`${name}: scan |Z| at every scanned frequency, several bank states`, () => {
        const { model, fundamental } = prepared(spec);
        const bank = model.bank!;
        const grid = scanGrid(model.scan.maxOrder, model.scan.step);
        const f = fundamental.board.frequencyHz;
        const evaluator = createScanEvaluator(fundamental, model);
        const states = [bank.stepLoads.map(() => true), bank.stepLoads.map((_, k) => k === 0), bank.stepLoads.map(() => false)];
        const out = new Float64Array(evaluator.pairs.length);
        let compared = 0;
        states.forEach((steps, s) => {
          const omit = new Set(bank.stepLoads.filter((_, k) => !steps[k]));
          evaluator.pairs.forEach(([p, q], k) => {
            const netlist = harmonicNetlist(fundamental, model, { emf: fundamental.board.emf.map(() => c(0)), drive: [nodeOf(p), nodeOf(q)], omitLoads: omit });
            const vectors = [`v(${nodeOf(p)})`, `v(${nodeOf(q)})`];
            const sweep = runAcSweep(netlist, { startHz: grid[0]! * f, stopHz: grid.at(-1)! * f, points: grid.length }, vectors, dir, `scan${b}-${s}-${k}`);
            expect(sweep.frequencies.length).toBe(grid.length);
            grid.forEach((h, i) => {
              expect(Math.abs(sweep.frequencies[i]! - h * f)).toBeLessThan(1e-9 * h * f);
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

      it.skipIf(!ngspice)(`${name}: line, neutral currents and bus voltages at every order`, () => {
        const { board, model, fundamental } = prepared(spec);
        const orders = ordersPresent(model);
        expect(orders.length).toBeGreaterThan(2);
        for (const h of orders) {
          const solution = solveAtOrder(fundamental, model, h);
          const sources = solution.branches.map((branches, l) => branches.map((st) => (model.loads[l]!.kind === 'non-linear' ? st.current : null)));
          const netlist = harmonicNetlist(fundamental, model, { emf: solution.board.emf, sources });
          const probes = [
            ...board.phases.map((ph, k) => ({ vector: `i(vi_${ph.toLowerCase()})`, core: solution.lineCurrents[k]!, kind: 'current' as const, label: `line ${ph}` })),
            ...board.phases.map((ph, k) => ({ vector: `v(bus_${ph.toLowerCase()})`, core: solution.nodeVoltages[solution.topology.busNode[k]!]!, kind: 'voltage' as const, label: `bus ${ph}` })),
            ...(board.hasNeutral ? [{ vector: 'i(vi_n)', core: solution.neutralCurrent!, kind: 'current' as const, label: 'neutral' }] : []),
          ];
          const spice = runAc(netlist, h * board.frequencyHz, probes.map((p) => p.vector), dir, `order${b}-${h}`);
          const scale = {
            current: Math.max(...probes.filter((p) => p.kind === 'current').map((p) => cAbs(p.core))),
            voltage: Math.max(...probes.filter((p) => p.kind === 'voltage').map((p) => cAbs(p.core))),
          };
          for (const probe of probes) {
            const ref = spice.get(probe.vector)!;
            const error = cAbs(cSub(probe.core, ref));
            figures.note(`order solve relative (${probe.kind})`, error / Math.max(cAbs(ref), 1e-3 * scale[probe.kind]), `${name}, h ${h}, ${probe.label}`);
            expect(error, `${probe.label} at h = ${h}`).toBeLessThanOrEqual(REL * cAbs(ref) + 1e-9 * scale[probe.kind]);
          }
        }
      });
    });
  });
}
