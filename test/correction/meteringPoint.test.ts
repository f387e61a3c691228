/**
 * A target measured away from the equipment's board (`target.measuredAt`): at the
 * origin (the supply's terminals) or at the incomer of a board the equipment is fed
 * through. Checked by re-solving independently (the bank written as ordinary
 * capacitive loads), by the feeder's own reactive power (a bank that must also
 * cover a feeder's I²X), by a collapse law (zero-impedance feeders: the origin is
 * the board), and by bad input.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  correctBoard,
  correctInstallation,
  compareInstallationCorrections,
  boardOfInstallation,
  InputError,
  normaliseInstallation,
  parseInstallation,
  readBoardText,
  solveInstallation,
  type BankSizing,
  type EquipmentGroup,
  type InstallationCorrection,
  type Installation,
  type InstallationSpec,
} from '@trivar/core';
import { cConj, cMul, cPolarDeg, cSub, c } from '../support/complexMath.js';
import { expectClose } from '../support/tolerance.js';
import { runs } from './support/arbitraries.js';

const read = (text: string): InstallationSpec => parseInstallation(readBoardText(text));
const fileOf = (name: string) => read(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8'));
const modelOf = (spec: InstallationSpec): Installation => normaliseInstallation(spec).installation;
const tannery = fileOf('tannery-lane-works.yaml');
const sizingOf = (k: InstallationCorrection) => k.report.sizing as BankSizing;

/** The file with every equipment branch written as an ordinary constant-impedance load (kvar at its nominal voltage). */
function withBankAsLoads(spec: InstallationSpec, board: string, equipment: readonly EquipmentGroup[]): InstallationSpec {
  const loads = equipment.flatMap((g) =>
    g.branches
      .filter((b) => b.susceptanceS !== 0)
      .map((b) => ({ name: `${g.name} ${b.branch}`, connection: `${b.from}-${b.to}` as const, kW: 0, kvar: (-b.susceptanceS * b.vNominal ** 2) / 1000, model: 'constant-impedance' as const })),
  );
  return { ...spec, boards: spec.boards.map((b) => (b.name === board ? { ...b, loads: [...b.loads, ...loads] } : b)) } as InstallationSpec;
}

describe('the target measured upstream of the bank, verified by an independent re-solve', () => {
  it('bank on the press shop, target 0.95 per line at the main switchboard: every line there reaches 0.95 in the file re-solved with the bank as loads', () => {
    const c1 = correctInstallation(modelOf(tannery), { arrangement: 'star-bank', target: { pf: 0.95, measuredAt: 'Main switchboard' } }, { board: 'Press shop' });
    expect(c1.report.status).toBe('meets-target');
    expect(c1.measuredAt).toBe('Main switchboard');
    const independent = solveInstallation(withBankAsLoads(tannery, 'Press shop', c1.report.verification.equipment));
    const main = independent.boards.find((b) => b.name === 'Main switchboard')!.result;
    for (const p of main.phases) {
      expect(p.sense).toBe('lagging');
      expect(p.pf!).toBeGreaterThanOrEqual(0.95 - 1e-9);
    }
    // The report's readings at the metering point are the independent solve's.
    c1.report.verification.metering!.after.phases.forEach((p, k) => expectClose(p.pf!, main.phases[k]!.pf!, { rel: 1e-6, abs: 0 }, `PF ${p.phase}`));
  });

  it('target 0.95 (vector) at the origin: the PF the supply terminals see, from EMF and source impedance, is within the band', () => {
    const c1 = correctInstallation(modelOf(tannery), { arrangement: 'delta-bank', target: { pf: 0.95, definition: 'vector', measuredAt: 'origin' } }, { board: 'Press shop' });
    expect(c1.report.status).toBe('meets-target');
    const independent = solveInstallation(withBankAsLoads(tannery, 'Press shop', c1.report.verification.equipment));
    // Supply terminals: E − Zs·I per phase, Zs from the transformer (4.5 %, X/R 4, 250 kVA at 400 V:
    // |Z| = 0.045 × 400² / 250 000 Ω; handbook short-circuit impedance), neutral solid at the star point.
    const zAbs = (0.045 * 400 ** 2) / 250_000;
    const r = zAbs / Math.sqrt(17);
    const zs = c(r, 4 * r);
    const main = independent.boards[0]!.result;
    const e = 400 / Math.sqrt(3);
    let p = 0;
    let q = 0;
    main.phases.forEach((ph, k) => {
      const emf = cPolarDeg(e, [0, -120, 120][k]!);
      const i = cPolarDeg(ph.current.magnitude, ph.current.angleDeg);
      const s = cMul(cSub(emf, cMul(zs, i)), cConj(i));
      p += s.re;
      q += s.im;
    });
    const pf = p / Math.hypot(p, q);
    expect(pf).toBeGreaterThanOrEqual(0.95 - 1e-6);
    // and the continuous sizing stops at the target: the PF there is 0.95, not beyond (within the search's tolerance)
    expectClose(sizingOf(c1).check.board!.pf!, 0.95, { rel: 1e-6, abs: 0 }, 'sized PF at the origin');
    expectClose(c1.report.verification.metering!.powerFactor.vector!.after, pf, { rel: 1e-6, abs: 0 }, 'reported PF at the origin');
  });

  it('the report also gives the PF at the bank board, and it is better there than at the origin (the rest of the works and the cables still draw vars)', () => {
    const c1 = correctInstallation(modelOf(tannery), { arrangement: 'star-bank', target: { pf: 0.95, measuredAt: 'origin' } }, { board: 'Press shop' });
    const v = c1.report.verification;
    expect(v.metering!.point).toBe('origin');
    const lowestAtOrigin = Math.min(...v.metering!.after.phases.map((p) => p.pf!));
    const lowestAtBank = Math.min(...v.after.phases.map((p) => p.pf!));
    expect(lowestAtOrigin).toBeGreaterThanOrEqual(0.95 - 1e-9);
    expect(lowestAtBank).toBeGreaterThan(lowestAtOrigin);
    // the default (own board) keeps the old study exactly
    const own = correctInstallation(modelOf(tannery), { arrangement: 'star-bank', target: { pf: 0.95, measuredAt: 'Press shop' } }, { board: 'Press shop' });
    const plain = correctInstallation(modelOf(tannery), { arrangement: 'star-bank', target: { pf: 0.95 } }, { board: 'Press shop' });
    expect(own.report.verification.metering).toBeUndefined();
    expect(own.report.selection).toEqual(plain.report.selection);
    // The controller's CT reads at the bank: the report says so when the target is measured elsewhere.
    expect(c1.report.warnings.filter((w) => w.code === 'controller-reads-elsewhere')).toHaveLength(1);
    expect(own.report.warnings.some((w) => w.code === 'controller-reads-elsewhere')).toBe(false);
  });
});

