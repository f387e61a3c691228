/**
 * Every exported function of the library, handed nothing, null, an empty object, a word or a number
 * where its first argument goes, either answers or refuses with an InputError naming the argument and
 * what it takes: never a TypeError or RangeError from inside, never NaN or "undefined" passed off as an
 * answer. The helpers the studies call in their loops keep their answers for good input.
 */
import { describe, expect, it } from 'vitest';
import * as core from '@trivar/core';
import {
  analyseSolution,
  arrangementNames,
  bankInServiceWords,
  capacitorVoltage,
  conductorReactance,
  conventionsOf,
  dutyConditions,
  InputError,
  labelIn,
  labellerOf,
  normaliseBoard,
  parseBoard,
  polar,
  regionWords,
  renderReportHtml,
  renderReportMarkdown,
  renderTimeChart,
  scanResonance,
  selectBankUnits,
  solveNetwork,
  stepCombinations,
  terminalVoltage,
  toPhasor,
  withHarmonicNeutral,
} from '@trivar/core';

/** An invented 60 Hz bakery board: enough to give the helpers something real to read. */
const board = normaliseBoard(
  parseBoard({
    name: 'Ridge Road bakery',
    supply: { system: 'three-phase-4wire', voltage: '208Y/120', frequencyHz: 60 },
    loads: [
      { name: 'Proofer', connection: 'A-N', kW: 3, pf: 0.9 },
      { name: 'Mixer', connection: 'B-C', kW: 5, pf: 0.8 },
    ],
  }),
);

const BAD_FIRST_ARGUMENTS: readonly [string, unknown][] = [
  ['null', null],
  ['undefined', undefined],
  ['{}', {}],
  ["'x'", 'x'],
  ['42', 42],
];

/** What a call did: its InputError's paths, a plain answer, or anything else in words. */
function outcome(call: () => unknown): { kind: 'refused'; paths: string[]; message: string } | { kind: 'answered'; value: unknown } | { kind: 'other'; what: string } {
  try {
    const value = call();
    if (value instanceof Promise) value.catch(() => undefined);
    return { kind: 'answered', value };
  } catch (e) {
    if (e instanceof InputError) return { kind: 'refused', paths: e.issues.map((i) => i.path), message: e.message };
    return { kind: 'other', what: `${(e as Error)?.constructor?.name}: ${(e as Error)?.message}` };
  }
}

/** NaN, or "undefined"/"NaN"/"[object Object]" in text, anywhere a few levels into an answer. */
function garbageIn(value: unknown, depth = 0, seen = new Set<unknown>()): string | null {
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : null;
  if (typeof value === 'string') return /\bundefined\b|\bNaN\b|\[object Object\]/.test(value) ? value.slice(0, 80) : null;
  if (!value || typeof value !== 'object' || depth > 4 || seen.has(value)) return null;
  seen.add(value);
  for (const v of Object.values(value).slice(0, 200)) {
    const found = garbageIn(v, depth + 1, seen);
    if (found) return found;
  }
  return null;
}

const isClass = (f: unknown) => typeof f === 'function' && /^class\b/.test(Function.prototype.toString.call(f));

