/**
 * Installations against an independent circuit solver: random radial trees of
 * 2–20 boards with unequal conductors (some of zero impedance, some sized from
 * the cable library) behind every supply shape whose impedances differ per phase
 * or per sequence (equal, per phase, zero sequence, a bank of unequal
 * single-phase units, an open delta, ideal), solved by core and by ngspice's AC
 * analysis of the netlist built from the physical parts (test/support/
 * ngspiceInstallation.ts). Every bus, bar and star-point voltage and every
 * feeder, neutral and load-branch current must agree to 1e-6 relative (plus a
 * floor of 1e-9 of the installation's voltage or current scale).
 *
 * Worst disagreements go to test/reference/.ngspice-installation-agreement.json.
 * Skipped without ngspice unless CI=true.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { normaliseInstallation, parseInstallation, solveInstallationNetwork } from '@trivar/core';
import { installationSpecArb, SHAPES_OF, type SupplyShape } from '../property/arbitraries/installationSpec.js';
import { cAbs, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { complexRelativeError } from '../support/tolerance.js';
import { probeNgspice, runAc } from '../support/ngspice.js';
import { buildInstallationNetlist } from '../support/ngspiceInstallation.js';

const REL = 1e-6;
const FLOOR = 1e-9;
const PER_SHAPE = 3;

const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const seed = fc.readConfigureGlobal().seed ?? 0;

const cases = (Object.keys(SHAPES_OF) as (keyof typeof SHAPES_OF)[]).flatMap((system, s) =>
  SHAPES_OF[system].flatMap((shape: SupplyShape, k) =>
    fc.sample(installationSpecArb({ systems: [system], shapes: [shape] }), { numRuns: PER_SHAPE, seed: seed + 100 * s + k }).map((spec, n) => ({ name: `${system}, ${shape} supply #${n}`, spec })),
  ),
);

const figures = new FigureLog(new URL('./.ngspice-installation-agreement.json', import.meta.url));

describe.skipIf(!ngspice && !mustRun)(`installations agree with ngspice (${ngspice ?? 'missing'}) on ${cases.length} random trees`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-inst-'));
  afterAll(() => {
    if (!process.env.KEEP_SPICE) rmSync(dir, { recursive: true, force: true });
    figures.describe('reference', `${ngspice ?? 'none'}, AC analysis at the supply frequency`);
    figures.describe('installations', cases.length);
    figures.describe('tolerance', { rel: REL, floor: `${FLOOR} × the installation's voltage or current scale` });
    if (ngspice) figures.write();
  });
  it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

  cases.forEach(({ name, spec }, k) => {
    it(`${name}: ${spec.boards.length} boards, ${spec.boards.reduce((t, b) => t + b.loads.length, 0)} loads`, () => {
      const { shape: _shape, ...file } = spec;
      const { installation } = normaliseInstallation(parseInstallation(file));
      const solution = solveInstallationNetwork(installation);
      const { netlist, probes } = buildInstallationNetlist(installation, solution);
      const spice = runAc(netlist, installation.main.frequencyHz, probes.map((p) => p.vector), dir, `inst${k}`);
      // At least 1 A, so an installation that carries nothing is not held to round-off of zero.
      const currentScale = Math.max(1, ...probes.filter((p) => p.kind === 'current').map((p) => cAbs(p.core)));
      const scale = { voltage: installation.main.nominalLineToNeutralV, current: currentScale };
      const failures: string[] = [];
      for (const probe of probes) {
        const ref = spice.get(probe.vector)!;
        const error = cAbs(cSub(probe.core, ref));
        if (!(error <= REL * cAbs(ref) + FLOOR * scale[probe.kind])) failures.push(`${probe.label}: core ${JSON.stringify(probe.core)}, ngspice ${JSON.stringify(ref)}`);
        figures.note(`relative (${probe.kind})`, complexRelativeError(probe.core, ref, 1e-3 * scale[probe.kind]), `${name}: ${probe.label}`);
      }
      expect(failures).toEqual([]);
      // Every board's buses were compared, and every energised branch.
      const energised = solution.boards.reduce((t, s) => t + s.branches.flat().filter((b) => b.energised).length, 0);
      expect(probes.filter((p) => p.label.includes(' load ')).length).toBe(energised);
    });
  });
});
