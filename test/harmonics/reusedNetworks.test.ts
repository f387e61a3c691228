/**
 * Solves through one CompiledNetworkCache — the load flow at the fundamental and the linear solve at
 * every harmonic order — give, to the bit, what a fresh compile of each gives. An invented installation on a three-wire supply (so each step of its star bank
 * has a floating star point) is switched as the capacitor duty switches it — every load off, the
 * other bank's parts off, a step off, capacitance at a tolerance end, and all of that at once — and
 * solved at the fundamental and every order in turn through the one cache, each against the same
 * solve compiled alone.
 * Switching a step off kills its star point, so those states need networks of their own: the
 * cache compiles one per order and set of live nodes, and a dead star reads as dead.
 * The duty's own solves (installationDutyOrders.ts), which hand those networks back without laying
 * each state out and read only node voltages, read the voltages the full solves give, to the bit.
 * The same on a single board (`solveHarmonicOrders`) through its bank's step states.
 */
import { describe, expect, it } from 'vitest';
import {
  boardOfInstallation,
  installationOf,
  CompiledNetworkCache,
  parseBoard,
  parseInstallation,
  readBoardText,
  resolveInstallationHarmonics,
  resolveHarmonicModel,
  addInstalledBank,
  normaliseBoard,
  solveAtOrder,
  solveInstallationAtOrder,
  solveCompiledInstallation,
  solveHarmonicOrders,
  solveInstallationNetwork,
  solveNetwork,
  withCapacitanceFactor,
  withSteps,
  type HarmonicModel,
  type Installation,
} from '@trivar/core';
import { withInstallationLoadsOff, withPartsOff } from '../../packages/core/src/harmonics/dutyConditions.js';
import { installationDutyOrders } from '../../packages/core/src/harmonics/installationDutyOrders.js';
import { cAbs } from '../support/complexMath.js';

const INSTALLATION = `
name: Kestrel Road bottling
supply:
  system: three-phase-3wire
  voltage: { lineToLine: 400 }
  frequencyHz: 50
  transformer: { kVA: 400, impedancePercent: 5, xOverR: 6 }
boards:
  - name: Intake
    loads:
      - { name: Compressor drive, connection: ABC-delta, kW: 30, pf: 0.95, spectrum: six-pulse-drive-choke }
      - { name: Yard heaters, connection: ABC-star, kW: 9, pf: 1 }
  - name: Bottling hall
    fedFrom: Intake
    feeder: { lengthM: 60, line: { mm2: 50 } }
    loads:
      - { name: Conveyor motors, connection: ABC-star, kW: 15, pf: 0.8 }
      - { name: Labeller drives, connection: ABC-delta, kW: 8, pf: 0.9, spectrum: six-pulse-drive }
  - name: Cold room
    fedFrom: Intake
    feeder: { lengthM: 35, line: { mm2: 25 } }
    loads:
      - { name: Chiller, connection: ABC-delta, kW: 22, pf: 0.78 }
harmonics:
  background: [{ order: 5, percent: 1.2 }, { order: 7, percent: 0.8 }]
  banks:
    - { board: Bottling hall, connection: star, ratedV: 440, stepsKvar: [15, 15, 30] }
    - { board: Cold room, connection: delta, ratedV: 440, stepsKvar: [10, 20] }
`;

/** Every order the models inject or the supply carries. */
const ordersOf = (models: readonly HarmonicModel[]) =>
  [...new Set(models.flatMap((m) => [...m.background.map((o) => o.order), ...m.loads.flatMap((l) => (l.kind === 'non-linear' ? l.spectrum.map((o) => o.order) : []))]))].sort((a, b) => a - b);

/** The bank parts (load numbers) of each board. */
const partsOf = (models: readonly HarmonicModel[]) => models.map((m) => (m.bank ? [...(m.bank.fixedLoad === null ? [] : [m.bank.fixedLoad]), ...m.bank.stepLoads] : []));

/** The example installation and the states capacitorDuty puts it in: the hall's bank switched and scaled, the cold store's bank off. */
function dutyStates() {
  const { installation, models, bankBoards } = resolveInstallationHarmonics(parseInstallation(readBoardText(INSTALLATION)));
  const [hall, cold] = bankBoards as [number, number];
  const bank = models[hall]!.bank!;
  // The hall's bank in a state and at a capacitance factor, as capacitorDuty sets it; its model with it.
  const hallState = (steps: boolean[], factor: number) => {
    const at = withCapacitanceFactor(withSteps(boardOfInstallation(installation, hall), bank, steps), models[hall]!, factor);
    return { installation: installationOf(at.board).installation, models: models.map((m, b) => (b === hall ? at.model : m)) };
  };
  const coldOff = (inst: Installation) => withPartsOff(inst, partsOf(models).map((p, b) => (b === cold ? p : [])));
  return { installation, models, hall, hallState, coldOff };
}

