/**
 * A board written with L1/L2/L3 reads as L-names through `trivar correct`, `check`, `profile` and
 * `report` — text, the wording fields of the JSON and the HTML — with the same figures as the same
 * board written A/B/C; the A/B/C file keeps its letters and shows no L-name.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard, readBoardText } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';
import { figuresOf, inNumberedNames, LETTERED_LABEL, NUMBERED_LABEL } from '../support/phaseNaming.js';

const example = (file: string) => readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8');
const boardOf = (text: string) => normaliseBoard(parseBoard(readBoardText(text)));

/** Every sentence of a study result: the JSON fields written for people, not data keys. */
function sentencesOf(x: unknown, key = ''): string[] {
  if (typeof x === 'string') return /message|summary|reasons|why|shortfalls|statement|explanation|note|text|finding/i.test(key) ? [x] : [];
  if (Array.isArray(x)) return x.flatMap((y) => sentencesOf(y, key));
  if (x && typeof x === 'object') return Object.entries(x).flatMap(([k, v]) => sentencesOf(v, k));
  return [];
}

/** Every number and flag of a result in order: the figures two namings must share (data keys stay A/B/C in both). */
function figureLeaves(x: unknown): (number | boolean | null)[] {
  if (typeof x === 'number' || typeof x === 'boolean' || x === null) return [x];
  if (Array.isArray(x)) return x.flatMap(figureLeaves);
  if (x && typeof x === 'object') return Object.values(x).flatMap(figureLeaves);
  return [];
}

describe('correct follows the file naming', () => {
  for (const [file, arrangements] of [
    ['riverside-cold-store.yaml', ['delta-bank', 'star-bank', 'balancing-compensator']],
    ['hillside-workshop.yaml', ['balancing-compensator', 'star-bank']],
  ] as const)
    for (const arrangement of arrangements)
      it(`${file}, ${arrangement}: L-names in text and sentences, the same figures`, () => {
        const text = example(file);
        const numbered = inNumberedNames(text);
        expect(numbered).not.toBe(text);
        const spec = { arrangement, lightLoad: { fraction: 0.3 } };
        const lettered = correctBoard(boardOf(text), spec);
        const named = correctBoard(boardOf(numbered), spec);
        expect(named.verification.before.conventions.phaseNames).toBe('L1/L2/L3');
        expect(figureLeaves(named)).toEqual(figureLeaves(lettered));
        const namedText = renderCorrectionReport(named);
        const letteredText = renderCorrectionReport(lettered);
        expect(namedText).toMatch(/L1/);
        expect(namedText).not.toMatch(LETTERED_LABEL);
        for (const s of sentencesOf(named)) expect(s).not.toMatch(LETTERED_LABEL);
        expect(figuresOf(namedText)).toEqual(figuresOf(letteredText));
        // The A/B/C file keeps its letters.
        expect(letteredText).not.toMatch(NUMBERED_LABEL);
        expect(letteredText).toMatch(/^ {2}A {4}/m);
        for (const s of sentencesOf(lettered)) expect(s).not.toMatch(NUMBERED_LABEL);
      });
});
