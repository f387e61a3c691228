/**
 * Malformed boards: each must give an InputError whose issues name the field
 * (path and code asserted exactly, wording loosely) — never a stack trace or a
 * silently wrong answer.
 */
import { describe, expect, it } from 'vitest';
import { InputError, parseBoardText, solveBoard, validateBoard } from '@trivar/core';

const good = () => ({
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [{ name: 'oven', connection: 'A-B', kW: 6, pf: 1 }],
});
type Mutable = Record<string, any>;
const edit = (f: (b: Mutable) => void) => {
  const b = good() as Mutable;
  f(b);
  return b;
};

const cases: [string, unknown, string, string][] = [
  ['not an object', 42, 'invalid_type', ''],
  ['missing supply', edit((b) => delete b.supply), 'missing', 'supply'],
  ['missing loads', edit((b) => delete b.loads), 'missing', 'loads'],
  ['empty load list', edit((b) => (b.loads = [])), 'out_of_range', 'loads'],
  ['loads not a list', edit((b) => (b.loads = { name: 'x' })), 'invalid_type', 'loads'],
  ['unknown top-level key', edit((b) => (b.colour = 'red')), 'unknown_key', 'colour'],
  ['unknown key in a load', edit((b) => (b.loads[0].phase = 'A')), 'unknown_key', 'loads[0].phase'],
  ['unknown system', edit((b) => (b.supply.system = 'two-phase')), 'invalid_value', 'supply.system'],
  ['zero voltage', edit((b) => (b.supply.voltage.lineToLine = 0)), 'out_of_range', 'supply.voltage.lineToLine'],
  ['negative voltage', edit((b) => (b.supply.voltage.lineToLine = -400)), 'out_of_range', 'supply.voltage.lineToLine'],
  ['voltage as text', edit((b) => (b.supply.voltage.lineToLine = '400 V')), 'invalid_type', 'supply.voltage.lineToLine'],
  ['no voltage given', edit((b) => (b.supply.voltage = {})), 'missing', 'supply.voltage'],
  ['both voltages given', edit((b) => (b.supply.voltage.lineToNeutral = 230)), 'conflict', 'supply.voltage'],
  ['frequency 55 Hz', edit((b) => (b.supply.frequencyHz = 55)), 'invalid_value', 'supply.frequencyHz'],
  ['NaN power', edit((b) => (b.loads[0].kW = Number.NaN)), 'invalid_type', 'loads[0].kW'],
  ['infinite power', edit((b) => (b.loads[0].kW = Number.POSITIVE_INFINITY)), 'invalid_type', 'loads[0].kW'],
  ['PF above 1', edit((b) => (b.loads[0].pf = 1.2)), 'out_of_range', 'loads[0].pf'],
  ['PF zero', edit((b) => (b.loads[0].pf = 0)), 'out_of_range', 'loads[0].pf'],
  ['unknown phase', edit((b) => (b.loads[0].connection = 'A-D')), 'invalid_value', 'loads[0].connection'],
  ['phase C on split-phase', edit((b) => {
    b.supply = { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 };
    b.loads[0].connection = 'C-N';
  }), 'unknown_phase', 'loads[0].connection'],
  ['neutral load on 3-wire', edit((b) => {
    b.supply.system = 'three-phase-3wire';
    b.loads[0].connection = 'A-N';
  }), 'no_neutral', 'loads[0].connection'],
  ['negative resistance', edit((b) => {
    delete b.loads[0].kW;
    delete b.loads[0].pf;
    b.loads[0].ohms = { r: -5, x: 1 };
  }), 'out_of_range', 'loads[0].ohms.r'],
  ['zero impedance load', edit((b) => {
    delete b.loads[0].kW;
    delete b.loads[0].pf;
    b.loads[0].ohms = { r: 0, x: 0 };
  }), 'out_of_range', 'loads[0].ohms'],
  ['two ratings at once', edit((b) => (b.loads[0].kVA = 5)), 'rating', 'loads[0]'],
  ['no rating', edit((b) => {
    delete b.loads[0].kW;
    delete b.loads[0].pf;
  }), 'rating', 'loads[0]'],
  // kW alone is accepted (pf 1, stated: see 'a kW-only load' below); kVA and A still need a pf.
  ['kVA without pf', edit((b) => {
    delete b.loads[0].pf;
    delete b.loads[0].kW;
    b.loads[0].kVA = 6;
  }), 'rating', 'loads[0]'],
  ['ZIP fractions not summing to 1', edit((b) => (b.loads[0].zip = { z: 0.5, i: 0.2, p: 0.2 })), 'out_of_range', 'loads[0].zip'],
  ['model and zip together', edit((b) => {
    b.loads[0].model = 'constant-power';
    b.loads[0].zip = { z: 0.5, i: 0.25, p: 0.25 };
  }), 'conflict', 'loads[0]'],
  ['unknown load model', edit((b) => (b.loads[0].model = 'motor')), 'invalid_value', 'loads[0].model'],
  ['duplicate load names', edit((b) => b.loads.push({ ...b.loads[0] })), 'duplicate', 'loads[1].name'],
  ['empty load name', edit((b) => (b.loads[0].name = '')), 'out_of_range', 'loads[0].name'],
  ['negative feeder resistance', edit((b) => (b.feeder = { line: { r: -0.1, x: 0 } })), 'out_of_range', 'feeder.line.r'],
  ['feeder length without resistance', edit((b) => (b.feeder = { line: { lengthM: 30 } })), 'missing', 'feeder.line.rOhmPerKm'],
  ['steel conduit on a metric cable', edit((b) => (b.feeder = { lengthM: 30, line: { mm2: 35, conduit: 'steel' } })), 'not_applicable', 'feeder.line.conduit'],
  ['conduit beside a stated reactance', edit((b) => (b.feeder = { lengthM: 30, line: { awg: '2', conduit: 'steel', xOhmPerKm: 0.2 } })), 'conflict', 'feeder.line'],
  ['unknown conduit', edit((b) => (b.feeder = { lengthM: 30, line: { awg: '2', conduit: 'iron' } })), 'invalid_value', 'feeder.line.conduit'],
  ['neutral feeder on 3-wire', edit((b) => {
    b.supply.system = 'three-phase-3wire';
    b.feeder = { neutral: { r: 0.1, x: 0 } };
  }), 'not_applicable', 'feeder.neutral'],
  ['transformer and impedance both', edit((b) => {
    b.supply.impedance = { r: 0.01, x: 0.02 };
    b.supply.transformer = { kVA: 100, impedancePercent: 4, xOverR: 2 };
  }), 'conflict', 'supply'],
  ['transformer impedance 0 %', edit((b) => (b.supply.transformer = { kVA: 100, impedancePercent: 0, xOverR: 2 })), 'out_of_range', 'supply.transformer.impedancePercent'],
  ['EMF missing a phase', edit((b) => (b.supply.emf = { A: { V: 231, angleDeg: 0 }, B: { V: 231, angleDeg: -120 } })), 'missing', 'supply.emf.C'],
  // Read the other way round, the sequence parts swap: a 2.5 % unbalance came out as 3,984 %.
  ['EMF angles turning ABC on a supply declared ACB', edit((b) => {
    b.supply.sequence = 'ACB';
    b.supply.emf = { A: { V: 240, angleDeg: 0 }, B: { V: 220, angleDeg: -120 }, C: { V: 230, angleDeg: 120 } };
  }), 'conflict', 'supply.emf'],
  ['EMF angles turning ACB with no sequence given (ABC)', edit((b) => (b.supply.emf = { A: { V: 231, angleDeg: 0 }, B: { V: 231, angleDeg: 120 }, C: { V: 231, angleDeg: -120 } })), 'conflict', 'supply.emf'],
  ['sense without pf', edit((b) => {
    delete b.loads[0].pf;
    b.loads[0].kvar = 2;
    b.loads[0].sense = 'leading';
  }), 'not_applicable', 'loads[0].sense'],
  ['starPoint on a line-to-line load', edit((b) => (b.loads[0].starPoint = 'floating')), 'not_applicable', 'loads[0].starPoint'],
  ['line-to-line voltage on single-phase', edit((b) => {
    b.supply.system = 'single-phase';
    b.loads[0].connection = 'A-N';
  }), 'not_applicable', 'supply.voltage.lineToLine'],
];

