/**
 * The harmonic study of installations:
 * - collapse: a random board with non-linear loads, its loads spread over a tree of
 *   sub-boards joined by zero-impedance feeders (a bank, on three-phase boards, on one of
 *   them), gives the single-board study's figures — lines, neutral, bus voltages, power
 *   factors, TDD, the scan of every bank state and the capacitor duty (fast-check);
 * - laws at every order on random installations with spectra: KCL at every board (the
 *   feeder in = its own branches + the feeders out, lines and neutral), complex power at
 *   every board (in at its busbar = own branches + what leaves in its feeders), each
 *   feeder's sending − receiving power = its conductors' I²Z at order h, and Tellegen over
 *   the whole circuit (EMFs = source windings + conductors + every branch);
 * - bad input names the field path.
 * Worst figures go to test/harmonics/.installation-harmonics.json.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import {
  compileInstallation,
  InputError,
  installationAtOrder,
  parseInstallation,
  resolveInstallationHarmonics,
  solveInstallationAtOrder,
  solveInstallationNetwork,
  studyHarmonics,
  studyInstallationHarmonics,
  type BoardSpec,
  type DistortionReading,
  type HarmonicsReport,
  type InstallationHarmonicsReport,
  type InstallationSpec,
  type InstallationSolution,
  type HarmonicModel,
  type LoadSpec,
} from '@trivar/core';
import { C0, cAbs, cAdd, cInv, cMul, cPower, cScale, cSub } from '../support/complexMath.js';
import { FigureLog } from '../support/figureLog.js';
import { harmonicBoardArb, spectrumArb } from '../property/arbitraries/harmonicBoardSpec.js';
import { installationSpecArb } from '../property/arbitraries/installationSpec.js';

const figures = new FigureLog(new URL('./.installation-harmonics.json', import.meta.url));
afterAll(() => figures.write());

const REL = 1e-9;

/** A board's loads spread over a tree of sub-boards behind zero-impedance feeders; the bank (if any) on board `bankOn`. */
function collapsed(spec: BoardSpec, parents: readonly number[], placeOf: readonly number[], bankOn: number): InstallationSpec {
  const hasNeutral = spec.supply.system !== 'three-phase-3wire';
  const zero = { line: { r: 0, x: 0 }, ...(hasNeutral ? { neutral: { r: 0, x: 0 } } : {}) };
  // An installation's feeder names its line and neutral conductors (installationRules); a board
  // file's feeder may leave either out for none, so the main board's feeder is completed with zeros.
  const count = parents.length + 1;
  const names = Array.from({ length: count }, (_, b) => (b === 0 ? 'main' : `sub ${b}`));
  const { bank, ...shared } = spec.harmonics ?? {};
  return {
    name: 'collapsed',
    supply: spec.supply,
    ...(spec.conventions ? { conventions: spec.conventions } : {}),
    boards: names.map((name, b) => ({
      name,
      ...(b === 0 ? (spec.feeder ? { feeder: { ...zero, ...spec.feeder } } : {}) : { fedFrom: names[parents[b - 1]!]!, feeder: zero }),
      loads: spec.loads.filter((_, i) => placeOf[i]! % count === b),
    })),
    harmonics: { ...shared, ...(bank ? { banks: [{ ...bank, board: names[bankOn % count]! }] } : {}) },
  } as InstallationSpec;
}

const bankArb = fc.record({
  connection: fc.constantFrom('delta' as const, 'star' as const),
  ratedV: fc.constantFrom(400, 440, 480),
  stepsKvar: fc.array(fc.double({ min: 2, max: 30, noNaN: true }), { minLength: 1, maxLength: 2 }),
  fixedKvar: fc.option(fc.double({ min: 1, max: 10, noNaN: true }), { nil: undefined }),
  detuningPercent: fc.option(fc.constantFrom(7, 14), { nil: undefined }),
  capacitanceTolerance: fc.option(fc.record({ minusPercent: fc.constantFrom(0, 5), plusPercent: fc.constantFrom(5, 10) }), { nil: undefined }),
});

