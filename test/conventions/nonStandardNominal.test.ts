/**
 * A star system written at a voltage none of IEC 60038's pairs names (410 V: a distribution
 * transformer's usual no-load voltage on a 230/400 V system, common practice, no source) is judged
 * at its own figures, and the reports say so and how to write it instead: the nominal as the voltage
 * and the source's figure per phase under supply.emf, which then is judged at 230 V (EN 50160's 253 V).
 */
import { describe, expect, it } from 'vitest';
import { nonStandardNominalNote, solveBoard } from '@trivar/core';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';

const lamp = [{ name: 'Shed lamp', connection: 'A-N', kW: 0.1 }];
const at = (voltage: unknown, emfV?: number) => ({
  name: 'Yard board',
  supply: {
    system: 'three-phase-4wire',
    voltage,
    frequencyHz: 50,
    ...(emfV ? { emf: { A: { V: emfV, angleDeg: 0 }, B: { V: emfV, angleDeg: -120 }, C: { V: emfV, angleDeg: 120 } } } : {}),
  },
  loads: lamp,
  conventions: { voltageLimits: 'en50160-supply' },
});

describe('a nominal voltage outside IEC 60038', () => {
  it('is judged at its own figures, with a note in the text report naming the way to write it', () => {
    const r = solveBoard(at({ lineToLine: 410 }));
    expect(nonStandardNominalNote(r.board)).toMatch(/^410 V is not a nominal voltage of IEC 60038/);
    expect(renderSolveReport(r)).toMatch(/! 410 V is not a nominal voltage of IEC 60038/);
    expect(nonStandardNominalNote(solveBoard(at({ lineToLine: 400 })).board)).toBeNull();
  });
  it('written as 400/230 with 236.7 V per phase under emf, it is judged at 230 V: 255 V is over', () => {
    const r = solveBoard(at('400/230', 255));
    expect(r.board.nominalLineToNeutralV).toBe(230);
    expect(r.voltageCheck.verdict).toBe('over');
    // The same 255 V on a board written at 410 V (236.7 V to neutral) passes: the note is why.
    expect(solveBoard(at({ lineToLine: 410 }, 255)).voltageCheck.verdict).toBe('within');
  });
});
