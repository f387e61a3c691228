/**
 * Library renderers called without a naming label phases as the result's board names them:
 * a file written L1/L2/L3 gives L-labels by default, an A/B/C file keeps its letters.
 */
import { describe, expect, it } from 'vitest';
import {
  buildInstallationReport,
  checkHandFigures,
  driverColumns,
  handCheckSection,
  normaliseBoard,
  parseBoard,
  parseInstallation,
  planColumns,
  planDrivers,
  profileSection,
  readBoardText,
  renderOneLineDiagram,
  renderReportMarkdown,
  solveInstallation,
  studyProfile,
  type Board,
} from '@trivar/core';
import { inNumberedNames, LETTERED_LABEL, NUMBERED_LABEL } from '../support/phaseNaming.js';

// Invented workshop board: a kiln across two lines and lamps on one.
const WORKSHOP = `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }
loads:
  - { name: kiln, connection: A-B, kW: 6, pf: 0.9 }
  - { name: lamps, connection: C-N, kW: 2, pf: 0.8 }
`;
const boardOf = (text: string) => normaliseBoard(parseBoard(readBoardText(text)));
const textOf = (x: unknown) => JSON.stringify(x);

/** A short profile of the kiln: four 15-minute intervals. */
function profileOf(board: Board) {
  const plan = planColumns(board, ['time', 'kiln [kW]']);
  const count = 4;
  const columns = driverColumns(plan, [Float64Array.from([6, 5, 3, 6])], count);
  const utcMs = Float64Array.from({ length: count }, (_, k) => Date.UTC(2026, 0, 5) + k * 900_000);
  return studyProfile({ board: plan.board, drivers: planDrivers(plan), columns, utcMs, intervalMs: 900_000 }).result;
}

describe('report sections default to the board’s own phase naming', () => {
  it('the profile result carries the naming, and its section labels with it unless told otherwise', () => {
    const named = profileOf(boardOf(inNumberedNames(WORKSHOP)));
    const lettered = profileOf(boardOf(WORKSHOP));
    expect([named.phaseNames, lettered.phaseNames]).toEqual(['L1/L2/L3', 'A/B/C']);
    const byDefault = profileSection(named, []);
    expect(byDefault).toEqual(profileSection(named, [], 'L1/L2/L3'));
    expect(textOf(byDefault)).toMatch(NUMBERED_LABEL);
    expect(textOf(profileSection(lettered, []))).not.toMatch(NUMBERED_LABEL);
    // Only the labels differ: the same section, figure by figure, as the A/B/C file's.
    expect(textOf(byDefault).replace(/L([123])/g, (_, n: string) => 'ABC'[Number(n) - 1]!)).toBe(textOf(profileSection(lettered, [])));
  });

  it('the hand check carries the naming, and its section labels with it unless told otherwise', () => {
    const figures = readBoardText('capacitors: [{ branch: A-B, kvar: 2 }, { branch: C-N, kvar: 1 }]');
    const named = checkHandFigures(boardOf(inNumberedNames(WORKSHOP)), readBoardText(inNumberedNames('capacitors: [{ branch: A-B, kvar: 2 }, { branch: C-N, kvar: 1 }]')));
    const lettered = checkHandFigures(boardOf(WORKSHOP), figures);
    expect([named.phaseNames, lettered.phaseNames]).toEqual(['L1/L2/L3', 'A/B/C']);
    const byDefault = handCheckSection(named);
    expect(byDefault).toEqual(handCheckSection(named, undefined, 'L1/L2/L3'));
    const md = renderReportMarkdown({ title: 't', subtitle: 's', sections: [byDefault] }, 'r').markdown;
    expect(md).toMatch(/L1-L2/);
    expect(md).not.toMatch(LETTERED_LABEL);
    expect(renderReportMarkdown({ title: 't', subtitle: 's', sections: [handCheckSection(lettered)] }, 'r').markdown).not.toMatch(NUMBERED_LABEL);
  });

  it('an installation’s source and feeders entered per phase are described in the file’s naming', () => {
    const text = `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { L1: { r: 0.01, x: 0.03 }, L2: { r: 0.012, x: 0.03 }, L3: { r: 0.01, x: 0.03 } } }
boards:
  - { name: Main, loads: [{ name: heater, connection: L1-N, kW: 3 }] }
  - name: Barn
    fedFrom: Main
    feeder: { lengthM: 40, line: { L1: { mm2: 16 }, L2: { mm2: 16 }, L3: { mm2: 10 } }, neutral: { mm2: 16 } }
    loads: [{ name: dryer, connection: L2-L3, kW: 4, pf: 0.95 }]
`;
    const spec = parseInstallation(readBoardText(text));
    const result = solveInstallation(spec);
    const doc = buildInstallationReport({ spec, result });
    const description = doc.sections.find((s) => s.id === 'installation')!;
    const words = textOf(description.blocks.filter((b) => b.kind !== 'figure'));
    expect(words).toContain('L1 0.01 + j0.03 Ω, L2 0.012 + j0.03 Ω, L3 0.01 + j0.03 Ω');
    expect(words).toMatch(/L1: 16 mm²[^"]*; L2: 16 mm²[^"]*; L3: 10 mm²/);
    expect(words).not.toMatch(/\b[ABC] 0\.01|\b[ABC]: \d/);
    // The one-line drawing already followed the main board's naming.
    expect(renderOneLineDiagram(result)).toMatch(/L1 [\d.]+ · L2 [\d.]+ · L3 [\d.]+ A/);
  });
});
