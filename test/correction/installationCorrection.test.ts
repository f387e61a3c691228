/**
 * Correction on a board of an installation: the bank sized on a sub-board,
 * checked against an independent path (the installation file rewritten with the
 * bank as ordinary capacitive loads, solved by solveInstallation), its effect on
 * the boards upstream (asserted figures, and the direction a bank must move
 * them), power balance at every board after correction, and bad input.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  boardOfInstallation,
  installationOf as placeOf,
  scaleBoardLoads,
  correctBoard,
  correctInstallation,
  compareInstallationCorrections,
  InputError,
  normaliseInstallation,
  NumericalError,
  parseInstallation,
  readBoardText,
  solveInstallation,
  type EquipmentGroup,
  type InstallationResult,
  type InstallationSpec,
} from '@trivar/core';
import { cAbs, cPolarDeg, cSub, cSum, cPower, c } from '../support/complexMath.js';
import { expectClose } from '../support/tolerance.js';

const fileOf = (name: string): InstallationSpec => parseInstallation(readBoardText(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8')));
const tannery = fileOf('tannery-lane-works.yaml');
const riser = fileOf('maple-court-riser.yaml');
const installationOf = (spec: InstallationSpec) => normaliseInstallation(spec).installation;

/** The installation file with every equipment branch written as an ordinary load: kvar at its nominal voltage, constant impedance. */
function withBankAsLoads(spec: InstallationSpec, board: string, equipment: readonly EquipmentGroup[]): InstallationSpec {
  const loads = equipment.flatMap((g) =>
    g.branches
      .filter((b) => b.susceptanceS !== 0)
      .map((b) => ({
        name: `${g.name} ${b.branch}`,
        connection: `${b.from}-${b.to}` as const,
        kW: 0,
        // A susceptance B gives B·V² of capacitive (negative, load convention) vars at V.
        kvar: (-b.susceptanceS * b.vNominal ** 2) / 1000,
        model: 'constant-impedance' as const,
      })),
  );
  return { ...spec, boards: spec.boards.map((b) => (b.name === board ? { ...b, loads: [...b.loads, ...loads] } : b)) } as InstallationSpec;
}

/** Every board's phase voltages, line currents and neutral current agree to 1e-6 relative (floor: 1e-9 of the scale). */
function expectSameInstallation(actual: InstallationResult, expected: InstallationResult): void {
  expect(actual.boards.map((b) => b.name)).toEqual(expected.boards.map((b) => b.name));
  const phasor = (p: { magnitude: number; angleDeg: number }) => cPolarDeg(p.magnitude, p.angleDeg);
  actual.boards.forEach((b, i) => {
    const e = expected.boards[i]!.result;
    b.result.phases.forEach((p, k) => {
      const q = e.phases[k]!;
      expect(cAbs(cSub(phasor(p.voltage), phasor(q.voltage)))).toBeLessThanOrEqual(1e-6 * q.voltage.magnitude + 1e-9 * 230);
      expect(cAbs(cSub(phasor(p.current), phasor(q.current)))).toBeLessThanOrEqual(1e-6 * q.current.magnitude + 1e-9 * 100);
    });
    if (e.neutral) expect(cAbs(cSub(phasor(b.result.neutral!.current), phasor(e.neutral.current)))).toBeLessThanOrEqual(1e-6 * e.neutral.current.magnitude + 1e-9 * 100);
  });
}

