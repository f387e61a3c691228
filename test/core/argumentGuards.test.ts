/**
 * The public functions that take a normalised board or installation, or text, refuse the wrong
 * kind of argument with an InputError naming it, never a TypeError from deep inside a solve or a
 * silent answer on nonsense.
 */
import { describe, expect, it } from 'vitest';
import {
  addHandCapacitors,
  checkHandFigures,
  compareCorrections,
  correctBoard,
  correctInstallation,
  InputError,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseBoardText,
  parseHandFigures,
  parseInstallation,
  readBoardText,
  readPlainBoardText,
  rewriteBoardText,
  rebalanceBoard,
  rebalanceInstallation,
  solveBoardModel,
  solveInstallationModel,
  studyProfile,
  studyScenarios,
  studyInstallationScenarios,
  studyInstallationProfile,
  analyseHarmonics,
  boardOfInstallation,
  boardPowerFactor,
  buildBoardReport,
  buildInstallationReport,
  renderCurrentTriangles,
  renderOneLineDiagram,
  renderPhasorDiagram,
  renderSequenceDiagram,
  sizeDeltaBank,
  sizeStarBank,
  solveNetwork,
  studyOpenNeutral,
} from '@trivar/core';

const rawBoard = {
  name: 'x',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [{ name: 'a', connection: 'A-N', kW: 5, pf: 0.7 }],
};
const rawInstallation = {
  name: 'x',
  supply: { voltage: '400/230', frequencyHz: 50 },
  boards: [{ name: 'm', loads: [{ name: 'a', connection: 'A-N', kW: 1, pf: 0.7 }] }],
};
const board = normaliseBoard(parseBoard(rawBoard));

/** The InputError `call` throws, with its first issue. */
function refusal(call: () => unknown): { error: InputError; message: string; path: string } {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    const e = error as InputError;
    return { error: e, message: e.issues[0]!.message, path: e.issues[0]!.path };
  }
  throw new Error('expected an InputError, got a result');
}

describe('a board argument that is not a normalised board', () => {
  it.each([
    ['correctBoard(raw spec)', () => correctBoard(rawBoard as never, { arrangement: 'star-bank', target: { pf: 0.95 } })],
    ['correctBoard(null, {})', () => correctBoard(null as never, {})],
    ['compareCorrections(raw spec)', () => compareCorrections(rawBoard as never, {})],
    ['rebalanceBoard(raw spec)', () => rebalanceBoard(rawBoard as never, {})],
    ['solveBoardModel(raw spec)', () => solveBoardModel(rawBoard as never)],
    ['checkHandFigures(raw spec)', () => checkHandFigures(rawBoard as never, { capacitors: [] })],
    ['addHandCapacitors(undefined)', () => addHandCapacitors(undefined as never, { capacitors: [] })],
    ['studyScenarios(raw spec)', () => studyScenarios(rawBoard as never, {})],
    ['analyseHarmonics(raw spec)', () => analyseHarmonics(rawBoard as never, {} as never)],
    ['studyOpenNeutral(raw 4-wire spec) (it used to say the board had no neutral)', () => studyOpenNeutral(rawBoard as never)],
    ['sizeDeltaBank(raw spec)', () => sizeDeltaBank(rawBoard as never)],
    ['sizeStarBank(raw spec)', () => sizeStarBank(rawBoard as never)],
    ['solveNetwork(raw spec)', () => solveNetwork(rawBoard as never)],
  ])('%s: InputError naming "board"', (_, call) => {
    const { message, path, error } = refusal(call);
    expect(path).toBe('board');
    expect(message).toMatch(/^board: expected a board from normaliseBoard\(parseBoard\(\.\.\.\)\)/);
    expect(error.heading).toBe('the board argument is not a normalised board');
  });

  it('says when what it got is a spec', () => {
    expect(refusal(() => correctBoard(rawBoard as never, {})).message).toContain('(received a spec with supply: ..., not normalised)');
    expect(refusal(() => correctBoard(null as never, {})).message).toContain('(received null)');
  });
});

