/**
 * The conductor resistance models of the harmonic solve against ngspice at
 * one order (h = 5), on a board whose feeder has a different conductor on each
 * phase and a neutral of its own:
 * - `resistance: constant`: source, feeder and neutral keep R; ngspice scales
 *   every L and C with frequency itself;
 * - `resistance: skin-effect`: R × √h on the source, every line conductor and
 *   the neutral (common practice, HARMONICS_DEFAULTS). The netlist gets the
 *   resistances R·√5 written by this test from the board's fundamental values,
 *   so ngspice checks that core applies the model to every conductor it solves.
 * Line, neutral currents and bus voltages to 1e-6 relative; and the resonance
 * scan of the same board (per-phase conductors, both models) as an AC sweep.
 * Skipped without ngspice unless CI=true.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  addInstalledBank,
  createScanEvaluator,
  normaliseBoard,
  parseBoard,
  resolveHarmonicModel,
  solveAtOrder,
  solveNetwork,
  type Board,
  type BoardSpec,
  type ComplexValue,
} from '@trivar/core';
import { cAbs, cSub } from '../support/complexMath.js';
import { probeNgspice, runAc } from '../support/ngspice.js';
import { harmonicNetlist, nodeOf, runAcSweep } from '../support/ngspiceHarmonics.js';
import { c } from '../support/complexMath.js';

const REL = 1e-6;
const ORDER = 5;
const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';

/** Per-phase feeder conductors (one phase run in a smaller size), a neutral of its own, a plain delta bank. */
const board = (resistance: 'constant' | 'skin-effect'): BoardSpec => ({
  name: 'tannery annex',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 315, impedancePercent: 4.5, xOverR: 3.5 } },
  feeder: {
    lengthM: 60,
    line: { A: { mm2: 70 }, B: { mm2: 70 }, C: { mm2: 50 } },
    neutral: { mm2: 35 },
  },
  loads: [
    { name: 'office racks', connection: 'A-N', kW: 14, pf: 0.97, spectrum: 'switch-mode' },
    { name: 'led lines', connection: 'B-N', kW: 9, pf: 0.95, spectrum: [{ order: 3, percent: 30 }, { order: 5, percent: 18, angleDeg: 25 }] },
    { name: 'press drive', connection: 'ABC-delta', kW: 45, pf: 0.95, spectrum: 'six-pulse-drive' },
    { name: 'kilns', connection: 'ABC-star', kW: 30, pf: 1 },
    { name: 'fans', connection: 'C-N', kW: 6, pf: 0.8 },
  ],
  harmonics: { resistance, background: [{ order: 5, percent: 1.5, angleDeg: -20 }], bank: { connection: 'delta', ratedV: 440, stepsKvar: [25, 25] } },
});

function prepared(spec: BoardSpec) {
  const parsed = parseBoard(spec);
  const withBank = addInstalledBank(normaliseBoard(parsed), parsed.harmonics!.bank!);
  const model = resolveHarmonicModel(parsed, withBank.board, withBank.model);
  return { model, fundamental: solveNetwork(withBank.board) };
}

/** The board with every conductor resistance × √h: what `skin-effect` means, written out here. */
function withSkinEffect(b: Board, h: number): Board {
  const scaled = (z: ComplexValue): ComplexValue => ({ re: z.re * Math.sqrt(h), im: z.im });
  return {
    ...b,
    sourceImpedance: scaled(b.sourceImpedance),
    lineImpedance: scaled(b.lineImpedance),
    neutralImpedance: scaled(b.neutralImpedance),
    ...(b.sourceImpedances ? { sourceImpedances: b.sourceImpedances.map(scaled) } : {}),
    ...(b.lineImpedances ? { lineImpedances: b.lineImpedances.map(scaled) } : {}),
  };
}

