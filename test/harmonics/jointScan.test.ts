/**
 * The resonance scan with the other banks switched (scanJointResonance) and the duty with them off:
 * - by hand: two equal plain delta banks behind equal feeders on a stiff source. With bank B off,
 *   bank A alone resonates at h_r = √(X_C/(X_s + X_f)) = √(S_sc/Q_c) at its board; with both on the
 *   two banks swing together against the source at √(X_C/(X_f + 2·X_s)) and against each other
 *   through their feeders at √(X_C/X_f); the lossless network's resonances seen from A, the roots of
 *   h·B_A·(h·X_f + X_m(h)) = 1 with X_m = h·X_s ∥ (h·X_f − X_CB/h), confirm both by bisection;
 * - property: on random installations with two or three banks, the joint scan's states with every
 *   other bank fully on are the existing scan's curves and peaks exactly (same numbers, not close);
 * - law: in any mix of the banks' states at any order, |Z| from the evaluator equals the general
 *   solve of the installation at that order with the parts off left out and 1 A driven between the
 *   two terminals (solveFixedInstallation);
 * - the duty with the other bank out of service equals the duty of the same file without that bank.
 * Worst figures go to test/harmonics/.joint-scan.json.
 */
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import {
  controllerLevels,
  switchingLevels,
  createInstallationScanEvaluator,
  parseInstallation,
  readBoardText,
  resolveInstallationHarmonics,
  roundForPlot,
  scanGrid,
  scanJointResonance,
  scanNetworkStates,
  scanResonance,
  solveInstallationNetwork,
  stateKey,
  stepCombinations,
  studyInstallationHarmonics,
  branchAdmittanceAtOrder,
  installationAtOrder,
  solveFixedInstallation,
  terminalVoltage,
  type BankState,
  type InstallationSpec,
  type ScanPeak,
} from '@trivar/core';
import { FigureLog } from '../support/figureLog.js';
import { C0, cAbs, cSub } from '../support/complexMath.js';
import { installationSpecArb } from '../property/arbitraries/installationSpec.js';

const figures = new FigureLog(new URL('./.joint-scan.json', import.meta.url));
afterAll(() => figures.write());

// Hand figures: 400 V, per-phase source X_s = 0.016 Ω (S_sc = 400²/0.016 = 10 MVA at the main board),
// each feeder X_f = 0.004 Ω, each bank 100 kvar at 400 V (delta: star-equivalent X_C = 400²/100 kvar
// = 1.6 Ω); resistances X/50, so the peaks sit within 0.1 % of the lossless resonances.
const XS = 0.016;
const XF = 0.004;
const XC = 1.6;
const TWO_BANKS: InstallationSpec = {
  name: 'two banks on a stiff source',
  supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: XS / 50, x: XS } },
  boards: [
    { name: 'Main', loads: [{ name: 'lamps', connection: 'A-B', kW: 1 }] },
    { name: 'Plant A', fedFrom: 'Main', feeder: { line: { r: XF / 50, x: XF } }, loads: [{ name: 'heater A', connection: 'ABC-delta', kW: 2 }] },
    { name: 'Plant B', fedFrom: 'Main', feeder: { line: { r: XF / 50, x: XF } }, loads: [{ name: 'heater B', connection: 'ABC-delta', kW: 2 }] },
  ],
  harmonics: {
    scan: { maxOrder: 25, step: 0.1 },
    banks: [
      { board: 'Plant A', connection: 'delta', ratedV: 400, stepsKvar: [50, 50] },
      { board: 'Plant B', connection: 'delta', ratedV: 400, stepsKvar: [100] },
    ],
  },
} as InstallationSpec;

