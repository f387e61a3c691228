/**
 * Reference check against an independent circuit solver.
 *
 * Random boards are solved by core, then the same circuit is written as a
 * SPICE netlist (see test/support/ngspice.ts) and solved by ngspice's AC
 * analysis. Every node voltage and every line, neutral and branch current must
 * agree to 1e-6 relative (plus a floor of 1e-9 of the board's voltage or
 * current scale, for quantities that are zero). Voltage-dependent loads enter
 * the netlist as the admittances core converged to; constant-impedance loads
 * rated in ohms enter with the impedance written in the board file, so that
 * path does not go through core at all.
 *
 * The worst disagreement is written to test/reference/.ngspice-agreement.json.
 * Without ngspice the check is skipped (the test name says so), except on CI
 * (CI=true), where a missing ngspice fails the run. KEEP_SPICE=1 keeps the
 * netlists and ngspice's output in the temp directory for inspection.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, solveNetwork, type BoardSpec, type LoadSpec } from '@trivar/core';
import { boardSpecArb } from '../property/arbitraries/boardSpec.js';
import { largestCurrent } from '../property/laws.js';
import { c, cAbs, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { complexRelativeError } from '../support/tolerance.js';
import { buildNetlist, probeNgspice, runAc, type BranchElement } from '../support/ngspice.js';

const REL = 1e-6;
const FLOOR = 1e-9;
const PER_CATEGORY = 6;

const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';

interface Network {
  readonly category: string;
  readonly spec: BoardSpec;
  readonly neutralOpen: boolean;
}

/** A load added to a board spec (ohms-rated, so it reaches ngspice without passing through core). */
const ohmsLoad = (name: string, connection: LoadSpec['connection'], r: number, x: number): LoadSpec => ({ name, connection, ohms: { r, x } });

const withLoads = (spec: BoardSpec, extra: readonly LoadSpec[]): BoardSpec => ({ ...spec, loads: [...spec.loads, ...extra] });

/** The categories the brief of this check names, each a family of random boards. */
const CATEGORIES: readonly { name: string; arb: fc.Arbitrary<BoardSpec>; neutralOpen?: boolean }[] = [
  {
    name: '4-wire, solid neutral',
    arb: boardSpecArb({ systems: ['three-phase-4wire'], source: 'non-ideal' }).map((s) => ({ ...s, feeder: { ...(s.feeder?.line ? { line: s.feeder.line, neutral: { r: 0, x: 0 } } : {}) } })),
  },
  {
    name: '4-wire, neutral impedance',
    arb: fc
      .tuple(boardSpecArb({ systems: ['three-phase-4wire'] }), fc.double({ min: 0.005, max: 0.2, noNaN: true }), fc.double({ min: 0, max: 0.1, noNaN: true }))
      .map(([s, r, x]) => ({ ...s, feeder: { ...s.feeder, neutral: { r, x } } })),
  },
  {
    // Constant-impedance only: behind a broken neutral, loads in series have no unique constant-power solution.
    name: '4-wire, open neutral',
    arb: fc
      .tuple(boardSpecArb({ systems: ['three-phase-4wire'], models: 'constant-impedance', generation: false }), fc.double({ min: 5, max: 60, noNaN: true }))
      .map(([s, r]) => withLoads(s, [ohmsLoad('extra A', 'A-N', r, 0.3 * r), ohmsLoad('extra B', 'B-N', 2 * r, -0.2 * r)])),
    neutralOpen: true,
  },
  {
    name: '3-wire, floating star loads',
    arb: fc
      .tuple(boardSpecArb({ systems: ['three-phase-3wire'], source: 'non-ideal' }), fc.double({ min: 5, max: 60, noNaN: true }))
      .map(([s, r]) => withLoads(s, [ohmsLoad('extra star', 'ABC-star', r, 0.5 * r), ohmsLoad('extra C-A', 'C-A', 3 * r, -r)])),
  },
  { name: 'split-phase', arb: boardSpecArb({ systems: ['split-phase'] }) },
  {
    name: 'ideal source',
    arb: boardSpecArb({ systems: ['three-phase-4wire', 'three-phase-3wire', 'split-phase', 'single-phase'], source: 'ideal' }),
  },
];

