/**
 * The one-line drawing of a solved installation as SVG text: the supply, every
 * board as a box and every feeder as an orthogonal run from the feeding board
 * to the board it feeds, labelled with its line and neutral currents and its
 * voltage drop. Where each piece goes is oneLineLayout.ts's job (a tree while
 * the installation is narrow, a ladder when it is wide); this file draws.
 */
import { percentBesideBand } from '../board/conventions/voltageBesideBand.js';
import type { InstallationResult, FeederReading } from '../analysis/installationResult.js';
import { layOutOneLine, SUPPLY_HALF_HEIGHT } from './oneLineLayout.js';
import { INK, MUTED_INK, GRID_COLOUR } from './palette.js';
import { attrs, coord, drawingTitle, escapeXml, fixed, sig3 } from './svgText.js';
import { GLYPH_WIDTH_EM } from './labelPlacement.js';
import { assertInstallationResult } from '../analysis/resultGuards.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';

export interface OneLineDiagramOptions {
  /** Heading inside the drawing; '' for none (the <title> is then the installation's name alone). @defaultValue `One-line drawing of the installation` */
  readonly title?: string;
  /** Up to two short lines beside the supply symbol. @defaultValue voltage and frequency, and the transformer's rating */
  readonly supplyLines?: readonly string[];
  /** How a phase is named in labels (e.g. `L1` for `A`). @defaultValue the main board's naming (`conventions.phaseLabels`) */
  readonly phaseName?: (phase: string) => string;
}

/** Geometry (px); one place so the tests read the same numbers. */
export const ONE_LINE_LAYOUT = {
  column: 236,
  boxWidth: 204,
  boxHeight: 52,
  /** Tree: from one row's box top to the next row's box top. */
  rowPitch: 116,
  /** Tree: the bus run sits this far below the feeding board. */
  busDrop: 14,
  margin: 20,
  top: 58,
  sourceHeight: 84,
  minWidth: 560,
  indent: 30,
  stub: 14,
  ladderPitch: 68,
  /** Up to three boards that feed no other (a tree about 900 px wide) stay a tree; wider trees become a ladder. */
  treeMaxLeaves: 3,
  labelFont: 10.5,
  nameFont: 12,
  detailFont: 10.5,
} as const;

const L = ONE_LINE_LAYOUT;