/** Lossless parallel resonances seen from board A with bank A at X_CA and bank B at X_CB (null: off). */
function losslessResonances(xca: number, xcb: number | null): number[] {
  const f = (h: number) => {
    const xm = xcb === null ? h * XS : 1 / (1 / (h * XS) + 1 / (h * XF - xcb / h));
    return (h / xca) * (h * XF + xm) - 1;
  };
  const roots: number[] = [];
  for (let h = 1; h < 25; h += 0.01) {
    let [a, b] = [h, h + 0.01];
    if (Math.sign(f(a)) === Math.sign(f(b))) continue;
    for (let i = 0; i < 80; i++) {
      const m = (a + b) / 2;
      if (Math.sign(f(m)) === Math.sign(f(a))) a = m;
      else b = m;
    }
    if (Math.abs(f(a)) < 1e-6) roots.push(a); // not a pole of X_m
  }
  return roots;
}

describe('joint scan by hand: two banks behind their feeders on a stiff source', () => {
  const report = studyInstallationHarmonics(TWO_BANKS);
  const fromA = report.scans.find((s) => s.board === 'Plant A')!;
  const joint = fromA.jointScan!;
  const full = joint.combinations.find((c) => c.label === 'steps 1+2')!;

  it('bank B is scanned in every state of its steps: off, then its one step', () => {
    expect(joint.coverage).toBe('every step combination');
    expect(joint.otherBanks).toEqual([{ board: 'Plant B', levels: [expect.objectContaining({ label: 'off', capacitorKvar: 0 }), expect.objectContaining({ label: 'step 1' })] }]);
    // Bank A's distinct states (off, one 50 kvar step, both) × bank B's two levels.
    expect(joint.networkStates).toBe(3 * 2);
    expect(full.networkStates).toBe(2);
  });

  it('bank A alone (B off): h_r = √(S_sc/Q_c) at its board = √(1.6/0.02) = 8.94', () => {
    const expected = Math.sqrt(XC / (XS + XF)); // 8.944
    expect(losslessResonances(XC, null)).toHaveLength(1);
    expect(losslessResonances(XC, null)[0]).toBeCloseTo(expected, 6);
    // One peak with B off, at 8.94 on every pair (orders rounded to 0.01 in the states list).
    const off = full.states.find((x) => x.otherBanks === 'Plant B bank off')!;
    expect(off.peakOrders).toHaveLength(1);
    const rel = Math.abs(off.peakOrders[0]! - expected) / expected;
    figures.note('A alone: scan peak vs √(X_C/(X_s+X_f)) relative', rel);
    expect(rel).toBeLessThan(2e-3);
    // The classic formula at the board, from its short-circuit power (the scan's own estimate).
    const formula = fromA.scan.combinations.find((c) => c.label === 'steps 1+2')!.formulaOrder!;
    expect(Math.abs(formula - expected) / expected).toBeLessThan(1e-3);
  });

  it('both on: together against the source at √(1.6/0.036) = 6.67, against each other at √(1.6/0.004) = 20', () => {
    const together = Math.sqrt(XC / (XF + 2 * XS));
    const apart = Math.sqrt(XC / XF);
    const roots = losslessResonances(XC, XC);
    expect(roots).toHaveLength(2);
    expect(roots[0]).toBeCloseTo(together, 4);
    expect(roots[1]).toBeCloseTo(apart, 4);
    // With every other bank on, the existing scan: a peak at each root.
    const withBoth = fromA.scan.combinations.find((c) => c.label === 'steps 1+2')!;
    for (const root of roots) {
      const nearest = withBoth.peaks.reduce((b, p) => (Math.abs(p.order - root) < Math.abs(b.order - root) ? p : b));
      figures.note('both on: scan peak vs lossless root relative', Math.abs(nearest.order - root) / root, `root ${root}`);
      expect(Math.abs(nearest.order - root) / root).toBeLessThan(1e-3);
    }
    expect(full.lowestPeak!.otherBanks).toBe('Plant B bank step 1');
    expect(full.highestPeak!.otherBanks).toBe('Plant B bank step 1');
    expect(Math.abs(full.highestPeak!.order - apart) / apart).toBeLessThan(1e-3);
    expect(Math.abs(full.lowestPeak!.order - together) / together).toBeLessThan(1e-3);
  });

  it('one step of A with B off lands on the 13th (√(3.2/0.02) = 12.65), clear of it with B on: a warning names that state', () => {
    const alone = Math.sqrt((2 * XC) / (XS + XF));
    const withB = losslessResonances(2 * XC, XC);
    expect(withB.every((h) => Math.abs(h - 13) > 0.1 * 13)).toBe(true);
    const step1 = joint.combinations.find((c) => c.label === 'step 1')!;
    const at13 = step1.nearOrders.find((n) => n.order === 13)!;
    expect(at13.peak.otherBanks).toBe('Plant B bank off');
    expect(Math.abs(at13.peak.order - alone) / alone).toBeLessThan(1e-3);
    expect(fromA.scan.combinations.find((c) => c.label === 'step 1')!.nearOrders).not.toContain(13);
    const warning = report.warnings.find((w) => w.board === 'Plant A' && w.code === 'resonance-other-banks' && w.threshold === 13)!;
    expect(warning.message).toMatch(/^Plant A bank step 1 with Plant B bank off: resonance with the supply at h ≈ 12\.6[45], within ±10 % of order 13/);
    // A state already near that order with every other bank on is left to the scan's own warning.
    for (const w of report.warnings.filter((x) => x.board === 'Plant A' && x.code === 'resonance-other-banks')) {
      const state = fromA.scan.combinations.find((c) => w.message.startsWith(`Plant A bank ${c.label === 'bank off' ? 'off' : c.label} with `))!;
      expect(state.nearOrders).not.toContain(w.threshold);
    }
  });

  it('checked orders (none injected: the odd orders 3 … 19) near a peak of the full bank name the state of bank B', () => {
    expect(fromA.scan.checkedOrders).toEqual([3, 5, 7, 9, 11, 13, 15, 17, 19]);
    // 6.67 with B on is within 10 % of the 7th; 8.94 with B off within 10 % of the 9th (a triplen of single-phase
    // rectifiers); the banks against each other at 20 with B on within 10 % of the 19th.
    expect(full.nearOrders.map((n) => [n.order, n.peak.otherBanks])).toEqual([[7, 'Plant B bank step 1'], [9, 'Plant B bank off'], [19, 'Plant B bank step 1']]);
    // The nearest: 8.94 is 0.6 % from the 9th, 6.67 is 4.7 % from the 7th.
    expect(full.nearest!.checkedOrder).toBe(9);
  });
});

