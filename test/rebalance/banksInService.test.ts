/**
 * Rebalancing an installation whose file lists capacitor banks in service (harmonics.banks): the banks
 * are loads of their boards in every solve, as `trivar solve` has them, so the "now" figures are the
 * solve's; nothing of a bank moves or counts as a circuit; interval data leaves a bank as rated in
 * every condition; the report says which banks were in service.
 */
import { describe, expect, it } from 'vitest';
import {
  conditionsFromInstallationIntervals,
  driverColumns,
  planDrivers,
  planInstallationColumns,
  rebalanceInstallation,
  solveInstallationModel,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';
import { runTrivar } from '../cli/runTrivar.js';
import { ferrybankInService, ferrybankSpec } from '../support/ferrybankInService.js';

const spec = ferrybankSpec;
const installation = ferrybankInService;

describe('rebalance with the banks the file lists in service', () => {
  const report = rebalanceInstallation(installation, {}, { moveTable: false });
  const solved = solveInstallationModel(installation);

  it('the "now" figures at every incomer are those of trivar solve (banks included), to 1e-9', () => {
    for (const c of report.conditions) {
      const b = solved.boards.find((x) => x.name === c.board)!;
      c.solved.before.lineA.forEach((a, k) => expectClose(a, b.result.phases[k]!.current.magnitude, { rel: 1e-9, abs: 1e-9 }, `${c.board} line ${k}`));
    }
    // Ferrybank's main incomer by hand from the solve report: 226.8 / 204.9 / 205.2 A, neutral 27.4 A.
    const main = report.conditions.find((c) => c.board === 'Main board')!.solved.before;
    expect(main.lineA.map((a) => a.toFixed(1))).toEqual(['226.8', '204.9', '205.2']);
    expect(main.neutralA!.toFixed(1)).toBe('27.4');
  });

  it('no part of a bank is a circuit: the count is the file’s circuits, and no move names a bank', () => {
    const fileCircuits = spec.boards.reduce((n, b) => n + b.loads.length, 0);
    expect(fileCircuits).toBe(7);
    expect(report.search.circuits).toBe(fileCircuits);
    expect(report.moves.every((m) => !m.name.startsWith("bank "))).toBe(true);
  });

  it('the report names the banks in service', () => {
    const note = report.notes.find((n) => n.startsWith('Capacitor banks in service in every solve'))!;
    expect(note).toContain('Machine shop 120 kvar rated (every step: 30+30+60 kvar; 440 V units)');
    expect(note).toContain('Finishing shop 50 kvar rated (every step: 25+25 kvar; 440 V units)');
  });

  it('the CLI solves the same: its table shows the solve’s main incomer', () => {
    const out = runTrivar(['rebalance', 'examples/ferrybank-joinery.yaml']).stdout;
    expect(out).toMatch(/Main board +now +226\.8 +204\.9 +205\.2 +27\.4/);
    expect(out).toContain('Capacitor banks in service in every solve');
  });
});

describe('interval data: a bank in service has no column and stays as rated in every condition', () => {
  const header = ['time', 'Dust extraction [x]', 'Office and canteen [x]'];
  const N = 8;
  const values = [Float64Array.from({ length: N }, (_, i) => (i < 4 ? 0.2 : 0.9)), Float64Array.from({ length: N }, (_, i) => 0.5 + 0.05 * i)];
  const utcMs = Float64Array.from({ length: N }, (_, i) => Date.UTC(2026, 2, 2) + i * 3_600_000);
  const plan = planInstallationColumns(installation, header);
  const picked = conditionsFromInstallationIntervals(installation, plan, planDrivers(plan), driverColumns(plan, values, N), utcMs, 3_600_000);
  const boards = [picked.installation.main, ...picked.installation.subBoards];
  const flat = boards.flatMap((b, bi) => b.loads.map((l, k) => ({ board: bi, k, load: l })));

  it('every bank part has factor 1 in every condition; the metered loads carry their data', () => {
    const parts = new Set((installation.banksInService ?? []).flatMap((bank) => bank.loads.map((k) => `${bank.boardIndex}:${k}`)));
    expect(parts.size).toBe(5); // three steps on the machine shop, two on the finishing shop
    expect(picked.conditions.length).toBeGreaterThan(1);
    for (const c of picked.conditions)
      flat.forEach(({ board, k, load }, i) => {
        if (parts.has(`${board}:${k}`)) {
          expect(load.name).toMatch(/^bank step \d$/);
          expect(c.factors[i]).toEqual({ re: 1, im: 0 });
        }
      });
    // The dust extraction follows its column: 0.2 or 0.9 of its rating in the conditions picked.
    const dust = flat.findIndex((x) => x.load.name === 'Dust extraction');
    const seen = new Set(picked.conditions.map((c) => c.factors[dust]!.re.toFixed(2)));
    for (const x of seen) expect(['0.20', '0.90']).toContain(x);
  });
});
