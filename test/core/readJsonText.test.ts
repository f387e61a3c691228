/**
 * The JSON fast path reads exactly what the YAML 1.2 reader reads, and steps aside
 * (to the YAML reader and its error wording) wherever the two could differ.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError, readBoardText } from '@trivar/core';
import { readJsonText } from '../../packages/core/src/board/readJsonText.js';
import { readYamlText } from '../../packages/core/src/board/readBoardText.js';

const issueCodes = (text: string) => {
  try {
    readBoardText(text);
  } catch (e) {
    if (e instanceof InputError) return e.issues.map((i) => i.code);
    throw e;
  }
  throw new Error('expected an InputError');
};

describe('readJsonText', () => {
  it('gives the same data as the YAML reader for any JSON object, however it is indented', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue({ maxDepth: 4 })), fc.constantFrom(undefined, 0, 2, '\t'), (object, indent) => {
        const text = JSON.stringify(object, null, indent);
        const fast = readJsonText(text);
        expect(fast).toBeDefined();
        expect(fast).toEqual(readYamlText(text));
      }),
    );
  });

  it('reads a board the same way as YAML and as JSON', () => {
    const yaml = 'name: bakery\nsupply: { system: single-phase, voltage: { lineToNeutral: 230 }, frequencyHz: 50 }\nloads:\n  - { name: oven, connection: A-N, kW: 1.5e0, pf: 0.95 }\n';
    const data = readBoardText(yaml);
    expect(readJsonText(JSON.stringify(data))).toEqual(data);
    expect(readBoardText(` \n${JSON.stringify(data, null, 2)}\n`)).toEqual(data);
  });

  it('steps aside for a repeated key, written alike or through an escape, so the YAML reader refuses it', () => {
    for (const text of ['{"a": 1, "a": 2}', '{"a": 1, "\\u0061": 2}', '{"b": {"x": [1, {"y": 1, "y": 1}]}}']) {
      expect(readJsonText(text)).toBeUndefined();
      expect(issueCodes(text)).toEqual(['duplicate_key']);
    }
    // The issue names the mapping that has the key twice.
    expect(() => readBoardText('{"b": {"x": [1, {"y": 1, "y": 1}]}}')).toThrow(/b\.x\[1\]: the key "y" is given twice/);
    expect(readJsonText('{"a": {"a": 1}, "b": [{"a": 2}, {"a": 3}]}')).toEqual({ a: { a: 1 }, b: [{ a: 2 }, { a: 3 }] });
  });

  it('steps aside for YAML that is not JSON, and for JSON that is not an object', () => {
    expect(readJsonText('{a: 1}')).toBeUndefined();
    expect(readBoardText('{a: 1}')).toEqual({ a: 1 });
    expect(readJsonText('{"a": 1} # note')).toBeUndefined();
    expect(readBoardText('{"a": 1} # note')).toEqual({ a: 1 });
    expect(readJsonText('[1, 2]')).toBeUndefined();
    expect(readJsonText('"text"')).toBeUndefined();
    expect(readJsonText('{"a": 1,}')).toBeUndefined();
  });

  it('keeps a __proto__ key as an own key, as the YAML reader does', () => {
    const fast = readJsonText('{"__proto__": {"polluted": 1}}') as Record<string, unknown>;
    expect(Object.keys(fast)).toEqual(['__proto__']);
    expect(Object.getPrototypeOf(fast)).toBe(Object.prototype);
    expect(fast).toEqual(readYamlText('{"__proto__": {"polluted": 1}}'));
  });

  it('leaves the depth limit to the shape check before any parser runs', () => {
    expect(issueCodes(`{"a": ${'['.repeat(65)}${']'.repeat(65)}}`)).toEqual(['too_deep']);
  });
});
