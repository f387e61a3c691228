/**
 * Phase names L1/L2/L3 beside A/B/C: a file in either naming solves to the same figures,
 * reports follow the file's naming (JSON keys stay A/B/C), and a file that mixes the two,
 * or a breaker whose poles do not fit its load, is refused naming the field.
 */
import { describe, expect, it } from 'vitest';
import { conventionsOf, parseBoard, readBoardText, rewriteBoardText, solveBoard, solveInstallation, validateBoard, validateInstallation } from '@trivar/core';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';

type Mutable = Record<string, any>;
const lettered = () => ({
  name: 'Workshop',
  supply: {
    system: 'three-phase-4wire',
    voltage: { lineToLine: 400 },
    frequencyHz: 50,
    impedance: { A: { r: 0.02, x: 0.05 }, B: { r: 0.03, x: 0.05 }, C: { r: 0.02, x: 0.06 } },
  },
  feeder: { line: { A: { r: 0.05, x: 0.01 }, B: { r: 0.06, x: 0.01 }, C: { r: 0.05, x: 0.01 } }, neutral: { r: 0.05, x: 0.01 } },
  loads: [
    { name: 'saw', connection: 'A-B', kW: 3, pf: 0.8 },
    { name: 'kettle', connection: 'C-N', kW: 2 },
    { name: 'welder', connection: 'C-A', kW: 5, pf: 0.7 },
    { name: 'compressor', connection: 'ABC-delta', kW: 4, pf: 0.85 },
  ],
});
const numbered = () => ({
  ...lettered(),
  supply: { ...lettered().supply, impedance: { L1: { r: 0.02, x: 0.05 }, L2: { r: 0.03, x: 0.05 }, L3: { r: 0.02, x: 0.06 } } },
  feeder: { line: { L1: { r: 0.05, x: 0.01 }, L2: { r: 0.06, x: 0.01 }, L3: { r: 0.05, x: 0.01 } }, neutral: { r: 0.05, x: 0.01 } },
  loads: [
    { name: 'saw', connection: 'L1-L2', kW: 3, pf: 0.8 },
    { name: 'kettle', connection: 'L3-N', kW: 2 },
    { name: 'welder', connection: 'L1-L3', kW: 5, pf: 0.7 },
    { name: 'compressor', connection: 'L1L2L3-delta', kW: 4, pf: 0.85 },
  ],
});
const edit = (make: () => Mutable, f: (b: Mutable) => void) => {
  const b = make();
  f(b);
  return b;
};

