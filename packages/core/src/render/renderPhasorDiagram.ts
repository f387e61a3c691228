/**
 * The phasor diagram of a solved board as SVG text: phase voltages, line
 * currents and the neutral current from one origin, each quantity on its own
 * labelled scale; optionally a second result (after correction) drawn solid
 * over the first drawn dashed.
 */
import { labelIn } from '../board/conventions/phaseNames.js';
import type { BoardResult } from '../analysis/boardResult.js';
import type { Phasor } from '../complex.js';
import { GRID_COLOUR, INK, MUTED_INK, NEUTRAL_COLOUR, PHASE_COLOUR } from './palette.js';
import { phasorScale, type PhasorScale } from './phasorScale.js';
import { arrow, scaleBar, subscripted, type Point } from './svgShapes.js';
import { attrs, coord, drawingTitle, escapeXml, sig3 } from './svgText.js';
import { placeLabels, textBox, type Box, type LabelRequest } from './labelPlacement.js';
import { assertBoardResult } from '../analysis/resultGuards.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';

export interface PhasorDiagramOptions {
  /**
   * A second result of the same board (e.g. after correction): drawn solid and
   * labelled with values, the first result dashed behind it.
   * @defaultValue none
   */
  readonly after?: BoardResult;
  /**
   * Heading inside the drawing; '' for none (the <title> is then the board's name alone).
   * @defaultValue `Phasors at the board` (or `… before and after` with `after`)
   */
  readonly title?: string;
}

/** Drawing geometry (px); one place so the tests and the report agree. */
export const PHASOR_LAYOUT = { width: 560, height: 640, cx: 280, cy: 288, radius: 205, currentShare: 0.8 } as const;

const FONT = 12;

interface Drawn {
  readonly kind: 'voltage' | 'current';
  readonly phase: string;
  readonly state: 'before' | 'after' | 'only';
  readonly phasor: Phasor;
  readonly colour: string;
  readonly label: { readonly main: string; readonly sub: string; readonly rest: string } | null;
}

function collect(result: BoardResult, state: Drawn['state'], withValues: boolean, withVoltageLabels: boolean): Drawn[] {
  const out: Drawn[] = [];
  // Labels follow the board's phase names (L1/L2/L3 or A/B/C); data-phase attributes keep A/B/C.
  const label = (phase: string) => labelIn(result.conventions.phaseNames, phase);
  for (const p of result.phases) {
    out.push({
      kind: 'voltage',
      phase: p.phase,
      state,
      phasor: p.voltage,
      colour: PHASE_COLOUR[p.phase],
      label: withVoltageLabels ? { main: 'V', sub: label(p.phase), rest: withValues ? ` ${sig3(p.voltage.magnitude)} V` : '' } : null,
    });
  }
  for (const p of result.phases) {
    out.push({
      kind: 'current',
      phase: p.phase,
      state,
      phasor: p.current,
      colour: PHASE_COLOUR[p.phase],
      label: { main: 'I', sub: label(p.phase), rest: withValues ? ` ${sig3(p.current.magnitude)} A` : '' },
    });
  }
  if (result.neutral && !result.board.neutralOpen) {
    const n = result.neutral.current;
    out.push({ kind: 'current', phase: 'N', state, phasor: n, colour: NEUTRAL_COLOUR, label: { main: 'I', sub: 'N', rest: withValues ? ` ${sig3(n.magnitude)} A` : '' } });
  }
  return out;
}

const tipOf = (p: Phasor, s: PhasorScale): Point => ({ x: PHASOR_LAYOUT.cx + p.re * s.pxPerUnit, y: PHASOR_LAYOUT.cy - p.im * s.pxPerUnit });

