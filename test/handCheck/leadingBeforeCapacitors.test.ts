/**
 * A hand check words a leading line against the board without the capacitors: a line its own loads
 * already made lead is not "over-correction". Invented: the Fernhill pottery, a resistive 9 kW kiln across
 * B-C (line B's current then leads V_B by 30°, PF cos 30° = 0.866 leading, with a small resistive load
 * on B-N only pulling it nearer unity), a glaze heater on A-N and a pug-mill coil on C-N.
 * The neutral-return explanation quotes the neutral current the comparison table shows (as solved).
 */
import { describe, expect, it } from 'vitest';
import { checkHandFigures, normaliseBoard, parseBoard, solveBoardModel, type BoardSpec } from '@trivar/core';

const pottery: BoardSpec = {
  name: 'Fernhill pottery',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
  feeder: { line: { lengthM: 40, rOhmPerKm: 0.6, xOhmPerKm: 0.08 }, neutral: { lengthM: 40, rOhmPerKm: 1.2, xOhmPerKm: 0.09 } },
  loads: [
    { name: 'Kiln', connection: 'B-C', kW: 9, pf: 1, model: 'constant-impedance' },
    { name: 'Glaze heater', connection: 'A-N', kW: 6, pf: 0.85 },
    { name: 'Pug-mill coil', connection: 'C-N', ohms: { r: 7, x: 5 } },
  ],
};
const board = normaliseBoard(parseBoard(pottery));
const lineB = () => solveBoardModel(board).phases[1]!;

describe('a line that led before the capacitors', () => {
  it('without capacitors line B leads near cos 30° = 0.866 (the B-C kiln alone on it)', () => {
    expect(lineB().sense).toBe('leading');
    expect(Math.abs(lineB().pf! - 0.866)).toBeLessThan(0.005);
  });

  it('capacitors on A-N and C-N: line B is worded as leading before, not as over-correction', () => {
    const r = checkHandFigures(board, { capacitors: [{ branch: 'A-N', kvar: 2 }, { branch: 'C-N', kvar: 3 }] });
    const b = r.warnings.find((w) => w.code === 'hand-line-leading')!;
    expect(b.message).toMatch(/^line B leads at PF 0\.86\d with your capacitors in, as it did without them \(PF 0\.86\d leading\)/);
    expect(b.message).toContain('(a load across two lines draws its current 30° off either phase voltage)');
    expect(b.message).not.toContain('over-correction)');
    expect(r.warnings.filter((w) => w.code === 'hand-line-leading')).toHaveLength(1);
  });

  it('a capacitor on line B itself makes it lead more, and that is said', () => {
    const before = lineB().pf!;
    const r = checkHandFigures(board, { capacitors: [{ branch: 'B-N', kvar: 3 }] });
    const b = r.warnings.find((w) => w.code === 'hand-line-leading')!;
    const after = r.lines[1]!.pf.solved;
    expect(after).toBeLessThan(before - 0.01);
    expect(b.message).toBe(`line B already led without your capacitors (PF ${before.toFixed(3)} leading) and leads more with them in (PF ${after.toFixed(3)}): capacitors on it add to the lead; leave them off this line`);
  });

  it('a line that lagged before and leads after is over-correction', () => {
    const r = checkHandFigures(board, { capacitors: [{ branch: 'A-N', kvar: 12 }] });
    const a = r.warnings.find((w) => w.code === 'hand-line-leading' && w.message.startsWith('line A'))!;
    expect(a.message).toContain('they supply more reactive power than the loads on it draw (over-correction)');
  });

  it('the neutral-return note quotes the solved neutral current, the one the comparison shows', () => {
    const r = checkHandFigures(board, { capacitors: [{ branch: 'A-N', kvar: 2 }, { branch: 'C-N', kvar: 3 }] });
    const note = r.effects.find((e) => e.effect === 'neutral-return')!.explanation;
    expect(note).toContain(`The neutral carries ${r.neutralA!.solved.toFixed(1)} A back to the source as solved`);
  });
});
