/**
 * Places phasor labels so they do not overlap each other, the arrows, or the
 * edge of the drawing. Greedy: each label tries positions around its arrow tip
 * (and, further out, along and beside the arrow) and takes the one with the
 * least overlap; labels are placed longest arrow first. A handful of labels
 * needs nothing cleverer, and the result is the same on every run.
 */
import type { Point } from './svgShapes.js';

export interface Box {
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

export interface LabelRequest {
  /** Arrow tip the label belongs to. */
  readonly tip: Point;
  /** Arrow start (the origin). */
  readonly from: Point;
  /** Width and height of the text, px (estimated). */
  readonly w: number;
  readonly h: number;
}

export interface PlacedLabel {
  readonly box: Box;
  /** Baseline start of the text. */
  readonly textAt: Point;
}

/**
 * Average advance of a sans-serif glyph as a fraction of the font size; 0.6 is
 * generous for digits and capitals in DejaVu/Liberation/Arial, so estimated boxes
 * are never smaller than the drawn text (common practice, no source).
 */
export const GLYPH_WIDTH_EM = 0.6;

export function textBox(text: string, fontSize: number): { w: number; h: number } {
  return { w: text.length * GLYPH_WIDTH_EM * fontSize, h: 1.25 * fontSize };
}

const overlapArea = (a: Box, b: Box): number =>
  Math.max(0, Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x)) * Math.max(0, Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y));

/** Length of the segment p→q inside the box (sampled; close enough to rank candidates). */
function segmentInside(p: Point, q: Point, b: Box): number {
  const n = 24;
  let inside = 0;
  for (let k = 0; k <= n; k++) {
    const x = p.x + ((q.x - p.x) * k) / n;
    const y = p.y + ((q.y - p.y) * k) / n;
    if (x >= b.x - 1 && x <= b.x + b.w + 1 && y >= b.y - 1 && y <= b.y + b.h + 1) inside++;
  }
  return (inside / (n + 1)) * Math.hypot(q.x - p.x, q.y - p.y);
}

function candidates(req: LabelRequest): Box[] {
  const { tip, from, w, h } = req;
  const len = Math.hypot(tip.x - from.x, tip.y - from.y);
  const ux = len > 1e-9 ? (tip.x - from.x) / len : 1;
  const uy = len > 1e-9 ? (tip.y - from.y) / len : 0;
  const out: Box[] = [];
  // Centres on rings around the tip, in fixed angular order starting straight ahead.
  for (const gap of [6, 14, 26, 40]) {
    for (let k = 0; k < 16; k++) {
      const a = Math.atan2(uy, ux) + (k % 2 === 0 ? 1 : -1) * Math.ceil(k / 2) * (Math.PI / 8);
      const cx = Math.cos(a);
      const cy = Math.sin(a);
      // Distance from the box centre to its edge along (cx, cy), so the gap is to the box, not its centre.
      const edge = Math.min(Math.abs(cx) > 1e-9 ? w / 2 / Math.abs(cx) : Infinity, Math.abs(cy) > 1e-9 ? h / 2 / Math.abs(cy) : Infinity);
      const r = edge + gap;
      out.push({ x: tip.x + cx * r - w / 2, y: tip.y + cy * r - h / 2, w, h });
    }
  }
  return out;
}

/**
 * Places every label; `obstacles` are segments (the arrows) labels should keep off,
 * `area` the drawable region.
 */
export function placeLabels(requests: readonly LabelRequest[], obstacles: readonly (readonly [Point, Point])[], area: Box, fixed: readonly Box[] = []): PlacedLabel[] {
  const placed: Box[] = [...fixed];
  return requests.map((req) => {
    let best: Box | null = null;
    let bestScore = Infinity;
    candidates(req).forEach((box, order) => {
      const outside =
        Math.max(0, area.x - box.x) + Math.max(0, box.x + box.w - (area.x + area.w)) + Math.max(0, area.y - box.y) + Math.max(0, box.y + box.h - (area.y + area.h));
      let score = outside * 1000 + order * 0.01;
      for (const p of placed) score += overlapArea(box, p) * 50;
      for (const [a, b] of obstacles) score += segmentInside(a, b, box) * 20;
      if (score < bestScore) {
        bestScore = score;
        best = box;
      }
    });
    const box = best ?? { x: req.tip.x, y: req.tip.y, w: req.w, h: req.h };
    placed.push(box);
    return { box, textAt: { x: box.x, y: box.y + 0.8 * box.h } };
  });
}