/** Faint 30° spokes and the nominal-voltage ring; returns the SVG and the boxes its text occupies. */
function grid(nominalRadius: number, nominalV: number): { svg: string; boxes: Box[] } {
  const { cx, cy, radius } = PHASOR_LAYOUT;
  const parts: string[] = [];
  const boxes: Box[] = [];
  for (let deg = 0; deg < 360; deg += 30) {
    const a = (deg * Math.PI) / 180;
    const r = radius + 12;
    parts.push(`<line${attrs({ x1: cx, y1: cy, x2: cx + Math.cos(a) * r, y2: cy - Math.sin(a) * r, stroke: GRID_COLOUR, 'stroke-width': deg % 90 === 0 ? 0.8 : 0.4 })}/>`);
    if (deg % 90 === 0) {
      const text = deg <= 180 ? `${deg}°` : `${deg - 360}°`;
      const { w, h } = textBox(text, 10);
      const tx = cx + Math.cos(a) * (r + 4 + w / 2) - w / 2;
      const ty = cy - Math.sin(a) * (r + 4 + h / 2) + h / 2 - 3;
      parts.push(`<text${attrs({ x: tx, y: ty, 'font-size': 10, fill: MUTED_INK })}>${escapeXml(text)}</text>`);
      boxes.push({ x: tx, y: ty - 0.8 * h, w, h });
    }
  }
  parts.push(`<circle${attrs({ cx, cy, r: nominalRadius, fill: 'none', stroke: GRID_COLOUR, 'stroke-width': 0.8, 'stroke-dasharray': '1 3' })}/>`);
  const ringText = `nominal ${sig3(nominalV)} V`;
  const rb = textBox(ringText, 10);
  const rx = cx + nominalRadius * Math.cos(Math.PI / 4) + 4;
  const ry = cy + nominalRadius * Math.sin(Math.PI / 4) + 12;
  parts.push(`<text${attrs({ x: rx, y: ry, 'font-size': 10, fill: MUTED_INK })}>${escapeXml(ringText)}</text>`);
  boxes.push({ x: rx, y: ry - 0.8 * rb.h, w: rb.w, h: rb.h });
  return { svg: parts.join(''), boxes };
}

function legend(y: number, overlay: boolean, v: PhasorScale, i: PhasorScale, hasNeutral: boolean, threeWire: boolean): string {
  const parts: string[] = [];
  const x0 = 24;
  const sample = (x: number, yy: number, width: number, dashed: boolean, colour: string, text: string): string =>
    arrow({ x, y: yy }, { x: x + 34, y: yy }, { colour, width, dashed }, { legend: text }).replace('class="phasor"', 'class="legend-sample"') +
    `<text${attrs({ x: x + 42, y: yy + 4, 'font-size': 11, fill: INK })}>${escapeXml(text)}</text>`;
  parts.push(sample(x0, y, 1.4, false, INK, threeWire ? 'voltage to the virtual neutral' : 'voltage to the neutral bar'));
  parts.push(sample(x0, y + 20, 3, false, INK, 'line current'));
  if (hasNeutral) parts.push(sample(x0, y + 40, 3, false, NEUTRAL_COLOUR, 'neutral current (black)'));
  if (overlay) {
    parts.push(sample(300, y, 3, true, MUTED_INK, 'before (dashed)'));
    parts.push(sample(300, y + 20, 3, false, MUTED_INK, 'after (solid)'));
  }
  const sy = y + (hasNeutral ? 68 : 48);
  parts.push(`<text${attrs({ x: x0, y: sy + 4, 'font-size': 11, fill: MUTED_INK })}>scale</text>`);
  parts.push(scaleBar({ x: x0 + 44, y: sy }, v.barPx, `${v.barValue} V`, 'V'));
  parts.push(scaleBar({ x: x0 + 44 + v.barPx + 80, y: sy }, i.barPx, `${i.barValue} A`, 'A'));
  return parts.join('');
}

/**
 * Renders the phasor diagram of a solved board.
 * @param result the solved board (`solveBoard`, or `verification.before` of a correction)
 * @returns SVG text (UTF-8, no external references), the same text for the same input
 * @example
 * const svg = renderPhasorDiagram(solveBoard(boardFile), { after: correction.verification.after });
 */
