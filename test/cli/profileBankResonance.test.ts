/**
 * `trivar profile --bank` checks the supply resonance of the bank it sizes in every state its controller can
 * reach, with the machinery `trivar correct` uses. On an invented three-wire quarry board (no neutral: the
 * three-phase steps are a delta) the orders have a closed form per state, h = √(S_sc,X / Q_state)
 * (METHODS.md §5, h_r = √(S_sc/Q_C)), S_sc,X = U_LL²/X_path with X_path the transformer's reactance
 * (u_k·U²/S_T split by its X/R) plus the feeder's. The same week on the four-wire board (a star bank on the
 * neutral) puts the every-step-in state near the 5th. Text and --json must say the same.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const THREE_WIRE = 'test/fixtures/profile/quarry-three-wire.yaml';
const FOUR_WIRE = 'test/fixtures/profile/gravel-pit-crusher-no-correction.yaml';
const WEEK = 'test/fixtures/profile/gravel-pit-crusher-week.csv';

interface State { outputsIn: number[]; alike: number[][]; capacitorKvarAtNominalV: number; orders: number[]; lowestOrder: number | null; nearOrders: number[] }
interface Resonance {
  stepStates: { states: State[]; combinations: number; nearStates: number; fixedPart: { reactors: boolean; capacitors: boolean } };
  headlineOrders: number[];
  headline: string | null;
  warnings: string[];
  table: { header: string[]; rows: string[][]; note: string } | null;
  clear: string | null;
  caution: string;
}

const run = (file: string) => {
  const json = runTrivar(['profile', file, '--data', WEEK, '--bank', '--json']);
  const text = runTrivar(['profile', file, '--data', WEEK, '--bank']);
  expect(json.stderr).toBe('');
  expect(text.stderr).toBe('');
  const bank = JSON.parse(json.stdout).bank as { steps: { kvar: number }[]; totalKvar: number; resonance: Resonance };
  return { bank, res: bank.resonance, text: text.stdout, flat: text.stdout.replace(/\s+/g, ' ') };
};
const flat = (s: string) => s.replace(/\s+/g, ' ');

describe('a delta bank sized from the profile on a three-wire board', () => {
  const { bank, res, text, flat: words } = run(THREE_WIRE);
  // 400 V, 160 kVA at 6 % with X/R 5; feeder 180 m at 0.08 Ω/km.
  const xTransformer = ((0.06 * 400 ** 2) / 160e3) * (5 / Math.sqrt(1 + 5 ** 2));
  const xPath = xTransformer + 0.18 * 0.08;
  const sscX = 400 ** 2 / xPath; // VA

  it('works every state: 2^n − 1 combinations of n switched steps (no fixed part), equal steps one state per count', () => {
    const n = bank.steps.length;
    expect(n).toBeGreaterThan(1);
    expect(res.stepStates.combinations).toBe(2 ** n - 1);
    expect(new Set(bank.steps.map((s) => s.kvar)).size).toBe(1);
    expect(res.stepStates.states.map((s) => s.outputsIn.length)).toEqual(Array.from({ length: n }, (_, k) => n - k));
    expect(res.stepStates.states[0]!.capacitorKvarAtNominalV).toBeCloseTo(bank.totalKvar, 9);
  });

  it('each state resonates at h = √(S_sc,X / Q_state), one order (a delta: positive and negative sequence alike)', () => {
    for (const st of res.stepStates.states) {
      expect(st.orders).toHaveLength(1);
      const closed = Math.sqrt(sscX / (st.capacitorKvarAtNominalV * 1e3));
      expect(Math.abs(st.orders[0]! - closed) / closed).toBeLessThan(1e-9);
    }
    // The every-step-in state of 60 kvar: √(2.1848 MVA / 60 kvar) = 6.034 (hand figure from the values above).
    expect(res.stepStates.states[0]!.lowestOrder).toBeCloseTo(6.034, 3);
  });

  it('names the states near a watched order in a warning, with the headline orders correct would headline', () => {
    const near = res.stepStates.states.filter((s) => s.nearOrders.length > 0);
    expect(res.stepStates.nearStates).toBe(near.length);
    expect(near.length).toBeGreaterThan(0);
    // Every step in (6.03) is near no watched order; the states with fewer steps in are.
    expect(res.stepStates.states[0]!.nearOrders).toEqual([]);
    expect(res.warnings).toHaveLength(1);
    expect(res.warnings[0]).toMatch(/^with fewer steps in, the bank and the supply inductance resonate within 10 % of a harmonic order/);
    for (const st of near.slice(0, 4)) expect(res.warnings[0]).toContain(`${st.capacitorKvarAtNominalV.toFixed(1)} kvar, near ${st.orders[0]!.toFixed(1)}`);
    // The welding outlet across B-C carries triplens line to line: the 9th and 15th headline too (resonanceExcitation.ts).
    expect(res.headlineOrders).toEqual([...new Set(near.flatMap((s) => s.nearOrders))].sort((a, b) => a - b));
    expect(res.headline!).toContain('in 5 states with fewer steps in');
    expect(res.headline!).not.toContain('with every step in');
    expect(res.clear).toBeNull();
  });

  it('text and --json agree: headline, warnings, every table row, the caution', () => {
    expect(words).toContain(flat(res.headline!));
    for (const w of res.warnings) expect(words).toContain(flat(`! warning: ${w}`));
    for (const row of res.table!.rows) expect(text).toMatch(new RegExp(row.map((c) => c.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')).join('\\s+')));
    expect(res.table!.rows[0]).toEqual(['1+2+3+4+5+6 (every step)', '60.0', res.stepStates.states[0]!.lowestOrder!.toFixed(2), '-']);
    expect(words).toContain(flat(res.caution));
    expect(res.caution).toMatch(/harmonic study/);
    expect(res.caution).toMatch(/licensed professional to the local codes/);
  });
});

describe('a star bank on the neutral of the four-wire board', () => {
  const { res, flat: words } = run(FOUR_WIRE);

  it('puts every step in near the 5th, warns for it and for the states with fewer steps in, and headlines both', () => {
    const allIn = res.stepStates.states[0]!;
    expect(allIn.nearOrders).toContain(5);
    expect(res.warnings[0]).toMatch(/^the bank and the supply inductance resonate near harmonic order/);
    expect(res.warnings[1]).toMatch(/^also with fewer steps in/);
    expect(res.headlineOrders).toContain(5);
    expect(res.headline!).toContain('with every step in and in');
    expect(words).toContain(flat(res.headline!));
  });

  it('the star bank on the neutral resonates lower than √(S_sc,X/Q) of the line path alone (the neutral in its zero-sequence mode)', () => {
    // capacitorPathReactance.ts: the lowest order of a star bank on the neutral lies below the single-node estimate.
    const xPath = ((0.06 * 400 ** 2) / 160e3) * (5 / Math.sqrt(26)) + 0.18 * 0.08;
    for (const st of res.stepStates.states) expect(st.lowestOrder!).toBeLessThan(Math.sqrt(400 ** 2 / xPath / (st.capacitorKvarAtNominalV * 1e3)));
  });
});

describe('a small bank on a stiff supply (the osier-mill installation example)', () => {
  const args = ['profile', 'examples/osier-mill-studios.yaml', '--data', 'examples/osier-mill-day.csv', '--bank'];
  const json = runTrivar([...args, '--json']);
  const text = flat(runTrivar(args).stdout);
  const res = JSON.parse(json.stdout).bank.resonance as Resonance;

  it('is clear in every state: no table, no warning, no headline, the one clear line in the text with the caution', () => {
    expect(res.stepStates.nearStates).toBe(0);
    expect(res.table).toBeNull();
    expect(res.warnings).toEqual([]);
    expect(res.headline).toBeNull();
    expect(res.headlineOrders).toEqual([]);
    expect(text).toContain(flat(`the bank's supply resonance in ${res.clear!}`));
    expect(text).toContain(flat(res.caution));
  });

  it('fewer steps in, less capacitance, a higher lowest order', () => {
    const states = res.stepStates.states;
    for (let k = 1; k < states.length; k++) {
      expect(states[k]!.capacitorKvarAtNominalV).toBeLessThan(states[k - 1]!.capacitorKvarAtNominalV);
      expect(states[k]!.lowestOrder!).toBeGreaterThan(states[k - 1]!.lowestOrder!);
    }
    expect(res.clear).toContain(`lowest order ${states[0]!.lowestOrder!.toFixed(2)} with every step in`);
  });
});

describe("--correction-bank: the correction study's bank checked as trivar correct built it", () => {
  const board = 'test/fixtures/profile/gravel-pit-crusher.yaml';
  const profile = JSON.parse(runTrivar(['profile', board, '--data', WEEK, '--correction-bank', '--json']).stdout).bank as { design: { arrangement: string }; resonance: Resonance };
  const correct = JSON.parse(runTrivar(['correct', board, '--json']).stdout) as { outcomes: { arrangement: string; report: { verification: { resonanceStepStates: Resonance['stepStates'] } } }[] };

  it("the same states and orders as correct gives its bank (a delta stays a delta, not the simulator's star on the neutral)", () => {
    const own = correct.outcomes.find((o) => o.arrangement === profile.design.arrangement)!.report.verification.resonanceStepStates;
    expect(profile.design.arrangement).toBe('delta-bank');
    const { states } = profile.resonance.stepStates;
    expect(states.map((s) => s.outputsIn)).toEqual(own.states.map((s) => s.outputsIn));
    states.forEach((s, k) => {
      expect(s.orders).toHaveLength(own.states[k]!.orders.length);
      s.orders.forEach((h, j) => expect(Math.abs(h - own.states[k]!.orders[j]!) / h).toBeLessThan(1e-9));
    });
    expect(profile.resonance.stepStates.nearStates).toBe(own.nearStates);
  });
});
