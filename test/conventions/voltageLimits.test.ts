/**
 * Voltage limits: named presets and custom percentages, applied to every board of an
 * installation; the verdict, the warnings and the printed figures agree. Preset values:
 * METHODS.md §12 (EN 50160 ±10 % confirmed secondary; ANSI C84.1 Range A ±5 % at service
 * confirmed secondary, Range B from memory; UK +10/−6 % confirmed from the 1994 amendment).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { judgeVoltage, readBoardText, solveBoard, solveInstallation, VOLTAGE_LIMIT_PRESETS, type InstallationResult } from '@trivar/core';
import { renderInstallationReport } from '../../packages/cli/src/format/installationReport.js';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';

const ROOT = new URL('../../', import.meta.url);
const riserText = readFileSync(new URL('examples/maple-court-riser.yaml', ROOT), 'utf8');
const riser = (voltageLimits?: unknown) => {
  const spec = readBoardText(riserText) as Record<string, unknown>;
  return solveInstallation(voltageLimits === undefined ? spec : { ...spec, conventions: { voltageLimits } });
};
const lowest = (r: InstallationResult, board: string) => Math.min(...r.boards.find((b) => b.name === board)!.result.phases.map((p) => p.voltagePercent));

describe('voltage-limit presets', () => {
  it('hold the values of METHODS.md §12', () => {
    expect(VOLTAGE_LIMIT_PRESETS['en50160-supply']).toMatchObject({ underPercent: 10, overPercent: 10 });
    expect(VOLTAGE_LIMIT_PRESETS['c84-service-a']).toMatchObject({ underPercent: 5, overPercent: 5 });
    // Range B as the standard's volts on a 120 V base: 110 V and 127 V, exact fractions of it.
    expect(VOLTAGE_LIMIT_PRESETS['c84-service-b']).toMatchObject({ underPercent: (100 * 10) / 120, overPercent: (100 * 7) / 120 });
    expect(VOLTAGE_LIMIT_PRESETS['uk-supply']).toMatchObject({ underPercent: 6, overPercent: 10 });
    // 120 V service: Range A 114–126 V, Range B 110–127 V (ANSI C84.1, from memory).
    const a = { preset: 'c84-service-a' as const, ...VOLTAGE_LIMIT_PRESETS['c84-service-a'] };
    expect(judgeVoltage(a, (100 * 114) / 120)).toBe('within');
    expect(judgeVoltage(a, (100 * 113.8) / 120)).toBe('under');
    const b = { preset: 'c84-service-b' as const, ...VOLTAGE_LIMIT_PRESETS['c84-service-b'] };
    expect(judgeVoltage(b, (100 * 110) / 120)).toBe('within');
    expect(judgeVoltage(b, (100 * 127) / 120)).toBe('within');
    expect(judgeVoltage(b, (100 * 127.5) / 120)).toBe('over');
    expect(judgeVoltage(b, (100 * 109.99) / 120)).toBe('under');
  });

  it('judges the figure itself, not its 0.1 % rounding: 96.96 % is under a −3 % limit (the report prints it 96.96)', () => {
    const custom = { preset: 'custom' as const, underPercent: 3, overPercent: 3, source: '' };
    expect(judgeVoltage(custom, 96.96)).toBe('under');
    expect(judgeVoltage(custom, 96.9995)).toBe('within'); // round-off past the edge
    expect(judgeVoltage(custom, 97.04)).toBe('within');
  });
});

describe('limits on every board of the Maple Court riser', () => {
  it('the farthest board is the lowest, and is within EN 50160 (the IEC default) and ANSI Range A', () => {
    const r = riser();
    expect(r.totals.lowestVoltageBoard).toBe('Floor 4');
    expect(r.boards.every((b) => b.result.voltageCheck.limits.preset === 'en50160-supply')).toBe(true);
    expect(r.boards.every((b) => b.result.voltageCheck.verdict === 'within')).toBe(true);
    const a = riser('c84-service-a');
    expect(a.boards.every((b) => b.result.voltageCheck.verdict === 'within')).toBe(true);
  });

  it('custom −2.5 % puts exactly the boards with a voltage below 97.5 % under the limit, in the table, the line and the warnings', () => {
    const r = riser({ underPercent: 2.5, overPercent: 5 });
    for (const b of r.boards) {
      // Board voltages and every load's voltage on the board, past round-off (0.001 %).
      const all = [...b.result.phases.map((p) => p.voltagePercent), ...b.result.loads.flatMap((l) => l.branches.map((x) => x.voltagePercent))];
      const expected = all.some((v) => v < 97.5 - 0.001) ? 'under' : 'within';
      expect(b.result.voltageCheck.verdict, b.name).toBe(expected);
      const warned = b.result.warnings.some((w) => w.code.endsWith('undervoltage'));
      expect(warned, b.name).toBe(expected === 'under');
    }
    const under = r.boards.filter((b) => b.result.voltageCheck.verdict === 'under').map((b) => b.name);
    expect(under).toContain('Floor 4');
    expect(under).not.toContain('Main switchboard');
    expect(lowest(r, 'Floor 4')).toBeLessThan(97.5);
    const text = renderInstallationReport(r, { detailed: [] });
    expect(text).toMatch(/Floor 4 .* UNDER /);
    expect(text.replace(/\s+/g, ' ')).toMatch(new RegExp(`voltage limits −2.5/\\+5 % \\(custom\\): outside at ${under.map((n) => `${n} \\(under\\)`).join(', ')}`));
    // Floor 1's lowest, 97.453 %, would print 97.5 at 0.1 %, on the edge: it prints 97.45 beside its UNDER.
    expect(under).toContain('Floor 1');
    expect(text).toMatch(/└ Floor 1 +97\.45 +100\.1 .* UNDER /);
    expect(text).toContain('! Floor 1: phase A at the board is 224.1 V, 97.45 % of nominal, outside −2.5/+5 % (custom)');
  });

  it('the board report states the limits, their source and one verdict that agrees with its warnings', () => {
    const board = solveBoard({
      supply: { voltage: '208Y/120', frequencyHz: 60, impedance: { r: 0.2, x: 0.05 } },
      loads: [{ name: 'heater', connection: 'A-N', kW: 4.5 }],
    });
    expect(board.conventions.voltageLimits.preset).toBe('c84-service-a');
    expect(board.voltageCheck.verdict).toBe('under');
    const text = renderSolveReport(board);
    expect(text).toMatch(/limits ±5 % \(c84-service-a\): BELOW the lower limit; lowest (\d+\.\d) % at (phase A|"heater")/);
    const shown = Number(/lowest (\d+\.\d) %/.exec(text)![1]);
    expect(shown).toBeLessThan(95);
    expect(text).toMatch(/ANSI C84\.1 Range A/);
    expect(board.warnings.map((w) => w.code)).toContain('undervoltage');
  });
});
