/**
 * Balancing compensators sized on the solved board against the closed forms of
 * the methods notes §1 (Steinmetz, Gyugyi, the 4-wire Δ + Y form, the
 * capacitor-only limits). All on an ideal source, where those closed forms are exact.
 */
import { describe, expect, it } from 'vitest';
import { sizeBalancingCompensator, solveBoardModel, type CompensatorSolution } from '@trivar/core';
import { makeBoard, type LoadLine } from './support/boards.js';
import { expectClose } from '../support/tolerance.js';

const SQRT3 = Math.sqrt(3);
const kvarOf = (s: CompensatorSolution, branch: string) => s.branches.find((b) => b.branch === branch)!.kvarAtNominalV;
const exact = { rel: 1e-9, abs: 1e-9 };

describe('Steinmetz circuit (methods notes §1.3; Steinmetz 1897, from memory)', () => {
  const P = 12;
  it('resistive load P on A-B, ABC: capacitor P/√3 on B-C, reactor P/√3 on C-A, nothing on A-B, I2 = 0', () => {
    const board = makeBoard('three-phase-3wire', [{ name: 'kiln element', connection: 'A-B', kW: P, pf: 1 }]);
    const { ideal } = sizeBalancingCompensator(board, { target: { pf: 1 } });
    expectClose(kvarOf(ideal, 'A-B'), 0, exact, 'A-B');
    expectClose(kvarOf(ideal, 'B-C'), P / SQRT3, exact, 'B-C');
    expectClose(kvarOf(ideal, 'C-A'), -P / SQRT3, exact, 'C-A');
    expect(ideal.reactorBranches).toEqual(['C-A']);
    expect(ideal.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-8);
    expectClose(ideal.residual.positiveSequencePf!, 1, exact, 'PF1+');
  });

  it('ACB: the capacitor moves to C-A and the reactor to B-C', () => {
    const board = makeBoard('three-phase-3wire', [{ name: 'kiln element', connection: 'A-B', kW: P, pf: 1 }], { sequence: 'ACB' });
    const { ideal } = sizeBalancingCompensator(board, { target: { pf: 1 } });
    expectClose(kvarOf(ideal, 'C-A'), P / SQRT3, exact, 'C-A');
    expectClose(kvarOf(ideal, 'B-C'), -P / SQRT3, exact, 'B-C');
    expect(ideal.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-8);
  });

  it('the same with line-to-line branches only on a 4-wire board', () => {
    const board = makeBoard('three-phase-4wire', [{ name: 'kiln element', connection: 'A-B', kW: P, pf: 1 }]);
    const { ideal } = sizeBalancingCompensator(board, { target: { pf: 1 }, branches: 'delta' });
    expectClose(kvarOf(ideal, 'B-C'), P / SQRT3, exact, 'B-C');
    expectClose(kvarOf(ideal, 'C-A'), -P / SQRT3, exact, 'C-A');
  });
});

describe('Gyugyi compensator for a delta load (methods notes §1.2; Gyugyi, Otto, Putman 1978, from memory)', () => {
  it('Q_γab = Q_ab + (P_ca − P_bc)/√3 and cyclic, for an uneven lagging delta load', () => {
    const loads: LoadLine[] = [
      { name: 'welder', connection: 'A-B', kW: 14, pf: 0.7 },
      { name: 'press', connection: 'B-C', kW: 6, pf: 0.85 },
      { name: 'dryer', connection: 'C-A', kW: 9, pf: 0.95 },
    ];
    const q = (l: LoadLine) => (l.kW * Math.sqrt(1 - l.pf ** 2)) / l.pf;
    const [ab, bc, ca] = loads as [LoadLine, LoadLine, LoadLine];
    const { ideal } = sizeBalancingCompensator(makeBoard('three-phase-3wire', loads), { target: { pf: 1 } });
    expectClose(kvarOf(ideal, 'A-B'), q(ab) + (ca.kW - bc.kW) / SQRT3, exact, 'A-B');
    expectClose(kvarOf(ideal, 'B-C'), q(bc) + (ab.kW - ca.kW) / SQRT3, exact, 'B-C');
    expectClose(kvarOf(ideal, 'C-A'), q(ca) + (bc.kW - ab.kW) / SQRT3, exact, 'C-A');
    // Line currents then all equal ΣP/(√3·V_LL) (methods notes §1.2).
    const expected = ((ab.kW + bc.kW + ca.kW) * 1000) / (SQRT3 * 400);
    for (const line of ideal.lines) expectClose(line.currentA.after, expected, exact, `line ${line.phase}`);
  });
});

