/**
 * A conductor size written close to the file's AWG/kcmil spelling (`awg: 4`, "AWG 2", "0000",
 * "250 kcmil", `kcmil: "250"`) is still refused, and the error says how the file writes it; the
 * spelling it suggests is one the board then accepts. A YAML reader's numbers are named as such.
 */
import { describe, expect, it } from 'vitest';
import { readBoardText, validateBoard, type InputIssue } from '@trivar/core';

type Conductor = Record<string, unknown>;
const boardWith = (line: Conductor) => ({
  name: 'Pump house',
  supply: { system: 'three-phase-4wire', voltage: '208Y/120', frequencyHz: 60, transformer: { kVA: 150, impedancePercent: 3, xOverR: 3 } },
  feeder: { lengthFt: 120, line, neutral: { awg: '1/0' } },
  loads: [{ name: 'pump', connection: 'ABC-delta', kW: 15, pf: 0.82 }],
});
const lineIssue = (line: Conductor): InputIssue => {
  const result = validateBoard(boardWith(line));
  expect(result.ok).toBe(false);
  const issue = result.ok ? undefined : result.issues.find((i) => i.path.startsWith('feeder.line.'));
  expect(issue).toBeDefined();
  return issue!;
};
/** The `field: value` the message suggests, read back as a conductor. */
const suggested = (message: string): Conductor | null => {
  const m = /write (awg|kcmil): ("[^"]+"|\d+)/.exec(message);
  return m ? { [m[1]!]: JSON.parse(m[2]!) } : null;
};

describe('a conductor size near the file’s spelling', () => {
  const cases: [string, Conductor, Conductor][] = [
    ['a number for an AWG size (YAML reads awg: 4 so)', { awg: 4 }, { awg: '4' }],
    ['the word AWG written in', { awg: 'AWG 2' }, { awg: '2' }],
    ['AWG after the size', { awg: '4/0 AWG' }, { awg: '4/0' }],
    ['a gauge mark', { awg: '#6' }, { awg: '6' }],
    ['aughts as zeros', { awg: '0000' }, { awg: '4/0' }],
    ['a kcmil size in the AWG field', { awg: '250' }, { kcmil: 250 }],
    ['MCM, the older name of kcmil', { awg: '500 MCM' }, { kcmil: 500 }],
    ['a kcmil size as text', { kcmil: '350' }, { kcmil: 350 }],
    ['an AWG size in the kcmil field', { kcmil: '2/0' }, { awg: '2/0' }],
  ];
  it.each(cases)('%s: the hint names the spelling, and that spelling is accepted', (_, written, expected) => {
    const issue = lineIssue(written);
    expect(issue.message).toContain('AWG sizes are text ("14" … "1", then "1/0" … "4/0"), larger sizes a kcmil number (kcmil: 250)');
    expect(suggested(issue.message)).toEqual(expected);
    expect(validateBoard(boardWith(expected)).ok).toBe(true);
  });

  it('an AWG field tells YAML users to quote the size', () => {
    expect(lineIssue({ awg: 4 }).message).toContain('in YAML quote it, since an unquoted 4 or 0000 is read as a number');
  });

  it('0 read by YAML (from 0, 00, 000 or 0000) suggests no size: which one was meant is lost', () => {
    const issue = lineIssue({ awg: 0 });
    expect(suggested(issue.message)).toBeNull();
    expect(issue.message).toContain('YAML reads 0, 00, 000 and 0000 alike as the number 0, so write the size quoted ("1/0" … "4/0")');
    // And indeed an unquoted 0000 in a board file arrives as that 0.
    const text = 'name: x\nsupply: { system: three-phase-4wire, voltage: "208Y/120", frequencyHz: 60 }\nfeeder: { lengthFt: 10, line: { awg: 0000 } }\nloads: [ { name: a, connection: A-N, kW: 1 } ]';
    expect((readBoardText(text) as { feeder: { line: { awg: unknown } } }).feeder.line.awg).toBe(0);
  });

  it('a size no spelling of the table names gets the rule but no suggestion', () => {
    for (const line of [{ awg: '7' }, { awg: 'AWG 5' }, { kcmil: 260 }]) {
      const issue = lineIssue(line);
      expect(suggested(issue.message)).toBeNull();
      expect(issue.message).toContain('larger sizes a kcmil number');
    }
  });

  it('a size the material lacks is not suggested (aluminium has no 14 AWG)', () => {
    const issue = lineIssue({ awg: 'AWG 14', material: 'aluminium' });
    expect(suggested(issue.message)).toBeNull();
    expect(lineIssue({ awg: 'AWG 12', material: 'aluminium' }).message).toContain('write awg: "12"');
  });

  it('a metric size keeps its own message', () => {
    expect(lineIssue({ mm2: 30 }).message).not.toContain('AWG sizes are text');
  });
});