/** A motor board fed through a pure reactance (no resistance, so the feeder adds vars and no watts) from an otherwise empty main board on an ideal supply. */
const reactiveFeeder = (xOhm: number, wires: 3 | 4 = 3) =>
  read(
    [
      'name: reactive feeder',
      `supply: { system: three-phase-${wires}wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }`,
      'boards:',
      '  - { name: Intake, loads: [] }',
      '  - name: Motor board',
      '    fedFrom: Intake',
      `    feeder: { line: { r: 0, x: ${xOhm} }${wires === 4 ? `, neutral: { r: 0, x: ${xOhm} }` : ''} }`,
      '    loads: [{ name: fans, connection: ABC-delta, kW: 60, pf: 0.78 }]',
    ].join('\n'),
  );

describe("a feeder's reactive power is the bank's to cover", () => {
  it('metered at the intake, the bank on the motor board is larger by the feeder’s 3·X·|I|² (continuous sizing, vector target)', () => {
    const x = 0.04;
    const spec = reactiveFeeder(x);
    const study = (measuredAt?: string) => ({ arrangement: 'delta-bank', target: { pf: 0.95, definition: 'vector', ...(measuredAt ? { measuredAt } : {}) } });
    const atBoard = correctInstallation(modelOf(spec), study(), { board: 'Motor board' });
    const atIntake = correctInstallation(modelOf(spec), study('Intake'), { board: 'Motor board' });
    const delivered = (r: InstallationCorrection) => sizingOf(r).branches.reduce((s, b) => s + b.kvarAtAppliedV, 0);
    // The feeder current with the larger bank in place, from the sizing's own re-solve of the installation.
    const sized = solveInstallation(withBankAsLoads(spec, 'Motor board', sizingOf(atIntake).equipment));
    const feederVar = (3 * x * Math.max(...sized.boards[1]!.result.phases.map((p) => p.current.magnitude)) ** 2) / 1000;
    const difference = delivered(atIntake) - delivered(atBoard);
    expect(difference).toBeGreaterThan(0);
    // ΔQc = Q_feeder − tan φ·P_feeder, and P_feeder = 0 through a pure reactance (constant-power load: P unchanged).
    expectClose(difference, feederVar, { rel: 1e-4, abs: 1e-6 }, 'bank difference, kvar');
    // Both meet their target exactly where it is measured.
    expectClose(sizingOf(atBoard).check.board!.pf!, 0.95, { rel: 1e-7, abs: 0 });
    expectClose(sizingOf(atIntake).check.board!.pf!, 0.95, { rel: 1e-7, abs: 0 });
    expect(atIntake.report.verification.metering!.point).toBe('Intake');
  });

  it('per-line target at the intake: each line’s bank share grows by its feeder conductor’s X·|I|²', () => {
    const x = 0.03;
    // 4-wire, so the star bank's branches are line-to-neutral ones (the balanced motor leaves the neutral without current).
    const spec = reactiveFeeder(x, 4);
    const atBoard = correctInstallation(modelOf(spec), { arrangement: 'star-bank', target: { pf: 0.97 } }, { board: 'Motor board' });
    const atIntake = correctInstallation(modelOf(spec), { arrangement: 'star-bank', target: { pf: 0.97, measuredAt: 'Intake' } }, { board: 'Motor board' });
    const sized = solveInstallation(withBankAsLoads(spec, 'Motor board', sizingOf(atIntake).equipment));
    sizingOf(atIntake).branches.forEach((b, k) => {
      const i = sized.boards[1]!.result.phases[k]!.current.magnitude;
      expectClose(b.kvarAtAppliedV - sizingOf(atBoard).branches[k]!.kvarAtAppliedV, (x * i * i) / 1000, { rel: 1e-4, abs: 1e-6 }, `branch ${b.branch}`);
    });
  });
});