describe('L1/L2/L3 in a board file', () => {
  it('solves to exactly the figures of the same board in A/B/C', () => {
    const a = solveBoard(lettered());
    const l = solveBoard(numbered());
    expect(l.phases).toEqual(a.phases);
    expect(l.loads.map((x) => x.connection)).toEqual(['A-B', 'C-N', 'C-A', 'ABC-delta']);
    expect(l.neutral).toEqual(a.neutral);
    expect(l.conventions.phaseNames).toBe('L1/L2/L3');
    expect(a.conventions.phaseNames).toBe('A/B/C');
    // JSON keys stay A/B/C; the labels map them.
    expect(l.phases.map((p) => p.phase)).toEqual(['A', 'B', 'C']);
    expect(l.conventions.phaseLabels).toEqual({ A: 'L1', B: 'L2', C: 'L3' });
  });

  it('labels the text report the way the file names phases, and never mixes', () => {
    const text = renderSolveReport(solveBoard(numbered()));
    expect(text).toMatch(/^ {2}L1 +\d/m);
    expect(text).toMatch(/L3-L1 \d+\.\d V/);
    expect(text).toMatch(/compressor +L1L2L3-delta/);
    expect(text).toMatch(/sequence L1L2L3/);
    expect(text).not.toMatch(/\b[ABC]-[ABCN]\b|^ {2}[ABC] +\d|sequence ABC/m);
    const plain = renderSolveReport(solveBoard(lettered()));
    expect(plain).toMatch(/^ {2}A +\d/m);
    expect(plain).not.toMatch(/\bL[123]\b/);
  });

  it('a board whose file does not settle the naming (one built in code) takes its region default, overridable', () => {
    const base = { nominalLineToNeutralV: 230, nominalLineToLineV: 400 };
    expect(conventionsOf({ ...base, system: 'three-phase-4wire', frequencyHz: 50 })).toMatchObject({ region: 'iec', regionBasis: 'frequency', phaseNames: 'L1/L2/L3' });
    expect(conventionsOf({ ...base, system: 'three-phase-4wire', frequencyHz: 60 })).toMatchObject({ region: 'north-america', phaseNames: 'A/B/C' });
    expect(conventionsOf({ nominalLineToNeutralV: 120, nominalLineToLineV: 240, system: 'split-phase', frequencyHz: 50 })).toMatchObject({ region: 'north-america', regionBasis: 'split-phase' });
    const chosen = { ...lettered(), conventions: { region: 'north-america' } };
    expect(solveBoard(chosen).conventions).toMatchObject({ phaseNames: 'A/B/C', region: 'north-america', regionBasis: 'file' });
    expect(solveBoard({ ...lettered(), supply: { ...lettered().supply, voltage: '208Y/120' } }).conventions).toMatchObject({ region: 'north-america', regionBasis: 'notation' });
    expect(solveBoard({ ...lettered(), supply: { ...lettered().supply, voltage: '230/400' } }).conventions).toMatchObject({ region: 'iec', regionBasis: 'notation' });
  });

  const invalid: [string, unknown, string, string][] = [
    ['a load in the other naming', edit(numbered, (b) => (b.loads[2].connection = 'C-A')), 'mixed_phase_names', 'loads[2].connection'],
    ['a per-phase key in the other naming', edit(numbered, (b) => (b.feeder.line = { L1: { r: 0.05, x: 0 }, B: { r: 0.05, x: 0 }, L3: { r: 0.05, x: 0 } })), 'mixed_phase_names', 'feeder.line.B'],
    ['the same phase twice', edit(lettered, (b) => (b.supply.impedance = { A: { r: 0.02, x: 0 }, L1: { r: 0.02, x: 0 }, B: { r: 0.02, x: 0 }, C: { r: 0.02, x: 0 } })), 'duplicate_phase', 'supply.impedance.L1'],
    ['an unknown phase name', edit(numbered, (b) => (b.loads[0].connection = 'L1-L4')), 'invalid_value', 'loads[0].connection'],
    ['a rule broken in L1/L2/L3 is reported in L1/L2/L3', edit(numbered, (b) => (b.supply.emf = { L1: { V: 230, angleDeg: 0 }, L2: { V: 230, angleDeg: -120 } })), 'missing', 'supply.emf.L3'],
    ['one pole on a line-to-line load', edit(lettered, (b) => (b.loads[0].poles = 1)), 'pole_count', 'loads[0].poles'],
    ['two poles on a line-to-neutral load', edit(lettered, (b) => (b.loads[1].poles = 2)), 'pole_count', 'loads[1].poles'],
    ['two poles on a three-phase load', edit(lettered, (b) => (b.loads[3].poles = 2)), 'pole_count', 'loads[3].poles'],
    ['four poles', edit(lettered, (b) => (b.loads[3].poles = 4)), 'invalid_value', 'loads[3].poles'],
    ['a bad limits preset', edit(lettered, (b) => (b.conventions = { voltageLimits: 'strict' })), 'invalid_value', 'conventions.voltageLimits'],
    ['custom limits out of range', edit(lettered, (b) => (b.conventions = { voltageLimits: { underPercent: 60, overPercent: 5 } })), 'out_of_range', 'conventions.voltageLimits.underPercent'],
    ['an unknown region', edit(lettered, (b) => (b.conventions = { region: 'mars' })), 'invalid_value', 'conventions.region'],
  ];
  it.each(invalid)('%s: code and path', (_, input, code, path) => {
    const result = validateBoard(input);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues.map((i) => [i.code, i.path])).toContainEqual([code, path]);
  });

  it('the mixed-naming message names where the file set its naming', () => {
    const result = validateBoard(edit(numbered, (b) => (b.loads[2].connection = 'C-A')));
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0]!.message).toMatch(/names phases L1\/L2\/L3 \(first at supply\.impedance\.L1\)/);
  });

  it('a validated spec validates again as it is, and solves the same (notation and L1/L2/L3 kept in conventions)', () => {
    const input = { ...numbered(), supply: { ...numbered().supply, voltage: '230/400' } };
    const spec = parseBoard(input);
    expect(spec.conventions?.phaseNames).toBe('L1/L2/L3');
    expect(spec.supply.voltage).toMatchObject({ written: '230/400', lineToLine: 400, lineToNeutral: 230 });
    expect(parseBoard(spec)).toEqual(spec);
    expect(solveBoard(spec).phases).toEqual(solveBoard(input).phases);
    expect(solveBoard(spec).conventions.phaseNames).toBe('L1/L2/L3');
    // A hand-edited spec whose figures disagree with its notation is refused.
    const edited = { ...spec, supply: { ...spec.supply, voltage: { ...spec.supply.voltage, lineToLine: 415 } } };
    expect(validateBoard(edited).ok).toBe(false);
  });

  it('phaseNames chooses the report labels of a file written either way', () => {
    const r = solveBoard({ ...lettered(), conventions: { phaseNames: 'L1/L2/L3' } });
    expect(renderSolveReport(r)).toMatch(/^ {2}L1 +\d/m);
  });

  it('never changes the object it was given', () => {
    const input = numbered();
    const copy = structuredClone(input);
    validateBoard(input);
    expect(input).toEqual(copy);
  });
});

