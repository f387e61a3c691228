/**
 * The banks an installation file lists under `harmonics.banks` are in service at the fundamental
 * (harmonics/banksInService.ts): `solveInstallation` takes them in, and `trivar correct` sizes equipment
 * on one board with the other boards' banks in every solve, the file's bank on that board replaced.
 *
 * Reference values:
 * - a bank part is a constant susceptance B = Q_r/(3·U_r²) per delta branch, delivering Q = Q_r·(V/V_r)²
 *   (METHODS.md §4, Q = 2πf·C·U², confirmed catalogue); a detuned step B/(1 − p) at the fundamental,
 *   Q_eff = Q_r·(U/U_r)²/(1 − p) (METHODS.md §5, confirmed application note). The same parts written in the
 *   file as ordinary constant-impedance loads of that kvar at nominal voltage must give the same solve.
 * - the installation is invented here (a boatyard: a paint shed with an old bank, a hoist house getting a new one).
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  InputError,
  correctInstallation,
  correctInstallationWithHarmonics,
  correctWithHarmonics,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  readBoardText,
  solveBoard,
  solveInstallation,
  withBanksInService,
  type BankSizing,
  type CorrectionReport,
  type InstallationResult,
} from '@trivar/core';
import { expectClose, expectComplexClose } from '../support/tolerance.js';

const V = 400;
const supply = { system: 'three-phase-4wire', voltage: { lineToLine: V }, frequencyHz: 50, transformer: { kVA: 160, impedancePercent: 4.5, xOverR: 4 } };
const cable = (lengthM: number, mm2: number) => ({ lengthM, line: { mm2 }, neutral: { mm2 } });

interface BankEntry {
  board: string;
  connection: 'delta' | 'star';
  ratedV: number;
  stepsKvar: number[];
  fixedKvar?: number;
  detuningPercent?: number;
  stepsInService?: number[];
}

const paintShedBank: BankEntry = { board: 'Paint shed', connection: 'delta', ratedV: 440, stepsKvar: [10, 10] };

/** The boatyard's boards; `extra` adds loads per board (the banks written out as ordinary loads). */
function boatyard(banks: BankEntry[] | null, extra: Record<string, object[]> = {}) {
  return {
    name: 'Saltmarsh boatyard',
    supply,
    boards: [
      { name: 'Main board', feeder: cable(12, 95), loads: [{ name: 'Office', connection: 'A-N', kW: 5, pf: 0.95 }, ...(extra['Main board'] ?? [])] },
      {
        name: 'Paint shed',
        fedFrom: 'Main board',
        feeder: cable(30, 35),
        loads: [
          { name: 'Extraction fans', connection: 'ABC-delta', kW: 22, pf: 0.78 },
          { name: 'Compressor', connection: 'ABC-delta', kW: 15, pf: 0.8 },
          ...(extra['Paint shed'] ?? []),
        ],
      },
      {
        name: 'Hoist house',
        fedFrom: 'Main board',
        feeder: cable(50, 50),
        loads: [
          { name: 'Hoist drive', connection: 'ABC-delta', kW: 30, pf: 0.75 },
          { name: 'Winch', connection: 'ABC-delta', kW: 11, pf: 0.8 },
          ...(extra['Hoist house'] ?? []),
        ],
      },
    ],
    ...(banks ? { harmonics: { detuning: 'none', banks } } : {}),
  };
}

/** A bank's parts in service as ordinary loads: delta, constant impedance, kvar at nominal voltage (capacitive: negative). */
function partsAsLoads(bank: BankEntry): object[] {
  const p = (bank.detuningPercent ?? 0) / 100;
  const vElement = bank.connection === 'delta' ? V : V / Math.sqrt(3);
  const kvarAtNominal = (rated: number) => (rated * (vElement / bank.ratedV) ** 2) / (1 - p);
  const steps = bank.stepsInService ?? bank.stepsKvar.map((_, k) => k + 1);
  const rated = [...(bank.fixedKvar ? [bank.fixedKvar] : []), ...steps.map((s) => bank.stepsKvar[s - 1]!)];
  return rated.map((q, k) => ({ name: `written part ${k + 1}`, connection: bank.connection === 'delta' ? 'ABC-delta' : 'ABC-star', kW: 0, kvar: -kvarAtNominal(q), model: 'constant-impedance' }));
}