describe('a bank on a sub-board, checked by an independent path', () => {
  const cases = [
    { name: 'Tannery Lane, star bank on the press-shop board', spec: tannery, board: 'Press shop', study: { arrangement: 'star-bank' } },
    { name: 'Tannery Lane, delta bank on the press-shop board at 0.98', spec: tannery, board: 'Press shop', study: { arrangement: 'delta-bank', target: { pf: 0.98 } } },
    { name: 'Maple Court, star bank on Floor 2 at 0.99', spec: riser, board: 'Floor 2', study: { arrangement: 'star-bank', target: { pf: 0.99 } } },
  ];
  for (const k of cases)
    it(`${k.name}: the corrected installation solved as a file with capacitive loads agrees to 1e-6`, () => {
      const corrected = correctInstallation(installationOf(k.spec), k.study, { board: k.board });
      expect(corrected.board).toBe(k.board);
      expect(corrected.report.selection).not.toBeNull();
      const independent = solveInstallation(withBankAsLoads(k.spec, k.board, corrected.report.verification.equipment));
      expectSameInstallation(corrected.effect.after, independent);
      // The study's own after (its board only) is the same state as the installation's.
      const own = corrected.effect.after.boards.find((b) => b.name === k.board)!.result;
      own.phases.forEach((p, i) => expectClose(p.current.magnitude, corrected.report.verification.after.phases[i]!.current.magnitude, { rel: 1e-9, abs: 1e-9 }));
      // And the before is the installation as the file has it.
      expectSameInstallation(corrected.effect.before, solveInstallation(k.spec));
    });
});

describe('the effect of a press-shop bank on the boards upstream (Tannery Lane, star bank, PF ≥ 0.95 per line)', () => {
  const corrected = correctInstallation(installationOf(tannery), { arrangement: 'star-bank' }, { board: 'Press shop' });
  const main = corrected.effect.boards.find((b) => b.name === 'Main switchboard')!;
  const press = corrected.effect.boards.find((b) => b.name === 'Press shop')!;
  const offices = corrected.effect.boards.find((b) => b.name === 'Offices')!;
  const t = { rel: 0, abs: 5e-4 };

  it('meets the target at the press-shop board, and says where the equipment is', () => {
    expect(corrected.report.status).toBe('meets-target');
    expect(press.hasEquipment).toBe(true);
    expect(main.hasEquipment || offices.hasEquipment).toBe(false);
  });
  it('the main incomer PF improves (0.807 → 0.973) and the service feeder current falls (112.7 → 94.7 A)', () => {
    expectClose(main.vectorPf!.before, 0.8068, t);
    expectClose(main.vectorPf!.after, 0.9733, t);
    expectClose(main.feeder.largestLineCurrentA.before, 112.742, { rel: 0, abs: 5e-3 });
    expectClose(main.feeder.largestLineCurrentA.after, 94.722, { rel: 0, abs: 5e-3 });
    expect(main.feeder.lossesKW.after).toBeLessThan(main.feeder.lossesKW.before);
  });
  it('the press-shop feeder carries less (97.3 → 77.6 A) and its board voltage rises', () => {
    expectClose(press.feeder.largestLineCurrentA.before, 97.316, { rel: 0, abs: 5e-3 });
    expectClose(press.feeder.largestLineCurrentA.after, 77.631, { rel: 0, abs: 5e-3 });
    expect(press.lowestVoltagePercent.after).toBeGreaterThan(press.lowestVoltagePercent.before);
  });
  it('the office board beside it sees only the higher voltage: its constant-power loads keep their PF', () => {
    expectClose(offices.vectorPf!.after, offices.vectorPf!.before, { rel: 1e-9, abs: 0 });
    expect(offices.lowestVoltagePercent.after).toBeGreaterThan(offices.lowestVoltagePercent.before);
  });
  it('the supply delivers less reactive power by what the bank gives plus the change in reactive losses', () => {
    const s = corrected.effect.supply;
    expectClose(s.pf.after, 0.9709, t);
    expectClose(s.kvar.before, 44.797, { rel: 0, abs: 5e-3 });
    expectClose(s.kvar.after, 14.741, { rel: 0, abs: 5e-3 });
    // Σ loads (the bank at its solved output, capacitive) + reactive losses = what the source delivers.
    const after = corrected.effect.after;
    expectClose(after.totals.sourceKvar, after.totals.loadKvar + after.boards.reduce((q, b) => q + b.result.losses.totalKvar, 0), { rel: 1e-9, abs: 1e-9 });
    expectClose(after.totals.loadKvar - corrected.effect.before.totals.loadKvar, -corrected.report.verification.branches.reduce((q, b) => q + b.kvarAtAppliedV, 0), { rel: 1e-9, abs: 1e-9 });
  });
  it('the transformer is reported at the main board only; a sub-board reports its incomer against its feeder rating', () => {
    const r = corrected.effect.after.boards;
    expect(r[0]!.result.transformer).not.toBeNull();
    for (const b of r.slice(1)) expect(b.result.transformer).toBeNull();
    const pressAfter = r.find((b) => b.name === 'Press shop')!.result;
    expect(pressAfter.incomer?.fedFrom).toBe('Main switchboard');
    expect(pressAfter.incomer?.ratingA).toBe(150);
    expectClose(pressAfter.incomer!.loadingPercent!, (100 * 77.6306) / 150, { rel: 0, abs: 1e-3 });
    expect(r[0]!.result.incomer).toBeNull();
  });
});