if (!ngspice && !mustRun) {
  describe.skip('ngspice conductor-resistance check — SKIPPED: ngspice is not installed', () => {
    it('needs ngspice on PATH', () => {});
  });
} else {
  describe(`conductor resistance at order ${ORDER} against ngspice (${ngspice ?? 'missing'})`, () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-skin-'));
    afterAll(() => rmSync(dir, { recursive: true, force: true }));

    it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

    const solved = (resistance: 'constant' | 'skin-effect') => {
      const { model, fundamental } = prepared(board(resistance));
      const solution = solveAtOrder(fundamental, model, ORDER);
      const sources = solution.branches.map((branches, l) => branches.map((st) => (model.loads[l]!.kind === 'non-linear' ? st.current : null)));
      const circuit = resistance === 'skin-effect' ? { ...fundamental, board: withSkinEffect(fundamental.board, ORDER) } : fundamental;
      const netlist = harmonicNetlist(circuit, model, { emf: solution.board.emf, sources });
      const b = fundamental.board;
      const probes = [
        ...b.phases.map((ph, k) => ({ vector: `i(vi_${ph.toLowerCase()})`, core: solution.lineCurrents[k]!, label: `line ${ph}` })),
        ...b.phases.map((ph, k) => ({ vector: `v(bus_${ph.toLowerCase()})`, core: solution.nodeVoltages[solution.topology.busNode[k]!]!, label: `bus ${ph}` })),
        { vector: 'i(vi_n)', core: solution.neutralCurrent!, label: 'neutral' },
      ];
      const spice = runAc(netlist, ORDER * b.frequencyHz, probes.map((p) => p.vector), dir, resistance);
      return { board: b, probes: probes.map((p) => ({ ...p, spice: spice.get(p.vector)! })) };
    };

    for (const resistance of ['constant', 'skin-effect'] as const)
      it.skipIf(!ngspice)(`resistance: ${resistance} — every line, the neutral and every bus voltage to ${REL}`, () => {
        const { board: b, probes } = solved(resistance);
        expect(b.lineImpedances?.length).toBe(3); // the per-phase conductors are in the model
        for (const p of probes) expect(cAbs(cSub(p.core, p.spice)) / cAbs(p.spice), `${p.label}: core ${JSON.stringify(p.core)}, ngspice ${JSON.stringify(p.spice)}`).toBeLessThan(REL);
      });

    for (const resistance of ['constant', 'skin-effect'] as const)
      it.skipIf(!ngspice)(`resistance: ${resistance} — the scan |Z| of every terminal pair, bank on, h = 2 … 14 by 0.5`, () => {
        const { model, fundamental } = prepared(board(resistance));
        const f = fundamental.board.frequencyHz;
        const evaluator = createScanEvaluator(fundamental, model);
        const grid = Array.from({ length: 25 }, (_, i) => 2 + 0.5 * i);
        const out = new Float64Array(evaluator.pairs.length);
        const allOn = model.bank!.stepLoads.map(() => true);
        evaluator.pairs.forEach(([p, q], k) => {
          grid.forEach((h) => {
            // The resistances at this order: √h changes with h, so one AC point per order.
            const circuit = resistance === 'skin-effect' ? { ...fundamental, board: withSkinEffect(fundamental.board, h) } : fundamental;
            const netlist = harmonicNetlist(circuit, model, { emf: fundamental.board.emf.map(() => c(0)), drive: [nodeOf(p), nodeOf(q)] });
            const vectors = [`v(${nodeOf(p)})`, `v(${nodeOf(q)})`];
            const sweep = runAcSweep(netlist, { startHz: h * f, stopHz: h * f, points: 1 }, vectors, dir, `scan-${resistance}-${k}-${h}`);
            const spice = cAbs(cSub(sweep.values.get(vectors[0]!)![0]!, sweep.values.get(vectors[1]!)![0]!));
            evaluator.prepare(h);
            evaluator.impedances(allOn, out, 0);
            expect(Math.abs(out[k]! - spice) / spice, `${p}-${q} at h = ${h}: core ${out[k]}, ngspice ${spice}`).toBeLessThan(REL);
          });
        });
      });

    it.skipIf(!ngspice)('the two models differ by more than the tolerance, so the check tells them apart', () => {
      const constant = solved('constant').probes;
      const skin = solved('skin-effect').probes;
      const neutral = (ps: typeof constant) => ps.find((p) => p.label === 'neutral')!.spice;
      const change = cAbs(cSub(neutral(skin), neutral(constant))) / cAbs(neutral(constant));
      expect(change).toBeGreaterThan(1e3 * REL);
    });
  });
}
