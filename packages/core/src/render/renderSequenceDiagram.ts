/**
 * The symmetrical components of a solved board as SVG text: one row for the
 * voltages and one for the currents, each with a zero-, positive- and
 * negative-sequence panel drawn on one scale per row, so the size of the
 * unbalance can be read against the positive sequence at a glance.
 */
import { labelIn } from '../board/conventions/phaseNames.js';
import type { BoardResult } from '../analysis/boardResult.js';
import type { PhaseId } from '../board/boardModel.js';
import type { Phasor } from '../complex.js';
import type { SequenceSet } from '../analysis/symmetricalComponents.js';
import { GRID_COLOUR, INK, MUTED_INK, PHASE_COLOUR } from './palette.js';
import { phasorScale, type PhasorScale } from './phasorScale.js';
import { arrow, scaleBar, type Point } from './svgShapes.js';
import { attrs, coord, drawingTitle, escapeXml, sig3 } from './svgText.js';
import { placeLabels, textBox, type LabelRequest } from './labelPlacement.js';
import { InputError, inputIssue } from '../errors.js';
import { assertBoardResult } from '../analysis/resultGuards.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';

export const SEQUENCE_LAYOUT = { width: 600, rowHeight: 250, top: 50, panelRadius: 78 } as const;

type Component = 'zero' | 'positive' | 'negative';
const COMPONENTS: readonly Component[] = ['zero', 'positive', 'negative'];

/**
 * The three phases of one sequence set, from the phase-A component: positive
 * sequence runs in the supply's sequence (B lags A by 120° for ABC), negative
 * the other way, zero sequence has all three equal.
 */
export function sequencePhasors(componentA: Phasor, component: Component, sequence: 'ABC' | 'ACB'): Record<PhaseId, { re: number; im: number }> {
  const rot = (deg: number) => {
    const a = (deg * Math.PI) / 180;
    return { re: componentA.re * Math.cos(a) - componentA.im * Math.sin(a), im: componentA.re * Math.sin(a) + componentA.im * Math.cos(a) };
  };
  const lagB = sequence === 'ABC' ? -120 : 120;
  const step = component === 'zero' ? 0 : component === 'positive' ? lagB : -lagB;
  return { A: rot(0), B: rot(step), C: rot(2 * step) };
}