describe('the short-circuit power at a sub-board counts every impedance back to the source', () => {
  it('S_sc = 3·V²/|Z_source + Z_service + Z_feeder| (hand-computed impedances)', () => {
    const spec = parseInstallation({
      name: 'hand check',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.01, x: 0.04 } },
      boards: [
        { name: 'Main', feeder: { line: { lengthM: 100, rOhmPerKm: 0.2, xOhmPerKm: 0.08 }, neutral: { lengthM: 100, rOhmPerKm: 0.2, xOhmPerKm: 0.08 } }, loads: [] },
        { name: 'Sub', fedFrom: 'Main', feeder: { line: { lengthM: 50, rOhmPerKm: 0.6, xOhmPerKm: 0.08 }, neutral: { lengthM: 50, rOhmPerKm: 0.6, xOhmPerKm: 0.08 } }, loads: [{ name: 'motor', connection: 'ABC-delta', kW: 20, pf: 0.75 }] },
      ],
    });
    const corrected = correctInstallation(installationOf(spec), { arrangement: 'delta-bank' }, { board: 'Sub' });
    // Z = (0.01 + 0.02 + 0.03) + j(0.04 + 0.008 + 0.004) = 0.06 + j0.052 Ω per line.
    const expected = (3 * (400 / Math.sqrt(3)) ** 2) / Math.hypot(0.06, 0.052) / 1000;
    expectClose(corrected.report.verification.voltageRise.shortCircuitKVA!, expected, { rel: 1e-12, abs: 0 });
  });
});

describe('power balance at every board after correction (property)', () => {
  const boards = [
    { spec: tannery, board: 'Press shop' },
    { spec: tannery, board: 'Main switchboard' },
    { spec: riser, board: 'Floor 3' },
    { spec: riser, board: 'Plant room' },
  ];
  it('incomer power = own loads (bank included) + what the feeders it supplies take, at every board', () => {
    fc.assert(
      fc.property(fc.constantFrom(...boards), fc.constantFrom('star-bank', 'delta-bank'), fc.double({ min: 0.9, max: 0.99, noNaN: true }), ({ spec, board }, arrangement, pf) => {
        const { effect } = correctInstallation(installationOf(spec), { arrangement, target: { pf } }, { board });
        for (const r of [effect.before, effect.after]) {
          const byName = new Map(r.boards.map((b) => [b.name, b]));
          for (const b of r.boards) {
            const incomer = cSum(b.result.phases.map((p) => cPower(cPolarDeg(p.voltage.magnitude, p.voltage.angleDeg), cPolarDeg(p.current.magnitude, p.current.angleDeg))));
            const children = r.boards.filter((x) => x.fedFrom === b.name).map((x) => c(x.result.source.kW * 1000, x.result.source.kvar * 1000));
            const own = c(b.result.totals.kW * 1000, b.result.totals.kvar * 1000);
            const scale = cAbs(incomer) + 1;
            expect(cAbs(cSub(incomer, cSum([own, ...children])))).toBeLessThanOrEqual(1e-9 * scale);
            expect(byName.get(b.name)).toBe(b);
          }
        }
      }),
      { numRuns: 6 },
    );
  });
});