export function renderPhasorDiagram(result: BoardResult, options: PhasorDiagramOptions = {}): string {
  assertBoardResult(result);
  checkOptionKeys(options, 'options', ['after', 'title']);
  if (options.after !== undefined) assertBoardResult(options.after, 'options.after');
  const { width, height, cx, cy, radius, currentShare } = PHASOR_LAYOUT;
  const after = options.after;
  const drawn = after ? [...collect(result, 'before', false, false), ...collect(after, 'after', true, true)] : collect(result, 'only', true, true);
  const nominalV = result.board.nominalLineToNeutralV;
  const vMax = Math.max(nominalV, ...drawn.filter((d) => d.kind === 'voltage').map((d) => d.phasor.magnitude));
  const iMax = Math.max(0, ...drawn.filter((d) => d.kind === 'current').map((d) => d.phasor.magnitude));
  const vScale = phasorScale(vMax, radius, 'V');
  const iScale = phasorScale(iMax, currentShare * radius, 'A');
  const g = grid(nominalV * vScale.pxPerUnit, nominalV);

  const origin = { x: cx, y: cy };
  const arrows: string[] = [];
  const obstacles: (readonly [Point, Point])[] = [];
  const requests: (LabelRequest & { d: Drawn })[] = [];
  for (const d of drawn) {
    const s = d.kind === 'voltage' ? vScale : iScale;
    const tip = tipOf(d.phasor, s);
    const dashed = d.state === 'before';
    arrows.push(
      arrow(origin, tip, { colour: d.colour, width: d.kind === 'voltage' ? 1.4 : 3, dashed, ...(dashed ? { opacity: 0.6 } : {}) }, {
        quantity: d.kind,
        phase: d.phase,
        state: d.state,
        magnitude: sig3(d.phasor.magnitude),
      }),
    );
    obstacles.push([origin, tip]);
    if (d.label) {
      const text = `${d.label.main}${d.label.sub}${d.label.rest}`;
      requests.push({ tip, from: origin, ...textBox(text, FONT), d });
    }
  }
  // Longest arrows first: their labels have the least room to move.
  requests.sort((a, b) => Math.hypot(b.tip.x - cx, b.tip.y - cy) - Math.hypot(a.tip.x - cx, a.tip.y - cy));
  const area: Box = { x: 8, y: 46, w: width - 16, h: height - 108 - 46 };
  const placed = placeLabels(requests, obstacles, area, g.boxes);
  const labels = placed.map((p, k) => {
    const d = requests[k]!.d;
    return `<text${attrs({ class: 'phasor-label', x: p.textAt.x, y: p.textAt.y, 'font-size': FONT, fill: d.colour, 'font-weight': d.state === 'before' ? 'normal' : 'bold', 'data-phase': d.phase, 'data-quantity': d.kind })}>${subscripted(d.label!.main, d.label!.sub, d.label!.rest)}</text>`;
  });

  const { heading, title } = drawingTitle(options.title, after ? 'Phasors at the board — before and after' : 'Phasors at the board', result.board.name);
  const name = result.board.name.length > 70 ? `${result.board.name.slice(0, 69)}…` : result.board.name;
  const threeWire = result.neutral === null;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg"${attrs({ viewBox: `0 0 ${coord(width)} ${coord(height)}`, width, height, 'font-family': 'DejaVu Sans, Liberation Sans, Arial, sans-serif', role: 'img', 'data-view': 'phasors' })}>` +
    `<title>${escapeXml(title)}</title>` +
    `<rect${attrs({ x: 0, y: 0, width, height, fill: '#FFFFFF' })}/>` +
    (heading === null ? '' : `<text${attrs({ x: 16, y: 22, 'font-size': 15, 'font-weight': 'bold', fill: INK })}>${escapeXml(heading)}</text>`) +
    `<text${attrs({ x: 16, y: 40, 'font-size': 11, fill: MUTED_INK })}>${escapeXml(`${name} · 0° = phase-${labelIn(result.conventions.phaseNames, 'A')} source voltage, anticlockwise`)}</text>` +
    g.svg +
    arrows.join('') +
    labels.join('') +
    legend(height - 96, Boolean(after), vScale, iScale, drawn.some((d) => d.phase === 'N'), threeWire) +
    `</svg>\n`
  );
}