const collapseCaseArb = fc
  .tuple(
    harmonicBoardArb,
    fc.option(bankArb, { nil: undefined }),
    fc.integer({ min: 1, max: 4 }).chain((n) => fc.tuple(...Array.from({ length: n }, (_, i) => fc.integer({ min: 0, max: i })))),
    fc.array(fc.nat(), { minLength: 6, maxLength: 6 }),
    fc.nat(),
  )
  .map(([spec, bank, parents, placeOf, bankOn]) => {
    const threePhase = spec.supply.system.startsWith('three-phase');
    const board: BoardSpec = {
      ...spec,
      harmonics: { ...spec.harmonics, scan: { maxOrder: 13, step: 0.25 }, ...(bank && threePhase ? { bank } : {}), ...(placeOf[0]! % 2 ? { pcc: {} } : {}) },
    };
    return { board, installation: collapsed(board, parents, placeOf, bankOn) };
  });

/** |a − e| ≤ REL·(|e| + scale): scale is the size of the quantity's kind on the board (so zeros compare). */
function close(a: number | null, e: number | null, scale: number, what: string): void {
  if (a === null || e === null) return expect(a, what).toBe(e);
  figures.note('collapse relative (of the kind’s scale)', Math.abs(a - e) / Math.max(Math.abs(e), scale), what);
  expect(Math.abs(a - e), `${what}: installation ${a}, board ${e}`).toBeLessThanOrEqual(REL * (Math.abs(e) + scale));
}

function sameReading(a: DistortionReading, e: DistortionReading, scale: number, what: string): void {
  close(a.rms, e.rms, scale, `${what} rms`);
  close(a.fundamental, e.fundamental, scale, `${what} h1`);
  expect(a.orders.map((o) => o.order)).toEqual(e.orders.map((o) => o.order));
  a.orders.forEach((o, k) => close(o.magnitude, e.orders[k]!.magnitude, scale, `${what} h${o.order}`));
}