describe('bad board input', () => {
  it(`covers at least 20 malformed boards (${cases.length})`, () => {
    expect(cases.length).toBeGreaterThanOrEqual(20);
  });
  it.each(cases)('%s', (_label, board, code, path) => {
    const result = validateBoard(board);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues).toContainEqual(expect.objectContaining({ code, path }));
    for (const issue of result.issues) {
      // Every message names where the problem is and what is accepted.
      expect(issue.message).toContain(issue.path === '' ? 'board' : issue.path);
      expect(issue.message).toMatch(/expected /);
      expect(issue.message).not.toMatch(/\n\s+at /);
    }
    expect(() => solveBoard(board)).toThrow(InputError);
  });
  it('reports several problems in one pass', () => {
    const result = validateBoard(edit((b) => {
      b.loads[0].pf = 3;
      b.supply.frequencyHz = 40;
      b.extra = true;
    }));
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues.map((i) => i.path).sort()).toEqual(['extra', 'loads[0].pf', 'supply.frequencyHz']);
  });
  it('names the line and column of a YAML syntax error', () => {
    const err = (() => {
      try {
        parseBoardText('supply:\n  system: [three-phase-4wire\nloads: []\n');
      } catch (e) {
        return e;
      }
      return null;
    })();
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).issues[0]!.message).toMatch(/line \d+, column \d+/);
  });
  it('rejects an empty file', () => {
    expect(() => parseBoardText('# only a comment\n')).toThrow(/empty/);
  });
});
