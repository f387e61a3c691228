/**
 * `trivar correct` on an installation file with harmonic data: the bank on its board checked against
 * the installation's harmonics, detuned variants beside it (correctInstallationWithHarmonics.ts).
 * - the scan from the bank's board sees the short-circuit power of the source, service cable and
 *   sub-board feeder in series (worked out here from the file's figures), and the plain bank's
 *   resonance sits at √(S_sc/Q_c) of that path;
 * - a plain bank on a sub-board with a drive resonates on the 7th; a 7 % detuned bank passes and is chosen;
 * - a board file spread over sub-boards behind zero-impedance feeders gives the single-board verdict;
 * - a bank of `harmonics.banks` on a board the installation does not have is refused at its field path.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  InputError,
  correctInstallationWithHarmonics,
  correctWithHarmonics,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  readBoardText,
  type InstallationSpec,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const V = 400;
const transformer = { kVA: 200, impedancePercent: 6, xOverR: 6 };
const service = { lengthM: 10, rOhmPerKm: 0.06, xOhmPerKm: 0.08 };
const workshopFeeder = { lengthM: 40, rOhmPerKm: 0.1, xOhmPerKm: 0.08 };

/** An invented joinery: heaters on the main board, compressors and a saw drive on a sub-board 40 m away. */
function joinery(harmonics: Record<string, unknown> = {}): InstallationSpec {
  return parseInstallation({
    name: 'Test joinery',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: V }, frequencyHz: 50, transformer },
    boards: [
      { name: 'Main board', feeder: { line: service, neutral: service }, loads: [{ name: 'Heaters', connection: 'ABC-delta', kW: 20, pf: 1 }] },
      {
        name: 'Workshop',
        fedFrom: 'Main board',
        feeder: { line: workshopFeeder, neutral: workshopFeeder },
        loads: [
          { name: 'Compressors', connection: 'ABC-delta', kW: 90, pf: 0.76 },
          { name: 'Saw drive', connection: 'ABC-delta', kW: 30, pf: 0.95, spectrum: 'six-pulse-drive' },
        ],
      },
    ],
    harmonics,
  });
}

const study = { arrangement: 'delta-bank', target: { pf: 0.95 } };

function correct(spec: InstallationSpec, board = 'Workshop') {
  return correctInstallationWithHarmonics(spec, normaliseInstallation(spec).installation, study, { board });
}

describe('the bank on a sub-board, checked against the installation', () => {
  it('the scan sees S_sc of source + service cable + feeder, and the plain bank resonates at √(S_sc/Q_c)', () => {
    const result = correct(joinery({ detuning: 'none' }));
    const check = result.report.harmonics.check!;
    const { scan } = check.scans.find((s) => s.board === 'Workshop')!;
    // Per phase, at the fundamental: the transformer's u_k·V²/S split by X/R, then both cables.
    const zT = ((transformer.impedancePercent / 100) * V * V) / (transformer.kVA * 1000);
    const rT = zT / Math.hypot(1, transformer.xOverR);
    const r = rT + (service.lengthM * service.rOhmPerKm + workshopFeeder.lengthM * workshopFeeder.rOhmPerKm) / 1000;
    const x = transformer.xOverR * rT + (service.lengthM * service.xOhmPerKm + workshopFeeder.lengthM * workshopFeeder.xOhmPerKm) / 1000;
    const sscKVA = (V * V) / Math.hypot(r, x) / 1000;
    expectClose(scan.shortCircuitKVA!, sscKVA, { rel: 1e-9, abs: 0 }, 'S_sc at the workshop');
    const full = scan.combinations.at(-1)!;
    expect(full.steps.every(Boolean)).toBe(true);
    const lowest = Math.min(...full.peaks.map((p) => p.order));
    // The lossless L–C figure: X_C/X = S_sc,X/Q_c with S_sc,X = V²/X; √(S_sc/Q_c) with |Z| lies just above it.
    const lossless = Math.sqrt((V * V) / x / 1000 / full.capacitorKvar);
    expectClose(lowest, lossless, { rel: 0.01, abs: 0 }, 'scanned resonance vs √(X_C/X)');
    expectClose(lowest, Math.sqrt(sscKVA / full.capacitorKvar), { rel: 0.02, abs: 0 }, 'scanned resonance vs √(S_sc/Q_c)');
    expect(result.report.harmonics.variants.map((v) => v.name)).toEqual(['plain']);
    expect(result.report.harmonics.variants[0]!.lowestResonanceOrder).toBe(Math.min(...scan.combinations.flatMap((c) => c.peaks.map((p) => p.order))));
  });

  it('the plain bank resonates on the 7th; the 7 % detuned bank passes and is chosen', () => {
    const result = correct(joinery());
    const h = result.report.harmonics;
    const plain = h.variants[0]!;
    expect(plain.passes).toBe(false);
    expect(plain.resonantOrders).toContain(7);
    expect(Math.abs(plain.lowestResonanceOrder! - 7)).toBeLessThan(0.7);
    expect(plain.reasons.join(' ')).toContain('order 7');
    expect(h.chosen).toBe('detuned 7 %');
    const chosen = h.variants.find((v) => v.name === 'detuned 7 %')!;
    expect(chosen.passes).toBe(true);
    expect(chosen.lowestResonanceOrder!).toBeLessThan(chosen.tuningOrder!);
    expect(chosen.worstDutyRatio!).toBeLessThanOrEqual(1);
    expect(result.report.selection!.steps.every((s) => s.detuningFactor === 0.07)).toBe(true);
    expect(h.summary).toContain('chosen: detuned 7 %');
    expect(result.report.cautions.join(' ')).not.toContain('does not check harmonics');
    expect(result.report.cautions.join(' ')).toContain('installation file');
    // The installation effect is of the bank as chosen: the workshop's incomer meets the target.
    const workshop = result.effect.boards.find((b) => b.name === 'Workshop')!;
    expect(workshop.hasEquipment).toBe(true);
    expect(Math.min(...workshop.lines.map((l) => l.pf.after!))).toBeGreaterThanOrEqual(0.95);
  });

  it('another bank of harmonics.banks stays in place: scanned switched with the new one', () => {
    const result = correct(joinery({ banks: [{ board: 'Main board', connection: 'delta', ratedV: 440, stepsKvar: [20, 20] }] }));
    const scan = result.report.harmonics.check!.scans[0]!;
    expect(scan.board).toBe('Workshop');
    expect(scan.jointScan!.otherBanks.map((o) => o.board)).toEqual(['Main board']);
    for (const v of result.report.harmonics.variants) expect(v.resonantOrdersOtherBanksSwitched).toBeDefined();
  });
});