/** Every board's phase voltages and line currents, and every feeder's, agree. */
function expectSameSolve(actual: InstallationResult, expected: InstallationResult, rel: number): void {
  const largest = Math.max(...expected.feeders.flatMap((f) => f.lines.map((l) => l.current.magnitude)));
  expected.boards.forEach((b, i) => {
    const a = actual.boards[i]!;
    expect(a.name).toBe(b.name);
    b.result.phases.forEach((p, k) => {
      const q = a.result.phases[k]!;
      expectComplexClose(q.voltage, p.voltage, { rel, abs: rel * V }, `${b.name} V${p.phase}`);
      expectComplexClose(q.current, p.current, { rel, abs: rel * largest }, `${b.name} I${p.phase}`);
    });
  });
  expectClose(actual.totals.sourceKvar, expected.totals.sourceKvar, { rel, abs: rel * 100 }, 'source kvar');
}

describe('solve: the banks the file lists are in service', () => {
  it('gives the figures of the same installation with the bank written as ordinary capacitive loads', () => {
    const withBank = solveInstallation(boatyard([paintShedBank]));
    const written = solveInstallation(boatyard(null, { 'Paint shed': partsAsLoads(paintShedBank) }));
    expectSameSolve(withBank, written, 1e-9);
    // Left out, the paint shed would draw its loads' lagging kvar: 22·tan(acos 0.78) + 15·tan(acos 0.8) = 28.90 kvar at nominal voltage.
    const without = solveInstallation(boatyard(null));
    expect(without.boards[1]!.result.totals.kvar).toBeGreaterThan(withBank.boards[1]!.result.totals.kvar + 15);
  });

  it('states each bank with what its parts deliver, Σ B·|V|² over the branches as solved', () => {
    const r = solveInstallation(boatyard([paintShedBank]));
    expect(r.banksInService).toHaveLength(1);
    const bank = r.banksInService[0]!;
    expect(bank).toMatchObject({ board: 'Paint shed', connection: 'delta', ratedV: 440, stepsKvar: [10, 10], stepsInService: [1, 2], fixedKvar: 0, detuningPercent: 0, ratedKvarInService: 20 });
    // B per branch of a 10 kvar, 440 V delta step: 10 000 / 3 / 440² S.
    const b = 10_000 / 3 / 440 ** 2;
    const parts = r.boards[1]!.result.loads.filter((l) => l.origin === 'added');
    expect(parts.map((l) => l.name)).toEqual(['bank step 1', 'bank step 2']);
    const delivered = parts.flatMap((l) => l.branches).reduce((s, br) => s + (b * br.voltage.magnitude ** 2) / 1000, 0);
    expectClose(bank.deliveredKvar, delivered, { rel: 1e-9, abs: 1e-9 }, 'delivered kvar');
    // Near nominal voltage: about 20·(400/440)² = 16.53 kvar, less the drop along the way.
    expect(bank.deliveredKvar).toBeGreaterThan(15.5);
    expect(bank.deliveredKvar).toBeLessThan(16.53);
  });

  it('warns on a board whose bank delivers more than its own circuits draw, with the kvar going back up its feeder', () => {
    const small = solveInstallation(boatyard([paintShedBank]));
    expect(small.boards[1]!.result.warnings.map((w) => w.code)).not.toContain('bank-in-service-exceeds-loads');
    const big = solveInstallation(boatyard([{ ...paintShedBank, stepsKvar: [30, 30] }]));
    const shed = big.boards[1]!.result;
    const warning = shed.warnings.find((w) => w.code === 'bank-in-service-exceeds-loads')!;
    // 60 kvar at 440 V delivers about 60·(400/440)² = 49.6 kvar against the loads' 28.9 kvar (both less the drop): about 20 kvar goes back.
    const delivered = big.banksInService[0]!.deliveredKvar;
    expect(warning.value).toBe(shed.totals.kvar);
    expectClose(-warning.value, delivered - (shed.totals.kvar + delivered), { rel: 1e-12, abs: 1e-9 }, 'kvar back up the feeder');
    expect(-warning.value).toBeGreaterThan(18);
    expect(-warning.value).toBeLessThan(21);
    expect(warning.message).toContain(`delivers ${delivered.toFixed(2)} kvar, more than the ${(shed.totals.kvar + delivered).toFixed(2)} kvar its own circuits draw`);
  });

  it('takes only the steps stepsInService names, and a detuned part at its effective B/(1 − p)', () => {
    const bank: BankEntry = { ...paintShedBank, stepsKvar: [10, 15], fixedKvar: 5, detuningPercent: 7, stepsInService: [2] };
    const r = solveInstallation(boatyard([bank]));
    expectSameSolve(r, solveInstallation(boatyard(null, { 'Paint shed': partsAsLoads(bank) })), 1e-9);
    expect(r.banksInService[0]).toMatchObject({ stepsInService: [2], ratedKvarInService: 20, detuningPercent: 7 });
    expect(r.boards[1]!.result.loads.filter((l) => l.origin === 'added').map((l) => l.name)).toEqual(['bank fixed part', 'bank step 2']);
  });

  it('holds for any bank on any board (fast-check): solved with the bank ≡ solved with its parts written as loads', () => {
    const boards = ['Main board', 'Paint shed', 'Hoist house'];
    fc.assert(
      fc.property(
        fc.constantFrom(...boards),
        fc.constantFrom<'delta' | 'star'>('delta', 'star'),
        fc.constantFrom(400, 415, 440, 480, 525),
        fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 4 }),
        fc.integer({ min: 0, max: 10 }),
        fc.constantFrom(0, 5.67, 7, 14),
        fc.array(fc.boolean(), { minLength: 4, maxLength: 4 }),
        (board, connection, ratedV, stepsKvar, fixedKvar, detuningPercent, on) => {
          const stepsInService = stepsKvar.flatMap((_, k) => (on[k] ? [k + 1] : []));
          const bank: BankEntry = { board, connection, ratedV, stepsKvar, fixedKvar, detuningPercent, stepsInService };
          expectSameSolve(solveInstallation(boatyard([bank])), solveInstallation(boatyard(null, { [board]: partsAsLoads(bank) })), 1e-9);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('a board file’s own harmonics.bank is left out, as solveBoard leaves it: the same figures', () => {
    const file = {
      name: 'Slipway board',
      supply,
      feeder: cable(12, 95),
      loads: [{ name: 'Hoist drive', connection: 'ABC-delta', kW: 30, pf: 0.75 }],
      harmonics: { bank: { connection: 'delta', ratedV: 440, stepsKvar: [10, 10] } },
    };
    const board = solveBoard(file);
    const asInstallation = solveInstallation(file);
    expect(asInstallation.banksInService).toEqual([]);
    board.phases.forEach((p, k) => expectComplexClose(asInstallation.boards[0]!.result.phases[k]!.current, p.current, { rel: 1e-12, abs: 1e-9 }, `I${p.phase}`));
  });

  it('refuses steps a bank does not have, or one named twice, at the field path', () => {
    const issues = (bank: BankEntry) => {
      try {
        solveInstallation(boatyard([bank]));
      } catch (error) {
        if (error instanceof InputError) return error.issues.map((i) => [i.code, i.path]);
        throw error;
      }
      return [];
    };
    expect(issues({ ...paintShedBank, stepsInService: [3] })).toEqual([['too_big', 'harmonics.banks[0].stepsInService[0]']]);
    expect(issues({ ...paintShedBank, stepsInService: [2, 2] })).toEqual([['duplicate', 'harmonics.banks[0].stepsInService[1]']]);
    expect(issues({ ...paintShedBank, board: 'Boat shed' })).toEqual([['unknown_board', 'harmonics.banks[0].board']]);
    // A step number that is not whole says so in words ("a whole number", not zod's "a int").
    try {
      solveInstallation(boatyard([{ ...paintShedBank, stepsInService: [1.5] }]));
      expect.unreachable();
    } catch (error) {
      expect((error as InputError).issues.map((i) => i.message)).toEqual(['harmonics.banks[0].stepsInService[0]: expected a whole number (received 1.5)']);
    }
  });
});

/** The continuous sizing of a delta bank study, branch by branch. */
const sizedBranches = (r: CorrectionReport) => (r.sizing as BankSizing).branches;

describe('correct: the other boards’ banks are in service when the equipment is sized', () => {
  const study = { arrangement: 'delta-bank', target: { pf: 0.95, measuredAt: 'origin' } };
  const spec = parseInstallation(boatyard([paintShedBank]));
  const corrected = correctInstallationWithHarmonics(spec, normaliseInstallation(spec).installation, study, { board: 'Hoist house' });

  it('re-solving the file with the new bank and the paint shed bank as ordinary loads gives every board’s figures (1e-6)', () => {
    const equipment = corrected.report.verification.equipment.flatMap((g) =>
      g.branches.map((br) => ({ name: `new ${br.branch}`, connection: `${br.from}-${br.to}`, kW: 0, kvar: (-br.susceptanceS * br.vNominal ** 2) / 1000, model: 'constant-impedance' })),
    );
    expect(equipment).toHaveLength(3);
    const written = solveInstallation(boatyard(null, { 'Paint shed': partsAsLoads(paintShedBank), 'Hoist house': equipment }));
    expectSameSolve(corrected.effect.after, written, 1e-6);
    // and before: the file as trivar solve takes it, the paint shed bank in
    expectSameSolve(corrected.effect.before, solveInstallation(boatyard([paintShedBank])), 1e-9);
  });

  it('meets the target at the metering point with the other bank in, and says which banks it took', () => {
    const v = corrected.report.verification;
    expect(corrected.report.status).toBe('meets-target');
    expect(v.metering?.point).toBe('origin');
    for (const line of v.metering!.lines) {
      expect(line.sense.after).toBe('lagging');
      expect(line.pf.after!).toBeGreaterThanOrEqual(0.95 - 1e-6);
    }
    expect(corrected.otherBanksInService).toEqual([{ board: 'Paint shed', connection: 'delta', ratedV: 440, stepsKvar: [10, 10], stepsInService: [1, 2], fixedKvar: 0, detuningPercent: 0, ratedKvarInService: 20 }]);
    expect(corrected.replacedBank).toBeNull();
    expect(corrected.leadingWithBanks).toBeNull();
    expect(corrected.effect.before.banksInService.map((b) => b.board)).toEqual(['Paint shed']);
  });

  it('sized without the other bank, the equipment would be larger by about what that bank delivers', () => {
    const without = correctInstallation(normaliseInstallation(spec).installation, study, { board: 'Hoist house' });
    const paint = corrected.effect.before.banksInService[0]!.deliveredKvar;
    const continuous = (r: CorrectionReport) => sizedBranches(r).reduce((s, b) => s + b.kvarAtAppliedV, 0);
    const difference = continuous(without.report) - continuous(corrected.report);
    // The continuous sizing at the origin differs by the bank's kvar, give or take the feeders' share of it.
    expectClose(difference, paint, { rel: 0.1, abs: 0 }, 'kvar the other bank saves');
  });

  it('replaces the file’s bank on its own board and keeps the others in', () => {
    const hoistBank: BankEntry = { board: 'Hoist house', connection: 'delta', ratedV: 440, stepsKvar: [20, 20] };
    const both = parseInstallation(boatyard([paintShedBank, hoistBank]));
    const c = correctInstallationWithHarmonics(both, normaliseInstallation(both).installation, study, { board: 'Hoist house' });
    expect(c.replacedBank).toEqual({ connection: 'delta', ratedV: 440, stepsKvar: [20, 20], fixedKvar: 0, detuningPercent: 0 });
    expect(c.otherBanksInService.map((b) => b.board)).toEqual(['Paint shed']);
    expect(c.report.verification.before.loads.filter((l) => l.origin === 'added')).toEqual([]);
    // The same study as with only the paint shed bank listed.
    expectClose(sizedBranches(c.report)[0]!.kvarAtAppliedV, sizedBranches(corrected.report)[0]!.kvarAtAppliedV, { rel: 1e-9, abs: 1e-9 }, 'A-B kvar');
  });

  it('says so when the banks in service already make the metering point lead', () => {
    const big: BankEntry = { ...paintShedBank, stepsKvar: [60, 60] };
    const leading = parseInstallation(boatyard([big]));
    const c = correctInstallationWithHarmonics(leading, normaliseInstallation(leading).installation, study, { board: 'Hoist house' });
    expect(c.leadingWithBanks?.point).toBe('origin');
    expect(c.leadingWithBanks?.lines.map((l) => l.phase)).toEqual(['A', 'B', 'C']);
    // Capacitors add nothing to a point that leads (the lowest line PF 0.915 leading here).
    expect(Math.min(...c.leadingWithBanks!.lines.map((l) => l.pf!))).toBeLessThan(0.95);
    expectClose((c.report.sizing as BankSizing).totalKvarAtNominalV, 0, { rel: 0, abs: 1e-6 }, 'kvar added');
  });

  it('a board file gives what it gave: its own harmonics.bank is the one the study replaces', () => {
    const file = {
      name: 'Slipway board',
      supply,
      feeder: cable(12, 95),
      loads: [{ name: 'Hoist drive', connection: 'ABC-delta', kW: 30, pf: 0.75 }],
      harmonics: { detuning: 'none', bank: { connection: 'delta', ratedV: 440, stepsKvar: [10, 10] } },
    };
    const boardSpec = parseBoard(file);
    const onBoard = correctWithHarmonics(boardSpec, normaliseBoard(boardSpec), { arrangement: 'delta-bank', target: { pf: 0.95 } });
    const asInstallation = parseInstallation(file);
    const inInstallation = correctInstallationWithHarmonics(asInstallation, withBanksInService(normaliseInstallation(asInstallation).installation, asInstallation.harmonics?.banks), { arrangement: 'delta-bank', target: { pf: 0.95 } });
    expect(inInstallation.otherBanksInService).toEqual([]);
    expect(inInstallation.replacedBank).not.toBeNull();
    expectClose(inInstallation.report.selection!.deliveredKvar, onBoard.selection!.deliveredKvar, { rel: 1e-9, abs: 1e-9 }, 'delivered kvar');
    onBoard.verification.lines.forEach((l, k) => expectClose(inInstallation.report.verification.lines[k]!.currentA.after, l.currentA.after, { rel: 1e-9, abs: 1e-9 }, `line ${l.phase}`));
  });
});

describe('the shipped example: Ferrybank joinery, the machine-shop bank sized with the finishing shop’s in service', () => {
  it('re-solved with the chosen bank and the finishing shop’s bank written as loads, every board agrees (1e-6); the target is met at the origin', () => {
    const text = readFileSync(new URL('../../examples/ferrybank-joinery.yaml', import.meta.url), 'utf8');
    const file = readBoardText(text) as ReturnType<typeof boatyard> & { harmonics: { banks: BankEntry[] } };
    const spec = parseInstallation(file);
    const c = correctInstallationWithHarmonics(spec, normaliseInstallation(spec).installation, { arrangement: 'delta-bank', target: { pf: 0.95, measuredAt: 'origin' } }, { board: 'Machine shop' });
    expect(c.report.status).toBe('meets-target');
    for (const line of c.report.verification.metering!.lines) expect(line.pf.after!).toBeGreaterThanOrEqual(0.95 - 1e-6);
    // The chosen (detuned) bank enters the fundamental at its effective susceptance, as verified.
    const equipment = c.report.verification.equipment.flatMap((g) =>
      g.branches.map((br) => ({ name: `new ${br.branch}`, connection: `${br.from}-${br.to}`, kW: 0, kvar: (-br.susceptanceS * br.vNominal ** 2) / 1000, model: 'constant-impedance' })),
    );
    const finishing = file.harmonics.banks.find((b) => b.board === 'Finishing shop')!;
    const { harmonics: _h, ...plain } = file;
    const boards = plain.boards.map((b) => {
      const extra = b.name === 'Finishing shop' ? partsAsLoads(finishing) : b.name === 'Machine shop' ? equipment : [];
      return { ...b, loads: [...b.loads, ...extra] };
    });
    expectSameSolve(c.effect.after, solveInstallation({ ...plain, boards }), 1e-6);
  });
});
