/**
 * Reads trivar's SVG back as a user's tool would: parsed with a real XML
 * parser, each phasor's start and tip taken from the drawn geometry, each
 * scale from the drawn scale bar and its printed value.
 */
import { DOMParser, type Element } from '@xmldom/xmldom';

export interface DrawnPhasor {
  readonly data: Readonly<Record<string, string>>;
  readonly from: { x: number; y: number };
  readonly tip: { x: number; y: number };
}

export function parseSvg(svg: string): Element {
  const doc = new DOMParser().parseFromString(svg, 'image/svg+xml');
  const root = doc.documentElement;
  if (!root || root.tagName !== 'svg') throw new Error('not an SVG document');
  return root as unknown as Element;
}

const byClass = (root: Element, tag: string, cls: string): Element[] => Array.from(root.getElementsByTagName(tag)).filter((e) => e.getAttribute('class') === cls) as Element[];

function dataOf(e: Element): Record<string, string> {
  const out: Record<string, string> = {};
  for (const a of Array.from(e.attributes)) if (a.name.startsWith('data-')) out[a.name.slice(5)] = a.value;
  return out;
}

/** Every arrow (or dot, for a phasor too short to draw as an arrow). */
export function readPhasors(root: Element): DrawnPhasor[] {
  return byClass(root, 'g', 'phasor').map((g) => {
    const line = g.getElementsByTagName('line')[0];
    const polygon = g.getElementsByTagName('polygon')[0];
    const circle = g.getElementsByTagName('circle')[0];
    if (line && polygon) {
      const [tx, ty] = polygon.getAttribute('points')!.split(' ')[0]!.split(',').map(Number) as [number, number];
      return { data: dataOf(g), from: { x: Number(line.getAttribute('x1')), y: Number(line.getAttribute('y1')) }, tip: { x: tx, y: ty } };
    }
    if (line && circle) {
      // Too short for an arrowhead: a dot at the tip on a short shaft.
      const tip = { x: Number(circle.getAttribute('cx')), y: Number(circle.getAttribute('cy')) };
      return { data: dataOf(g), from: { x: Number(line.getAttribute('x1')), y: Number(line.getAttribute('y1')) }, tip };
    }
    throw new Error('a phasor group without an arrow or dot');
  });
}

/** Pixels per unit, from the scale bar's drawn length and the value printed beside it. */
export function readScales(root: Element): { unit: string; pxPerUnit: number }[] {
  return byClass(root, 'g', 'scale').map((g) => {
    const bar = g.getElementsByTagName('line')[0]!;
    const length = Number(bar.getAttribute('x2')) - Number(bar.getAttribute('x1'));
    const label = g.getElementsByTagName('text')[0]!.textContent!;
    const m = /^([\d.e+-]+) (\S+)$/.exec(label);
    if (!m) throw new Error(`unreadable scale label "${label}"`);
    return { unit: m[2]!, pxPerUnit: length / Number(m[1]) };
  });
}

/** The drawn text of the labels, with their estimated boxes (x, baseline y, text). */
export function readLabels(root: Element): { text: string; x: number; y: number; fontSize: number }[] {
  return byClass(root, 'text', 'phasor-label').map((t) => ({
    text: t.textContent ?? '',
    x: Number(t.getAttribute('x')),
    y: Number(t.getAttribute('y')),
    fontSize: Number(t.getAttribute('font-size')),
  }));
}