describe('joint scan by hand: the other bank switched out of its written order', () => {
  // Bank B of 20 + 80 kvar: a controller that switches by need may run step 2 alone (80 kvar,
  // X_C = 400²/80 kvar = 2.0 Ω), a level stepping in the written order never reaches.
  const UNEQUAL = { ...TWO_BANKS, harmonics: { ...TWO_BANKS.harmonics, banks: [TWO_BANKS.harmonics!.banks![0]!, { board: 'Plant B', connection: 'delta', ratedV: 400, stepsKvar: [20, 80] }] } } as InstallationSpec;

  it('every state of bank B is scanned, step 2 alone too, with the lossless resonances of that state', () => {
    const joint = studyInstallationHarmonics(UNEQUAL).scans.find((s) => s.board === 'Plant A')!.jointScan!;
    expect(joint.coverage).toBe('every step combination');
    expect(joint.otherBanks[0]!.levels.map((l) => [l.label, +l.capacitorKvar.toFixed(6)])).toEqual([['off', 0], ['step 1', 20], ['step 2', 80], ['steps 1+2', 100]]);
    expect(joint.networkStates).toBe(3 * 4);
    const full = joint.combinations.find((c) => c.label === 'steps 1+2')!;
    const alone2 = full.states.find((x) => x.otherBanks === 'Plant B bank step 2')!;
    const roots = losslessResonances(XC, 400 ** 2 / 80e3);
    expect(alone2.peakOrders).toHaveLength(roots.length);
    alone2.peakOrders.forEach((h, k) => expect(Math.abs(h - roots[k]!) / roots[k]!).toBeLessThan(2e-3));
  });

  it('where every state would pass the limit, the written order is scanned and the assumptions say other orders are not', () => {
    const report = studyInstallationHarmonics(UNEQUAL, { jointStateLimit: 9 });
    const joint = report.scans.find((s) => s.board === 'Plant A')!.jointScan!;
    expect(joint.coverage).toBe('controller levels');
    expect(joint.otherBanks[0]!.levels.map((l) => l.label)).toEqual(['off', 'step 1', 'steps 1+2']);
    expect(joint.combinations.every((c) => c.states.every((x) => x.otherBanks !== 'Plant B bank step 2'))).toBe(true);
    expect(report.assumptions.some((a) => a.startsWith('Plant A:') && a.includes('order the steps are written') && a.includes('other switching orders are not covered'))).toBe(true);
  });
});

