/**
 * The installation harmonic solve against ngspice (an independent circuit solver, run as an
 * external program): at every order present, the installation written from its physical parts
 * at the supply frequency (test/support/ngspiceInstallation.ts) — source windings, service
 * feeder, every sub-board feeder conductor and neutral, a star-point impedance or open delta —
 * with the linear loads as R, L, C from their solved fundamental admittance, the detuned and
 * plain bank steps as L–C and C, the non-linear loads as AC current sources worked out from
 * their fundamental current and spectrum, and the background EMFs; ngspice's AC analysis at
 * h·f scales every reactance itself. Every bus, bar and star-point voltage and every feeder,
 * neutral and load-branch current must agree to 1e-6 relative (plus a floor of 1e-9 of the
 * installation's scale). Resistance constant with frequency (SPICE resistors are). Cases: the
 * Harrow Yard example (a bank on a sub-board) and random installations of every supply shape
 * with spectra. Worst figures go to test/harmonics/.ngspice-installation-harmonics.json.
 * Skipped without ngspice unless CI=true.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import {
  installationAtOrder,
  ordersPresent,
  parseInstallation,
  readBoardText,
  resolveInstallationHarmonics,
  solveInstallationAtOrder,
  solveInstallationNetwork,
  type InstallationSpec,
  type LoadSpec,
} from '@trivar/core';
import { installationSpecArb, SHAPES_OF } from '../property/arbitraries/installationSpec.js';
import { spectrumArb } from '../property/arbitraries/harmonicBoardSpec.js';
import { cAbs, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { complexRelativeError } from '../support/tolerance.js';
import { probeNgspice, runAc } from '../support/ngspice.js';
import { buildInstallationNetlist } from '../support/ngspiceInstallation.js';

const REL = 1e-6;
const FLOOR = 1e-9;
const ngspice = probeNgspice();
const mustRun = process.env.CI === 'true';
const seed = fc.readConfigureGlobal().seed ?? 0;
const figures = new FigureLog(new URL('./.ngspice-installation-harmonics.json', import.meta.url));

const example = (name: string) => readBoardText(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8')) as InstallationSpec;

/** A random installation of one system with spectra on its loads (not on stars) and background distortion. */
const randomCase = (system: keyof typeof SHAPES_OF, k: number) =>
  fc.sample(
    fc.tuple(installationSpecArb({ systems: [system], maxBoards: 6 }), fc.array(fc.option(spectrumArb, { nil: undefined }), { minLength: 24, maxLength: 24 })).map(([spec, spectra]) => {
      let n = 0;
      const { shape, ...file } = spec;
      return {
        name: `${system}, ${shape} supply`,
        spec: {
          ...file,
          boards: file.boards.map((b) => ({ ...b, loads: b.loads.map((l): LoadSpec => (l.connection === 'ABC-star' || spectra[n++] === undefined ? l : { ...l, spectrum: spectra[n - 1]! })) })),
          harmonics: { background: [{ order: 5, percent: 1.5, angleDeg: 15 }, { order: 11, percent: 0.5 }] },
        } as InstallationSpec,
      };
    }),
    { numRuns: 1, seed: seed + k },
  )[0]!;

const CASES = [
  { name: 'Harrow Yard studios (bank on the workshop board)', spec: example('harrow-yard-studios.yaml') },
  ...(Object.keys(SHAPES_OF) as (keyof typeof SHAPES_OF)[]).flatMap((system, s) => [randomCase(system, 10 * s), randomCase(system, 10 * s + 1)]),
];

describe.skipIf(!ngspice && !mustRun)(`installation harmonics against ngspice (${ngspice ?? 'missing'})`, () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-spice-inst-harm-'));
  afterAll(() => {
    if (!process.env.KEEP_SPICE) rmSync(dir, { recursive: true, force: true });
    figures.describe('reference', `${ngspice ?? 'none'}: AC analysis at h·f of the installation's physical parts, non-linear loads as AC current sources`);
    figures.describe('tolerance', { rel: REL, floor: `${FLOOR} × the installation's voltage or current scale at that order` });
    if (ngspice) figures.write();
  });
  it('ngspice is installed (required on CI)', () => expect(ngspice).not.toBeNull());

  CASES.forEach(({ name, spec }, c) => {
    it(`${name}: every voltage and current at every order`, () => {
      const { installation, models } = resolveInstallationHarmonics(parseInstallation(spec));
      let fundamental;
      try {
        fundamental = solveInstallationNetwork(installation);
      } catch {
        return; // a random supply that cannot carry its loads: no harmonic question to ask
      }
      const orders = [...new Set(models.flatMap(ordersPresent))].sort((a, b) => a - b);
      expect(orders.length).toBeGreaterThan(1);
      let compared = 0;
      for (const h of orders) {
        const solution = solveInstallationAtOrder(fundamental, models, h);
        const emf = installationAtOrder(installation, models, h).main.emf;
        const { netlist, probes } = buildInstallationNetlist(installation, solution, { order: h, emf, fundamental, models });
        const spice = runAc(netlist, h * installation.main.frequencyHz, probes.map((p) => p.vector), dir, `case${c}-h${h}`);
        const scale = {
          voltage: Math.max(1e-3, ...probes.filter((p) => p.kind === 'voltage').map((p) => cAbs(p.core))),
          current: Math.max(1e-3, ...probes.filter((p) => p.kind === 'current').map((p) => cAbs(p.core))),
        };
        const failures: string[] = [];
        for (const probe of probes) {
          const ref = spice.get(probe.vector)!;
          const error = cAbs(cSub(probe.core, ref));
          if (!(error <= REL * cAbs(ref) + FLOOR * scale[probe.kind])) failures.push(`h${h} ${probe.label}: core ${JSON.stringify(probe.core)}, ngspice ${JSON.stringify(ref)}`);
          figures.note(`relative (${probe.kind})`, complexRelativeError(probe.core, ref, 1e-3 * scale[probe.kind]), `${name}, h${h}: ${probe.label}`);
          compared++;
        }
        expect(failures).toEqual([]);
      }
      figures.note(`values compared (${name})`, compared);
    });
  });
});
