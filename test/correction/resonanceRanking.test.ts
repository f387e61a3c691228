/**
 * The verdict and the ranking weigh a supply resonance near a harmonic order in any state the controller can
 * reach, as the warnings say it: a build that resonates there is not recommended over one that meets the target
 * clear of one, whatever it costs, and a recommended build that resonates is said to. Hillside workshop (an
 * invented example): every arrangement resonates near a watched order in some state; one is taken clear here to
 * see the rule choose it.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { compareCorrections, normaliseBoard, parseBoard, readBoardText } from '@trivar/core';
import { recommendArrangement, type ArrangementOutcome } from '../../packages/core/src/correction/compareCorrections.js';

const { correction: _study, ...spec } = readBoardText(readFileSync('examples/hillside-workshop.yaml', 'utf8')) as Record<string, unknown>;
const comparison = compareCorrections(normaliseBoard(parseBoard(spec)), {});
const clearOf = (o: ArrangementOutcome, clear: boolean): ArrangementOutcome =>
  o.report ? { ...o, report: { ...o.report, verification: { ...o.report.verification, resonanceNearHarmonic: !clear } } } : o;

describe('resonance near a harmonic order in a reachable step state, in the ranking', () => {
  it('hillside workshop: the star and delta banks resonate near a significant order; the compensator only near the 17th and 19th, warned but clear for the ranking', () => {
    const near = comparison.outcomes.filter((o) => o.report?.verification.resonanceNearHarmonic);
    expect(near.map((o) => o.arrangement).sort()).toEqual(['delta-bank', 'star-bank']);
    // The flag implies a resonance warning; a warning on the weak orders alone does not raise the flag.
    for (const o of comparison.outcomes) {
      const v = o.report!.verification;
      const codes = v.warnings.map((w) => w.code);
      expect(codes.includes('resonance') || codes.includes('resonance-step-state')).toBe(true);
      expect(v.resonanceNearHarmonic).toBe(v.resonanceHeadlineOrders.length > 0);
    }
    const compensator = comparison.outcomes.find((o) => o.arrangement === 'balancing-compensator')!.report!.verification;
    expect(compensator.resonanceStepStates!.states.filter((st) => st.nearOrders.length).map((st) => st.nearOrders)).toEqual([[17, 19]]);
    expect(comparison.outcomes.find((o) => o.arrangement === 'delta-bank')!.report!.verification.resonanceHeadlineOrders).toEqual([11]);
    // Met at nominal capacitance and clear ranks before met across the tolerance but near the 11th (the rule's order).
    expect(comparison.recommended).toBe('balancing-compensator');
    expect(comparison.why).toContain('star bank meets the target across the capacitance tolerance but resonates with the supply near a harmonic order in a step state (cost 18.3)');
  });

  it('a dearer star bank clear of every watched order is recommended over the cheaper delta bank that resonates', () => {
    const outcomes = comparison.outcomes.map((o) => clearOf(o, o.arrangement === 'star-bank'));
    const cost = (a: string) => outcomes.find((o) => o.arrangement === a)!.figures!.cost;
    expect(cost('star-bank')).toBeGreaterThan(cost('delta-bank'));
    const r = recommendArrangement(outcomes);
    expect(r.recommended).toBe('star-bank');
    expect(r.meetsTarget).toBe(true);
    expect(r.why).toMatch(/^star bank: meets the target across the capacitance tolerance at the least cost \(cost 18\.3\); delta bank meets the target across the capacitance tolerance but resonates with the supply near a harmonic order in a step state \(cost 11\.7\)/);
    expect(r.why).not.toContain('note: no arrangement meets the target with its supply resonance clear');
  });

  it('with every build clear of the watched orders, the cheapest is recommended again', () => {
    // All clear: the cheapest, the delta bank, as before this rule.
    expect(recommendArrangement(comparison.outcomes.map((o) => clearOf(o, true))).recommended).toBe('delta-bank');
  });
});
