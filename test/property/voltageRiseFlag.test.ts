/**
 * Laws of the per-line supply path and of the rise's flag:
 * - each line's path, summed over the parts it runs through, averages to the one figure `supplyPathImpedance`
 *   gives where the source is a set of per-phase impedances (the mean of sums is the sum of means);
 * - an open delta's per-line form keeps every line-to-line loop: the two lines of a winding meet its impedance
 *   and two feeder conductors, the outer lines both windings (Kirchhoff's voltage law round each loop);
 * - the verdict agrees with the flag: flagged exactly where the judged rise is above the level the file sets,
 *   and then, and only then, the summary, the warning and the reading say so.
 * Boards invented here, and the gravel pit crusher board (test/fixtures/hostile/gravel-pit-crusher.yaml).
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { boardOfInstallation, correctBoard, normaliseBoard, normaliseInstallation, parseBoard, parseBoardText, parseInstallation, type BoardSpec } from '@trivar/core';
import { supplyPathImpedance, supplyPathImpedancesPerLine } from '../../packages/core/src/network/installationModel.js';

const impedanceArb = fc.record({ r: fc.double({ min: 0.001, max: 0.2, noNaN: true }), x: fc.double({ min: 0.001, max: 0.2, noNaN: true }) });
const sum = (zs: readonly { re: number; im: number }[]) => zs.reduce((s, z) => ({ re: s.re + z.re, im: s.im + z.im }), { re: 0, im: 0 });

describe('the per-line supply path', () => {
  it('per-phase source and feeder impedances: the lines’ paths average to the one figure, line by line the sum of their own parts', () => {
    fc.assert(
      fc.property(fc.tuple(impedanceArb, impedanceArb, impedanceArb), fc.tuple(impedanceArb, impedanceArb, impedanceArb), (source, line) => {
        const spec: BoardSpec = {
          name: 'Orchard pack house',
          supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { A: source[0], B: source[1], C: source[2] } },
          feeder: { line: { A: line[0], B: line[1], C: line[2] }, neutral: { r: 0.05, x: 0.02 } },
          loads: [{ name: 'Grader', connection: 'ABC-delta', kW: 10, pf: 0.8 }],
        };
        const board = normaliseBoard(parseBoard(spec));
        const perLine = supplyPathImpedancesPerLine(board);
        perLine.forEach((z, k) => {
          expect(z.re).toBeCloseTo(source[k]!.r + line[k]!.r, 12);
          expect(z.im).toBeCloseTo(source[k]!.x + line[k]!.x, 12);
        });
        const mean = sum(perLine);
        const one = supplyPathImpedance(board);
        expect(mean.re / 3).toBeCloseTo(one.re, 12);
        expect(mean.im / 3).toBeCloseTo(one.im, 12);
      }),
      { numRuns: 40 },
    );
  });

  it('open delta: the per-line form keeps each line-to-line loop (a winding and two feeder conductors; both windings between the outer lines)', () => {
    const windingArb = fc.record({ kVA: fc.double({ min: 10, max: 200, noNaN: true }), impedancePercent: fc.double({ min: 1, max: 6, noNaN: true }), xOverR: fc.double({ min: 0.5, max: 8, noNaN: true }) });
    fc.assert(
      fc.property(windingArb, windingArb, impedanceArb, (ab, bc, line) => {
        const board = normaliseBoard(
          parseBoard({
            name: 'Ridgeback feed mill',
            supply: { system: 'three-phase-3wire', voltage: { lineToLine: 240 }, frequencyHz: 60, openDelta: { 'A-B': ab, 'B-C': bc } },
            feeder: { line },
            loads: [{ name: 'Hammer mill', connection: 'ABC-delta', kW: 15, pf: 0.8 }],
          }),
        );
        const [a, b, c] = supplyPathImpedancesPerLine(board);
        // A winding's impedance from its nameplate, written out here: z % of V²/S, split by X/R.
        const winding = (w: { kVA: number; impedancePercent: number; xOverR: number }) => {
          const z = ((w.impedancePercent / 100) * 240 ** 2) / (w.kVA * 1000);
          const r = z / Math.sqrt(1 + w.xOverR ** 2);
          return { re: r, im: w.xOverR * r };
        };
        const loops = [
          [sum([a!, b!]), sum([winding(ab), { re: 2 * line.r, im: 2 * line.x }])],
          [sum([b!, c!]), sum([winding(bc), { re: 2 * line.r, im: 2 * line.x }])],
          [sum([a!, c!]), sum([winding(ab), winding(bc), { re: 2 * line.r, im: 2 * line.x }])],
        ] as const;
        for (const [perLine, hand] of loops) {
          expect(perLine.re).toBeCloseTo(hand.re, 12);
          expect(perLine.im).toBeCloseTo(hand.im, 12);
        }
      }),
      { numRuns: 40 },
    );
  });
});

describe('the per-line path of a sub-board', () => {
  it('two boards down, with unequal conductors in each feeder: every part of its own line, averaging to the one figure', () => {
    fc.assert(
      fc.property(fc.tuple(impedanceArb, impedanceArb, impedanceArb), fc.tuple(impedanceArb, impedanceArb, impedanceArb), impedanceArb, (first, second, service) => {
        const installation = normaliseInstallation(
          parseInstallation({
            name: 'Saltmarsh boatyard',
            supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4.5, xOverR: 4 } },
            boards: [
              { name: 'Yard main', feeder: { line: { ...service, ratingA: 400 }, neutral: { ...service, ratingA: 400 } }, loads: [{ name: 'Hoist', connection: 'ABC-delta', kW: 20, pf: 0.8 }] },
              { name: 'Shed board', fedFrom: 'Yard main', feeder: { line: { A: first[0], B: first[1], C: first[2] }, neutral: { r: 0.05, x: 0.01 } }, loads: [{ name: 'Saw', connection: 'A-N', kW: 3, pf: 0.8 }] },
              { name: 'Loft board', fedFrom: 'Shed board', feeder: { line: { A: second[0], B: second[1], C: second[2] }, neutral: { r: 0.05, x: 0.01 } }, loads: [{ name: 'Lights', connection: 'B-N', kW: 1, pf: 0.95 }] },
            ],
          }),
        ).installation;
        const loft = boardOfInstallation(installation, 2);
        const source = supplyPathImpedance(boardOfInstallation(installation, 0));
        const perLine = supplyPathImpedancesPerLine(loft);
        perLine.forEach((z, k) => {
          // The main board's own path (transformer and service cable, the same on every line) and this line's conductor of each feeder.
          expect(z.im).toBeCloseTo(source.im + first[k]!.x + second[k]!.x, 12);
          expect(z.re).toBeCloseTo(source.re + first[k]!.r + second[k]!.r, 12);
        });
        expect(sum(perLine).im / 3).toBeCloseTo(supplyPathImpedance(loft).im, 12);
      }),
      { numRuns: 25 },
    );
  });
});

describe('the verdict agrees with the flag', () => {
  const board = normaliseBoard(parseBoardText(readFileSync(new URL('../fixtures/hostile/gravel-pit-crusher.yaml', import.meta.url), 'utf8')));
  it('for any flag level: flagged exactly above it, and only then the summary, the warning and the reading say so', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 8, noNaN: true }), fc.constantFrom('star-bank' as const, 'delta-bank' as const), (level, arrangement) => {
        const r = correctBoard(board, { arrangement, target: { pf: 0.95 }, voltageRiseLimitPercent: level });
        const rise = r.verification.voltageRise;
        expect(rise.flagLevelPercent).toBe(level);
        expect(rise.judgedPercent).toBe(Math.max(rise.estimatePercent ?? -Infinity, rise.solvedPercent));
        expect(rise.flagged).toBe(rise.judgedPercent > level);
        expect(rise.flagReading !== null).toBe(rise.flagged);
        expect(r.summary.includes('flag level')).toBe(rise.flagged);
        expect(r.warnings.some((w) => w.code === 'voltage-rise')).toBe(rise.flagged);
        // A figure said to be above the level never prints as the level itself.
        if (rise.flagged) expect(Number(/about ([\d.]+) %, is above/.exec(r.summary)![1])).toBeGreaterThan(level);
      }),
      { numRuns: 12 },
    );
  });
});
