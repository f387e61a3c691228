/**
 * Checks on the test machinery itself: the arbitraries produce valid boards
 * that reach every corner the properties claim to cover, and the law helpers
 * reject a solution that is wrong by far less than any real bug would make it.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyseSolution, normaliseBoard, solveNetwork, validateBoard, type BoardSpec, type NetworkSolution } from '@trivar/core';
import { cAbs, cScale } from '../support/complexMath.js';
import { ALL_SYSTEMS, balancedBoardSpecArb, boardSpecArb, CONNECTIONS_OF } from './arbitraries/boardSpec.js';
import { assertCurrentLawHolds, assertElementLawsHold, assertPowerBalances, ratedPower } from './laws.js';

/** Every feature a board shows, as short tags, to count what a sample covers. */
function featuresOf(spec: BoardSpec): string[] {
  const s = spec.supply;
  const tags = [
    `system:${s.system}`,
    `source:${s.transformer ? 'transformer' : s.impedance ? 'impedance' : 'ideal'}`,
    `line:${spec.feeder?.line ? ('lengthM' in spec.feeder.line ? 'per-length' : 'direct') : 'zero'}`,
    `neutral:${spec.feeder?.neutral ? (spec.feeder.neutral.lengthM ? 'per-length' : 'direct') : 'zero'}`,
    `voltage:${s.voltage.lineToLine ? 'LL' : 'LN'}`,
    `hz:${s.frequencyHz}`,
  ];
  if (s.emf) tags.push('emf:explicit');
  if (s.sequence) tags.push(`sequence:${s.sequence}`);
  for (const l of spec.loads) {
    tags.push(`connection:${s.system}:${l.connection}`);
    const form = l.ohms ? 'ohms' : l.kvar !== undefined ? 'kW+kvar' : l.kW !== undefined ? 'kW+pf' : l.kVA !== undefined ? 'kVA+pf' : 'A+pf';
    tags.push(`form:${form}`, `model:${l.zip ? 'zip' : (l.model ?? 'default')}`);
    if (l.sense) tags.push(`sense:${l.sense}`);
    if (l.kW !== undefined && l.kW < 0) tags.push('generation');
    if (l.starPoint) tags.push(`star:${l.starPoint}`);
  }
  return tags;
}

describe('board arbitraries', () => {
  it('produce only boards the validator accepts', () => {
    const arb = fc.oneof(boardSpecArb(), balancedBoardSpecArb(), boardSpecArb({ source: 'ideal', models: 'constant-impedance' }));
    fc.assert(
      fc.property(arb, (spec) => {
        const v = validateBoard(spec);
        expect(v.ok ? [] : v.issues.map((i) => i.message)).toEqual([]);
      }),
    );
  });

  it('cover every system, connection, rating form, model and source kind', () => {
    const seen = new Set(fc.sample(boardSpecArb(), { numRuns: 1500 }).flatMap(featuresOf));
    const wanted = [
      ...ALL_SYSTEMS.map((s) => `system:${s}`),
      ...ALL_SYSTEMS.flatMap((s) => CONNECTIONS_OF[s].map((c) => `connection:${s}:${c}`)),
      ...['kW+pf', 'kVA+pf', 'A+pf', 'kW+kvar', 'ohms'].map((f) => `form:${f}`),
      ...['default', 'constant-impedance', 'constant-current', 'constant-power', 'zip'].map((m) => `model:${m}`),
      'source:ideal', 'source:impedance', 'source:transformer',
      'line:zero', 'line:direct', 'line:per-length', 'neutral:zero', 'neutral:direct', 'neutral:per-length',
      'voltage:LL', 'voltage:LN', 'hz:50', 'hz:60', 'emf:explicit', 'sequence:ABC', 'sequence:ACB',
      'sense:lagging', 'sense:leading', 'generation', 'star:neutral', 'star:floating',
    ];
    expect(wanted.filter((w) => !seen.has(w))).toEqual([]);
  });
});

/** The branch carrying the most current: where a tampering is surely visible. */
function busiestBranch(solution: NetworkSolution): [number, number] {
  let best: [number, number] = [0, 0];
  let most = -1;
  solution.branches.forEach((states, li) =>
    states.forEach((st, bi) => {
      if (cAbs(st.current) > most) [most, best] = [cAbs(st.current), [li, bi]];
    }),
  );
  return best;
}

describe('law helpers', () => {
  it('reject a solution with one branch current off by 1 part in 10^6', () => {
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const solution = solveNetwork(normaliseBoard(spec));
        const [li, bi] = busiestBranch(solution);
        const branches = solution.branches.map((states, l) =>
          states.map((st, b) => (l === li && b === bi ? { ...st, current: cScale(st.current, 1 + 1e-6) } : st)),
        );
        const tampered: NetworkSolution = { ...solution, branches };
        expect(() => assertCurrentLawHolds(tampered)).toThrow(/KCL|I_N/);
        expect(() => assertElementLawsHold(tampered)).toThrow(/current/);
      }),
    );
  });

  it('reject a result whose source power is off by 1 part in 10^6', () => {
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const solution = solveNetwork(normaliseBoard(spec));
        const result = analyseSolution(solution);
        const bump = 1e-6 * (result.loads.reduce((s, l) => s + l.kVA, 0) + Math.hypot(result.losses.totalKW, result.losses.totalKvar));
        expect(() => assertPowerBalances({ ...result, source: { ...result.source, kW: result.source.kW + bump } }, ratedPower(solution.board))).toThrow(/source power/);
      }),
    );
  });
});
