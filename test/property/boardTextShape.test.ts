/**
 * scanYamlShape (the depth and entry count behind the board-text limits) jumps over runs of
 * ordinary characters. The character-by-character scan it replaced is kept here as the
 * reference: on any text, both count the same depth and entries.
 */
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scanYamlShape } from '../../packages/core/src/board/boardText.js';

/** The reference: one character at a time (as in readBoardText.ts before the jumps). */
function scanOneByOne(text: string): { depth: number; entries: number } {
  let deepest = 0;
  let entries = 0;
  let flow = 0;
  const indents: number[] = [];
  let quote: '"' | "'" | null = null;
  let lineStart = true;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quote) {
      if (c === '\\' && quote === '"') i++;
      else if (c === quote) quote = null;
      continue;
    }
    if (lineStart) {
      lineStart = false;
      let j = i;
      while (text[j] === ' ') j++;
      const first = text[j];
      if (first !== undefined && first !== '\n' && first !== '\r' && first !== '#' && flow === 0) {
        const indent = j - i;
        while (indents.length && indents[indents.length - 1]! >= indent) indents.pop();
        indents.push(indent);
        let dashes = 0;
        // "- - - x" and "? ? ? x" nest on one line.
        while ((text[j] === '-' || text[j] === '?') && (text[j + 1] === ' ' || text[j + 1] === '\t')) {
          dashes++;
          j += 2;
          while (text[j] === ' ') j++;
        }
        deepest = Math.max(deepest, indents.length + dashes);
        entries += 1 + dashes;
      }
      i = j - 1;
      continue;
    }
    if (c === '\n') lineStart = true;
    else if (c === '#' && (i === 0 || /\s/.test(text[i - 1]!))) {
      while (i + 1 < text.length && text[i + 1] !== '\n') i++;
    } else if (c === '"' || c === "'") {
      // A quote opens a string only where a scalar can start (not inside a plain word like O'Brien).
      const before = text[i - 1];
      if (before === undefined || /[\s[{,:-]/.test(before)) quote = c;
    } else if (c === '[' || c === '{') {
      flow++;
      entries++;
      deepest = Math.max(deepest, indents.length + flow);
    } else if ((c === ']' || c === '}') && flow > 0) flow--;
    else if (c === ',' && flow > 0) entries++;
  }
  return { depth: deepest, entries };
}

const PIECES = ['a', 'x y', ' ', '  ', '\n', '\r\n', '\t', '-', '- ', '? ', ':', ': ', '#', ' #', '"', "'", '\\', '\\"', '[', ']', '{', '}', ',', "O'Brien", 'é'];

describe('scanYamlShape', () => {
  it('counts what the character-by-character scan counts, on any text', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...PIECES), { maxLength: 120 }), (pieces) => {
        const text = pieces.join('');
        expect(scanYamlShape(text)).toEqual(scanOneByOne(text));
      }),
      { numRuns: 3000 },
    );
  });
  it('counts what it counted on every shipped example', () => {
    for (const file of readdirSync('examples').filter((f) => f.endsWith('.yaml'))) {
      const text = readFileSync(`examples/${file}`, 'utf8');
      expect(scanYamlShape(text), file).toEqual(scanOneByOne(text));
    }
  });
});