describe('exported functions given a wrong first argument', () => {
  const functions = Object.entries(core).filter(([, f]) => typeof f === 'function' && !isClass(f)) as [string, (...args: unknown[]) => unknown][];

  it('the library exports functions to check (the sweep is not empty)', () => {
    expect(functions.length).toBeGreaterThan(200);
  });

  it('every one answers or refuses with an InputError: no TypeError, RangeError or NaN', () => {
    const wrong: string[] = [];
    for (const [name, f] of functions)
      for (const [label, arg] of BAD_FIRST_ARGUMENTS) {
        const r = outcome(() => f(arg));
        if (r.kind === 'other') wrong.push(`${name}(${label}) → ${r.what}`);
        else if (r.kind === 'answered' && garbageIn(r.value)) wrong.push(`${name}(${label}) → ${garbageIn(r.value)}`);
      }
    expect(wrong).toEqual([]);
  });

  // A representative set: the error names the argument (or the field in it) and says what is accepted.
  const refusals: readonly [string, () => unknown, string, RegExp][] = [
    ['analyseSolution', () => analyseSolution(null as never), 'solved', /network solution from solveNetwork/],
    ['conventionsOf', () => conventionsOf(undefined as never), 'board', /a board from normaliseBoard/],
    ['renderReportHtml', () => renderReportHtml({} as never), 'doc', /report document from buildBoardReport/],
    ['renderReportMarkdown', () => renderReportMarkdown({ sections: [] } as never, 42 as never), 'figurePrefix', /prefix of the figure files/],
    ['renderTimeChart', () => renderTimeChart('x' as never), 'input', /chart input/],
    ['toPhasor', () => toPhasor({ re: 1, im: Number.NaN }), 'a', /complex value \{ re, im \} of finite numbers/],
    ['polar', () => polar(2, Number.POSITIVE_INFINITY), 'angleRad', /finite number of radians/],
    ['terminalVoltage', () => terminalVoltage(null as never, 'A'), 'solution', /network solution/],
    ['labelIn', () => labelIn('A/B/C', 42 as never), 'term', /phase, line pair or connection/],
    ['labellerOf', () => labellerOf('1/2/3' as never), 'naming', /one of "A\/B\/C", "L1\/L2\/L3"/],
    ['regionWords', () => regionWords('europe' as never, 'three-phase-4wire'), 'region', /one of "iec", "north-america"/],
    ['arrangementNames', () => arrangementNames('three-phase-4wire', undefined as never), 'region', /one of "iec", "north-america"/],
    ['stepCombinations', () => stepCombinations(42), 'n', /whole number of steps from 0 to 20/],
    ['capacitorVoltage', () => capacitorVoltage(480, 1), 'p', /detuning factor/],
    ['selectBankUnits', () => selectBankUnits({} as never), 'sized', /sizing from sizeStarBank/],
    ['scanResonance', () => scanResonance(null as never, {} as never, {} as never), 'fundamental', /network solution of the board/],
    ['bankInServiceWords', () => bankInServiceWords(null as never), 'b', /bank in service/],
    ['conductorReactance', () => conductorReactance({} as never, 60), 'size', /\{ mm2 \}, \{ awg \} or \{ kcmil \}/],
    ['dutyConditions', () => dutyConditions({ minusPercent: -5, plusPercent: 10 }), 'tolerance.minusPercent', /tolerance, %, from 0 to 100/],
    ['withHarmonicNeutral', () => withHarmonicNeutral({} as never, 42 as never), 'text', /text of a file/],
  ];
  it.each(refusals)('%s: an InputError naming its argument', (_name, call, path, expected) => {
    const r = outcome(call);
    expect(r.kind).toBe('refused');
    if (r.kind !== 'refused') return;
    expect(r.paths).toEqual([path]);
    expect(r.message).toContain(`${path}: expected`);
    expect(r.message).toMatch(expected);
  });

  it('the checked helpers give the same answers for good input', () => {
    expect(toPhasor({ re: 0, im: 2 })).toEqual({ re: 0, im: 2, magnitude: 2, angleDeg: 90 });
    expect(polar(2, Math.PI / 2).im).toBeCloseTo(2, 12);
    expect(conventionsOf(board).region).toBe('north-america');
    expect(labelIn('L1/L2/L3', 'B-C')).toBe('L2-L3');
    expect(labellerOf('L1/L2/L3')('ABC-delta')).toBe('L1L2L3-delta');
    expect(stepCombinations(2)).toEqual([
      [false, false],
      [true, false],
      [false, true],
      [true, true],
    ]);
    // 480 V across a step detuned at p = 7 %: 480 / 0.93 = 516.13 V on its capacitor.
    expect(capacitorVoltage(480, 0.07)).toBeCloseTo(516.129, 3);
    const solved = solveNetwork(board);
    expect(analyseSolution(solved).phases.map((p) => p.phase)).toEqual(['A', 'B', 'C']);
    expect(terminalVoltage(solved, 'N')).not.toBeNull();
  });
});