const starLoads: LoadLine[] = [
  { name: 'line A fryers', connection: 'A-N', kW: 10, pf: 0.8 },
  { name: 'line B fans', connection: 'B-N', kW: 4, pf: 0.9 },
  { name: 'line C pumps', connection: 'C-N', kW: 6, pf: 0.7 },
];
const P = starLoads.map((l) => l.kW);
const Q = starLoads.map((l) => (l.kW * Math.sqrt(1 - l.pf ** 2)) / l.pf);
const cyc = (k: number) => [k % 3, (k + 1) % 3, (k + 2) % 3] as const;

describe('star load on a 4-wire board (methods notes §1.5, §1.6, derived and verified there)', () => {
  it('delta branches only: Q_γab = [√3(P_a − P_b) + 2Q_a + 2Q_b − Q_c]/3, and the neutral current is left as it was', () => {
    const board = makeBoard('three-phase-4wire', starLoads);
    const { ideal } = sizeBalancingCompensator(board, { target: { pf: 1 }, branches: 'delta' });
    ['A-B', 'B-C', 'C-A'].forEach((branch, k) => {
      const [a, b, c] = cyc(k);
      expectClose(kvarOf(ideal, branch), (SQRT3 * (P[a]! - P[b]!) + 2 * Q[a]! + 2 * Q[b]! - Q[c]!) / 3, exact, branch);
    });
    expect(ideal.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-8);
    // A delta cannot carry zero sequence: the neutral current is what it was.
    expectClose(ideal.residual.neutralCurrentA!, solveBoardModel(board).neutral!.current.magnitude, exact, 'I_N');
  });

  it('delta + star: the gauge-invariant combinations of §1.6 hold, I2 = 0 and I_N = 0, line currents ΣP/(3·V_LN) in phase', () => {
    const { ideal } = sizeBalancingCompensator(makeBoard('three-phase-4wire', starLoads), { target: { pf: 1 } });
    const delta = ['A-B', 'B-C', 'C-A'].map((b) => kvarOf(ideal, b));
    const star = ['A-N', 'B-N', 'C-N'].map((b) => kvarOf(ideal, b));
    // Adding q to every Δ branch and removing q from every Y branch changes nothing, so
    // Q_Δab − Q_Δbc and Q_Ya + Q_Δab are what the formulas pin down.
    const qDelta = [0, 1, 2].map((k) => {
      const [a, b] = cyc(k);
      return (2 / SQRT3) * (P[a]! - P[b]!);
    });
    const qStar = [0, 1, 2].map((k) => {
      const [a, b, c] = cyc(k);
      return Q[a]! + (P[b]! - P[c]!) / SQRT3;
    });
    expectClose(delta[0]! - delta[1]!, qDelta[0]! - qDelta[1]!, exact, 'ΔAB − ΔBC');
    expectClose(delta[1]! - delta[2]!, qDelta[1]! - qDelta[2]!, exact, 'ΔBC − ΔCA');
    for (let k = 0; k < 3; k++) expectClose(star[k]! + delta[0]!, qStar[k]! + qDelta[0]!, exact, `Y${k} + ΔAB`);
    expect(ideal.residual.neutralCurrentA!).toBeLessThan(1e-9);
    expect(ideal.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-8);
    const expected = ((P[0]! + P[1]! + P[2]!) * 1000) / (3 * (400 / SQRT3));
    for (const line of ideal.lines) expectClose(line.currentA.after, expected, exact, `line ${line.phase}`);
    // Among the exact solutions the one with least reactor kvar is chosen: no cheaper one exists along the gauge line.
    const reactorKvar = (qs: number[]) => qs.reduce((s, x) => s + Math.max(0, -x), 0);
    const chosen = reactorKvar([...delta, ...star]);
    for (let q = -20; q <= 20; q += 0.25)
      expect(reactorKvar([...delta.map((x) => x + q), ...star.map((x) => x - q)])).toBeGreaterThanOrEqual(chosen - 1e-9);
  });

  it('a capacitor-only exact solution exists when max(−Q_Δ) ≤ min(Q_Y) — and is found (methods notes §1.8)', () => {
    const loads: LoadLine[] = [
      { name: 'line A motors', connection: 'A-N', kW: 10, pf: 0.7 },
      { name: 'line B motors', connection: 'B-N', kW: 8, pf: 0.7 },
      { name: 'line C motors', connection: 'C-N', kW: 6, pf: 0.7 },
    ];
    const sizing = sizeBalancingCompensator(makeBoard('three-phase-4wire', loads), { target: { pf: 1 } });
    expect(sizing.ideal.reactorBranches).toEqual([]);
    expect(sizing.capacitorOnly.exact).toBe(true);
    expect(sizing.capacitorOnly.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-4);
    expect(sizing.capacitorOnly.residual.zeroSequenceCurrentPercent).toBeLessThan(1e-4);
    expect(sizing.status).toBe('meets-target');
  });

  it('a single resistive line-to-neutral load cannot be balanced with capacitors only (methods notes §1.8)', () => {
    const sizing = sizeBalancingCompensator(makeBoard('three-phase-4wire', [{ name: 'water heater', connection: 'A-N', kW: 3, pf: 1 }]), { target: { pf: 1 } });
    expect(sizing.ideal.reactorBranches.length).toBeGreaterThan(0);
    expect(sizing.capacitorOnly.exact).toBe(false);
    for (const b of sizing.capacitorOnly.branches) expect(b.susceptanceS).toBeGreaterThanOrEqual(0);
  });
});