describe('an installation argument that is not a normalised installation', () => {
  it.each([
    ['correctInstallation(raw spec)', () => correctInstallation(rawInstallation as never, { arrangement: 'star-bank' })],
    ['rebalanceInstallation(raw spec)', () => rebalanceInstallation(rawInstallation as never, {})],
    ['solveInstallationModel(a board)', () => solveInstallationModel(board as never)],
    ['studyInstallationScenarios(raw spec)', () => studyInstallationScenarios(rawInstallation as never, {})],
  ])('%s: InputError naming "installation"', (_, call) => {
    const { message, path } = refusal(call);
    expect(path).toBe('installation');
    expect(message).toMatch(/^installation: expected an installation from normaliseInstallation\(parseInstallation\(\.\.\.\)\)\.installation/);
  });

  it('a normalised installation still passes', () => {
    const { installation } = normaliseInstallation(parseInstallation(rawInstallation));
    expect(solveInstallationModel(installation).boards).toHaveLength(1);
  });

  it('boardOfInstallation names an index that is no board of it (it read past the list)', () => {
    const { installation } = normaliseInstallation(parseInstallation(rawInstallation));
    const { path, message } = refusal(() => boardOfInstallation(installation, 1));
    expect(path).toBe('index');
    expect(message).toBe('index: expected a board number from 0 (the main board) to 0 (received 1)');
    expect(boardOfInstallation(installation, 0).name).toBe('m');
  });
});

describe('studyProfile', () => {
  it('refuses a board spec and text in place of its input', () => {
    const { message, path } = refusal(() => studyProfile(rawBoard as never, 'time,a [x]\n2026-01-01T00:00,1\n' as never));
    expect(path).toBe('input');
    expect(message).toContain('input: expected { board, drivers, columns, utcMs, intervalMs }');
  });

  it('names input.board when the board inside is a spec', () => {
    const { message } = refusal(() => studyProfile({ board: rawBoard } as never));
    expect(message).toMatch(/^input\.board: expected a board from normaliseBoard/);
  });
});

describe('text arguments', () => {
  it.each([
    ['parseBoardText(42)', () => parseBoardText(42 as never)],
    ['readBoardText(undefined)', () => readBoardText(undefined as never)],
    ['readPlainBoardText(a Buffer)', () => readPlainBoardText(Buffer.from('name: x') as never)],
    ['rewriteBoardText(null, [])', () => rewriteBoardText(null as never, [])],
  ])('%s: InputError naming "text"', (_, call) => {
    const { message, path } = refusal(call);
    expect(path).toBe('text');
    expect(message).toMatch(/^text: expected the text of a file, as a string/);
  });
});

describe('option and study arguments name themselves, not the board', () => {
  it('correctBoard(board) with no settings names spec', () => {
    const { message } = refusal(() => correctBoard(board, undefined));
    expect(message).toBe('spec: expected an object');
  });

  it('rebalanceBoard(board, "x") names study', () => {
    expect(refusal(() => rebalanceBoard(board, 'x')).message).toBe('study: expected an object (received "x")');
  });

  it('parseHandFigures(null) names figures', () => {
    expect(refusal(() => parseHandFigures(null, board)).message).toBe('figures: expected an object (received null)');
  });
});

describe('normaliseBoard and normaliseInstallation check what they read', () => {
  it('refuses a load power that is not a number, which used to reach correctBoard as NaN', () => {
    const spec = { ...rawBoard, loads: [{ name: 'a', connection: 'A-N', kW: 'lots' }] };
    const { message, error } = refusal(() => normaliseBoard(spec as never));
    expect(message).toBe('loads[0].kW: expected a finite number (received "lots")');
    expect(error.heading).toMatch(/^normaliseBoard: the spec argument is not a validated board spec/);
  });

  it('lists every field it cannot read, with its path', () => {
    const { error } = refusal(() => normaliseBoard({} as never));
    expect(error.issues.map((i) => i.path)).toEqual(['supply', 'loads']);
    const bad = { ...rawBoard, supply: { ...rawBoard.supply, frequencyHz: '50' }, feeder: { line: { r: Number.NaN, x: 0 } }, loads: [{ name: 'a', connection: 'A-X', kW: 1, pf: 1.5 }] };
    expect(refusal(() => normaliseBoard(bad as never)).error.issues.map((i) => i.message)).toEqual([
      'supply.frequencyHz: expected a finite number (received "50")',
      'feeder.line.r: expected a finite number (received NaN)',
      'loads[0].connection: expected one of "A-N", "B-N", "C-N", "A-B", "B-C", "C-A", "ABC-star", "ABC-delta" (received "A-X")',
      'loads[0].pf: expected a number > 0 and <= 1 (received 1.5)',
    ]);
  });

  it('refuses something that is not an object', () => {
    expect(refusal(() => normaliseBoard('board.yaml' as never)).message).toBe('spec: expected a board spec from parseBoard(...) (received "board.yaml")');
  });

  it('normaliseInstallation refuses a raw spec it cannot read, naming the path', () => {
    const { error } = refusal(() => normaliseInstallation(rawInstallation as never));
    expect(error.heading).toMatch(/^normaliseInstallation: the spec argument is not a validated installation spec/);
    expect(error.issues.map((i) => i.path)).toEqual(['supply.system', 'supply.voltage']);
    const orphan = parseInstallation({ ...rawInstallation, boards: [...rawInstallation.boards, { name: 's', fedFrom: 'm', loads: [] }] });
    const broken = { ...orphan, boards: orphan.boards.map((b) => (b.name === 's' ? { ...b, fedFrom: 'nowhere' } : b)) };
    expect(refusal(() => normaliseInstallation(broken)).message).toBe('boards[1].fedFrom: expected the name of another board (received "nowhere")');
  });

  it('a validated spec normalises as before', () => {
    expect(board.loads[0]!.branches[0]!.sNominal.re).toBeCloseTo(5000, 9);
  });
});