describe('L1/L2/L3 in an installation file', () => {
  const riser = (connection: string) => ({
    supply: { voltage: '230/400', frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
    boards: [
      { name: 'Main', loads: [{ name: 'lift', connection: 'L1L2L3-delta', kW: 5, pf: 0.8 }] },
      { name: 'Floor 1', fedFrom: 'Main', feeder: { lengthM: 10, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: 'flat', connection, kW: 4 }] },
    ],
  });
  it('reads the names on every board and labels every board', () => {
    const r = solveInstallation(riser('L2-N'));
    expect(r.boards[1]!.result.loads[0]!.connection).toBe('B-N');
    expect(r.boards.every((b) => b.result.conventions.phaseNames === 'L1/L2/L3')).toBe(true);
  });
  it('refuses a sub-board in the other naming, naming the field', () => {
    const v = validateInstallation(riser('B-N'));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.issues.map((i) => [i.code, i.path])).toContainEqual(['mixed_phase_names', 'boards[1].loads[0].connection']);
  });
});

describe('panel-schedule fields', () => {
  it('keeps circuit number, breaker and poles in the result and shows them in the report', () => {
    const b = edit(lettered, (x) => {
      x.loads[0] = { ...x.loads[0], circuit: '7', breakerA: 16, poles: 2 };
      x.loads[3] = { ...x.loads[3], circuit: '9', breakerA: 20, poles: 3 };
    });
    const r = solveBoard(b);
    expect(r.loads.map((l) => [l.circuit, l.breakerA, l.poles])).toEqual([
      ['7', 16, 2],
      [null, null, null],
      [null, null, null],
      ['9', 20, 3],
    ]);
    const text = renderSolveReport(r);
    expect(text).toMatch(/^ {2}7 +saw .*16 A 2P$/m);
    expect(text).toMatch(/^ {2}9 +compressor .*20 A 3P$/m);
  });
});

