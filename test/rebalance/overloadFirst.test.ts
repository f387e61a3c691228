/**
 * A board over a rating (or a study capacity) that no arrangement keeps: the search lowers the overload first
 * (the largest loading over 100 %, then the loadings over 100 % added), then the score, then the moves; and the
 * verdict and notes say what stays over. Where an arrangement within every rating exists, it is found, and a move
 * limit that stops it is named. Invented boards; hand figures at nominal voltage (P / U, ideal source).
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, readBoardText, rebalanceBoard, rewriteBoardText, solveBoard, type ConnectionSpec } from '@trivar/core';
import { renderRebalanceReport } from '../../packages/cli/src/format/rebalanceReport.js';
import { expectClose } from '../support/tolerance.js';
import { boardFigures } from './support/rebalanceBoards.js';

const OVERLOADS = ['line-over-rating', 'neutral-over-rating', 'transformer-overload', 'source-unit-overload'];
const flat = (text: string) => text.replace(/\s+/g, ' ');

function rebalanceText(text: string, study: object = {}) {
  const report = rebalanceBoard(normaliseBoard(parseBoard(readBoardText(text))), study);
  return { report, after: solveBoard(readBoardText(rewriteBoardText(text, report.moves))), words: flat(renderRebalanceReport(report)) };
}

const moveWords = (r: { moves: readonly { name: string; from: string; to: string }[] }) => r.moves.map((m) => `${m.name} ${m.from} → ${m.to}`);

/** 240 V open delta; unit A-B 7.5 kVA (7500 / 240 = 31.25 A), unit B-C 25 kVA (104.2 A). */
const coldStore = `name: Orchard cold store
supply:
  system: three-phase-3wire
  voltage: { lineToLine: 240 }
  frequencyHz: 60
  openDelta:
    A-B: { kVA: 7.5, impedancePercent: 2.5, xOverR: 2 }
    B-C: { kVA: 25, impedancePercent: 2.5, xOverR: 2 }
loads:
  - { name: Chiller, connection: A-B, kW: 5.5, pf: 0.85 }
  - { name: Defrost heater, connection: A-B, kW: 3, pf: 1 }
  - { name: Conveyor, connection: B-C, kW: 3, pf: 0.8 }
  - { name: Grading lights, connection: C-A, kW: 2, pf: 0.95 }
`;

/**
 * 230/400 V, every conductor rated 40 A. Each heater draws 10000 / 230.94 = 43.30 A: wherever they go, some line
 * carries one of them, so no arrangement is within 40 A and the least largest loading is 43.30 / 40 = 108.3 %.
 */
const forge = (rating: string) => `name: Hollybush forge
supply:
  system: three-phase-4wire
  voltage: { lineToLine: 400 }
  frequencyHz: 50
feeder:
  line: { lengthM: 12, rOhmPerKm: 0.6, xOhmPerKm: 0.08, ${rating} }
  neutral: { lengthM: 12, rOhmPerKm: 0.6, xOhmPerKm: 0.08, ${rating} }
loads:
  - { name: Hearth heater, connection: L1-N, kW: 10, pf: 1 }
  - { name: Annealing oven, connection: L1-N, kW: 10, pf: 1 }
  - { name: Belt grinder, connection: L1-N, kW: 5, pf: 0.8 }
  - { name: Yard lamps, connection: L2-N, kW: 1.5, pf: 0.95 }
`;

describe('a rated unit over its rating as things stand, which moves can bring within', () => {
  it('the answer is within every rating: unit A-B 44.7 A → 28.0 A of 31.25 A, and the verdict and note say so', () => {
    const { report, after, words } = rebalanceText(coldStore);
    const unit = after.sourceUnits!.find((u) => u.winding === 'A-B')!;
    expectClose(unit.ratedCurrentA, 7500 / 240, { rel: 1e-9, abs: 0 }, 'unit A-B rated current');
    expectClose(unit.currentA, 28.04, { rel: 0, abs: 0.01 }, 'unit A-B after');
    expect(after.warnings.filter((w) => OVERLOADS.includes(w.code))).toEqual([]);
    expect(report.capacityExceeded).toEqual([]);
    expect(report.overload).not.toBeNull();
    expect(report.overload!.within).toBe(true);
    expectClose(report.overload!.largestLoadingPercent.before, (100 * 44.72) / 31.25, { rel: 0, abs: 0.3 }, 'unit A-B now, % of its rating');
    expect(report.overload!.largestLoadingPercent.after).toBeLessThanOrEqual(100);
    expect(words).toContain("proven best within the file's ratings Work order");
    expect(report.notes.join('\n')).toContain('28.0 A after the moves (within it). The moves bring it within.');
    expect(report.notes.join('\n')).not.toContain('has not brought it within');
  });

  it('a move limit of 0 keeps the overload: the note names the one move that would cure it', () => {
    const { report, words } = rebalanceText(coldStore, { moveLimit: 0 });
    expect(report.moves).toEqual([]);
    expect(report.overload).toMatchObject({ within: false, movesForWithin: 1 });
    expect(words).toContain("still over: the supply's single-phase unit on A-B at 143 % of its rating; the move limit of 0 allows no move");
    expect(words).not.toContain("within the file's ratings");
    expect(report.notes.join(' ')).toContain('The move limit of 0 keeps an overload: with 1 move every limited current would be within its limit');
    expect(report.notes.join(' ')).toContain('The move limit of 0 allows no move: check the rating and the protection.');
  });
});