describe('correction on an installation: bad input', () => {
  it('an unknown board names the option and every board there is', () => {
    try {
      correctInstallation(installationOf(tannery), { arrangement: 'star-bank' }, { board: 'Paint shop' });
      expect.fail('expected an InputError');
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      const issue = (error as InputError).issues[0]!;
      expect(issue.code).toBe('unknown_board');
      expect(issue.path).toBe('board');
      expect(issue.message).toBe('board: expected a board of this installation: "Main switchboard", "Press shop", "Offices" (received "Paint shop")');
    }
    expect(() => compareInstallationCorrections(installationOf(tannery), {}, { board: 'paint shop' })).toThrow(InputError);
  });
  it('the default is the main board', () => {
    const c0 = correctInstallation(installationOf(tannery), { arrangement: 'delta-bank' });
    expect(c0.board).toBe('Main switchboard');
    expect(c0.boardIndex).toBe(0);
    expect(c0.effect.boards[0]!.hasEquipment).toBe(true);
  });
});

describe('correctBoard refuses a collapsed board (the library, not only the CLI)', () => {
  const collapsed = {
    name: 'tiny transformer',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 0.1, impedancePercent: 4, xOverR: 3 } },
    boards: [{ name: 'Main', loads: [] }, { name: 'Shed', fedFrom: 'Main', feeder: { lengthM: 10, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: 'heater', connection: 'A-N', kW: 50, pf: 1, model: 'constant-impedance' }] }],
  };
  it('throws NumericalError (reason collapsed) with the CLI wording, naming the board', () => {
    const installation = installationOf(parseInstallation(collapsed));
    for (const run of [() => correctBoard(boardOfInstallation(installation, 1), { arrangement: 'delta-bank' }), () => correctInstallation(installation, { arrangement: 'star-bank' }, { board: 'Shed' })]) {
      try {
        run();
        expect.fail('expected a NumericalError');
      } catch (error) {
        expect(error).toBeInstanceOf(NumericalError);
        expect((error as NumericalError).reason).toBe('collapsed');
        expect((error as Error).message).toMatch(/^no viable operating point: the supply cannot carry these loads: Main: the board voltage has collapsed to .*A-N \d+\.\d %/);
      }
    }
  });
});

describe('light load on a board that feeds others scales everything its incomer carries', () => {
  it('a sub-board: its own loads and those of every board below it, nothing beside or above it', () => {
    const installation = installationOf(riser);
    const floor2 = boardOfInstallation(installation, installation.subBoards.findIndex((b) => b.name === 'Floor 2') + 1);
    const light = placeOf(scaleBoardLoads(floor2, { fraction: 0.5 })).installation;
    const kW = (loads: readonly { branches: readonly { sNominal: { re: number } }[] }[]) => loads.reduce((s, l) => s + l.branches.reduce((t, b) => t + b.sNominal.re, 0), 0);
    installation.subBoards.forEach((sb, i) => {
      const ratio = kW(light.subBoards[i]!.loads) / kW(sb.loads);
      expectClose(ratio, ['Floor 2', 'Floor 3', 'Floor 4'].includes(sb.name) ? 0.5 : 1, { rel: 1e-12, abs: 0 });
    });
    expectClose(kW(light.main.loads) / kW(installation.main.loads), 1, { rel: 1e-12, abs: 0 });
  });
  it('the main board at no load: the main incomer carries no active power (before the change it carried the other boards)', () => {
    const c = correctInstallation(installationOf(tannery), { arrangement: 'star-bank', lightLoad: { fraction: 0 } }, { board: 'Main switchboard' });
    const after = c.report.verification.lightLoad!.after;
    const kW = after.phases.reduce((s, p) => s + p.kW, 0);
    expect(Math.abs(kW)).toBeLessThan(1e-6);
  });
});

