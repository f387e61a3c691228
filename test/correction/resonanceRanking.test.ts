/**
 * A supply resonance estimated near a harmonic order in a state the controller can reach is named in the verdict
 * column and the recommendation, but does not rank: without the board's harmonic currents it asks for a harmonic
 * study (or a detuned bank), not for a dearer arrangement. Hillside workshop (an invented example): the star and
 * delta banks resonate near a significant order in some state, the compensator (eight times the cost) does not.
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
    // The estimate does not rank: the cheapest that meets across the tolerance is recommended, and told to need the study.
    expect(comparison.recommended).toBe('delta-bank');
    expect(comparison.why).toContain('star bank meets the target across the capacitance tolerance but resonates with the supply near a harmonic order in a step state (cost 18.3)');
    expect(comparison.why).toContain("note: the recommended delta bank's supply resonance lies near a harmonic order in a step state its controller can reach (an estimate: the board's harmonic currents are not given); it needs the harmonic study its warnings name, and a detuned bank where the board has harmonic-producing loads (the balancing compensator, dearer, is clear of one; the estimate alone does not rank)");
  });

  it('a dearer star bank clear of every watched order is not recommended over the cheaper delta bank that resonates, and is named beside it', () => {
    const outcomes = comparison.outcomes.map((o) => clearOf(o, o.arrangement === 'star-bank'));
    const cost = (a: string) => outcomes.find((o) => o.arrangement === a)!.figures!.cost;
    expect(cost('star-bank')).toBeGreaterThan(cost('delta-bank'));
    const r = recommendArrangement(outcomes);
    expect(r.recommended).toBe('delta-bank');
    expect(r.meetsTarget).toBe(true);
    expect(r.why).toMatch(/^delta bank: meets the target across the capacitance tolerance at the least cost \(cost 11\.7\)/);
    expect(r.why).toContain('(the star bank, dearer, is clear of one; the estimate alone does not rank)');
  });

  it('with every build clear of the watched orders, the cheapest is recommended again', () => {
    // All clear: the cheapest, the delta bank, and no resonance note.
    const r = recommendArrangement(comparison.outcomes.map((o) => clearOf(o, true)));
    expect(r.recommended).toBe('delta-bank');
    expect(r.why).not.toContain('supply resonance lies near');
  });
});