describe('harmonic solves through a CompiledNetworkCache equal fresh compiles', () => {
  it('an installation in the duty check’s states, at every order', () => {
    const { installation, models, hall, hallState, coldOff } = dutyStates();
    const states: [string, Installation, readonly HarmonicModel[]][] = [
      ['as given', installation, models],
      ['every load off', withInstallationLoadsOff(installation), models],
      ['cold room bank off', coldOff(installation), models],
      ['hall step 3 off, capacitance +10 %', hallState([true, true, false], 1.1).installation, hallState([true, true, false], 1.1).models],
      ['hall steps 1 and 2 off, capacitance −5 %', hallState([false, false, true], 0.95).installation, hallState([false, false, true], 0.95).models],
      ['every hall step off, cold room bank off, every load off', withInstallationLoadsOff(coldOff(hallState([false, false, false], 1).installation)), models],
      ['as given again', installation, models],
    ];
    const orders = ordersOf(models);
    expect(orders.length).toBeGreaterThanOrEqual(4);
    const networks = new CompiledNetworkCache();
    const hallVoltages: number[] = [];
    let deadStars = 0;
    const livePatterns = new Set<string>();
    for (const [label, inst, stateModels] of states) {
      const fundamental = solveInstallationNetwork(inst);
      expect(solveCompiledInstallation(networks.compileForLoadFlow(inst)), `${label}, fundamental`).toEqual(fundamental);
      for (const h of orders) {
        const fresh = solveInstallationAtOrder(fundamental, stateModels, h);
        const reused = solveInstallationAtOrder(fundamental, stateModels, h, { networks });
        // Every voltage, line, neutral and branch current, every board: the same numbers, not close ones.
        expect(reused, `${label}, order ${h}`).toEqual(fresh);
        const hallBus = fresh.boards[hall]!;
        hallVoltages.push(cAbs(hallBus.nodeVoltages[hallBus.topology.busNode[0]!]!));
        livePatterns.add(fresh.boards[0]!.nodeVoltages.map((v) => (v === null ? '0' : '1')).join(''));
        deadStars += fresh.boards.flatMap((s) => [...s.topology.terminalNode].filter(([t, node]) => t.startsWith('star:') && s.nodeVoltages[node] === null)).length;
      }
    }
    // Real states: the hall's busbar voltage at each order differs from state to state.
    expect(new Set(hallVoltages.map((v) => v.toPrecision(6))).size).toBeGreaterThan(orders.length * 4);
    // Some states kill floating stars, so they cannot share the others' networks; every other
    // solve found its network again: one compile per order (the fundamental too) and set of live nodes.
    expect(deadStars).toBeGreaterThan(0);
    // Every node live; step 3's star dead; steps 1 and 2's; all three.
    expect(livePatterns.size).toBe(4);
    expect(networks.compiled).toBe((orders.length + 1) * livePatterns.size);
    expect(networks.compiled + networks.reused).toBe(states.length * (orders.length + 1));
  });

  it('the duty’s solves read the same node voltages as full solves, in every state and order', () => {
    const { installation, models, hall, hallState, coldOff } = dutyStates();
    const off = hallState([false, false, false], 1);
    const states: [string, Installation, readonly HarmonicModel[]][] = [
      ['as given', installation, models],
      ['hall step 3 off, capacitance +10 %', hallState([true, true, false], 1.1).installation, hallState([true, true, false], 1.1).models],
      ['every load off', withInstallationLoadsOff(installation), models],
      ['hall steps 1 and 2 off, capacitance −5 %', hallState([false, false, true], 0.95).installation, hallState([false, false, true], 0.95).models],
      ['every hall step off, cold room bank off', coldOff(off.installation), off.models],
      ['hall step 3 off, capacitance −5 %', hallState([true, true, false], 0.95).installation, hallState([true, true, false], 0.95).models],
      ['as given again', installation, models],
    ];
    const orders = ordersOf(models);
    const networks = new CompiledNetworkCache();
    const solveStates = installationDutyOrders(networks);
    for (const [label, inst, stateModels] of states) {
      const duty = solveStates(inst, stateModels, orders, hall);
      const fundamental = solveInstallationNetwork(inst);
      const full = [fundamental, ...orders.map((h) => solveInstallationAtOrder(fundamental, stateModels, h))];
      expect(duty.map((o) => o.order)).toEqual([1, ...orders]);
      duty.forEach((o, k) => {
        const board = full[k]!.boards[hall]!;
        expect(o.solution.nodeVoltages, `${label}, order ${o.order}`).toEqual(board.nodeVoltages);
        expect([...o.solution.topology.terminalNode], `${label}, order ${o.order}`).toEqual([...board.topology.terminalNode]);
      });
    }
    // The states that share live nodes share networks: found again without being laid out.
    expect(networks.reused).toBeGreaterThan(0);
  });

  it('a board through its bank’s step states, at every order', () => {
    const spec = parseBoard(
      readBoardText(`
name: Weir Lane laundry
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4.5, xOverR: 5 } }
loads:
  - { name: Washer drives, connection: ABC-delta, kW: 18, pf: 0.93, spectrum: six-pulse-drive }
  - { name: Dryer fans, connection: ABC-delta, kW: 11, pf: 0.8 }
  - { name: Counter lighting, connection: B-N, kW: 2.5, pf: 0.95, spectrum: led-driver }
harmonics:
  background: [{ order: 5, percent: 1 }]
  bank: { connection: delta, ratedV: 440, stepsKvar: [10, 20] }
`),
    );
    const added = addInstalledBank(normaliseBoard(spec), spec.harmonics!.bank!);
    const model = resolveHarmonicModel(spec, added.board, added.model);
    const bank = model.bank!;
    const orders = ordersOf([model]);
    const networks = new CompiledNetworkCache();
    const states = [[true, true], [true, false], [false, true], [false, false]];
    for (const steps of states) {
      const board = withSteps(added.board, bank, steps);
      const fundamental = solveNetwork(board);
      const fresh = [{ order: 1, solution: fundamental }, ...orders.map((h) => ({ order: h, solution: solveAtOrder(fundamental, model, h) }))];
      expect(solveHarmonicOrders(board, model, undefined, networks), `steps ${steps.join(', ')}`).toEqual(fresh);
    }
    // Delta parts switched off leave every node live: one network per order serves every state.
    expect(networks.compiled).toBe(orders.length + 1);
    expect(networks.reused).toBe((orders.length + 1) * (states.length - 1));
  });
});
