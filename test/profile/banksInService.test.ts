/**
 * Profiles of an installation whose file lists capacitor banks in service (harmonics.banks): each bank
 * is in every interval (and every scenario) as listed, whatever the data or --unlisted-at-rating says, as
 * `trivar solve` has it; no column or scenario may drive a bank part; a bank studied on a board takes the
 * place of the file's bank there. Checked against the general installation solve, interval by interval.
 */
import { writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  driverColumns,
  planDrivers,
  planInstallationColumns,
  solveInstallationModel,
  studyInstallationProfile,
  studyInstallationScenarios,
  InputError,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';
import { runTrivar } from '../cli/runTrivar.js';
import { ferrybankInService, ferrybankSpec } from '../support/ferrybankInService.js';

const spec = ferrybankSpec;
const installation = ferrybankInService;
const fileLoads = spec.boards.flatMap((b) => b.loads.map((l) => l.name));

describe('interval data with every circuit at its rating', () => {
  // Seven circuits of the file, each at x = 1 in all four intervals: every interval is the file as written.
  const header = ['time', ...fileLoads.map((n) => `${n} [x]`)];
  const COUNT = 4;
  const values = fileLoads.map(() => new Float64Array(COUNT).fill(1));
  const utcMs = Float64Array.from({ length: COUNT }, (_, i) => Date.UTC(2026, 2, 2) + i * 3_600_000);
  const plan = planInstallationColumns(installation, header);
  const study = studyInstallationProfile({
    installation,
    loads: plan.board.loads,
    loadBoards: plan.loadBoards,
    drivers: planDrivers(plan),
    columns: driverColumns(plan, values, COUNT),
    utcMs,
    intervalMs: 3_600_000,
  });
  const solved = solveInstallationModel(installation);

  it('the five bank parts are held in service, not counted among the loads with no column', () => {
    expect(plan.inService).toHaveLength(5);
    expect(plan.inService!.map((l) => plan.board.loads[l]!.name)).toEqual([
      'Machine shop/bank step 1',
      'Machine shop/bank step 2',
      'Machine shop/bank step 3',
      'Finishing shop/bank step 1',
      'Finishing shop/bank step 2',
    ]);
    expect(plan.undriven).toEqual([]);
  });

  it('every interval at every board is the solve of the file with its banks (line and neutral currents to 1e-9)', () => {
    study.before.forEach((figures, b) => {
      const r = solved.boards[b]!.result;
      for (let i = 0; i < COUNT; i++) {
        r.phases.forEach((p, k) => expectClose(figures.lineA[k]![i]!, p.current.magnitude, { rel: 1e-9, abs: 1e-9 }, `${r.board.name} line ${k} interval ${i}`));
        expectClose(figures.neutralA[i]!, r.neutral?.current.magnitude ?? 0, { rel: 1e-9, abs: 1e-9 }, `${r.board.name} neutral`);
      }
    });
    // Ferrybank's main incomer as trivar solve prints it: 226.8 / 204.9 / 205.2 A.
    expect([0, 1, 2].map((k) => study.before[0]!.lineA[k]![0]!.toFixed(1))).toEqual(['226.8', '204.9', '205.2']);
  });

  it('the result names the banks in service', () => {
    expect(study.result.banksInService.map((b) => b.board)).toEqual(['Machine shop', 'Finishing shop']);
    expect(study.result.replacedBank).toBeNull();
  });
});

describe('what may not drive a bank part', () => {
  it('a column or group naming a bank part is refused, naming the header cell or the group member', () => {
    // By its bare name too ("bank step 1" is a part on two boards): not offered as a choice between them.
    for (const name of ['bank step 1', 'Finishing shop/bank step 2'])
      expect(() => planInstallationColumns(installation, ['time', `${name} [x]`])).toThrow(/part of a capacitor bank the file lists in service/);
    expect(() => planInstallationColumns(installation, ['time', 'shops [x]'], { groups: { shops: ['Planer', 'Machine shop/bank step 3'] } })).toThrow(/profile\.groups\.shops\[1\]/);
    const header = ['time', 'Machine shop/bank step 1 [x]'];
    expect(() => planInstallationColumns(installation, header)).toThrow(InputError);
    try {
      planInstallationColumns(installation, header);
    } catch (e) {
      const issue = (e as InputError).issues[0]!;
      expect(issue.path).toBe('header, column 2 ("Machine shop/bank step 1 [x]")');
      expect(issue.message).toContain('"Machine shop/bank step 1" is, and stays in service in every interval as listed');
    }
  });

  it('scenarios leave the banks as listed (a scenario with everything else off still carries them) and may not scale them', () => {
    const night = studyInstallationScenarios(installation, { scenarios: [{ name: 'night', hours: 10, loads: {}, others: 0 }] } as never);
    // Only the banks on: the machine shop's feeder carries its bank's current alone, capacitive.
    const shop = night.boards.find((b) => b.board === 'Machine shop')!;
    expect(Math.min(...shop.scenarios[0]!.lineA)).toBeGreaterThan(100);
    expect(shop.scenarios[0]!.kvar).toBeLessThan(-90);
    // The same state solved in general: the file with every circuit taken out, the banks left in.
    const { banksInService: records, ...plain } = installation;
    const banksOnly = solveInstallationModel({ ...plain, main: { ...installation.main, loads: [] }, subBoards: installation.subBoards.map((b, i) => ({ ...b, loads: b.loads.filter((_, k) => records!.some((x) => x.boardIndex === i + 1 && x.loads.includes(k))) })) });
    shop.scenarios[0]!.lineA.forEach((a, k) => expectClose(a, banksOnly.boards[1]!.result.phases[k]!.current.magnitude, { rel: 1e-9, abs: 1e-9 }, `line ${k}`));
    expect(night.banksInService).toHaveLength(2);
    expect(() => studyInstallationScenarios(installation, { scenarios: [{ name: 'x', hours: 1, loads: { 'Machine shop/bank step 2': 0.5 } }] } as never)).toThrow(/part of a capacitor bank the file lists in service/);
    // By the bare name two boards' banks share, too: refused as a bank part, not offered as a choice.
    expect(() => studyInstallationScenarios(installation, { scenarios: [{ name: 'x', hours: 1, loads: { 'bank step 1': 0.5 } }] } as never)).toThrow(/"bank step 1" is, and stays in service in every scenario as listed/);
  });
});

describe('trivar profile', () => {
  it('prints the banks in service, and a bank studied on the machine shop takes the place of the file’s bank there', () => {
    const csv = ['time,Dust extraction [x],Office and canteen [x]', '2026-03-02 00:00,0.2,0.5', '2026-03-02 00:15,0.9,0.9', '2026-03-02 00:30,0.9,0.9', '2026-03-02 00:45,0.2,0.5'].join('\n');
    const file = `${process.env.TMPDIR ?? '/tmp'}/trivar-banks-in-service-${process.pid}.csv`;
    writeFileSync(file, `${csv}\n`);
    const plain = runTrivar(['profile', 'examples/ferrybank-joinery.yaml', '--data', file]).stdout.replace(/\s+/g, ' ');
    expect(plain).toContain('capacitor banks in service in every interval, as the file lists them under harmonics.banks');
    expect(plain).toContain('Machine shop 120 kvar rated (every step: 30+30+60 kvar; 440 V units); Finishing shop 50 kvar rated');
    const banked = runTrivar(['profile', 'examples/ferrybank-joinery.yaml', '--data', file, '--bank', '--board', 'Machine shop']).stdout.replace(/\s+/g, ' ');
    expect(banked).toContain("the file's bank on Machine shop, 120 kvar rated (every step: 30+30+60 kvar; 440 V units), is left out: the bank studied takes its place");
    expect(banked).toMatch(/capacitor banks in service in every interval, [^:]+: Finishing shop 50 kvar rated/);
    expect(banked).not.toMatch(/in service in every interval, [^:]+: Machine shop/);
  });
});
