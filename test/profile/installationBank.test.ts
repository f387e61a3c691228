/**
 * A bank simulated on a sub-board of an installation: every interval, with the steps the controller
 * had connected, equals the general installation solve of the same loads plus that many kvar of
 * capacitors (constant impedance, star to the neutral) on that board — every board's line currents
 * and phase voltages to 1e-9. The invented Osier Mill studios with steps written in profile.bank.steps.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  driverColumns,
  normaliseInstallation,
  parseInstallation,
  planDrivers,
  planInstallationColumns,
  readBoardText,
  solveInstallationNetwork,
  studyInstallationProfile,
  terminalVoltage,
  type Installation,
} from '@trivar/core';
import { scaleLoads, starBank, withLoadOn } from '../support/installationLoads.js';

const spec = parseInstallation(readBoardText(readFileSync('examples/osier-mill-studios.yaml', 'utf8')));
const { installation } = normaliseInstallation(spec);
const loadNames = [installation.main, ...installation.subBoards].flatMap((b) => b.loads.map((l) => `${b.name}/${l.name}`));
const COUNT = 40;
const STEP_MS = 15 * 60_000;

/** Deterministic invented scales: a slow swing with a ripple, per load. */
const scales = loadNames.map((_, l) => Float64Array.from({ length: COUNT }, (_, i) => Math.max(0, 0.55 + 0.45 * Math.sin((i + 3 * l) / 4) + 0.1 * Math.cos(7 * i + l))));

function withLoadsAt(i: number, bankKvar: number, bankBoard: number): Installation {
  return withLoadOn(scaleLoads(installation, (k) => scales[k]![i]!), bankBoard, starBank(installation, bankKvar));
}

describe('a bank on a board of an installation', () => {
  it.each([
    ['Pottery', 1],
    ['Mill intake', 0],
  ] as const)('on %s: each interval equals the general solve with the connected kvar on that board', (name, boardNumber) => {
    const plan = planInstallationColumns(installation, ['time', ...loadNames.map((n) => `${n} [x]`)]);
    const study = studyInstallationProfile(
      {
        installation,
        loads: plan.board.loads,
        loadBoards: plan.loadBoards,
        drivers: planDrivers(plan),
        columns: driverColumns(plan, scales, COUNT),
        utcMs: Float64Array.from({ length: COUNT }, (_, i) => Date.UTC(2026, 2, 10) + i * STEP_MS),
        intervalMs: STEP_MS,
        profile: { bank: { targetPf: 0.99, steps: [{ kvar: 1.5 }, { kvar: 1.5 }, { kvar: 1.5 }, { kvar: 1.5 }], delaySeconds: 0, reconnectSeconds: 0 } },
      },
      { bank: true, bankBoard: name },
    );
    const connected = study.connectedKvar!;
    // The controller did switch: more than one connected total over the run.
    expect(new Set(connected).size).toBeGreaterThan(1);
    expect(study.result.bank!.board).toBe(name);
    for (let i = 0; i < COUNT; i++) {
      const general = solveInstallationNetwork(withLoadsAt(i, connected[i]!, boardNumber));
      general.boards.forEach((g, b) => {
        const f = study.after![b]!;
        installation.main.phases.forEach((p, k) => {
          const i0 = Math.hypot(g.lineCurrents[k]!.re, g.lineCurrents[k]!.im);
          expect(Math.abs(f.lineA[k]![i]! - i0), `interval ${i} ${g.board.name} line ${p}`).toBeLessThanOrEqual(1e-9 * Math.max(1, i0));
          const v = terminalVoltage(g, p)!;
          const n = terminalVoltage(g, 'N')!;
          const v0 = Math.hypot(v.re - n.re, v.im - n.im);
          expect(Math.abs(f.phaseV[k]![i]! - v0), `interval ${i} ${g.board.name} voltage ${p}`).toBeLessThanOrEqual(1e-9 * v0);
        });
      });
    }
  });
});
