/**
 * Names every object inherits (`toString`, `constructor`, `valueOf`, `hasOwnProperty`) are names like
 * any other in scenarios, groups and interval headers: unknown ones are refused at their field, and a
 * load or group really called that is found.
 */
import { describe, expect, it } from 'vitest';
import {
  conditionsFromScenarios,
  InputError,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  planColumns,
  planInstallationColumns,
  rebalanceBoard,
  studyInstallationScenarios,
  studyScenarios,
} from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
const INHERITED = ['toString', 'constructor', 'valueOf', 'hasOwnProperty'] as const;

/** The first issue's path of the InputError `call` throws. */
function refusedAt(call: () => unknown): string {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as InputError).issues[0]!.path;
  }
  throw new Error('expected an InputError, got a result');
}

/** A greenhouse board whose one scenario names `name` (a load it does not have). */
function greenhouse(name: string) {
  const parsed = parseBoard({
    supply,
    loads: [
      { name: 'heater', connection: 'A-N', kW: 2, pf: 1 },
      { name: 'fans', connection: 'B-N', kW: 1, pf: 1 },
    ],
    profile: { scenarios: [{ name: 'frost night', hours: 10, loads: { [name]: 1 } }] },
  });
  return { parsed, board: normaliseBoard(parsed) };
}

describe('an inherited name that is no load of the board', () => {
  it.each(INHERITED)('%s in a scenario: refused at profile.scenarios[0].loads.<name>', (name) => {
    const { parsed, board } = greenhouse(name);
    expect(refusedAt(() => studyScenarios(board, parsed.profile!))).toBe(`profile.scenarios[0].loads.${name}`);
  });

  it.each(INHERITED)('%s in a scenario turned into conditions: kept as a circuit name, refused by the rebalancing', (name) => {
    const { parsed, board } = greenhouse(name);
    const conditions = conditionsFromScenarios(parsed.profile!);
    expect(conditions).toEqual([{ name: 'frost night', weight: 10, factor: 0, circuits: { [name]: 1 } }]);
    expect(refusedAt(() => rebalanceBoard(board, { conditions }))).toBe(`conditions[0].circuits.${name}`);
  });

  it.each([...INHERITED, '__proto__'])('%s as an interval header: refused at its column', (name) => {
    const { board } = greenhouse('heater');
    expect(refusedAt(() => planColumns(board, ['time', `${name} [kW]`]))).toBe(`header, column 2 ("${name} [kW]")`);
  });

  it('on an installation, a scenario naming toString is refused (it used to read as no load, 0 kW)', () => {
    const parsed = parseInstallation({
      supply,
      boards: [
        { name: 'Yard', loads: [{ name: 'pump', connection: 'A-N', kW: 2, pf: 1 }] },
        { name: 'Shed', fedFrom: 'Yard', feeder: { lengthM: 20, line: { mm2: 10 }, neutral: { mm2: 10 } }, loads: [{ name: 'saw', connection: 'B-N', kW: 2, pf: 1 }] },
      ],
      profile: { scenarios: [{ name: 'weekend', hours: 10, loads: { toString: 1 } }] },
    });
    const { installation } = normaliseInstallation(parsed);
    expect(refusedAt(() => studyInstallationScenarios(installation, parsed.profile!))).toBe('profile.scenarios[0].loads.toString');
    expect(refusedAt(() => planInstallationColumns(installation, ['time', 'constructor [kW]']))).toBe('header, column 2 ("constructor [kW]")');
  });
});

describe('a load or group really called by an inherited name', () => {
  const parsed = parseBoard({
    supply,
    loads: [
      { name: 'constructor', connection: 'A-N', kW: 2, pf: 1 },
      { name: 'toString', connection: 'B-N', kW: 1, pf: 1 },
      { name: 'lamps', connection: 'C-N', kW: 0.5, pf: 1 },
    ],
    profile: {
      groups: { valueOf: ['toString', 'lamps'] },
      scenarios: [{ name: 'evening', hours: 4, loads: { constructor: 0.5, valueOf: 1 } }],
    },
  });
  const board = normaliseBoard(parsed);

  it('is scaled by a scenario: 0.5 × 2 kW + 1 kW + 0.5 kW = 2.5 kW (a stiff supply: no drop)', () => {
    expect(studyScenarios(board, parsed.profile!).scenarios[0]!.kW).toBeCloseTo(2.5, 9);
  });

  it('has its own interval column, and a group of that name drives its members', () => {
    const plan = planColumns(board, ['time', 'constructor [kW]', 'valueOf [kW]'], { groups: parsed.profile!.groups! });
    expect(plan.targets.map((t) => [t.name, t.kind, t.loads])).toEqual([
      ['constructor', 'load', [0]],
      ['valueOf', 'group', [1, 2]],
    ]);
  });

  it('becomes a rebalancing condition with the group expanded', () => {
    const conditions = conditionsFromScenarios(parsed.profile!);
    expect(conditions[0]!.circuits).toEqual({ constructor: 0.5, toString: 1, lamps: 1 });
    expect(rebalanceBoard(board, { conditions }).conditions.map((c) => c.name)).toEqual(['evening']);
  });
});