describe('voltage band: a bank on a far board lifts a load back inside the band', () => {
  // Invented: a barn 380 m from the farmhouse on 25 mm² copper, a mill motor at PF 0.7.
  const spec = parseInstallation({
    name: 'far barn',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
    boards: [
      { name: 'Farmhouse', loads: [{ name: 'house', connection: 'A-N', kW: 3, pf: 0.98 }] },
      {
        name: 'Barn',
        fedFrom: 'Farmhouse',
        feeder: { lengthM: 380, line: { mm2: 25, ratingA: 100 }, neutral: { mm2: 25 } },
        loads: [
          { name: 'mill motor', connection: 'ABC-delta', kW: 30, pf: 0.7 },
          { name: 'lights', connection: 'B-N', kW: 1, pf: 0.95 },
        ],
      },
    ],
  });
  it('the lights go from below the band (89.5 % of 230 V) to inside it (91.5 %); the effect counts 1 → 0', () => {
    const c = correctInstallation(installationOf(spec), { arrangement: 'delta-bank', target: { pf: 0.98 } }, { board: 'Barn' });
    const barn = c.effect.boards.find((b) => b.name === 'Barn')!;
    expect(barn.loadsOutsideVoltageBand).toEqual({ before: 1, after: 0, change: -1 });
    expectClose(barn.lowestVoltagePercent.before, 89.484, { rel: 0, abs: 5e-3 });
    expectClose(barn.lowestVoltagePercent.after, 91.517, { rel: 0, abs: 5e-3 });
    // The counts are the boards' own undervoltage warnings, before and after.
    const warned = (r: InstallationResult) => r.boards.find((b) => b.name === 'Barn')!.result.warnings.filter((w) => w.code === 'undervoltage').length;
    expect([warned(c.effect.before), warned(c.effect.after)]).toEqual([1, 0]);
    expect(c.effect.boards.find((b) => b.name === 'Farmhouse')!.loadsOutsideVoltageBand).toEqual({ before: 0, after: 0, change: 0 });
  });
});
describe('the effect on a board already outside its band', () => {
  it('counts the board\'s own circuits outside its band, not the bank added to it', () => {
    const spec = parseInstallation({
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
      boards: [
        { name: 'Main', feeder: { lengthM: 30, line: { mm2: 50 }, neutral: { mm2: 50 } }, loads: [{ name: 'm1', connection: 'ABC-delta', kW: 20, pf: 0.8 }] },
        {
          name: 'Sub',
          fedFrom: 'Main',
          voltageLimits: { underPercent: 2, overPercent: 2 },
          feeder: { lengthM: 50, line: { mm2: 16 }, neutral: { mm2: 16 } },
          loads: [
            { name: 's1', connection: 'ABC-star', kW: 9, pf: 0.9 },
            { name: 'a', connection: 'A-N', kW: 3 },
          ],
        },
      ],
    });
    const corrected = correctInstallation(normaliseInstallation(spec).installation, { arrangement: 'star-bank', target: { pf: 0.99 } }, { board: 'Sub' });
    const sub = corrected.effect.boards.find((b) => b.name === 'Sub')!;
    const after = corrected.report.verification.after;
    const added = after.loads.filter((l) => l.origin === 'added').map((l) => `"${l.name}"`);
    const band = after.warnings.filter((w) => w.code === 'overvoltage' || w.code === 'undervoltage');
    const ofAdded = band.filter((w) => added.some((name) => w.message.includes(name)));
    // The bank's branches sit below the Sub board's tight band too (so the count must leave them out) …
    expect(ofAdded.length).toBeGreaterThan(0);
    // … and the count is the board's own circuits' warnings only, never more than its four branches.
    expect(sub.loadsOutsideVoltageBand.after).toBe(band.length - ofAdded.length);
    expect(sub.loadsOutsideVoltageBand.before).toBeGreaterThan(0);
    expect(sub.loadsOutsideVoltageBand.after).toBeLessThanOrEqual(4);
  });
});