/** Reproducible from the run's fast-check seed (TRIVAR_SEED), like the property tests. */
const seed = fc.readConfigureGlobal().seed ?? 0;
const networks: Network[] = CATEGORIES.flatMap((cat, k) =>
  fc.sample(cat.arb, { numRuns: PER_CATEGORY, seed: seed + k }).map((spec) => ({ category: cat.name, spec, neutralOpen: cat.neutralOpen ?? false })),
);

const figures = new FigureLog(new URL('./.ngspice-agreement.json', import.meta.url));

if (!ngspice && !mustRun) {
  describe.skip('ngspice reference check — SKIPPED: ngspice is not installed (install it, or set CI=true to make this a failure)', () => {
    it('needs ngspice on PATH', () => {});
  });
} else {
  // Independent solver: ngspice-39, Berkeley SPICE AC analysis (modified nodal
  // analysis of the netlist, its own sparse LU), run as an external program.
  describe(`agreement with ngspice (${ngspice ?? 'missing'}) on ${networks.length} random networks`, () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-'));
    afterAll(() => {
      if (!process.env.KEEP_SPICE) rmSync(dir, { recursive: true, force: true });
      figures.describe('reference', `${ngspice ?? 'none'}, AC analysis at the board frequency`);
      figures.describe('networks', networks.length);
      figures.describe('tolerance', { rel: REL, floor: `${FLOOR} × the board's voltage or current scale` });
      if (ngspice) figures.write();
    });

    it('ngspice is installed (required on CI)', () => {
      expect(ngspice, 'CI=true but ngspice was not found on PATH').not.toBeNull();
    });

    // A fixed rule per branch, alternating forms, so both the series and the
    // parallel equivalent are in every board; ohms-rated constant-impedance
    // loads use the board file's own impedance.
    const elementFor = (spec: BoardSpec) => (load: number, branch: number): BranchElement => {
      const l = spec.loads[load]!;
      const fromFile = l.ohms && (l.model ?? 'constant-impedance') === 'constant-impedance' && !l.zip;
      const form = (load + branch) % 2 === 0 ? 'series' : 'parallel';
      return fromFile ? { form, impedance: c(l.ohms!.r, l.ohms!.x) } : { form };
    };

    networks.forEach((net, k) => {
      it.skipIf(!ngspice)(`${net.category} #${k % PER_CATEGORY}: ${net.spec.loads.length} loads, ${net.spec.supply.frequencyHz} Hz`, () => {
        const board = { ...normaliseBoard(parseBoard(net.spec)), neutralOpen: net.neutralOpen };
        const solution = solveNetwork(board);
        const { netlist, probes } = buildNetlist(board, solution, elementFor(net.spec));
        const spice = runAc(netlist, board.frequencyHz, probes.map((p) => p.vector), dir, `net${k}`);
        const scale = { voltage: board.nominalLineToNeutralV, current: largestCurrent(solution) };
        const failures: string[] = [];
        for (const probe of probes) {
          const ref = spice.get(probe.vector)!;
          const error = cAbs(cSub(probe.core, ref));
          const floor = FLOOR * scale[probe.kind];
          if (!(error <= REL * cAbs(ref) + floor)) failures.push(`${probe.label}: core ${JSON.stringify(probe.core)}, ngspice ${JSON.stringify(ref)}`);
          const where = `${net.category} #${k % PER_CATEGORY}: ${probe.label}`;
          // Relative to the quantity itself, floored at 1e-3 of the board's scale so near-zero quantities do not divide by noise.
          figures.note(`relative (${probe.kind})`, complexRelativeError(probe.core, ref, 1e-3 * scale[probe.kind]), where);
          figures.note(`of scale (${probe.kind})`, error / scale[probe.kind], where);
        }
        expect(failures).toEqual([]);
        // Every branch, line and node must have been compared, not just some.
        const energised = solution.branches.flat().filter((b) => b.energised).length;
        expect(probes.filter((p) => p.label.includes(' branch ')).length).toBe(energised);
      });
    });
  });
}