function row(set: SequenceSet<Phasor>, unit: 'V' | 'A', y0: number, sequence: 'ABC' | 'ACB', quantity: string, names: Readonly<Record<PhaseId, string>>): string {
  const { width, panelRadius } = SEQUENCE_LAYOUT;
  const largest = Math.max(...COMPONENTS.map((c) => set[c].magnitude));
  const scale: PhasorScale = phasorScale(largest, panelRadius, unit);
  const parts: string[] = [];
  parts.push(`<text${attrs({ x: 16, y: y0 + 14, 'font-size': 13, 'font-weight': 'bold', fill: INK })}>${escapeXml(quantity)}</text>`);
  COMPONENTS.forEach((c, k) => {
    const cx = width / 6 + (k * width) / 3;
    const cy = y0 + 40 + panelRadius + 4;
    const centre = { x: cx, y: cy };
    parts.push(`<circle${attrs({ cx, cy, r: panelRadius, fill: 'none', stroke: GRID_COLOUR, 'stroke-width': 0.6, 'stroke-dasharray': '1 3' })}/>`);
    const magnitude = set[c].magnitude;
    const heading = magnitude === 0 ? `${c}: none` : `${c} ${sig3(magnitude)} ${unit}`;
    parts.push(`<text${attrs({ x: cx, y: y0 + 34, 'font-size': 12, fill: INK, 'text-anchor': 'middle' })}>${escapeXml(heading)}</text>`);
    // A component of zero (round-off read as none, noiseFloor.ts) has no phasors to draw or label: said in the panel instead.
    if (magnitude === 0) {
      parts.push(`<text${attrs({ class: 'phasor-label empty-component', 'data-component': c, x: cx, y: cy + 4, 'font-size': 11, fill: MUTED_INK, 'text-anchor': 'middle' })}>none</text>`);
      return;
    }
    const phasors = sequencePhasors(set[c], c, sequence);
    const tips: Point[] = [];
    const requests: LabelRequest[] = [];
    const phases: PhaseId[] = ['A', 'B', 'C'];
  const allThree = `${names.A}=${names.B}=${names.C}`;
    for (const p of phases) {
      const ph = phasors[p];
      const tip = { x: cx + ph.re * scale.pxPerUnit, y: cy - ph.im * scale.pxPerUnit };
      tips.push(tip);
      // Zero sequence: the three coincide; draw A only, labelled for all three.
      if (c === 'zero' && p !== 'A') continue;
      parts.push(
        arrow(centre, tip, { colour: c === 'zero' ? INK : PHASE_COLOUR[p], width: 2.4 }, { quantity: unit === 'V' ? 'voltage' : 'current', component: c, phase: p, magnitude: sig3(set[c].magnitude) }),
      );
      requests.push({ tip, from: centre, ...textBox(c === 'zero' ? allThree : names[p], 11) });
    }
    const obstacles = tips.map((t) => [centre, t] as const);
    const placed = placeLabels(requests, obstacles, { x: cx - width / 6 + 4, y: y0 + 38, w: width / 3 - 8, h: 2 * panelRadius + 16 });
    placed.forEach((pl, j) => {
      const text = c === 'zero' ? allThree : names[(['A', 'B', 'C'] as const)[j]!];
      const colour = c === 'zero' ? INK : PHASE_COLOUR[(['A', 'B', 'C'] as const)[j]!];
      parts.push(`<text${attrs({ class: 'phasor-label', x: pl.textAt.x, y: pl.textAt.y, 'font-size': 11, fill: colour })}>${escapeXml(text)}</text>`);
    });
  });
  parts.push(`<text${attrs({ x: 16, y: y0 + 2 * panelRadius + 72, 'font-size': 11, fill: MUTED_INK })}>scale</text>`);
  parts.push(scaleBar({ x: 60, y: y0 + 2 * panelRadius + 68 }, scale.barPx, `${scale.barValue} ${unit}`, unit));
  return parts.join('');
}

/**
 * Renders the sequence-component view of a solved three-phase board.
 * @throws {InputError} for a board without sequence components (split-phase or single-phase)
 */
export interface SequenceDiagramOptions {
  /** Heading inside the drawing; '' for none (the <title> is then the board's name alone). @defaultValue 'Symmetrical components' */
  readonly title?: string;
}

export function renderSequenceDiagram(result: BoardResult, options: SequenceDiagramOptions = {}): string {
  assertBoardResult(result);
  checkOptionKeys(options, 'options', ['title']);
  if (!result.sequences)
    throw new InputError([inputIssue('not-three-phase', 'supply.system', 'a three-phase board (sequence components exist only there)', result.board.system)], 'no sequence view');
  const { width, rowHeight, top } = SEQUENCE_LAYOUT;
  const height = top + 2 * rowHeight + 10;
  const { heading, title } = drawingTitle(options.title, 'Symmetrical components', result.board.name);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg"${attrs({ viewBox: `0 0 ${coord(width)} ${coord(height)}`, width, height, 'font-family': 'DejaVu Sans, Liberation Sans, Arial, sans-serif', role: 'img', 'data-view': 'sequence' })}>` +
    `<title>${escapeXml(title)}</title>` +
    `<rect${attrs({ x: 0, y: 0, width, height, fill: '#FFFFFF' })}/>` +
    (heading === null ? '' : `<text${attrs({ x: 16, y: 22, 'font-size': 15, 'font-weight': 'bold', fill: INK })}>${escapeXml(heading)}</text>`) +
    `<text${attrs({ x: 16, y: 40, 'font-size': 11, fill: MUTED_INK })}>${escapeXml(`${result.board.name} · phase-${result.conventions.phaseLabels.A} components, sequence ${labelIn(result.conventions.phaseNames, result.board.sequence)}; each row on one scale`)}</text>` +
    row(result.sequences.voltage, 'V', top, result.board.sequence, 'Voltages', result.conventions.phaseLabels) +
    row(result.sequences.current, 'A', top + rowHeight, result.board.sequence, 'Line currents', result.conventions.phaseLabels) +
    `</svg>\n`
  );
}