describe('collapse: with zero-impedance cables the origin is the bank board', () => {
  const loadArb = fc.record({
    kW: fc.double({ min: 2, max: 40, noNaN: true }),
    pf: fc.double({ min: 0.6, max: 0.9, noNaN: true }),
    connection: fc.constantFrom('A-N', 'B-N', 'C-N', 'ABC-star', 'ABC-delta', 'A-B'),
  });
  const caseArb = fc.record({
    loads: fc.array(loadArb, { minLength: 1, maxLength: 4 }),
    kVA: fc.constantFrom(100, 250, 630),
    impedancePercent: fc.double({ min: 3, max: 6, noNaN: true }),
    pf: fc.double({ min: 0.9, max: 0.98, noNaN: true }),
    arrangement: fc.constantFrom('star-bank', 'delta-bank'),
  });
  it('metering at the origin sizes and verifies the same bank as metering at the bank board', () => {
    fc.assert(
      fc.property(caseArb, (k) => {
        const spec = read(
          [
            'name: collapse',
            `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: ${k.kVA}, impedancePercent: ${k.impedancePercent}, xOverR: 5 } }`,
            'boards:',
            '  - { name: Main, feeder: { line: { r: 0, x: 0 }, neutral: { r: 0, x: 0 } }, loads: [] }',
            '  - name: Sub',
            '    fedFrom: Main',
            '    feeder: { line: { r: 0, x: 0 }, neutral: { r: 0, x: 0 } }',
            `    loads: [${k.loads.map((l, i) => `{ name: L${i}, connection: ${l.connection}, kW: ${l.kW}, pf: ${l.pf} }`).join(', ')}]`,
          ].join('\n'),
        );
        const study = (measuredAt?: string) => ({ arrangement: k.arrangement, target: { pf: k.pf, ...(measuredAt ? { measuredAt } : {}) } });
        const own = correctInstallation(modelOf(spec), study(), { board: 'Sub' });
        const origin = correctInstallation(modelOf(spec), study('origin'), { board: 'Sub' });
        const kvar = (r: typeof own) => sizingOf(r).branches.map((b) => b.kvarAtAppliedV);
        const total = Math.max(1e-3, ...kvar(own).map(Math.abs));
        kvar(origin).forEach((q, i) => expect(Math.abs(q - kvar(own)[i]!)).toBeLessThanOrEqual(1e-6 * total));
        expect(origin.report.status).toBe(own.report.status);
        origin.report.verification.metering!.after.phases.forEach((p, i) => {
          const b = own.report.verification.after.phases[i]!;
          if (p.pf !== null && b.pf !== null) expect(Math.abs(p.pf - b.pf)).toBeLessThanOrEqual(1e-9);
        });
      }),
      { numRuns: runs(6) },
    );
  });
});

describe('bad metering points', () => {
  const model = modelOf(tannery);
  const issueOf = (f: () => unknown) => {
    try {
      f();
    } catch (error) {
      if (error instanceof InputError) return error.issues[0]!;
      throw error;
    }
    throw new Error('no error');
  };
  it.each([
    { what: 'a board that does not exist', measuredAt: 'Yard', arrangement: 'star-bank', code: 'unknown_board', words: ['origin', '"Press shop"', '"Main switchboard"'] },
    { what: 'a board beside the bank, not above it', measuredAt: 'Offices', arrangement: 'star-bank', code: 'not_upstream', words: ['"Main switchboard"'] },
    { what: 'a compensator judged away from its board', measuredAt: 'origin', arrangement: 'balancing-compensator', code: 'not_applicable', words: ['own board'] },
    { what: 'an empty name', measuredAt: '', arrangement: 'star-bank', code: 'out_of_range', words: [] },
  ])('$what: $code at target.measuredAt', ({ measuredAt, arrangement, code, words }) => {
    const issue = issueOf(() => correctBoard(boardOfInstallation(model, 1), { arrangement, target: { measuredAt } }));
    expect(issue.code).toBe(code);
    expect(issue.path).toBe('target.measuredAt');
    for (const w of words) expect(issue.message).toContain(w);
  });

  it('comparing arrangements with the target at the origin leaves the compensator out, saying why', () => {
    const compared = compareInstallationCorrections(model, { target: { measuredAt: 'origin' } }, { board: 'Press shop' });
    const compensator = compared.comparison.outcomes.find((o) => o.arrangement === 'balancing-compensator')!;
    expect(compensator.report).toBeNull();
    expect(compensator.notApplicable).toContain('own board');
    expect(compared.measuredAt).toBe('origin');
  });
});
