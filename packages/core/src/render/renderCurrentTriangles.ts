/**
 * One current triangle per line, each drawn in the frame of its own line
 * voltage (voltage to the right): the active part of the line current along
 * the voltage, the reactive part across it (lagging down), before and after
 * equipment is added, and the arrow of what the change did to the line current.
 */
import { labelIn } from '../board/conventions/phaseNames.js';
import type { BoardResult, PhaseReading } from '../analysis/boardResult.js';
import { EQUIPMENT_COLOUR, GRID_COLOUR, INK, MUTED_INK, PHASE_COLOUR } from './palette.js';
import { phasorScale } from './phasorScale.js';
import { arrow, scaleBar, subscripted, type Point } from './svgShapes.js';
import { attrs, coord, drawingTitle, escapeXml, fixed, sig3 } from './svgText.js';
import { assertBoardResult } from '../analysis/resultGuards.js';
import { ampsFigure } from '../analysis/boardWarnings.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';

export interface LineCurrentParts {
  /** P/|V|, A (negative when the line exports). */
  readonly activeA: number;
  /** Q/|V|, A, + lagging. */
  readonly reactiveA: number;
  readonly magnitudeA: number;
  /** null for a line with no current. */
  readonly pf: number | null;
  readonly sense: PhaseReading['sense'];
}

/** A line current split along and across its own line-to-neutral voltage. */
export function lineCurrentParts(p: PhaseReading): LineCurrentParts {
  checkObjectArgument(p, 'p', 'a phase reading of a solved board (result.phases[i])', ['voltage', 'current', 'kW', 'kvar']);
  const v = p.voltage.magnitude;
  // A line with no current (its round-off read as zero, as every table reads it) has no parts either.
  return v > 0 && p.current.magnitude > 0
    ? { activeA: (1000 * p.kW) / v, reactiveA: (1000 * p.kvar) / v, magnitudeA: p.current.magnitude, pf: p.pf, sense: p.sense }
    : { activeA: 0, reactiveA: 0, magnitudeA: p.current.magnitude, pf: p.pf, sense: p.sense };
}

export interface CurrentTriangleOptions {
  /** Heading inside the drawing; '' for none (the <title> is then the board's name alone). @defaultValue `Line current triangles — before and after` */
  readonly title?: string;
  /** What made the change, for the legend. @defaultValue `the correction` */
  readonly changeName?: string;
}

export const TRIANGLE_LAYOUT = { panelWidth: 210, top: 64, bottomText: 86, widthBudget: 150, heightBudget: 230 } as const;

/**
 * A current label: to 0.1 A as the correction's line table prints it, 2 significant figures where 0.1 A would
 * show a real current as 0.0 (ampsFigure, the warnings' rule); a line with no current as 0.0, as that table
 * prints it (its 'no current' said beside it), never to more places than the real figures.
 */
const amps = ampsFigure;
/** A line's current and PF: the figure and PF, or only 'no current' where it carries none. */
const currentText = (r: LineCurrentParts): string => (r.magnitudeA === 0 ? 'no current' : `${amps(r.magnitudeA)} A · ${pfText(r)}`);

const pfText = (r: LineCurrentParts): string => r.pf === null ? 'no current' : `PF ${fixed(r.pf, 3)}${r.sense === 'unity' ? '' : r.sense === 'lagging' ? ' lag' : ' lead'}`;

/**
 * Renders the current triangle of every line, before and after.
 * @param before the board without the equipment
 * @param after the same board with it (same phases)
 */