function sameStudy(inst: InstallationHarmonicsReport, board: HarmonicsReport, scannedFrom: string): void {
  const main = inst.boards[0]!;
  const amps = Math.max(1e-3, ...board.lines.map((l) => l.current.rms));
  const volts = Math.max(...board.lines.map((l) => l.voltage.rms));
  expect(inst.orders).toEqual(board.orders);
  main.lines.forEach((l, k) => {
    sameReading(l.current, board.lines[k]!.current, amps, `line ${l.phase}`);
    sameReading(l.voltage, board.lines[k]!.voltage, volts, `voltage ${l.phase}`);
  });
  main.lineToLine.forEach((p, k) => sameReading(p.voltage, board.lineToLine[k]!.voltage, volts, `voltage ${p.pair}`));
  if (board.neutral) sameReading(main.neutral!.current, board.neutral.current, amps, 'neutral');
  else expect(main.neutral).toBeNull();
  close(main.powerFactor.true, board.powerFactor.true, 1, 'true PF');
  close(main.powerFactor.displacement, board.powerFactor.displacement, 1, 'displacement PF');
  expect(inst.tdd === null).toBe(board.tdd === null);
  inst.tdd?.lines.forEach((l, k) => close(l.tddPercent, board.tdd!.lines[k]!.tddPercent, 1, `TDD ${l.phase}`));
  // Every sub-board shares the main board's nodes: the same bus voltages.
  for (const b of inst.boards) b.lines.forEach((l, k) => close(l.voltage.rms, board.lines[k]!.voltage.rms, volts, `${b.board} voltage ${l.phase}`));
  // The scan seen from the bank's board (or the main board) and the duty.
  expect(inst.scans.map((s) => s.board)).toEqual([scannedFrom]);
  const scan = inst.scans[0]!.scan;
  close(scan.shortCircuitKVA, board.scan.shortCircuitKVA, 1, 'S_sc');
  expect(scan.combinations.map((c) => c.label)).toEqual(board.scan.combinations.map((c) => c.label));
  scan.combinations.forEach((c, k) => {
    const e = board.scan.combinations[k]!;
    const zScale = Math.max(...e.impedanceOhm.flat());
    c.impedanceOhm.forEach((curve, p) => curve.forEach((z, i) => close(z, e.impedanceOhm[p]![i]!, 1e-5 * zScale, `|Z| ${c.label} pair ${p} point ${i}`)));
    expect(c.peaks.length).toBe(e.peaks.length);
    c.peaks.forEach((pk, i) => expect(Math.abs(pk.order - e.peaks[i]!.order), `${c.label} peak`).toBeLessThan(1e-6));
  });
  const duty = inst.scans[0]!.capacitorDuty;
  if (!board.capacitorDuty) expect(duty).toBeNull();
  else {
    expect(duty!.cases.map((c) => [c.label, c.branch, c.condition])).toEqual(board.capacitorDuty.cases.map((c) => [c.label, c.branch, c.condition]));
    duty!.cases.forEach((c, k) => {
      const e = board.capacitorDuty!.cases[k]!.figures;
      for (const key of ['voltageRms', 'voltagePeak', 'currentRms', 'kvar'] as const) close(c.figures[key], e[key], 1, `duty ${c.label} ${key}`);
    });
  }
  // The board's warnings; sub-boards add their own feeders' (their neutral and busbar findings).
  // A bank on a sub-board is judged for leading at that board's feeder, the board file's at the whole board: the
  // same finding only where the bank is on the main board.
  const leadsElsewhere = (w: { code: string }) => scannedFrom !== main.board && w.code === 'bank-state-leads';
  const asBoard = inst.warnings.filter((w) => (w.board === main.board || !/^(neutral|voltage)-/.test(w.code)) && !leadsElsewhere(w));
  expect(asBoard.map((w) => w.code).sort()).toEqual(board.warnings.filter((w) => !leadsElsewhere(w)).map((w) => w.code).sort());
}

describe('an installation collapsed to one board (zero-impedance feeders)', () => {
  it('gives the single-board harmonic study: lines, neutral, voltages, PF, TDD, scan and duty', () => {
    fc.assert(
      fc.property(collapseCaseArb, ({ board, installation }) => {
        let single: HarmonicsReport;
        try {
          single = studyHarmonics(board);
        } catch (error) {
          // A board the solver refuses is refused as an installation too.
          expect(() => studyInstallationHarmonics(installation)).toThrow((error as Error).constructor as never);
          return;
        }
        const inst = studyInstallationHarmonics(installation);
        sameStudy(inst, single, installation.harmonics?.banks?.[0]?.board ?? 'main');
      }),
      { numRuns: 30 },
    );
  });

  it('a single-phase board whose neutral equals its line current up to round-off: no neutral-above-phase warning either way (found by the property above)', () => {
    const board = {"name": "random board", "supply": {"system": "single-phase", "voltage": {"lineToNeutral": 230}, "frequencyHz": 50, "emf": {"A": {"V": 230, "angleDeg": 0}}}, "loads": [{"name": "L1", "connection": "A-N", "kW": -0.15, "pf": 0.5, "spectrum": "switch-mode"}, {"name": "L2", "connection": "A-N", "kW": -0.18232422023098788, "pf": 0.6077474007699596, "model": "constant-impedance", "linearForm": "series"}, {"name": "L3", "connection": "A-N", "kW": -0.2722782609880827, "pf": 0.907594203293609, "linearForm": "series"}, {"name": "L4", "connection": "A-N", "kW": -0.15, "pf": 0.5, "zip": {"z": 0, "i": 0, "p": 1}, "spectrum": "switch-mode"}], "harmonics": {"scan": {"maxOrder": 13, "step": 0.25}, "pcc": {}}} as BoardSpec;
    const installation = collapsed(board, [0, 0, 0], [1, 1, 0, 0, 0, 0], 0);
    const single = studyHarmonics(board);
    expect(single.warnings.map((w) => w.code)).toEqual(['ideal-source']);
    sameStudy(studyInstallationHarmonics(installation), single, 'main');
  });

  it('a board file given to the installation study is the installation with that one board', () => {
    fc.assert(
      fc.property(collapseCaseArb, ({ board }) => {
        let single: HarmonicsReport;
        try {
          single = studyHarmonics(board);
        } catch {
          return;
        }
        sameStudy(studyInstallationHarmonics(board), single, board.name ?? 'board');
      }),
      { numRuns: 10 },
    );
  });
});