describe('rebalancing a file written in L1/L2/L3', () => {
  it('writes the moved circuits back in the file’s own naming, so the file stays valid', () => {
    const text = 'supply: { voltage: 230/400, frequencyHz: 50 }\nloads:\n  - { name: Kettle, connection: L1-N, kW: 2 }\n  - { name: Oven, connection: L1-L2, kW: 3 }\n';
    const out = rewriteBoardText(text, [
      { listPosition: 1, name: 'Kettle', to: 'B-N' },
      { listPosition: 2, name: 'Oven', to: 'C-A' },
    ]);
    expect(out).toContain('connection: L2-N');
    expect(out).toContain('connection: L3-L1');
    expect(validateBoard(readBoardText(out)).ok).toBe(true);
    expect(rewriteBoardText('loads:\n  - { name: Kettle, connection: A-N, kW: 2 }\n', [{ listPosition: 1, name: 'Kettle', to: 'B-N' }])).toContain('connection: B-N');
  });
});

describe('drawings and the HTML report follow the naming', () => {
  it('labels phasors, sequence components and the limits table L1/L2/L3, keeping data-phase A/B/C', async () => {
    const { renderPhasorDiagram, renderSequenceDiagram, buildBoardReport, renderReportHtml } = await import('@trivar/core');
    const r = solveBoard(numbered());
    const phasors = renderPhasorDiagram(r);
    expect(phasors).toContain('0° = phase-L1 source voltage');
    expect(phasors).toMatch(/>L2</);
    expect(phasors).toContain('data-phase="B"');
    const sequences = renderSequenceDiagram(r);
    expect(sequences).toContain('L1=L2=L3');
    expect(sequences).toContain('sequence L1L2L3');
    const html = renderReportHtml(buildBoardReport({ spec: parseBoard(numbered()), result: r }));
    expect(html).toContain('L1 0.02 + j0.05 Ω');
    expect(html).toMatch(/<td[^>]*>L3-L1<\/td>/);
    expect(html).not.toMatch(/<td[^>]*>[ABC]-[ABCN]<\/td>/);
  });
});

describe('a rebalancing work order for a file in L1/L2/L3', () => {
  it('names the connections the way the file does', async () => {
    const { normaliseBoard, rebalanceBoard } = await import('@trivar/core');
    const { renderRebalanceReport } = await import('../../packages/cli/src/format/rebalanceReport.js');
    const board = normaliseBoard(
      parseBoard({
        supply: { voltage: '230/400', frequencyHz: 50, impedance: { r: 0.02, x: 0.02 } },
        loads: [
          { name: 'Flat 1', connection: 'L1-N', kW: 5 },
          { name: 'Flat 2', connection: 'L1-N', kW: 5 },
          { name: 'Flat 3', connection: 'L1-N', kW: 5 },
        ],
      }),
    );
    const report = rebalanceBoard(board, {});
    expect(report.moves.length).toBe(2);
    expect(report.board.phaseNames).toBe('L1/L2/L3');
    const text = renderRebalanceReport(report);
    expect(text).toMatch(/Flat \d +L1-N +L[23]-N/);
    expect(text).not.toMatch(/\b[ABC]-N\b/);
  });
});

describe('profile columns naming phases', () => {
  it('"phase L2 [kW]" drives the same metered phase as "phase B [kW]"', async () => {
    const { normaliseBoard, planColumns } = await import('@trivar/core');
    const board = normaliseBoard(parseBoard(numbered()));
    const numberedPlan = planColumns(board, ['time', 'phase L2 [kW]']);
    const letteredPlan = planColumns(board, ['time', 'phase B [kW]']);
    expect(numberedPlan.board.loads.at(-1)!.branches[0]!.from).toBe('B');
    expect(numberedPlan.board.loads.at(-1)).toEqual(letteredPlan.board.loads.at(-1));
  });
});