/** Random installations on a three-phase supply with a bank on two or three of their boards. */
const multiBankArb = fc
  .tuple(
    installationSpecArb({ systems: ['three-phase-4wire', 'three-phase-3wire'], minBoards: 2, maxBoards: 5 }),
    fc.array(fc.record({ connection: fc.constantFrom('delta' as const, 'star' as const), steps: fc.array(fc.double({ min: 2, max: 40, noNaN: true }), { minLength: 1, maxLength: 3 }), fixed: fc.option(fc.double({ min: 1, max: 10, noNaN: true }), { nil: undefined }), detuned: fc.boolean() }), { minLength: 3, maxLength: 3 }),
    fc.integer({ min: 2, max: 3 }),
  )
  .map(([spec, banks, count]) => {
    const { shape: _shape, ...file } = spec;
    const on = file.boards.slice(0, Math.min(count, file.boards.length)).map((b) => b.name);
    return {
      ...file,
      harmonics: {
        scan: { maxOrder: 15, step: 0.25 },
        banks: on.map((board, k) => {
          const b = banks[k]!;
          return { board, connection: b.connection, ratedV: 440, stepsKvar: b.steps, ...(b.fixed ? { fixedKvar: b.fixed } : {}), ...(b.detuned && k === 1 ? { detuningPercent: 7 } : {}) };
        }),
      },
    } as InstallationSpec;
  });

/** The installation, its models and its fundamental; null for one that cannot carry its loads at the fundamental or has fewer than two banks. */
function withBanks(spec: InstallationSpec) {
  try {
    const prepared = resolveInstallationHarmonics(parseInstallation(spec));
    const fundamental = solveInstallationNetwork(prepared.installation);
    return prepared.bankBoards.length < 2 ? null : { ...prepared, fundamental };
  } catch {
    return null;
  }
}

