/**
 * profile.scenarios on an installation: each scenario is every board solved at once at those load
 * levels. Held to the general installation solve (solveInstallationNetwork) of the same loads scaled —
 * every board's incomer currents, phase voltages, kW and kvar to 1e-9 — on the invented Osier Mill
 * studios, whose file names loads bare, as `<board>/<load>` and through a group.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  InputError,
  judgedNominalOf,
  normaliseInstallation,
  parseInstallation,
  readBoardText,
  solveInstallationNetwork,
  studyInstallationScenarios,
  terminalVoltage,
  type BoardLoad,
  type Installation,
  type ProfileSpec,
} from '@trivar/core';

const spec = parseInstallation(readBoardText(readFileSync('examples/osier-mill-studios.yaml', 'utf8')));
const { installation } = normaliseInstallation(spec);
const profile = spec.profile!;
const result = studyInstallationScenarios(installation, profile);

/** The installation with each load scaled by `scale(board, load)` (0 = off). */
function scaledBy(scale: (board: string, load: string) => number): Installation {
  const scaled = (board: string, loads: readonly BoardLoad[]) =>
    loads.map((load) => {
      const x = scale(board, load.name);
      return { ...load, branches: load.branches.map((b) => ({ ...b, sNominal: { re: b.sNominal.re * x, im: b.sNominal.im * x } })) };
    });
  return {
    ...installation,
    main: { ...installation.main, loads: scaled(installation.main.name, installation.main.loads) },
    subBoards: installation.subBoards.map((sb) => ({ ...sb, loads: scaled(sb.name, sb.loads) })),
  };
}

/** The scales the example's scenarios give, written out here by hand from the file. */
const BY_HAND: Record<string, Record<string, number>> = {
  'firing night': { 'Large kiln': 1, 'Small kiln': 1, Compressor: 0.05, Cafe: 0.08, 'Workshop lighting': 0.1 },
  'studio day': { 'Wheels and pug mill': 0.8, Press: 0.7, 'Drying cabinet': 1, Compressor: 0.6, Cafe: 0.7, 'Workshop lighting': 0.8, 'Small kiln': 1 },
  closed: { 'Workshop lighting': 0.05 },
};

describe('scenarios on an installation', () => {
  it('every board in every scenario equals the general installation solve of the same loads, to 1e-9', () => {
    expect(result.boards.map((b) => [b.board, b.fedFrom])).toEqual([
      ['Mill intake', null],
      ['Pottery', 'Mill intake'],
      ['Print room', 'Pottery'],
    ]);
    expect(result.boards[0]!.scenarios.map((s) => s.name)).toEqual(['firing night', 'studio day', 'closed']);
    for (const [k, name] of Object.keys(BY_HAND).entries()) {
      const general = solveInstallationNetwork(scaledBy((_, load) => BY_HAND[name]![load] ?? 0));
      general.boards.forEach((g, b) => {
        const r = result.boards[b]!.scenarios[k]!;
        let w = 0;
        let q = 0;
        installation.main.phases.forEach((p, m) => {
          const i0 = Math.hypot(g.lineCurrents[m]!.re, g.lineCurrents[m]!.im);
          expect(Math.abs(r.lineA[m]! - i0), `${name}, ${g.board.name}, line ${p}`).toBeLessThanOrEqual(1e-9 * Math.max(1, i0));
          const v = terminalVoltage(g, p)!;
          const n = terminalVoltage(g, 'N')!;
          const u = { re: v.re - n.re, im: v.im - n.im };
          // S = U · I*, the power through the board's incomer on that phase.
          w += u.re * g.lineCurrents[m]!.re + u.im * g.lineCurrents[m]!.im;
          q += u.im * g.lineCurrents[m]!.re - u.re * g.lineCurrents[m]!.im;
          const percent = (100 * Math.hypot(u.re, u.im)) / judgedNominalOf(installation.main).ln;
          expect(r.lowestVoltagePercent).toBeLessThanOrEqual(percent + 1e-9);
          expect(r.highestVoltagePercent).toBeGreaterThanOrEqual(percent - 1e-9);
        });
        // The floor reads round-off as nothing: boards with every load off show exactly 0 kW.
        expect(Math.abs(r.kW - w / 1000), `${name}, ${g.board.name}, kW`).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(w / 1000)));
        expect(Math.abs(r.kvar - q / 1000), `${name}, ${g.board.name}, kvar`).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(q / 1000)));
      });
    }
  });

  it('weighs each board\'s year by the hours, judges each against its own band, reads an idle board as idle', () => {
    for (const b of result.boards) {
      expect(b.kWhImport).toBeCloseTo(b.scenarios.reduce((a, s) => a + Math.max(0, s.kW) * s.hours, 0), 9);
      expect(b.billingPf).toBeCloseTo(b.kWhImport / Math.hypot(b.kWhImport, b.kvarhLagging), 12);
    }
    expect(result.hours).toBe(8760);
    expect(result.boards.map((b) => [b.limits.voltageLowPercent, b.limits.voltageHighPercent])).toEqual([
      [90, 110],
      [95, 105],
      [90, 110],
    ]);
    // The print room has nothing on at night: no power and no power factor (neither 1 nor round-off's).
    const night = result.boards[2]!.scenarios[0]!;
    expect([night.kW, night.kvar, night.pf]).toEqual([0, 0, null]);
    // A tighter band than the pottery's own: the firing night's 97.6 % (of the 230 V nominal) falls below 98 %, the studio day's 98.6 % does not.
    const tight = studyInstallationScenarios(installation, { ...profile, limits: { voltageLowPercent: 98 } });
    expect(tight.boards[1]!.outsideBand).toEqual(['firing night']);
    expect(tight.boards[1]!.limits.voltageLimitsFrom).toBe('profile.limits');
    expect(result.boards.every((b) => b.outsideBand.length === 0)).toBe(true);
  });

  it('names the field of a load no board has, one several boards have, and a bad group member', () => {
    const twice: Installation = { ...installation, subBoards: installation.subBoards.map((sb, i) => (i === 1 ? { ...sb, loads: [...sb.loads, { ...sb.loads[0]!, name: 'Cafe' }] } : sb)) };
    const bad: ProfileSpec = {
      groups: { kilns: ['Large kiln', 'Pottery/Kiln 3'] },
      scenarios: [
        { name: 'a', hours: 10, loads: { Oven: 1, Cafe: 0.5 } },
        { name: 'b', hours: 20, loads: { kilns: 1, 'Print room/Cafe': 1 } },
      ],
    };
    try {
      studyInstallationScenarios(twice, bad);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      const issues = (e as InputError).issues;
      expect(issues.map((i) => [i.code, i.path])).toEqual([
        ['unknown_load', 'profile.groups.kilns[1]'],
        ['unknown_load', 'profile.scenarios[0].loads.Oven'],
        ['ambiguous_load', 'profile.scenarios[0].loads.Cafe'],
      ]);
      expect(issues[2]!.expected).toContain('load "Cafe" on board "Mill intake" (write "Mill intake/Cafe") and load "Cafe" on board "Print room" (write "Print room/Cafe")');
    }
    expect(() => studyInstallationScenarios(installation, { scenarios: [{ name: 'a', hours: 1, loads: {} }, { name: 'b', weight: 1, loads: {} }] })).toThrow(InputError);
  });
});
