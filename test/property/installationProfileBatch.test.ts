/**
 * The profile's batch path on installations against the general compiled solve
 * (solveInstallationNetwork) on random installations (arbitraries/installationSpec.ts:
 * trees of boards, unequal and zero-impedance conductors, every supply shape) and
 * random intervals: every board's bus voltages, neutral-bar voltage, incomer line
 * currents and neutral current agree to 1e-9 relative (absolute floor 1e-9 × the
 * largest quantity of its kind on the interval), interval by interval. The same
 * with the installation framed at the origin (a bank's controller reading the
 * supply's terminals): the origin's bus voltages are the general solve's, its line
 * currents the main board's, and Ohm's law holds along the service cable.
 */
import fc from 'fast-check';
import { describe, it } from 'vitest';
import {
  boardOfInstallation,
  installationOf,
  normaliseInstallation,
  parseInstallation,
  planDrivers,
  solveInstallationNetwork,
  terminalVoltage,
  type Installation,
  type InstallationSpec,
} from '@trivar/core';
import { meteringPlace } from '../../packages/core/src/correction/meteringPoint.js';
import { scaleLoads } from '../support/installationLoads.js';
import { planInstallationColumns } from '../../packages/core/src/profile/installationColumns.js';
import { compileInstallationBatch, createInstallationKernel } from '../../packages/core/src/profile/installationBatch.js';
import { edgePowersAt, type DriverColumns } from '../../packages/core/src/profile/batchNetwork.js';
import { installationSpecArb } from './arbitraries/installationSpec.js';
import { expectComplexClose } from '../support/tolerance.js';

const REL = 1e-9;
const strip = ({ shape: _s, ...file }: InstallationSpec & { shape: string }): InstallationSpec => file;

const scaledInstallation = (installation: Installation, scales: readonly number[]) => scaleLoads(installation, (k) => scales[k]!);

/**
 * The batch kernel of `installation`'s loads, one column per load, on `circuit` (the installation itself, or
 * framed with a board before it: `shift` boards on), and a function solving interval i of `intervals`.
 */
function batchOver(installation: Installation, intervals: readonly (readonly number[])[], circuit = installation, shift = 0) {
  const names = [installation.main, ...installation.subBoards].flatMap((b) => b.loads.map((l) => `${b.name}/${l.name} [x]`));
  if (names.length === 0) return null;
  const plan = planInstallationColumns(installation, ['time', ...names]);
  const net = compileInstallationBatch(circuit, plan.board.loads, plan.loadBoards.map((b) => b + shift), planDrivers(plan));
  const kernel = createInstallationKernel(net);
  const columns: DriverColumns = {
    count: intervals.length,
    re: names.map((_, l) => Float64Array.from(intervals, (x) => x[l]!)),
    im: names.map(() => new Float64Array(intervals.length)),
  };
  const powers = new Float64Array(net.edges.length * 6);
  /** Largest current to expect: every rating at nominal voltage, or a solved line current above that. */
  const rated = plan.board.loads.flatMap((l) => l.branches).reduce((t, b) => t + Math.hypot(b.sNominal.re, b.sNominal.im), 0) / installation.main.nominalLineToNeutralV;
  return {
    kernel,
    rated,
    solve(i: number) {
      edgePowersAt(net, columns, i, powers);
      kernel.solve(powers, i);
    },
  };
}

// A share of exact zeros: whole boards and floating stars switched off.
const scaleArb = fc.oneof({ weight: 1, arbitrary: fc.constant(0) }, { weight: 4, arbitrary: fc.double({ min: 0.05, max: 1.5, noNaN: true }) });