describe('joint scan on random installations', () => {
  it('the states with every other bank fully on are the existing scan exactly; levels and counts as documented', () => {
    let checked = 0;
    fc.assert(
      fc.property(multiBankArb, (spec) => {
        const prepared = withBanks(spec);
        // Skipped runs do not count towards numRuns, so every counted run compares.
        fc.pre(prepared !== null);
        const { models, bankBoards, fundamental } = prepared!;
        checked++;
        const grid = scanGrid(15, 0.25);
        for (const b of bankBoards) {
          const evaluator = createInstallationScanEvaluator(fundamental, models, b);
          const scan = scanResonance(fundamental.boards[b]!, models[b]!, { grid, checkedOrders: [5, 7, 11], checkedOrdersFrom: 'spectra and background' }, evaluator);
          const combos = stepCombinations(models[b]!.bank!.stepLoads.length);
          const allOn = (k: number): BankState => ({ steps: Array.from({ length: evaluator.banks[k]!.stepCount }, () => true), fixedOn: true });
          // Electrically identical combinations are scanned once, as the first of them (scanResonance's dedupe).
          const keys = combos.map((steps) => stateKey(fundamental.boards[b]!.board, models[b]!.bank!, steps));
          const states = combos.map((_, c) => evaluator.banks.map((_, k) => (k === evaluator.ownBank ? { steps: combos[keys.indexOf(keys[c]!)]!, fixedOn: true } : allOn(k))));
          const seen: ScanPeak[][] = [];
          scanNetworkStates(evaluator, grid, states, (s, values, peaks) => {
            const c = scan.combinations[s]!;
            evaluator.pairs.forEach((_, k) => {
              const curve = grid.map((_, i) => values[i * evaluator.pairs.length + k]!);
              expect(roundForPlot(curve)).toEqual(c.impedanceOhm[k]);
            });
            expect(peaks).toEqual(c.peaks);
            seen.push(peaks);
          });
          expect(seen).toHaveLength(combos.length);

          // The summary over the other banks' states contains the all-on state's peaks.
          const joint = scanJointResonance(fundamental, models, evaluator, { grid, checkedOrders: [5, 7, 11] })!;
          const otherBanks = evaluator.banks.filter((_, k) => k !== evaluator.ownBank).map((bank) => [fundamental.boards[bank.board]!.board, models[bank.board]!.bank!] as const);
          const levels = otherBanks.map(([board, bank]) => switchingLevels(board, bank));
          expect(joint.coverage).toBe('every step combination');
          levels.forEach((l, j) => {
            const [board, bank] = otherBanks[j]!;
            expect(joint.otherBanks[j]!.levels.map((x) => x.label)).toEqual(l.map((x) => x.label));
            // Everything off first, everything on last, least capacitance first, no two electrically alike.
            expect(l[0]!.capacitorKvar).toBe(0);
            expect(l.at(-1)!.steps.every(Boolean) && l.at(-1)!.fixedOn).toBe(true);
            l.slice(1).forEach((x, k) => expect(x.capacitorKvar).toBeGreaterThanOrEqual(l[k]!.capacitorKvar));
            const keys = l.map((x) => `${x.fixedOn} ${stateKey(board, bank, x.steps)}`);
            expect(new Set(keys).size).toBe(l.length);
            // Every level a controller reaches in the written order is one of them.
            for (const x of controllerLevels(board, bank)) expect(keys).toContain(`${x.fixedOn} ${stateKey(board, bank, x.steps)}`);
          });
          const others = levels.reduce((n, l) => n * l.length, 1);
          joint.combinations.forEach((c, k) => {
            expect(c.networkStates).toBe(others);
            for (const p of scan.combinations[k]!.peaks) {
              expect(c.lowestPeak!.order).toBeLessThanOrEqual(p.order);
              expect(c.highestPeak!.order).toBeGreaterThanOrEqual(p.order);
            }
            for (const o of scan.combinations[k]!.nearOrders) expect(c.nearOrders.map((n) => n.order)).toContain(o);
          });
        }
      }),
      { numRuns: 8 },
    );
    figures.note('random installations with two or more banks checked', checked);
    expect(checked).toBe(8);
  });

  it('any mix of bank states at any order: |Z| is the general solve with 1 A driven between the terminals', () => {
    let checked = 0;
    fc.assert(
      fc.property(multiBankArb, fc.double({ min: 1, max: 15, noNaN: true }), fc.array(fc.boolean(), { minLength: 12, maxLength: 12 }), (spec, h, switches) => {
        const prepared = withBanks(spec);
        fc.pre(prepared !== null);
        const { models, bankBoards, fundamental } = prepared!;
        const b = bankBoards[0]!;
        const evaluator = createInstallationScanEvaluator(fundamental, models, b);
        let n = 0;
        const states: BankState[] = evaluator.banks.map((bank) => ({ steps: Array.from({ length: bank.stepCount }, () => switches[n++ % 12]!), fixedOn: switches[n++ % 12]! || !bank.hasFixedPart }));
        // Parts off: each bank's steps as its state has them, its fixed part when out of service.
        const off = new Set(
          evaluator.banks.flatMap((bank, k) => {
            const m = models[bank.board]!.bank!;
            return [...(m.fixedLoad !== null && !states[k]!.fixedOn ? [m.fixedLoad] : []), ...m.stepLoads.filter((_, j) => !states[k]!.steps[j])].map((l) => `${bank.board}:${l}`);
          }),
        );
        // Each part of a star bank has its own star point, tied to nothing while that part is off, which
        // the general solve cannot take (the evaluator ties it down): such mixes are left to ngspice.
        const starOff = evaluator.banks.some((bank, k) => {
          const written = spec.harmonics!.banks!.find((x) => x.board === fundamental.boards[bank.board]!.board.name)!;
          return written.connection === 'star' && (!states[k]!.fixedOn || !states[k]!.steps.every(Boolean));
        });
        fc.pre(!starOff);
        evaluator.prepare(h);
        const out = new Float64Array(evaluator.pairs.length);
        evaluator.impedancesIn(states, out, 0);
        const atOrder = installationAtOrder(fundamental.installation, models, h);
        const zeroEmf = { ...atOrder, main: { ...atOrder.main, emf: atOrder.main.emf.map(() => ({ re: 0, im: 0 })) } };
        const admittances = fundamental.boards.map((board, c) =>
          board.branches.map((bs, l) => bs.map((st) => (off.has(`${c}:${l}`) ? { re: 0, im: 0 } : branchAdmittanceAtOrder(st.admittance, models[c]!.loads[l]!, h)))),
        );
        evaluator.pairs.forEach(([p, q], k) => {
          const drive = { name: 'drive', connection: 'A-N' as const, model: 'constant-impedance' as const, origin: 'added' as const, branches: [{ from: q, to: p, sNominal: { re: 1, im: 0 }, vNominal: 1, zip: { z: 1, i: 0, p: 0 } }] };
          const withDrive = b === 0 ? { ...zeroEmf, main: { ...zeroEmf.main, loads: [...zeroEmf.main.loads, drive] } } : { ...zeroEmf, subBoards: zeroEmf.subBoards.map((sb, i) => (i + 1 === b ? { ...sb, loads: [...sb.loads, drive] } : sb)) };
          const solved = solveFixedInstallation(withDrive as never, {
            admittances: admittances.map((board, c) => (c === b ? [...board, [{ re: 0, im: 0 }]] : board)),
            branchSources: admittances.map((board, c) => [...board.map((bs) => bs.map(() => null)), ...(c === b ? [[{ re: 1, im: 0 }]] : [])]),
          });
          const at = solved.boards[b]!;
          const z = cAbs(cSub(terminalVoltage(at, p) ?? C0, terminalVoltage(at, q) ?? C0));
          const error = Math.abs(z - out[k]!) / Math.max(z, 1e-12);
          figures.note('mixed state |Z| vs general solve (relative)', error, `h ${h} ${p}-${q}`);
          expect(error).toBeLessThan(1e-9);
        });
        checked++;
      }),
      { numRuns: 20 },
    );
    figures.note('mixed states checked against the general solve', checked);
    expect(checked).toBe(20);
  });

  it('above the state limit the other banks are taken at their extremes, and the assumptions say so', () => {
    const report = studyInstallationHarmonics(TWO_BANKS, { jointStateLimit: 2 });
    const joint = report.scans[0]!.jointScan!;
    expect(joint.coverage).toBe('all off or all on together');
    expect(report.assumptions.some((a) => a.includes('Plant A') && a.includes('more than 2 networks') && a.includes('intermediate levels are not covered'))).toBe(true);
    const roomy = studyInstallationHarmonics(TWO_BANKS, { jointStateLimit: 6 });
    expect(roomy.scans[0]!.jointScan!.coverage).toBe('every step combination');
    for (const bad of [0, 2.5, Number.NaN]) {
      expect(() => studyInstallationHarmonics(TWO_BANKS, { jointStateLimit: bad })).toThrow(/jointStateLimit.*whole number of networks, at least 1/);
    }
  });
});