/** Random installations (every supply shape) with spectra on some loads and maybe background. */
const harmonicInstallationArb = fc
  .tuple(installationSpecArb({ maxBoards: 6 }), fc.array(fc.option(spectrumArb, { nil: undefined }), { minLength: 24, maxLength: 24 }), fc.boolean())
  .map(([spec, spectra, background]) => {
    let k = 0;
    const { shape: _shape, ...file } = spec;
    return {
      ...file,
      boards: file.boards.map((b) => ({
        ...b,
        loads: b.loads.map((l): LoadSpec => {
          const spectrum = spectra[k++ % spectra.length];
          return l.connection === 'ABC-star' || spectrum === undefined ? l : { ...l, spectrum };
        }),
      })),
      ...(background ? { harmonics: { background: [{ order: 5, percent: 2, angleDeg: 20 }, { order: 7, percent: 1 }] } } : {}),
    } as InstallationSpec;
  });

/** The installation and models the study builds, and its fundamental. */
function preparedInstallation(spec: InstallationSpec): { models: readonly HarmonicModel[]; fundamental: InstallationSolution } {
  const { installation, models } = resolveInstallationHarmonics(parseInstallation(spec));
  return { models, fundamental: solveInstallationNetwork(installation) };
}

const power = cPower;

describe('laws of the installation at every harmonic order (random installations with spectra)', () => {
  it('KCL and power at every board, feeder losses = I²Z, Tellegen over the circuit', () => {
    fc.assert(
      fc.property(harmonicInstallationArb, (spec) => {
        let prepared: ReturnType<typeof preparedInstallation>;
        try {
          prepared = preparedInstallation(spec);
        } catch {
          return; // a supply that cannot carry the loads at the fundamental: not a harmonic question
        }
        const { models, fundamental } = prepared;
        const orders = [...new Set(models.flatMap((m) => [...m.background.map((o) => o.order), ...m.loads.flatMap((l) => (l.kind === 'non-linear' ? l.spectrum.map((o) => o.order) : []))]))];
        for (const h of orders) {
          const solution = solveInstallationAtOrder(fundamental, models, h);
          const inst = fundamental.installation;
          const atOrder = installationAtOrder(inst, models, h);
          const v = (node: number | undefined) => (node === undefined || node < 0 ? C0 : (solution.boards[0]!.nodeVoltages[node] ?? C0));
          // At least 1 A, so an installation that carries almost nothing is not held to round-off of zero.
          const amps = Math.max(1, ...solution.boards.flatMap((s) => [...s.lineCurrents, ...s.branches.flat().map((b) => b.current)].map(cAbs)));
          const va = amps * inst.main.nominalLineToNeutralV;
          solution.boards.forEach((s, b) => {
            const children = inst.subBoards.flatMap((sb, i) => (sb.fedFrom === b ? [i + 1] : []));
            const topo = s.topology;
            // KCL at the board: what the feeder brings in = own branches + what the feeders out take.
            s.board.phases.forEach((phase, k) => {
              let out = C0;
              s.board.loads.forEach((load, l) =>
                load.branches.forEach((br, i) => {
                  const current = s.branches[l]![i]!.current;
                  if (br.from === phase) out = cAdd(out, current);
                  if (br.to === phase) out = cSub(out, current);
                }),
              );
              for (const c of children) out = cAdd(out, solution.boards[c]!.lineCurrents[k]!);
              const residual = cAbs(cSub(s.lineCurrents[k]!, out));
              figures.note('board KCL per order (of the largest branch current)', residual / amps, `${s.board.name} ${phase} h${h}`);
              expect(residual).toBeLessThanOrEqual(REL * amps);
            });
            if (s.neutralCurrent && !(b === 0 ? inst.main.neutralOpen : inst.subBoards[b - 1]!.feeder.neutralOpen)) {
              let back = C0;
              s.board.loads.forEach((load, l) =>
                load.branches.forEach((br, i) => {
                  const current = s.branches[l]![i]!.current;
                  if (br.to === 'N') back = cAdd(back, current);
                  if (br.from === 'N') back = cSub(back, current);
                }),
              );
              for (const c of children) back = cAdd(back, solution.boards[c]!.neutralCurrent!);
              const residual = cAbs(cSub(s.neutralCurrent, back));
              figures.note('board neutral KCL per order', residual / amps, `${s.board.name} h${h}`);
              expect(residual).toBeLessThanOrEqual(REL * amps);
            }
            // Power at the board's busbar = own branches + what leaves in the feeders out (at their sending end).
            const inAt = (sol: typeof s, busTopo: typeof topo) => {
              let total = C0;
              sol.board.phases.forEach((_, k) => (total = cAdd(total, power(v(busTopo.busNode[k]), sol.lineCurrents[k]!))));
              if (sol.neutralCurrent) total = cSub(total, power(v(busTopo.neutralNode), sol.neutralCurrent));
              return total;
            };
            let own = C0;
            s.branches.flat().forEach((br) => (own = cAdd(own, power(br.voltage, br.current))));
            let leaving = C0;
            for (const c of children) leaving = cAdd(leaving, inAt(solution.boards[c]!, topo));
            const residual = cAbs(cSub(inAt(s, topo), cAdd(own, leaving)));
            figures.note('board power per order (of largest branch VA)', residual / va, `${s.board.name} h${h}`);
            expect(residual).toBeLessThanOrEqual(REL * va);
            // A feeder's sending − receiving power = its conductors' I²Z at order h.
            if (b > 0) {
              const sb = atOrder.subBoards[b - 1]!;
              const parent = solution.boards[sb.fedFrom]!.topology;
              let loss = C0;
              s.lineCurrents.forEach((i, k) => (loss = cAdd(loss, cScale(sb.feeder.lineImpedances[k]!, cAbs(i) ** 2))));
              if (s.neutralCurrent && !sb.feeder.neutralOpen) loss = cAdd(loss, cScale(sb.feeder.neutralImpedance, cAbs(s.neutralCurrent) ** 2));
              const drop = cSub(inAt(s, parent), inAt(s, topo));
              const r = cAbs(cSub(drop, loss));
              figures.note('feeder loss per order (of largest branch VA)', r / va, `${s.board.name} h${h}`);
              expect(r).toBeLessThanOrEqual(REL * va);
            }
          });
          // Tellegen over the compiled circuit at order h: EMFs = windings + elements + branches.
          const { network, layout } = compileInstallation(atOrder);
          let delivered = C0;
          let absorbed = C0;
          network.circuit.sources.forEach((src, k) => {
            const i = solution.boards[0]!.lineCurrents[layout.mainSources.indexOf(k)]!;
            delivered = cAdd(delivered, power(src.emf, i));
            if (src.admittance) absorbed = cAdd(absorbed, cScale(cInv(src.admittance), cAbs(i) ** 2));
          });
          for (const e of network.circuit.elements) {
            const dv = cSub(v(e.from), v(e.to));
            absorbed = cAdd(absorbed, power(dv, cMul(e.admittance, dv)));
          }
          solution.boards.forEach((s) => s.branches.flat().forEach((br) => (absorbed = cAdd(absorbed, power(br.voltage, br.current)))));
          const residual = cAbs(cSub(delivered, absorbed));
          figures.note('Tellegen per order (of largest branch VA)', residual / va, `h${h}`);
          expect(residual).toBeLessThanOrEqual(REL * va);
        }
      }),
      { numRuns: 40 },
    );
  });
});