/** Words in lines no wider than `widthPx` (estimated as the label placer does). */
function wrapToWidth(words: string, widthPx: number, fontSize: number): string[] {
  const max = Math.max(8, Math.floor(widthPx / (GLYPH_WIDTH_EM * fontSize)));
  const lines: string[] = [];
  let line = '';
  for (const w of words.split(' ')) {
    if (line && line.length + 1 + w.length > max) {
      lines.push(line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) lines.push(line);
  return lines;
}

/** Text cut to fit a width, with an ellipsis. */
function fit(text: string, widthPx: number, fontSize: number): string {
  const max = Math.max(1, Math.floor(widthPx / (GLYPH_WIDTH_EM * fontSize)));
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}

const text = (x: number, y: number, size: number, content: string, extra: Readonly<Record<string, string | number>> = {}) =>
  `<text${attrs({ class: 'tree-text', x, y, 'font-size': size, fill: INK, ...extra })}>${escapeXml(content)}</text>`;

/** The feeder's label lines: line currents, then neutral current and drop; amperes to 0.1 A as the report's tables print them (122.5, not 123; 0.0, not 0.000). */
function feederLines(f: FeederReading, phaseName: (p: string) => string): string[] {
  const currents = `${f.lines.map((l) => `${phaseName(l.phase)} ${fixed(l.current.magnitude, 1)}`).join(' · ')} A`;
  const neutral = f.neutral ? (f.neutral.open ? 'N open · ' : `N ${fixed(f.neutral.current.magnitude, 1)} A · `) : '';
  return [currents, `${neutral}drop ${fixed(f.voltageDropPercent, 2)} %`];
}

/** Stroke width grows with the feeder's largest line current, so heavy runs read as heavy. */
function strokeFor(f: FeederReading, largest: number): number {
  const i = Math.max(...f.lines.map((l) => l.current.magnitude));
  return 1.2 + 3.3 * (largest > 0 ? Math.sqrt(i / largest) : 0);
}

/**
 * Renders the one-line drawing of a solved installation.
 * @returns SVG text (no external references), the same text for the same input
 * @example
 * const svg = renderOneLineDiagram(solveInstallation(installationFile));
 */
export function renderOneLineDiagram(result: InstallationResult, options: OneLineDiagramOptions = {}): string {
  assertInstallationResult(result);
  checkOptionKeys(options, 'options', ['title', 'supplyLines', 'phaseName']);
  const labels = result.boards[0]!.result.conventions.phaseLabels as Readonly<Record<string, string>>;
  const phaseName = options.phaseName ?? ((p: string) => labels[p] ?? p);
  const layout = layOutOneLine(result, L);
  const { width } = layout;
  const legendTop = layout.bottom + 28;
  const legendWidth = width - 2 * L.margin;
  const legend = wrapToWidth(
    'Feeder labels: line currents, then the neutral current and the largest drop along the feeder (% of nominal line-to-neutral voltage); thicker runs carry more current. Box: the board, the range of the voltages its limits judge (% of nominal: line-to-neutral, line-to-line, at the loads), its own load; the heaviest outline marks the lowest voltage in the installation.',
    legendWidth,
    10.5,
  );
  const height = legendTop + 14 * legend.length + 6;
  const largest = Math.max(...result.feeders.flatMap((f) => f.lines.map((l) => l.current.magnitude)));

  const parts: string[] = [];
  // The supply: two overlapping rings (a transformer) or one ring with a wave (an ideal source).
  const { x: sx, y: sy } = layout.supply;
  const first = result.boards[0]!.result;
  const hasTransformer = first.transformer !== null;
  const source = hasTransformer
    ? `<circle${attrs({ cx: sx, cy: sy - 6, r: 11, fill: 'none', stroke: INK, 'stroke-width': 1.5 })}/><circle${attrs({ cx: sx, cy: sy + 8, r: 11, fill: 'none', stroke: INK, 'stroke-width': 1.5 })}/>`
    : `<circle${attrs({ cx: sx, cy: sy, r: 13, fill: 'none', stroke: INK, 'stroke-width': 1.5 })}/><path${attrs({ d: `M ${coord(sx - 8)} ${coord(sy)} q 4 -8 8 0 t 8 0`, fill: 'none', stroke: INK, 'stroke-width': 1.3 })}/>`;
  const b = first.board;
  const volts = first.conventions.voltageNotation;
  const transformerLine = first.transformer ? [`transformer ${fixed(first.transformer.ratedKVA, 0)} kVA`] : [];
  const supplyLines = (options.supplyLines ?? [`Supply ${volts} · ${b.frequencyHz} Hz`, ...transformerLine]).slice(0, 2);
  const supplyTextWidth = width - (sx + 24) - L.margin;
  parts.push(
    `<g${attrs({ class: 'supply', 'data-x': sx, 'data-bottom': sy + SUPPLY_HALF_HEIGHT })}>${source}${supplyLines
      .map((line, k) => text(sx + 24, sy - 2 + k * 14, k === 0 ? 11.5 : 10.5, fit(line, supplyTextWidth, k === 0 ? 11.5 : 10.5), k === 0 ? { 'font-weight': 'bold' } : { fill: MUTED_INK }))
      .join('')}</g>`,
  );

  // Feeders first, so boxes are drawn over their ends.
  for (const p of layout.boards) {
    const points = p.run.map(([x, y]) => `${coord(x)},${coord(y)}`).join(' ');
    const f = result.feeders.find((x) => x.board === p.board.name)!;
    const lines = feederLines(f, phaseName);
    parts.push(
      `<g${attrs({
        class: 'feeder',
        'data-board': p.board.name,
        'data-from': p.board.fedFrom ?? '',
        'data-max-current-a': sig3(Math.max(...f.lines.map((l) => l.current.magnitude))),
        'data-drop-percent': fixed(f.voltageDropPercent, 2),
      })}>` +
        `<polyline${attrs({ points, fill: 'none', stroke: INK, 'stroke-width': strokeFor(f, largest), 'stroke-linejoin': 'round' })}/>` +
        lines.map((line, k) => text(p.label.x, p.label.y + k * 13, L.labelFont, fit(line, p.label.width, L.labelFont), { class: 'tree-text feeder-label' })).join('') +
        `</g>`,
    );
  }

  const lowest = result.totals.lowestVoltageBoard;
  for (const p of layout.boards) {
    const r = p.board.result;
    const x = p.x;
    // The voltages the board's limits judge (line-to-neutral, line-to-line, at the loads), as the reports give them.
    const lo = r.voltageCheck.lowest.percent;
    const hi = r.voltageCheck.highest.percent;
    const warnings = r.warnings.length;
    const isLowest = p.board.name === lowest;
    // Beside the board's warnings: a figure near an edge with the decimals that show its side (voltageBesideBand.ts).
    const limits = r.voltageCheck.limits;
    const detail1 = `V ${percentBesideBand(limits, lo)}–${percentBesideBand(limits, hi)} %nom${isLowest ? ' · lowest' : ''}`;
    const detail2 = `${fixed(r.totals.kW, 1)} kW own${warnings ? ` · ${warnings} warning${warnings === 1 ? '' : 's'}` : ''}`;
    const inner = L.boxWidth - 14;
    parts.push(
      `<g${attrs({ class: 'board', 'data-board': p.board.name, 'data-fed-from': p.board.fedFrom ?? '', 'data-min-voltage-percent': fixed(lo, 1) })}>` +
        `<title>${escapeXml(p.board.name)}</title>` +
        `<rect${attrs({ x, y: p.top, width: L.boxWidth, height: L.boxHeight, rx: 3, fill: '#FFFFFF', stroke: INK, 'stroke-width': isLowest ? 2.4 : 1.2 })}/>` +
        text(x + 7, p.top + 17, L.nameFont, fit(p.board.name, inner, L.nameFont), { 'font-weight': 'bold' }) +
        text(x + 7, p.top + 32, L.detailFont, fit(detail1, inner, L.detailFont)) +
        text(x + 7, p.top + 46, L.detailFont, fit(detail2, inner, L.detailFont), { fill: MUTED_INK }) +
        `</g>`,
    );
  }

  parts.push(`<line${attrs({ x1: L.margin, y1: legendTop - 12, x2: width - L.margin, y2: legendTop - 12, stroke: GRID_COLOUR, 'stroke-width': 0.8 })}/>`);
  parts.push(legend.map((line, k) => text(L.margin, legendTop + 4 + k * 14, 10.5, line, { fill: MUTED_INK, class: 'tree-text legend' })).join(''));

  const { heading, title } = drawingTitle(options.title, 'One-line drawing of the installation', result.installation.name);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg"${attrs({ viewBox: `0 0 ${coord(width)} ${coord(height)}`, width, height, 'font-family': 'DejaVu Sans, Liberation Sans, Arial, sans-serif', role: 'img', 'data-view': 'one-line', 'data-arrangement': layout.arrangement })}>` +
    `<title>${escapeXml(title)}</title>` +
    `<rect${attrs({ x: 0, y: 0, width, height, fill: '#FFFFFF' })}/>` +
    (heading === null ? '' : text(16, 22, 15, fit(heading, width - 32, 15), { 'font-weight': 'bold' })) +
    text(16, 40, 11, fit(`${result.installation.name} · ${result.installation.boardCount} board${result.installation.boardCount === 1 ? '' : 's'}`, width - 32, 11), { fill: MUTED_INK }) +
    parts.join('') +
    `</svg>\n`
  );
}