describe('capacitor duty with the other banks out of service', () => {
  const example = readBoardText(readFileSync(new URL('../../examples/ferrybank-joinery.yaml', import.meta.url), 'utf8')) as InstallationSpec & { harmonics: { banks: unknown[] } };
  const both = studyInstallationHarmonics(example);
  const alone = studyInstallationHarmonics({ ...example, harmonics: { ...example.harmonics, banks: example.harmonics.banks.slice(0, 1) } });

  it('a state of the other bank near a checked order is checked too: Finishing shop with Machine shop at steps 1+3 equals the file with only those steps', () => {
    // From Finishing shop, the joint scan puts a peak near a checked order with Machine shop at steps 1+3
    // (90 kvar: a level stepping 30, 30, 60 in the written order never reaches).
    const duty = both.scans.find((s) => s.board === 'Finishing shop')!.capacitorDuty!;
    const step1 = duty.cases.find((c) => c.label === 'step 1')!;
    expect(step1.condition).toEqual({ capacitancePercent: 110, loads: 'off', otherBanks: 'switched', otherBanksState: 'Machine shop bank steps 1+3' });
    expect(both.assumptions.some((a) => a.includes('in each state at which the joint scan puts a peak within ±10 % of a checked order'))).toBe(true);
    // The same network written another way: Machine shop's bank as its steps 1 and 3 alone (30 + 60 kvar), all on.
    const banks = example.harmonics.banks as { board: string; stepsKvar: number[] }[];
    const written = { ...example, harmonics: { ...example.harmonics, banks: banks.map((b) => (b.board === 'Machine shop' ? { ...b, stepsKvar: [b.stepsKvar[0]!, b.stepsKvar[2]!] } : b)) } };
    const same = studyInstallationHarmonics(written).scans.find((s) => s.board === 'Finishing shop')!.capacitorDuty!.cases.find((c) => c.label === 'step 1')!;
    expect(same.condition).toEqual({ capacitancePercent: 110, loads: 'off', otherBanks: 'on' });
    for (const key of ['voltageRms', 'voltagePeak', 'currentRms', 'kvar'] as const) {
      figures.note('duty at a switched state vs the file written with those steps on, relative', Math.abs(step1.figures[key] - same.figures[key]) / same.figures[key], key);
      expect(Math.abs(step1.figures[key] - same.figures[key])).toBeLessThan(1e-9 * same.figures[key]);
    }
    // 1.20 × rated current: the worst of this bank's duty (with Machine shop fully on or out of service it was 1.07).
    expect(step1.figures.currentRms).toBeCloseTo(1.2022, 3);
    expect(duty.worst).toEqual(step1);
  });

  it('every state is checked with the other bank on and out of service; off equals the file without that bank', () => {
    const duty = both.scans.find((s) => s.board === 'Machine shop')!.capacitorDuty!;
    const single = alone.scans[0]!.capacitorDuty!;
    expect(new Set(duty.conditions.map((c) => c.otherBanks))).toEqual(new Set(['on', 'off']));
    expect(single.conditions.every((c) => c.otherBanks === undefined)).toBe(true);
    // The worst case over every condition, so at least as bad as the single-bank study's.
    const ratio = (f: { voltageRms: number; currentRms: number }) => Math.max(f.voltageRms / 1.1, f.currentRms / duty.limits.currentRms);
    expect(ratio(duty.worst.figures)).toBeGreaterThanOrEqual(ratio(single.worst.figures) - 1e-12);
    // Where the worst case of a state is with the other bank off, its figures are the single-bank file's.
    // Per state: the worst over both sets of conditions; the off set is the file without the bank.
    for (const c of duty.cases) {
      const same = single.cases.find((x) => x.label === c.label)!;
      expect(ratio(c.figures)).toBeGreaterThanOrEqual(ratio(same.figures) - 1e-12);
      if (c.condition.otherBanks !== 'off') continue;
      const { otherBanks: _o, ...condition } = c.condition;
      expect(condition).toEqual(same.condition);
      for (const key of ['voltageRms', 'currentRms', 'kvar'] as const) {
        figures.note('duty with the other bank off vs without it, relative', Math.abs(c.figures[key] - same.figures[key]) / same.figures[key], `${c.label} ${key}`);
        expect(Math.abs(c.figures[key] - same.figures[key])).toBeLessThan(1e-9 * same.figures[key]);
      }
    }
  });
});