describe('capacitor-only balancing of a line-to-line load (methods notes §1.8, derived and verified there)', () => {
  for (const pf of [1, 0.8]) {
    it(`load on A-B at pf ${pf}: I2 = 0 needs B_γ + k(1,1,1) with k = G/√3, leading Q1 = √3·P, PF1+ = 0.5 leading`, () => {
      const P = 9;
      const board = makeBoard('three-phase-3wire', [{ name: 'induction furnace', connection: 'A-B', kW: P, pf }]);
      const sizing = sizeBalancingCompensator(board, {
        target: { pf: 1, leading: 'allowed', minLeadingPf: 0.4 },
        weights: { negativeSequence: 1, reactive: 0 },
      });
      const cap = sizing.capacitorOnly;
      const qLoad = (P * Math.sqrt(1 - pf * pf)) / pf;
      const loose = { rel: 1e-6, abs: 1e-6 };
      expectClose(kvarOf(cap, 'A-B'), qLoad + P / SQRT3, loose, 'A-B');
      expectClose(kvarOf(cap, 'B-C'), (2 * P) / SQRT3, loose, 'B-C');
      expectClose(kvarOf(cap, 'C-A'), 0, loose, 'C-A');
      expect(cap.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-4);
      expectClose(cap.residual.positiveSequenceKvar!, -SQRT3 * P, loose, 'Q1');
      expectClose(cap.residual.positiveSequencePf!, 0.5, loose, 'PF1+');
    });
  }

  it('with the default never-leading target a resistive line-to-line load gets no capacitor at all: any capacitor makes a line lead', () => {
    const board = makeBoard('three-phase-3wire', [{ name: 'kiln element', connection: 'A-B', kW: 12, pf: 1 }]);
    const none = sizeBalancingCompensator(board, { target: { pf: 1 }, reactors: 'none' });
    for (const b of none.capacitorOnly.branches) expectClose(b.kvarAtNominalV, 0, { rel: 0, abs: 1e-9 });
    expect(none.status).toBe('infeasible');
    expect(none.reasons.join(' ')).toMatch(/\|I2\|\/\|I1\| is 100\.0 %, above the 10\.0 %/);
    expect(none.reasons.join(' ')).toMatch(/a capacitor of 6\.93 kvar on B-C, a reactor of 6\.93 kvar on C-A/);
    // With reactors allowed (the default) the Steinmetz circuit is what gets recommended.
    const steinmetz = sizeBalancingCompensator(board, { target: { pf: 1 } });
    expect(steinmetz.status).toBe('meets-target');
    expect(steinmetz.recommended).toBe('ideal');
    expect(steinmetz.balanceAfter.negativeSequencePercent).toBeLessThan(1e-6);
  });
});