describe('what the equipment makes worse on the boards it is fed through', () => {
  // An invented fabrication shop: two spot welders across line pairs on a sub-board. A star bank
  // correcting each line's PF puts unequal capacitance on the three lines, so its capacitor currents do
  // not cancel in the neutral: the neutral of the weld bay and of the main board's incomer both rise.
  const spec = {
    name: 'Fabrication shop',
    supply: { voltage: '230/400', frequencyHz: 50, transformer: { kVA: 400, impedancePercent: 4.5, xOverR: 5 } },
    boards: [
      { name: 'Main', feeder: { lengthM: 15, line: { mm2: 240 }, neutral: { mm2: 240 } }, loads: [{ name: 'Yard lights', connection: 'A-N', kW: 3, pf: 0.9 }] },
      {
        name: 'Weld bay',
        fedFrom: 'Main',
        feeder: { lengthM: 70, line: { mm2: 95 }, neutral: { mm2: 50 } },
        loads: [
          { name: 'Spot welder 1', connection: 'A-B', kW: 30, pf: 0.55 },
          { name: 'Spot welder 2', connection: 'B-C', kW: 18, pf: 0.6 },
        ],
      },
    ],
  } as unknown as InstallationSpec;
  const corrected = correctInstallation(installationOf(parseInstallation(spec)), { arrangement: 'star-bank' }, { board: 'Weld bay' });
  const main = corrected.effect.boards.find((b) => b.name === 'Main')!;

  it('the main board incomer neutral rise is a warning of the effect, with its figures', () => {
    expect(main.neutralCurrentA!.after - main.neutralCurrentA!.before).toBeGreaterThan(Math.max(0.1 * main.neutralCurrentA!.before, 1));
    const w = corrected.effect.otherBoards.find((x) => x.board === 'Main' && x.code === 'neutral-worse');
    expect(w?.message).toContain(`from ${main.neutralCurrentA!.before.toFixed(1)} A to ${main.neutralCurrentA!.after.toFixed(1)} A`);
    // The equipment's own board is the verification's business, not repeated here.
    expect(corrected.effect.otherBoards.some((x) => x.board === 'Weld bay')).toBe(false);
    expect(corrected.report.verification.warnings.some((x) => x.code === 'neutral-worse')).toBe(true);
  });
});

describe('an open-delta supply: each unit’s loading before and after the equipment', () => {
  it('reads the main board’s source units in both solves, the overloaded unit relieved', () => {
    // An invented farm on an open delta, the smaller unit overloaded by a barn of motors.
    const spec = parseInstallation({
      name: 'Open-delta farm',
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 240 }, frequencyHz: 60, openDelta: { 'A-B': { kVA: 50, impedancePercent: 2.5, xOverR: 2 }, 'B-C': { kVA: 25, impedancePercent: 2.8, xOverR: 2 } } },
      boards: [
        { name: 'Service', loads: [{ name: 'Dryer fan', connection: 'ABC-delta', kW: 15, pf: 0.85 }, { name: 'Welder', connection: 'A-B', kW: 8, pf: 0.7 }] },
        {
          name: 'Barn',
          fedFrom: 'Service',
          feeder: { lengthFt: 400, line: { awg: '2', material: 'aluminum' } },
          loads: [{ name: 'Vacuum pump', connection: 'ABC-delta', kW: 7.5, pf: 0.82 }, { name: 'Water heater', connection: 'B-C', kW: 6 }, { name: 'Cleaner', connection: 'C-A', kW: 3, pf: 0.75 }],
        },
      ],
    } as unknown as InstallationSpec);
    const corrected = correctInstallation(installationOf(spec), { arrangement: 'delta-bank' }, { board: 'Barn' });
    const units = corrected.effect.supply.sourceUnitLoadingPercent!;
    const before = corrected.effect.before.boards[0]!.result.sourceUnits!;
    const after = corrected.effect.after.boards[0]!.result.sourceUnits!;
    expect(units.map((u) => u.winding)).toEqual(['A-B', 'B-C']);
    units.forEach((u, k) => {
      expect(u.loading.before).toBe(before[k]!.loadingPercent);
      expect(u.loading.after).toBe(after[k]!.loadingPercent);
    });
    expect(units[1]!.loading.before).toBeGreaterThan(100);
    expect(units[1]!.loading.after).toBeLessThan(units[1]!.loading.before);
  });
});