describe('installation batch path = general compiled solve', () => {
  it('every board, interval by interval', () => {
    fc.assert(
      fc.property(
        installationSpecArb({ minBoards: 1, maxBoards: 6 }).chain((spec) => {
          const loadCount = spec.boards.reduce((s, b) => s + (b.loads?.length ?? 0), 0);
          return fc.tuple(fc.constant(spec), fc.array(fc.array(scaleArb, { minLength: loadCount, maxLength: loadCount }), { minLength: 1, maxLength: 3 }));
        }),
        ([spec, intervals]) => {
          const { installation } = normaliseInstallation(parseInstallation(strip(spec)));
          const batch = batchOver(installation, intervals);
          if (!batch) return;
          const { kernel } = batch;
          intervals.forEach((scales, i) => {
            batch.solve(i);
            const general = solveInstallationNetwork(scaledInstallation(installation, scales));
            const vMax = Math.max(...installation.main.emf.map((e) => Math.hypot(e.re, e.im)));
            const iMax = Math.max(batch.rated, ...general.boards.flatMap((s) => s.lineCurrents.map((c) => Math.hypot(c.re, c.im))));
            const vTol = { rel: REL, abs: REL * vMax };
            const iTol = { rel: REL, abs: REL * iMax };
            general.boards.forEach((g, b) => {
              const s = kernel.states[b]!;
              const at = `interval ${i} ${g.board.name}`;
              installation.main.phases.forEach((p, k) => {
                expectComplexClose({ re: s.busRe[k]!, im: s.busIm[k]! }, terminalVoltage(g, p)!, vTol, `${at} bus ${p}`);
                expectComplexClose({ re: s.lineRe[k]!, im: s.lineIm[k]! }, g.lineCurrents[k]!, iTol, `${at} line ${p}`);
              });
              if (g.neutralCurrent) expectComplexClose({ re: s.neutral[0]!, im: s.neutral[1]! }, g.neutralCurrent, iTol, `${at} neutral`);
              const bar = installation.main.hasNeutral ? terminalVoltage(g, 'N') : null;
              if (bar) expectComplexClose({ re: s.reference[0]!, im: s.reference[1]! }, bar, vTol, `${at} neutral bar`);
            });
          });
        },
      ),
      { numRuns: 40 },
    );
  });

  it('framed at the origin (a bank read at the supply\'s terminals): the general solve of the framed circuit, and Ohm\'s law along the service cable', () => {
    fc.assert(
      fc.property(
        installationSpecArb({ minBoards: 1, maxBoards: 4 }).chain((spec) => {
          const loadCount = spec.boards.reduce((s, b) => s + (b.loads?.length ?? 0), 0);
          return fc.tuple(fc.constant(spec), fc.array(fc.array(scaleArb, { minLength: loadCount, maxLength: loadCount }), { minLength: 1, maxLength: 2 }));
        }),
        ([spec, intervals]) => {
          const { installation } = normaliseInstallation(parseInstallation(strip(spec)));
          const frame = installationOf(meteringPlace(boardOfInstallation(installation, 0), 'origin')!.inFrame(boardOfInstallation(installation, 0))).installation;
          const batch = batchOver(installation, intervals, frame, 1);
          if (!batch) return;
          const { kernel } = batch;
          intervals.forEach((scales, i) => {
            batch.solve(i);
            const general = solveInstallationNetwork(scaledInstallation(frame, scales));
            const vMax = Math.max(...installation.main.emf.map((e) => Math.hypot(e.re, e.im)));
            const iMax = Math.max(batch.rated, ...general.boards.flatMap((g) => g.lineCurrents.map((c) => Math.hypot(c.re, c.im))));
            const [origin, main] = [kernel.states[0]!, kernel.states[1]!];
            installation.main.phases.forEach((p, k) => {
              expectComplexClose({ re: origin.busRe[k]!, im: origin.busIm[k]! }, terminalVoltage(general.boards[0]!, p)!, { rel: REL, abs: REL * vMax }, `interval ${i} origin ${p}`);
              // One current through the service cable: the origin's lines are the main board's.
              expectComplexClose({ re: origin.lineRe[k]!, im: origin.lineIm[k]! }, { re: main.lineRe[k]!, im: main.lineIm[k]! }, { rel: REL, abs: REL * iMax }, `interval ${i} line ${p}`);
            });
            // Ohm's law on each line of the service cable: origin − main board = Z · I.
            const service = frame.subBoards[0]!.feeder.lineImpedances;
            installation.main.phases.forEach((p, k) => {
              const z = service[k]!;
              const i0 = { re: main.lineRe[k]!, im: main.lineIm[k]! };
              expectComplexClose(
                { re: origin.busRe[k]! - main.busRe[k]!, im: origin.busIm[k]! - main.busIm[k]! },
                { re: z.re * i0.re - z.im * i0.im, im: z.re * i0.im + z.im * i0.re },
                { rel: REL, abs: REL * vMax },
                `interval ${i} service cable ${p}`,
              );
            });
          });
        },
      ),
      { numRuns: 25 },
    );
  });
});