describe('an installation profile input without a normalised installation', () => {
  it('names input.installation', () => {
    const { path, message } = refusal(() => studyInstallationProfile({ installation: rawInstallation } as never));
    expect(path).toBe('input.installation');
    expect(message).toMatch(/^input\.installation: expected an installation from normaliseInstallation/);
  });
});

describe('a result argument that is not a solved board or installation', () => {
  const solved = solveBoardModel(board);

  it.each([
    ['renderPhasorDiagram(raw spec)', () => renderPhasorDiagram(rawBoard as never), 'result', 'a spec with supply: ..., not solved'],
    ['renderPhasorDiagram(result, { after: board })', () => renderPhasorDiagram(solved, { after: board as never }), 'options.after', 'a normalised board, not solved'],
    ['renderSequenceDiagram(board)', () => renderSequenceDiagram(board as never), 'result', 'a normalised board, not solved'],
    ['renderCurrentTriangles(result, null)', () => renderCurrentTriangles(solved, null as never), 'after', 'null'],
    ['boardPowerFactor(raw spec) (it used to return undefined)', () => boardPowerFactor(rawBoard as never, 'vector'), 'result', 'a spec with supply: ..., not solved'],
  ])('%s: InputError naming the argument', (_, call, argument, received) => {
    const { message, path } = refusal(call);
    expect(path).toBe(argument);
    expect(message).toBe(`${argument}: expected a solved board from solveBoard(...) or solveBoardModel(...)${argument === 'result' && message.includes('powerFactor') ? ', or its powerFactor' : ''} (received ${received})`);
  });

  it('buildBoardReport and buildInstallationReport name input.result when it is not solved', () => {
    expect(refusal(() => buildBoardReport({ spec: parseBoard(rawBoard), result: board } as never)).message).toBe(
      'input.result: expected a solved board from solveBoard(...) or solveBoardModel(...) (received a normalised board, not solved)',
    );
    expect(refusal(() => buildInstallationReport({ spec: parseInstallation(rawInstallation), result: solved } as never)).path).toBe('input.result');
    expect(refusal(() => buildBoardReport({ spec: null, result: solved } as never)).path).toBe('input.spec');
    expect(buildBoardReport({ spec: parseBoard(rawBoard), result: solved }).sections.length).toBeGreaterThan(0);
  });

  it('renderOneLineDiagram(a board result) names result', () => {
    const { message, path } = refusal(() => renderOneLineDiagram(solved as never));
    expect(path).toBe('result');
    expect(message).toBe('result: expected a solved installation from solveInstallation(...) or solveInstallationModel(...) (received an object)');
  });

  it('boardPowerFactor with no definition names it (it used to return undefined); with one it reads the result', () => {
    const { message } = refusal(() => boardPowerFactor(solved, undefined as never));
    expect(message).toBe('definition: expected one of "effective", "vector", "arithmetic", "positive-sequence" (received nothing)');
    // One 5 kW load at pf 0.7 on a stiff supply: the board's vector PF is the load's.
    expect(boardPowerFactor(solved, 'vector')).toBeCloseTo(0.7, 9);
  });
});