export function renderCurrentTriangles(before: BoardResult, after: BoardResult, options: CurrentTriangleOptions = {}): string {
  assertBoardResult(before, 'before');
  assertBoardResult(after, 'after');
  checkOptionKeys(options, 'options', ['title', 'changeName']);
  const { panelWidth, top, bottomText, widthBudget, heightBudget } = TRIANGLE_LAYOUT;
  // Visible labels follow the board's phase names; data-phase attributes keep A/B/C.
  const label = (phase: string) => labelIn(before.conventions.phaseNames, phase);
  const lines = before.phases.map((p, k) => ({ phase: p.phase, before: lineCurrentParts(p), after: lineCurrentParts(after.phases[k]!) }));
  const all = lines.flatMap((l) => [l.before, l.after]);
  const minA = Math.min(0, ...all.map((r) => r.activeA));
  const maxA = Math.max(0, ...all.map((r) => r.activeA));
  const down = Math.max(0, ...all.map((r) => r.reactiveA));
  const up = Math.max(0, ...all.map((r) => -r.reactiveA));
  const pxPerA = Math.min(widthBudget / Math.max(maxA - minA, 1e-9), heightBudget / Math.max(up + down, 1e-9));
  const scale = phasorScale(1, pxPerA, 'A', 60);
  const oy = top + 24 + up * pxPerA;
  const width = Math.max(2, lines.length) * panelWidth + 20;
  const height = oy + down * pxPerA + bottomText + 40;
  const parts: string[] = [];
  lines.forEach((l, k) => {
    const ox = 10 + k * panelWidth + 24 + -minA * pxPerA;
    const o = { x: ox, y: oy };
    const at = (r: LineCurrentParts): Point => ({ x: ox + r.activeA * pxPerA, y: oy + r.reactiveA * pxPerA });
    const b = at(l.before);
    const a = at(l.after);
    const colour = PHASE_COLOUR[l.phase];
    // Reference: the line's own voltage, to the right.
    const vEnd = 10 + (k + 1) * panelWidth - 14;
    parts.push(`<line${attrs({ x1: ox, y1: oy, x2: vEnd, y2: oy, stroke: GRID_COLOUR, 'stroke-width': 1 })}/>`);
    parts.push(`<text${attrs({ x: vEnd - 22, y: oy - 6, 'font-size': 11, fill: MUTED_INK })}>${subscripted('V', label(l.phase), '')}</text>`);
    // The before triangle's legs.
    parts.push(`<polyline${attrs({ points: `${ox},${oy} ${b.x},${oy} ${b.x},${b.y}`, fill: 'none', stroke: colour, 'stroke-width': 1, 'stroke-dasharray': '2 3', opacity: 0.7 })}/>`);
    parts.push(arrow(o, b, { colour, width: 2.6, dashed: true, opacity: 0.65 }, { quantity: 'current', phase: l.phase, state: 'before', magnitude: sig3(l.before.magnitudeA) }));
    parts.push(arrow(o, a, { colour, width: 3 }, { quantity: 'current', phase: l.phase, state: 'after', magnitude: sig3(l.after.magnitudeA) }));
    parts.push(arrow(b, a, { colour: EQUIPMENT_COLOUR, width: 2.2 }, { quantity: 'change', phase: l.phase, state: 'change', magnitude: sig3(Math.hypot(a.x - b.x, a.y - b.y) / pxPerA) }));
    const tx = 10 + k * panelWidth + 8;
    const ty = oy + down * pxPerA + 26;
    const text = (dy: number, content: string, weight = 'normal', fill = INK) =>
      parts.push(`<text${attrs({ x: tx, y: ty + dy, 'font-size': 11, fill, 'font-weight': weight })}>${content}</text>`);
    text(0, escapeXml(`line ${label(l.phase)}`), 'bold', colour);
    text(15, escapeXml(`before ${currentText(l.before)}`), 'normal', MUTED_INK);
    text(30, escapeXml(`after ${currentText(l.after)}`), 'bold');
    text(45, escapeXml(`active ${amps(l.before.activeA)} → ${amps(l.after.activeA)} A`), 'normal', MUTED_INK);
    text(60, escapeXml(`reactive ${amps(l.before.reactiveA)} → ${amps(l.after.reactiveA)} A`), 'normal', MUTED_INK);
  });
  const { heading, title } = drawingTitle(options.title, 'Line current triangles — before and after', before.board.name);
  const change = options.changeName ?? 'the correction';
  const ly = height - 22;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg"${attrs({ viewBox: `0 0 ${coord(width)} ${coord(height)}`, width, height, 'font-family': 'DejaVu Sans, Liberation Sans, Arial, sans-serif', role: 'img', 'data-view': 'triangles' })}>` +
    `<title>${escapeXml(title)}</title>` +
    `<rect${attrs({ x: 0, y: 0, width, height, fill: '#FFFFFF' })}/>` +
    (heading === null ? '' : `<text${attrs({ x: 16, y: 22, 'font-size': 15, 'font-weight': 'bold', fill: INK })}>${escapeXml(heading)}</text>`) +
    `<text${attrs({ x: 16, y: 40, 'font-size': 11, fill: MUTED_INK })}>${escapeXml('each line in the frame of its own voltage: active part along it, lagging reactive part downward')}</text>` +
    `<text${attrs({ x: 16, y: 55, 'font-size': 11, fill: MUTED_INK })}>${escapeXml(`dashed: before · solid: after · purple: what ${change} changed`)}</text>` +
    parts.join('') +
    `<text${attrs({ x: 16, y: ly + 4, 'font-size': 11, fill: MUTED_INK })}>scale</text>` +
    scaleBar({ x: 60, y: ly }, scale.barPx, `${scale.barValue} A`, 'A') +
    `</svg>\n`
  );
}
