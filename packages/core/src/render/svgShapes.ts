/**
 * Drawing primitives shared by the diagrams: arrows whose tip is the exact
 * end of the phasor, scale bars, and text with a subscript.
 */
import { attrs, coord, escapeXml } from './svgText.js';
import { INK } from './palette.js';

export interface Point {
  readonly x: number;
  readonly y: number;
}

export interface ArrowStyle {
  readonly colour: string;
  readonly width: number;
  readonly dashed?: boolean;
  readonly opacity?: number;
  /** Length of the head, px. */
  readonly head?: number;
}

/** Below this length an arrow is drawn as a dot (its head alone would be larger than it). */
const MIN_ARROW_PX = 4;

/**
 * An arrow from `from` to `to`. The head is a polygon whose first point is the
 * tip, exactly `to`; the shaft stops at the head's base so it never pokes through.
 * `data` becomes data-* attributes on the group (what the arrow stands for).
 */
export function arrow(from: Point, to: Point, style: ArrowStyle, data: Readonly<Record<string, string>>): string {
  const dx = to.x - from.x;
  const dy = to.y - from.y;
  const len = Math.hypot(dx, dy);
  const dataAttrs = Object.fromEntries(Object.entries(data).map(([k, v]) => [`data-${k}`, v]));
  const group = `<g class="phasor"${attrs(dataAttrs)}${style.opacity !== undefined ? attrs({ opacity: style.opacity }) : ''}>`;
  if (len < MIN_ARROW_PX) {
    // The short shaft stays so the drawing still says where the phasor starts.
    const shaft = attrs({ x1: from.x, y1: from.y, x2: to.x, y2: to.y, stroke: style.colour, 'stroke-width': style.width });
    return `${group}<line${shaft}/><circle${attrs({ cx: to.x, cy: to.y, r: Math.max(2, style.width), fill: style.colour })}/></g>`;
  }
  const head = Math.min(style.head ?? 4 + 2.2 * style.width, 0.45 * len);
  const ux = dx / len;
  const uy = dy / len;
  const base = { x: to.x - ux * head, y: to.y - uy * head };
  const half = 0.42 * head;
  const left = { x: base.x - uy * half, y: base.y + ux * half };
  const right = { x: base.x + uy * half, y: base.y - ux * half };
  const shaft = attrs({
    x1: from.x,
    y1: from.y,
    x2: base.x,
    y2: base.y,
    stroke: style.colour,
    'stroke-width': style.width,
    ...(style.dashed ? { 'stroke-dasharray': `${coord(2.2 * style.width + 2)} ${coord(1.6 * style.width + 2)}` } : {}),
  });
  const points = [to, left, right].map((p) => `${coord(p.x)},${coord(p.y)}`).join(' ');
  return `${group}<line${shaft}/><polygon${attrs({ points, fill: style.colour })}/></g>`;
}

/** A horizontal scale bar with end ticks and its value, e.g. |———| 50 A. */
export function scaleBar(at: Point, lengthPx: number, label: string, unit: string, colour = INK): string {
  const y = at.y;
  const x2 = at.x + lengthPx;
  return (
    `<g class="scale"${attrs({ 'data-unit': unit })}>` +
    `<line${attrs({ x1: at.x, y1: y, x2, y2: y, stroke: colour, 'stroke-width': 1.5 })}/>` +
    `<line${attrs({ x1: at.x, y1: y - 4, x2: at.x, y2: y + 4, stroke: colour, 'stroke-width': 1.5 })}/>` +
    `<line${attrs({ x1: x2, y1: y - 4, x2, y2: y + 4, stroke: colour, 'stroke-width': 1.5 })}/>` +
    `<text${attrs({ x: x2 + 6, y: y + 4, 'font-size': 11, fill: colour })}>${escapeXml(label)}</text></g>`
  );
}

/** Text whose second part is a subscript: V + A → V_A, then the rest after it. */
export function subscripted(main: string, sub: string, rest: string): string {
  return `${escapeXml(main)}<tspan dy="3" font-size="0.75em">${escapeXml(sub)}</tspan><tspan dy="-3">${escapeXml(rest)}</tspan>`;
}
