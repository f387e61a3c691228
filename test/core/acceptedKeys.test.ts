/**
 * Unknown keys: the error names the keys the object takes and, where one is a likely
 * typing slip, that key. The schema walk is checked on zod's wrappers (optional, default,
 * union, lazy, pipe, array, record) and on the board and installation files.
 */
import { describe, expect, it } from 'vitest';
// zod is core's dependency, not the workspace root's: imported from there (the same copy core's schemas use).
import * as z from '../../packages/core/node_modules/zod/index.js';
import { InputError, parseBoardText } from '@trivar/core';
import { acceptedKeysAt, keyDistance, nearestKey } from '../../packages/core/src/_internal/acceptedKeys.js';

describe('keyDistance (optimal string alignment, letter case ignored)', () => {
  it.each([
    ['lenghtM', 'lengthM', 1], // transposition
    ['kw', 'kW', 0],
    ['pff', 'pf', 1], // deletion
    ['arrangment', 'arrangement', 1], // insertion
    ['ratingA', 'ratingB', 1], // substitution
    ['', 'abc', 3],
    ['abc', 'xyz', 3],
  ] as const)('%s → %s: %i', (a, b, d) => {
    expect(keyDistance(a, b)).toBe(d);
    expect(keyDistance(b, a)).toBe(d);
  });
});

describe('nearestKey', () => {
  const feeder = ['line', 'neutral', 'lengthM', 'lengthFt'];
  it('names the key one slip away', () => {
    expect(nearestKey('lenghtM', feeder)).toBe('lengthM');
    expect(nearestKey('Neutral', feeder)).toBe('neutral');
  });
  it('names the nearest of several, and none when two are equally near', () => {
    expect(nearestKey('lengthX', feeder)).toBe('lengthM');
    expect(nearestKey('lengthm', ['lengthM', 'lengthN'])).toBe('lengthM');
    expect(nearestKey('lengthZ', ['lengthM', 'lengthN'])).toBeNull();
  });
  it('allows one edit on short keys and two on longer ones', () => {
    expect(nearestKey('kv', ['kW', 'pf'])).toBe('kW');
    expect(nearestKey('xyz', ['kW', 'pf'])).toBeNull();
    expect(nearestKey('lnegthM', ['lengthM'])).toBe('lengthM'); // one transposition
    expect(nearestKey('lngthMM', ['lengthM'])).toBe('lengthM'); // two edits
    expect(nearestKey('lxngthMMM', ['lengthM'])).toBeNull();
  });
  it('does not measure very long keys (the table would grow with them)', () => {
    expect(nearestKey('k'.repeat(65), ['k'.repeat(64)])).toBeNull();
  });
});

describe('acceptedKeysAt walks zod wrappers to the object at the path', () => {
  const cable = z.strictObject({ mm2: z.number(), material: z.string().optional() });
  const impedance = z.strictObject({ r: z.number(), x: z.number() });
  const schema = z.strictObject({
    feeder: z.strictObject({ line: z.union([cable, impedance]), lengthM: z.number() }).optional(),
    loads: z.array(z.strictObject({ name: z.string(), kW: z.number().default(0) })).default([]),
    named: z.record(z.string(), z.strictObject({ on: z.string() })),
    later: z.lazy(() => z.strictObject({ deep: z.number() })),
    piped: z.strictObject({ a: z.string() }).pipe(z.transform((v) => v)),
  });
  it('the root', () => expect(acceptedKeysAt(schema, [], {})).toEqual(['feeder', 'loads', 'named', 'later', 'piped']));
  it('through optional', () => expect(acceptedKeysAt(schema, ['feeder'], {})).toEqual(['line', 'lengthM']));
  it('a union: the form that knows most of the keys given', () => {
    expect(acceptedKeysAt(schema, ['feeder', 'line'], { r: 1, x: 2, colour: 'red' })).toEqual(['r', 'x']);
    expect(acceptedKeysAt(schema, ['feeder', 'line'], { mm2: 25, colour: 'red' })).toEqual(['mm2', 'material']);
  });
  it('through default and array', () => expect(acceptedKeysAt(schema, ['loads', 3], {})).toEqual(['name', 'kW']));
  it('through record', () => expect(acceptedKeysAt(schema, ['named', 'anything'], {})).toEqual(['on']));
  it('through lazy and pipe', () => {
    expect(acceptedKeysAt(schema, ['later'], {})).toEqual(['deep']);
    expect(acceptedKeysAt(schema, ['piped'], {})).toEqual(['a']);
  });
  it('null where the path leads to no object', () => {
    expect(acceptedKeysAt(schema, ['feeder', 'lengthM'], 3)).toBeNull();
    expect(acceptedKeysAt(schema, ['nowhere'], {})).toBeNull();
  });
});

describe('unknown keys in files', () => {
  const issuesOf = (text: string) => {
    try {
      parseBoardText(text);
    } catch (error) {
      if (error instanceof InputError) return error.issues;
      throw error;
    }
    throw new Error('expected an InputError');
  };
  const supply = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }\n';
  it('a load key typed in the wrong case names the one meant and every key a load takes', () => {
    const [issue] = issuesOf(`${supply}loads:\n  - { name: oven, connection: A-N, kw: 2 }\n`);
    expect(issue).toMatchObject({ code: 'unknown_key', path: 'loads[0].kw', received: '"kw"' });
    expect(issue!.expected).toMatch(/^one of the keys taken here \("name", .*"connection", .*"kW", .*"pf".*\); nearest: "kW"$/);
  });
  it('a feeder key with two letters swapped', () => {
    const [issue] = issuesOf(`${supply}feeder: { lenghtM: 20, line: { mm2: 25 }, neutral: { mm2: 25 } }\nloads:\n  - { name: oven, connection: A-N, kW: 2 }\n`);
    expect(issue).toMatchObject({ code: 'unknown_key', path: 'feeder.lenghtM' });
    expect(issue!.expected).toBe('one of the keys taken here ("line", "neutral", "lengthM", "lengthFt"); nearest: "lengthM"');
  });
  it('a per-phase key in an L1/L2/L3 file lists the phases as the file names them', () => {
    const [issue] = issuesOf(
      `supply: { system: three-phase-4wire, voltage: 400/230, frequencyHz: 50 }\nfeeder: { lengthM: 20, line: { L1: { mm2: 25 }, L2: { mm2: 25 }, L3: { mm2: 25 }, L4: { mm2: 25 } }, neutral: { mm2: 25 } }\nloads:\n  - { name: oven, connection: L1-N, kW: 2 }\n`,
    );
    expect(issue).toMatchObject({ code: 'unknown_key', path: 'feeder.line.L4', expected: 'one of the keys taken here ("L1", "L2", "L3")' });
  });
  it('a key far from every accepted one gets the list and no guess', () => {
    const [issue] = issuesOf(`${supply}colour: red\nloads:\n  - { name: oven, connection: A-N, kW: 2 }\n`);
    expect(issue!.expected).toMatch(/^one of the keys taken here \(.*"supply".*"loads".*\)$/);
  });
});