describe('a board over its ratings that no arrangement brings within', () => {
  it('the least overload: one heater per line (43.3 A, 108 % of 40 A), two moves, not the one move that leaves L1 at 168 %', () => {
    const { report, after, words } = rebalanceText(forge('ratingA: 40'));
    expect(moveWords(report)).toEqual(['Hearth heater A-N → C-N', 'Belt grinder A-N → B-N']);
    const lines = after.phases.map((p) => p.current.magnitude);
    [43.3, 33.6, 43.4].forEach((a, k) => expectClose(lines[k]!, a, { rel: 0, abs: 0.05 }, `line ${k + 1} after`));
    expectClose(after.neutral!.current.magnitude, 23.8, { rel: 0, abs: 0.05 }, 'neutral after');
    // The fast model's largest line against the hand figure of one heater.
    expectClose(Math.max(...report.conditions[0]!.model.after.lineA), 10000 / (400 / Math.sqrt(3)), { rel: 1e-9, abs: 0 }, 'largest line, fast model');
    expect(report.overload).toMatchObject({ within: false, proven: true, movesForWithin: null });
    expect(report.overload!.worst!.limit).toBe('rating');
    expectClose(report.overload!.worst!.loadingPercent, (100 * lines[2]!) / 40, { rel: 1e-9, abs: 0 }, 'worst loading');
    expectClose(report.overload!.largestLoadingPercent.before, (100 * 110.2) / 40, { rel: 0, abs: 0.2 }, 'line L1 now, % of 40 A');
    expect(words).toContain('still over: line L3 at 108 % of its rating; no arrangement does better (proven, least overload first');
    expect(words).not.toContain("within the file's ratings");
    const notes = report.notes.join('\n');
    expect(report.notes[0]).toMatch(/^! To lower the worst overload, these moves put what the file rates over its rating, or further over: line L3 would carry 43\.4 A against its rating of 40\.0 A \(now 0\.0 A\)\. Every arrangement leaves something over its rating \(proven\)/);
    expect(notes).toContain('The moves lower the largest loading from 276 % to 108 % of its limit, and no arrangement lowers the overload further (proven)');
    expect(notes).not.toContain('has not brought it within');
    expect(notes).not.toContain('do not make these moves');
  });

  it('with one move allowed: L1 at 168 %, proven least for that limit, and a note that two moves would give about 109 % (fast model)', () => {
    const { report, after, words } = rebalanceText(forge('ratingA: 40'), { moveLimit: 1 });
    expect(moveWords(report)).toEqual(['Hearth heater A-N → C-N']);
    expectClose(after.phases[0]!.current.magnitude, 67.2, { rel: 0, abs: 0.05 }, 'line L1 after');
    expect(words).toContain('still over: line L1 at 168 % of its rating; no arrangement with at most 1 move does better (proven');
    expect(report.notes.join(' ')).toContain('The move limit of 1 keeps a larger overload: with 2 moves the most loaded current would be at about 109 % of its limit');
    expect(report.overload!.movesForWithin).toBeNull();
  });
});

describe('a study capacity no arrangement meets', () => {
  it('mirror images tie on overload and score: the fewer moves win (2, not 3), and the verdict says what stays over', () => {
    const text = forge('ratingA: 40, parallel: 2');
    const { report, words } = rebalanceText(text, { lineCapacityA: 40 });
    expect(moveWords(report)).toEqual(['Hearth heater A-N → C-N', 'Belt grinder A-N → B-N']);
    // The mirror image (Hearth heater → L3, Annealing oven → L2, Yard lamps → L1), in the test-side model: the same
    // line currents on other lines and the same neutral, so the same overload and score, for one move more.
    const spec = parseBoard(readBoardText(text));
    const figures = (connections: ConnectionSpec[]) => boardFigures(spec, connections);
    const chosen = figures(spec.loads.map((l) => report.moves.find((m) => m.name === l.name)?.to ?? l.connection));
    const mirror = figures(['C-N', 'B-N', 'A-N', 'A-N']);
    expect([...mirror.lines].sort((a, b) => a - b).map((a) => a.toFixed(9))).toEqual([...chosen.lines].sort((a, b) => a - b).map((a) => a.toFixed(9)));
    expectClose(mirror.neutral, chosen.neutral, { rel: 1e-9, abs: 0 }, 'mirror-image neutral');
    expect(report.overload).toMatchObject({ within: false, proven: true });
    expect(report.overload!.worst!.limit).toBe('capacity');
    expect(words).toMatch(/still over: line L[13] at 108 % of its capacity; no arrangement does better \(proven/);
    expect(words).not.toContain("within the file's ratings");
    for (const row of report.moveTable!) expect(row.withinCapacity).toBe(false);
    expect(words).toContain('over a limit, least proven');
    expect(words).not.toContain('no way within');
  });
});
