/**
 * The simulated bank's reconnection time: by default the discharge time of the board's capacitor
 * practice, the same figure the correction study uses (IEC 60831-1: 180 s at 50 Hz; NEC 460.6: 60 s at
 * 60 Hz); a file's own setting wins, and one shorter than the discharge time is warned about.
 * An invented joinery workshop, at 400 V 50 Hz and at 480 V 60 Hz.
 */
import { describe, expect, it } from 'vitest';
import { checkIntervalSequence, correctBoard, createRowReader, driverColumns, normaliseBoard, parseBoard, planColumns, planDrivers, studyProfile } from '@trivar/core';

const workshop = (frequencyHz: 50 | 60, bank: object = {}) => ({
  name: 'Alder Lane joinery',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: frequencyHz === 50 ? 400 : 480 }, frequencyHz },
  loads: [
    { name: 'planer', connection: 'ABC-delta', kW: 22, pf: 0.72 },
    { name: 'dust extractor', connection: 'ABC-delta', kW: 11, pf: 0.78 },
  ],
  profile: { bank: bank },
});

function bankOf(spec: ReturnType<typeof workshop>) {
  const parsed = parseBoard(spec);
  const board = normaliseBoard(parsed);
  const plan = planColumns(board, ['time', 'planer [kW]'], { undrivenAtRating: true });
  const reader = createRowReader(plan, { timeZone: 'UTC' });
  ['4', '22', '9', '22'].forEach((kW, i) => reader.push([`2026-04-07T0${i}:00:00Z`, kW], i + 2));
  const table = checkIntervalSequence(reader.finish(), 'none');
  const study = studyProfile(
    { board: plan.board, drivers: planDrivers(plan), columns: driverColumns(plan, table.values, table.count), utcMs: table.utcMs, intervalMs: table.intervalMs, profile: parsed.profile! },
    { bank: true },
  );
  return { board, bank: study.result.bank! };
}

describe("profile bank: the reconnection time follows the board's capacitor practice", () => {
  it('50 Hz IEC board: 180 s, the same discharge time the correction study sets', () => {
    const { board, bank } = bankOf(workshop(50));
    expect(bank.settings).toMatchObject({ reconnectSeconds: 180, dischargeSeconds: 180, reconnectFrom: 'practice' });
    expect(bank.settings.dischargeRule).toMatch(/IEC 60831-1/);
    expect(bank.withinInterval.words).toContain('no sooner than 180 s after it went off');
    expect(bank.warnings).toEqual([]);
    expect(correctBoard(board, { arrangement: 'star-bank' }).selection!.controller!.dischargeTimeS).toBe(bank.settings.dischargeSeconds);
  });

  it('60 Hz North-American board: 60 s (NEC 460.6)', () => {
    const { bank } = bankOf(workshop(60));
    expect(bank.settings).toMatchObject({ reconnectSeconds: 60, dischargeSeconds: 60, reconnectFrom: 'practice' });
    expect(bank.settings.dischargeRule).toMatch(/NEC 460\.6/);
  });

  it("the file's setting wins; shorter than the discharge time, it is warned about", () => {
    const short = bankOf(workshop(50, { reconnectSeconds: 45 })).bank;
    expect(short.settings).toMatchObject({ reconnectSeconds: 45, dischargeSeconds: 180, reconnectFrom: 'file' });
    expect(short.warnings).toHaveLength(1);
    expect(short.warnings[0]).toMatch(/^profile\.bank\.reconnectSeconds 45 s is shorter than the 180 s discharge time \(IEC 60831-1/);
    const long = bankOf(workshop(50, { reconnectSeconds: 240 })).bank;
    expect(long.settings).toMatchObject({ reconnectSeconds: 240, reconnectFrom: 'file' });
    expect(long.warnings).toEqual([]);
  });
});