describe('an installation collapsed to one board gives the board file’s verdict', () => {
  it('quayside print works, its loads over two sub-boards behind zero-impedance feeders', () => {
    const text = readFileSync(new URL('../../examples/quayside-print-works.yaml', import.meta.url), 'utf8');
    const spec = parseBoard(readBoardText(text));
    const single = correctWithHarmonics(spec, normaliseBoard(spec), spec.correction);
    const zero = { line: { r: 0, x: 0 }, neutral: { r: 0, x: 0 } };
    const installationSpec = parseInstallation({
      name: 'collapsed',
      supply: spec.supply,
      boards: [
        { name: 'main', feeder: spec.feeder, loads: spec.loads.filter((_, i) => i % 3 === 0) },
        { name: 'sub 1', fedFrom: 'main', feeder: zero, loads: spec.loads.filter((_, i) => i % 3 === 1) },
        { name: 'sub 2', fedFrom: 'sub 1', feeder: zero, loads: spec.loads.filter((_, i) => i % 3 === 2) },
      ],
      harmonics: spec.harmonics ?? {},
    });
    const collapsed = correctInstallationWithHarmonics(installationSpec, normaliseInstallation(installationSpec).installation, spec.correction);
    const a = collapsed.report.harmonics;
    const e = single.harmonics;
    expect(a.chosen).toBe(e.chosen);
    expect(e.chosen).toBe('detuned 7 %');
    expect(a.variants.map((v) => [v.name, v.passes, v.resonantOrders, v.unitRatedV])).toEqual(e.variants.map((v) => [v.name, v.passes, v.resonantOrders, v.unitRatedV]));
    a.variants.forEach((v, k) => {
      const w = e.variants[k]!;
      expectClose(v.lowestResonanceOrder!, w.lowestResonanceOrder!, { rel: 1e-6, abs: 0 }, `${v.name} lowest resonance`);
      expectClose(v.worstDutyRatio!, w.worstDutyRatio!, { rel: 1e-6, abs: 0 }, `${v.name} duty`);
      expectClose(v.deliveredKvar, w.deliveredKvar, { rel: 1e-6, abs: 0 }, `${v.name} delivered kvar`);
    });
  });
});

describe('bad input', () => {
  it('a bank of harmonics.banks on a board the installation does not have: the field path', () => {
    const spec = joinery({ banks: [{ board: 'Paint shop', connection: 'delta', ratedV: 440, stepsKvar: [20] }] });
    let error: unknown;
    try {
      correct(spec);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).issues.map((i) => i.path)).toEqual(['harmonics.banks[0].board']);
    expect((error as InputError).issues[0]!.message).toContain('Workshop');
  });
});