describe('bad input to the installation harmonic study', () => {
  const base = (harmonics: unknown): unknown => ({
    name: 'two boards',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 5, xOverR: 4 } },
    boards: [
      { name: 'Main', loads: [{ name: 'pcs', connection: 'A-N', kW: 5, spectrum: 'switch-mode' }] },
      { name: 'Shed', fedFrom: 'Main', feeder: { lengthM: 20, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: 'drive', connection: 'ABC-delta', kW: 11, spectrum: 'six-pulse-drive' }] },
    ],
    harmonics,
  });
  const bank = { connection: 'delta', ratedV: 440, stepsKvar: [10] };
  const issuesOf = (input: unknown) => {
    try {
      studyInstallationHarmonics(input);
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      return (error as InputError).issues.map((i) => ({ code: i.code, path: i.path, message: i.message }));
    }
    throw new Error('expected an InputError');
  };
  it.each([
    ['a bank on a board the installation does not have', { banks: [{ ...bank, board: 'Barn' }] }, 'unknown_board', 'harmonics.banks[0].board', /"Main", "Shed"/],
    ['two banks on one board', { banks: [{ ...bank, board: 'Shed' }, { ...bank, board: 'Shed' }] }, 'duplicate', 'harmonics.banks[1].board', /harmonics\.banks\[0\]/],
    ['a bank without its board', { banks: [bank] }, 'missing', 'harmonics.banks[0].board', /board/],
    ['a board file’s single bank in an installation', { bank }, 'unknown_key', 'harmonics.bank', /keys taken here \(.*\); nearest: "banks"/],
    ['a step of no output', { banks: [{ ...bank, board: 'Shed', stepsKvar: [0] }] }, 'out_of_range', 'harmonics.banks[0].stepsKvar[0]', /0/],
  ])('%s', (_what, harmonics, code, path, words) => {
    const issues = issuesOf(base(harmonics));
    const issue = issues.find((i) => i.path === path);
    expect(issue, JSON.stringify(issues)).toBeDefined();
    expect(issue!.code).toBe(code);
    expect(issue!.message).toMatch(words);
  });

  it('a spectrum on a load of a sub-board is checked at its path in the installation', () => {
    const input = base({}) as { boards: { loads: Record<string, unknown>[] }[] };
    input.boards[1]!.loads[0] = { ...input.boards[1]!.loads[0], spectrum: [{ order: 5.5, percent: 20 }] };
    const issues = issuesOf(input);
    expect(issues.map((i) => i.path)).toContain('boards[1].loads[0].spectrum[0].order');
  });

  it('a star bank on a split-phase installation (a delta bank, across the two lines, is taken)', () => {
    const input = base({ banks: [{ ...bank, connection: 'star', board: 'Shed' }] }) as Record<string, unknown> & { boards: { loads: unknown[] }[] };
    input.supply = { system: 'split-phase', voltage: { lineToLine: 240 }, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2, xOverR: 2 } };
    input.boards[0]!.loads = [{ name: 'pcs', connection: 'A-N', kW: 2, spectrum: 'switch-mode' }];
    input.boards[1]!.loads = [{ name: 'heater', connection: 'A-B', kW: 3 }];
    const issues = issuesOf(input);
    expect(issues).toContainEqual(expect.objectContaining({ code: 'not_applicable', path: 'harmonics.banks[0].connection' }));
    (input.harmonics as { banks: { connection: string; ratedV: number }[] }).banks[0] = { ...bank, board: 'Shed', ratedV: 277 } as never;
    const report = studyInstallationHarmonics(input);
    // The capacitor across the two lines is in the state solved and scanned at its board.
    expect(report.state).toBe('every bank step on (Shed: step 1)');
    expect(report.scans.map((s) => s.board)).toEqual(['Shed']);
  });
});
